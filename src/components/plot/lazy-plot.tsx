// Every 2-D chart of Cellwright: the cartesian plotting bundle loaded lazily, the Cellwright
// theme applied (./theme.ts), no library toolbar, no outside links, titles wrapped to the chart's
// width. Plot3D (./plot-3d.tsx) takes the same props for 3-D views.
import { lazy, Suspense, useEffect, useLayoutEffect, useRef, useState, type ComponentType, type CSSProperties, type LazyExoticComponent } from 'react';
import type { PlotParams } from 'react-plotly.js/factory';
import { Loading } from '@/components/ui/panel';
import { PLOT_CONFIG, merge, themedData, themedLayout } from './theme';

export { OKABE_ITO } from './theme';
export { exportPlot, exportPlotCsv } from './export';

export type PlotProps = Omit<PlotParams, 'layout' | 'config' | 'data'> & {
  data: unknown[];
  layout?: Record<string, unknown>;
  config?: Record<string, unknown>;
  /** name of exported images and CSV files, without extension */
  fileName?: string;
  /** chart title and a subtitle for conditions; or give layout.title as before */
  title?: string;
  subtitle?: string;
  style?: CSSProperties;
};

/** Replaces any link the library drew inside the chart with plain text: data stays in the lab. */
function unlink(graph: HTMLElement) {
  for (const a of graph.querySelectorAll('a[href]')) {
    const href = a.getAttribute('href') ?? '';
    if (/^(https?:)?\/\//i.test(href) && !href.startsWith(location.origin)) {
      a.removeAttribute('href');
      a.removeAttribute('target');
    }
  }
}

/** The chart's laid-out width in px, rounded down to 20 px so small resizes do not re-theme. */
function useWidth() {
  const ref = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(0);
  useLayoutEffect(() => {
    const node = ref.current;
    if (!node) return;
    const measure = () => setWidth(Math.floor(node.getBoundingClientRect().width / 20) * 20);
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(node);
    return () => observer.disconnect();
  }, []);
  return [ref, width] as const;
}

/**
 * Timing marks for the first-plot figure of `npm run bench`: `cw:first-plot` when the first chart
 * of a page load has drawn, `cw:plot-slot` when the place of a chart is on screen with its data.
 * With `?noplot=1` in the address the chart is left out (only the mark is set), so the same page
 * can be timed without it; nothing links there.
 */
const skipPlots = typeof location !== 'undefined' && new URLSearchParams(location.search).get('noplot') === '1';
// Only pages that draw charts load this module, so the plotting bundle is fetched and compiled as
// soon as the page's code arrives, while its data is still on the way, not after the data came.
const cartesianBundle = skipPlots ? null : import('./plotly');
cartesianBundle?.catch(() => {}); // a failed early load is tried again when a chart is drawn
const Cartesian = lazy(() => (cartesianBundle ?? import('./plotly')).catch(() => import('./plotly')));

function markOnce(name: string) {
  if (typeof performance === 'undefined' || performance.getEntriesByName(name).length > 0) return;
  performance.mark(name);
}

function SkippedPlot({ height }: { height: number }) {
  useEffect(() => markOnce('cw:plot-slot'), []);
  return <div style={{ height }} className="grid place-items-center rounded border border-dashed border-slate-300 text-sm text-slate-600">Chart left out for a timing run.</div>;
}

export function ThemedPlot({ component: Chart, bundle, ...props }: PlotProps & { component: LazyExoticComponent<ComponentType<PlotParams>>; bundle: '2d' | '3d' }) {
  const { fileName = 'cellwright-plot', config, layout, style, title, subtitle, onInitialized, onUpdate, data, ...rest } = props;
  const [box, width] = useWidth();
  const height = typeof style?.height === 'number' ? style.height : 420;
  return (
    <div ref={box} data-plot-bundle={bundle} className="min-w-0">
      {width > 0 && skipPlots && <SkippedPlot height={height} />}
      {width > 0 && !skipPlots && (
        <Suspense fallback={<div style={{ height }}><Loading label="Loading the plot…" /></div>}>
          {/* the chart is drawn at the measured width (the observer above follows the container), so
              the library's own window-resize handler, which can fire after the chart is gone, is off */}
          <Chart
            style={{ width: '100%', height: 420, ...style }}
            data={themedData(data, width)}
            layout={{ width, autosize: false, ...themedLayout(layout, { width, title, subtitle }) }}
            config={merge({ ...PLOT_CONFIG, toImageButtonOptions: { format: 'png', filename: fileName, scale: 2 } }, config)}
            onInitialized={(figure, graph) => { unlink(graph); markOnce('cw:plot-slot'); markOnce('cw:first-plot'); onInitialized?.(figure, graph); }}
            onUpdate={(figure, graph) => { unlink(graph); onUpdate?.(figure, graph); }}
            {...rest}
          />
        </Suspense>
      )}
    </div>
  );
}

/** A 2-D chart (lines, markers, bars, contours, heatmaps) in the Cellwright theme. */
export function LazyPlot(props: PlotProps) {
  return <ThemedPlot component={Cartesian} bundle="2d" {...props} />;
}

export { LazyPlot as Plot };

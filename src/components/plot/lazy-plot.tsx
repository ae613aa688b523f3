// Lazy plot with Cellwright's plot conventions: Okabe–Ito colours, units on axes, PNG/SVG export.
import { lazy, Suspense, type ComponentProps } from 'react';
import { Loading } from '@/components/ui/panel';

const Plot = lazy(() => import('./plotly'));

/** Okabe–Ito colour-blind-safe qualitative palette. */
export const OKABE_ITO = ['#0072B2', '#E69F00', '#009E73', '#D55E00', '#56B4E9', '#CC79A7', '#F0E442', '#000000'];

export type PlotProps = ComponentProps<typeof Plot>;

export function LazyPlot(props: PlotProps & { fileName?: string }) {
  const { fileName = 'cellwright-plot', config, layout, style, ...rest } = props;
  return (
    <Suspense fallback={<Loading label="Loading the plot…" />}>
      <Plot
        useResizeHandler
        style={{ width: '100%', height: 420, ...style }}
        layout={{
          font: { family: 'IBM Plex Sans Variable, sans-serif', size: 12, color: '#18233d' },
          paper_bgcolor: '#ffffff',
          plot_bgcolor: '#ffffff',
          colorway: OKABE_ITO,
          margin: { l: 64, r: 64, t: 48, b: 52 },
          hoverlabel: { font: { family: 'IBM Plex Mono, monospace' } },
          legend: { orientation: 'h', y: -0.2 },
          ...(layout as object),
        }}
        config={{
          displaylogo: false,
          responsive: true,
          toImageButtonOptions: { format: 'png', filename: fileName, scale: 2 },
          modeBarButtonsToRemove: ['lasso2d', 'select2d'],
          ...(config as object),
        }}
        {...rest}
      />
    </Suspense>
  );
}

/** Export the plot in a container as PNG or SVG through plotly's own image export. */
export async function exportPlot(container: HTMLElement | null, format: 'png' | 'svg', fileName: string) {
  const node = container?.querySelector('.js-plotly-plot') as HTMLElement | null;
  if (!node) return;
  const { Plotly } = await import('./plotly');
  await Plotly.downloadImage(node, { format, filename: fileName, width: 1200, height: 700, scale: format === 'png' ? 2 : 1 });
}

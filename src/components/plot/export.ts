// Our own export of a drawn chart: PNG or SVG through the plotting library's image export (the
// bundle that drew it), and CSV of exactly the points drawn, one self-describing row per point.

import { merge } from './theme';

type Graph = HTMLElement & { data?: Trace[]; layout?: Record<string, unknown> };
interface Trace {
  name?: string;
  type?: string;
  x?: ArrayLike<unknown>;
  y?: ArrayLike<unknown>;
  z?: ArrayLike<unknown> | ArrayLike<ArrayLike<unknown>>;
  yaxis?: string;
  xaxis?: string;
  visible?: boolean | 'legendonly';
  error_y?: { array?: ArrayLike<number>; arrayminus?: ArrayLike<number> };
  error_x?: { array?: ArrayLike<number>; arrayminus?: ArrayLike<number> };
}

function graphIn(container: HTMLElement | null): Graph | null {
  return (container?.querySelector('.js-plotly-plot') as Graph | null) ?? null;
}

async function plotlyFor(graph: HTMLElement) {
  const bundle = graph.closest<HTMLElement>('[data-plot-bundle]')?.dataset.plotBundle;
  return bundle === '3d' ? (await import('./plotly-3d')).Plotly : (await import('./plotly')).Plotly;
}

/**
 * What an exported image carries beyond the chart on screen: a layout drawn over the chart's own
 * (a title block, a legend written out, a footer) and the extra height it needs.
 */
export interface ExportLayout {
  layout: Record<string, unknown>;
  extraHeight?: number;
}

/**
 * Saves the first chart inside `container` as a PNG (2× pixels) or an SVG. With `extra`, the
 * image is drawn from the chart's data with the extra layout over its own (the page is untouched).
 */
export async function exportPlot(container: HTMLElement | null, format: 'png' | 'svg', fileName: string, extra?: ExportLayout) {
  const graph = graphIn(container);
  if (!graph) return;
  const Plotly = await plotlyFor(graph);
  const width = Math.max(900, Math.round(graph.getBoundingClientRect().width));
  const height = Math.max(520, Math.round(graph.getBoundingClientRect().height)) + (extra?.extraHeight ?? 0);
  if (!extra) {
    await Plotly.downloadImage(graph, { format, filename: fileName, width, height, scale: format === 'png' ? 2 : 1 });
    return;
  }
  const own = (graph.layout ?? {}) as Record<string, unknown>;
  const layout = mergeLayout(own, extra.layout);
  const url = await Plotly.toImage({ data: graph.data as never, layout: { ...layout, width, height } as never }, { format, width, height, scale: format === 'png' ? 2 : 1 });
  const a = document.createElement('a');
  a.href = url;
  a.download = `${fileName}.${format}`;
  document.body.appendChild(a);
  a.click();
  a.remove();
}

/** The chart's layout with `over` drawn over it: objects merged as the theme merges them, shapes and annotations added. */
export function mergeLayout(own: Record<string, unknown>, over: Record<string, unknown>): Record<string, unknown> {
  const { annotations, shapes, ...rest } = over;
  const out = merge(own, rest);
  for (const [key, extra] of [['annotations', annotations], ['shapes', shapes]] as const) {
    if (Array.isArray(extra)) out[key] = [...(Array.isArray(own[key]) ? (own[key] as unknown[]) : []), ...extra];
  }
  return out;
}

const plain = (text: unknown) => String(text ?? '').replace(/<br\s*\/?>/gi, ' ').replace(/<[^>]+>/g, '').replace(/\s+/g, ' ').trim();

function axisTitle(layout: Record<string, unknown> | undefined, ref: string | undefined, letter: 'x' | 'y'): string {
  const key = `${letter}axis${ref && ref !== letter ? ref.slice(1) : ''}`;
  const axis = layout?.[key] as { title?: { text?: string } | string } | undefined;
  const title = typeof axis?.title === 'string' ? axis.title : axis?.title?.text;
  return plain(title) || letter;
}

/** The drawn points of every visible trace: series, x, y (and z for grids, ± for error bars). */
export function plotRows(graph: Graph): Record<string, string | number>[] {
  const rows: Record<string, string | number>[] = [];
  for (const [index, trace] of (graph.data ?? []).entries()) {
    if (trace.visible === false) continue;
    const series = plain(trace.name) || `series ${index + 1}`;
    const xName = axisTitle(graph.layout, trace.xaxis, 'x');
    const yName = axisTitle(graph.layout, trace.yaxis, 'y');
    const x = Array.from(trace.x ?? []);
    const y = Array.from(trace.y ?? []);
    const z = trace.z ? Array.from(trace.z as ArrayLike<unknown>) : null;
    if (z && Array.isArray(z[0])) {
      // a grid: z[j][i] at x[i], y[j]
      (z as unknown[][]).forEach((row, j) => row.forEach((value, i) => rows.push({ series, 'x quantity': xName, x: x[i] as number, 'y quantity': yName, y: y[j] as number, z: value as number })));
      continue;
    }
    const plus = trace.error_y?.array ? Array.from(trace.error_y.array) : trace.error_x?.array ? Array.from(trace.error_x.array) : null;
    const minus = trace.error_y?.arrayminus ? Array.from(trace.error_y.arrayminus) : trace.error_x?.arrayminus ? Array.from(trace.error_x.arrayminus) : plus;
    for (let k = 0; k < Math.max(x.length, y.length); k++) {
      const row: Record<string, string | number> = { series, 'x quantity': xName, x: x[k] as number, 'y quantity': yName, y: y[k] as number };
      if (z) row.z = z[k] as number;
      if (plus) { row['error +'] = plus[k] ?? ''; row['error −'] = minus?.[k] ?? ''; }
      rows.push(row);
    }
  }
  return rows;
}

export function downloadText(text: string, fileName: string, type = 'text/csv') {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** Saves the points of the first chart inside `container` as CSV. */
export async function exportPlotCsv(container: HTMLElement | null, fileName: string) {
  const graph = graphIn(container);
  if (!graph) return;
  // the one CSV writer (formula-looking text made inert), loaded with the click, not the page
  const { writeCsv } = await import('@shared/csv/write-csv');
  const rows = plotRows(graph);
  const columns = [...new Set(rows.flatMap((row) => Object.keys(row)))];
  downloadText(writeCsv([columns, ...rows.map((row) => columns.map((column) => row[column]))]), `${fileName}.csv`);
}

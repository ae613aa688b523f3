// The one Cellwright plot theme: our fonts (IBM Plex Sans for words, Plex Mono for tick numbers),
// the Okabe–Ito colour-blind-safe palette, a quiet grid, axis titles that reserve their own room,
// and a configuration without the plotting library's toolbar or any link to an outside service.
// Every chart gets it through LazyPlot / Plot3D; callers pass only what their chart needs.

/** Okabe–Ito colour-blind-safe qualitative palette (blue, orange, green, vermilion, sky, purple, yellow, black). */
export const OKABE_ITO = ['#0072B2', '#E69F00', '#009E73', '#D55E00', '#56B4E9', '#CC79A7', '#F0E442', '#000000'];

export const PLOT_COLORS = {
  ink: '#18233d',
  muted: '#56668c',
  grid: '#ece8e0',
  axis: '#a9b4cc',
  zero: '#c9c2b4',
  paper: '#ffffff',
  reference: '#a9592a',
  /** the project's benchmark curve: a neutral grey, apart from every build colour */
  benchmark: '#6f6a62',
  /** a programme target's line or mark on every chart (Okabe–Ito vermillion) */
  target: '#D55E00',
} as const;

export const PLOT_FONT = "'IBM Plex Sans Variable', 'IBM Plex Sans', ui-sans-serif, sans-serif";
export const PLOT_MONO = "'IBM Plex Mono', ui-monospace, monospace";

/**
 * How the three quantities of a polarization plot are told apart: by colour and by dash, so the
 * plot still reads in greyscale print and for colour-blind readers.
 */
export const QUANTITY_STYLE = {
  voltage: { color: OKABE_ITO[0]!, dash: 'solid', width: 2 },
  irFree: { color: OKABE_ITO[3]!, dash: 'dash', width: 1.8 },
  power: { color: OKABE_ITO[2]!, dash: 'dot', width: 2 },
} as const;

/** Mixes a #rrggbb colour with white (amount > 0) or black (amount < 0). */
export function shade(hex: string, amount: number): string {
  const n = Number.parseInt(hex.slice(1), 16);
  const channel = (shift: number) => {
    const c = (n >> shift) & 255;
    const target = amount >= 0 ? 255 : 0;
    return Math.round(c + (target - c) * Math.abs(amount));
  };
  return `#${[16, 8, 0].map((s) => channel(s).toString(16).padStart(2, '0')).join('')}`;
}

/**
 * A round tick step for an axis from 0 to `max`: 1, 2, 2.5 or 5 × 10^k, about `count` ticks, and
 * the axis top at a whole number of steps so the last tick is labelled.
 */
export function roundAxis(max: number, count = 5): { range: [number, number]; dtick: number } {
  if (!(max > 0) || !Number.isFinite(max)) return { range: [0, 1], dtick: 0.2 };
  const raw = max / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * power).find((s) => s >= raw * 0.999) ?? 10 * power;
  const top = Math.ceil((max * 1.04) / step) * step;
  return { range: [0, Number(top.toPrecision(12))], dtick: Number(step.toPrecision(12)) };
}

export const PLOT_CONFIG = {
  displayModeBar: false,
  displaylogo: false,
  showTips: false,
  showLink: false,
  showSendToCloud: false,
  plotlyServerURL: '',
  linkText: '',
  responsive: true,
  scrollZoom: false,
} as const;

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Deep merge of plain objects; arrays and values in `over` replace those in `base`. */
export function merge<T extends Obj>(base: T, over: Obj | undefined): T {
  if (!over) return base;
  const out: Obj = { ...base };
  for (const [k, v] of Object.entries(over)) out[k] = isObj(v) && isObj(out[k]) ? merge(out[k] as Obj, v) : v;
  return out as T;
}

function axisTheme(compact: boolean): Obj {
  return {
    gridcolor: PLOT_COLORS.grid,
    zerolinecolor: PLOT_COLORS.zero,
    linecolor: PLOT_COLORS.axis,
    showline: true,
    ticks: 'outside',
    ticklen: 4,
    tickcolor: PLOT_COLORS.axis,
    tickfont: { family: PLOT_MONO, size: compact ? 10 : 11, color: PLOT_COLORS.ink },
    title: { font: { family: PLOT_FONT, size: compact ? 11 : 12, color: PLOT_COLORS.ink }, standoff: compact ? 6 : 10 },
    automargin: true,
    hoverformat: '.4~g',
  };
}

/** Width in characters a title line may take in a chart `width` px wide at `size` px. */
export const charsFor = (width: number, size: number) => Math.max(16, Math.floor((width - 24) / (size * 0.56)));

/** Breaks one line of text at spaces (or after " · ") so no line is longer than `max` characters. */
export function wrapLine(text: string, max: number): string[] {
  const parts = text.split(/(?<= · )|(?<= )/);
  const lines: string[] = [];
  let line = '';
  for (const part of parts) {
    if (line && (line + part).trimEnd().length > max) {
      lines.push(line.trimEnd());
      line = part.trimStart();
    } else line += part;
  }
  if (line.trim()) lines.push(line.trimEnd());
  return lines;
}

export interface TitleParts {
  title?: string;
  subtitle?: string;
}

/**
 * Splits the HTML-ish title text callers used to write ("Main<br><span style=…>conditions</span>")
 * into its title and subtitle, so the theme can wrap and style both.
 */
export function splitTitle(text: string | undefined): TitleParts {
  if (!text) return {};
  const [first, ...rest] = text.split(/<br\s*\/?>/i);
  const strip = (s: string) => s.replace(/<[^>]+>/g, '').trim();
  const subtitle = rest.map(strip).filter(Boolean).join(' · ');
  return { title: strip(first ?? ''), subtitle: subtitle || undefined };
}

/** The title block as the plotting library's text markup, wrapped for the chart's width. */
export function titleMarkup({ title, subtitle }: TitleParts, width: number, compact: boolean): { text: string; lines: number } {
  const titleSize = compact ? 13 : 14;
  const subSize = compact ? 10.5 : 11;
  const main = title ? wrapLine(title, charsFor(width, titleSize)) : [];
  const sub = subtitle ? wrapLine(subtitle, charsFor(width, subSize)) : [];
  const text = [
    ...main.map((l) => l.replace(/&/g, '&amp;').replace(/</g, '&lt;')),
    ...sub.map((l) => `<span style="font-size:${subSize}px;color:${PLOT_COLORS.muted}">${l.replace(/&/g, '&amp;').replace(/</g, '&lt;')}</span>`),
  ].join('<br>');
  return { text, lines: main.length * 1.25 + sub.length };
}

/** Legend names wrapped so no entry is wider than the chart (the legend is never clipped). */
export function themedData(data: unknown[], width: number): unknown[] {
  if (!(width > 0)) return data;
  const max = Math.max(14, charsFor(width, 11) - 6);
  return data.map((trace) => {
    if (!isObj(trace) || typeof trace.name !== 'string' || trace.name.length <= max || trace.name.includes('<br>')) return trace;
    return { ...trace, name: wrapLine(trace.name, max).join('<br>') };
  });
}

export interface ThemeOptions {
  /** the chart's width in px as laid out (narrow charts get smaller type and margins) */
  width: number;
  title?: string;
  subtitle?: string;
}

/** The caller's layout on top of the Cellwright theme. */
export function themedLayout(layout: Obj | undefined, { width, title, subtitle }: ThemeOptions): Obj {
  const compact = width > 0 && width < 600;
  const given = layout ?? {};
  const titleText = isObj(given.title) ? (given.title.text as string | undefined) : typeof given.title === 'string' ? given.title : undefined;
  const parts = title || subtitle ? { title, subtitle } : splitTitle(titleText);
  const heading = parts.title || parts.subtitle ? titleMarkup(parts, width || 800, compact) : null;
  const top = heading ? Math.round(26 + heading.lines * (compact ? 15 : 17)) : compact ? 16 : 24;
  const axis = axisTheme(compact);
  const base: Obj = {
    font: { family: PLOT_FONT, size: compact ? 11 : 12, color: PLOT_COLORS.ink },
    paper_bgcolor: PLOT_COLORS.paper,
    plot_bgcolor: PLOT_COLORS.paper,
    colorway: OKABE_ITO,
    separators: '.,',
    margin: { l: compact ? 8 : 16, r: compact ? 8 : 16, t: top, b: compact ? 8 : 16, pad: 0 },
    hoverlabel: { font: { family: PLOT_MONO, size: 12 }, bgcolor: '#ffffff', bordercolor: PLOT_COLORS.axis },
    // below the plot, in the container's own coordinates so it takes room of its own and never
    // overlaps the x-axis title
    legend: { orientation: 'h', x: 0, xref: 'container', xanchor: 'left', y: 0, yref: 'container', yanchor: 'bottom', font: { size: compact ? 10.5 : 11 }, bgcolor: 'rgba(255,255,255,0)', tracegroupgap: 4 },
    xaxis: axis,
    yaxis: axis,
  };
  // every axis the caller names (yaxis2, xaxis2, scene axes…) gets the same look
  for (const key of Object.keys(given)) {
    if (/^[xy]axis\d+$/.test(key)) base[key] = { ...axis, showgrid: false };
  }
  if (isObj(given.scene)) base.scene = { xaxis: { ...axis, automargin: undefined }, yaxis: { ...axis, automargin: undefined }, zaxis: { ...axis, automargin: undefined } };
  const { title: _omit, ...rest } = given;
  const merged = merge(base, rest);
  if (heading) merged.title = { text: heading.text, x: 0, xref: 'container', xanchor: 'left', y: 1, yref: 'container', yanchor: 'top', pad: { l: compact ? 8 : 12, t: 16 }, font: { family: PLOT_FONT, size: compact ? 13 : 14, color: PLOT_COLORS.ink } };
  // the caller's margins may only grow the top to fit the title block
  // a caller that places the legend itself in plot coordinates keeps them
  const legend = isObj(given.legend) ? given.legend : null;
  if (legend && legend.y !== undefined && legend.yref === undefined) (merged.legend as Obj).yref = 'paper';
  if (legend && legend.x !== undefined && legend.xref === undefined) (merged.legend as Obj).xref = 'paper';
  const m = merged.margin as Obj;
  if (heading && typeof m.t === 'number' && m.t < top) m.t = top;
  if (compact) {
    for (const side of ['l', 'r', 'b'] as const) if (typeof m[side] === 'number') m[side] = Math.min(m[side] as number, 40);
  }
  return merged;
}

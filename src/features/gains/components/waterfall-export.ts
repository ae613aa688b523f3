// What an exported waterfall carries beyond the chart on screen: a title block naming the project,
// the response with its unit, the chain, the reference point and conditions, the export date, the
// legend written out, and the target lines already drawn (named here too). Pure: tested as it is.
import { titleMarkup } from '@/components/plot/theme';
import type { ExportLayout } from '@/components/plot/export';

export interface WaterfallExportInfo {
  project: string;
  /** the response's label and display unit */
  label: string;
  unit: string;
  from: string;
  to: string;
  /** the reference point and conditions line the chart shows (j_ref, iR-free, temperatures, gases) */
  conditions: string;
  /** YYYY-MM-DD */
  date: string;
  confidencePercent: number;
  targets: { label: string }[];
  benchmark?: string | null;
  /** the export width in px (at least 900) */
  width?: number;
}

export function waterfallLegendText(info: Pick<WaterfallExportInfo, 'confidencePercent' | 'targets' | 'benchmark'>): string {
  const parts = ['Legend: solid bar = gain', 'hatched bar = loss', 'faded bar = within noise (interval contains zero)', 'dotted bar = the step changed test conditions', `whiskers = ${info.confidencePercent} % interval`];
  if (info.targets.length) parts.push(`dashed line = target (${info.targets.map((t) => t.label).join('; ')})`);
  if (info.benchmark) parts.push(`grey dashed line = benchmark ${info.benchmark}`);
  return parts.join(', ');
}

export function waterfallExportLayout(info: WaterfallExportInfo): ExportLayout {
  const width = Math.max(900, info.width ?? 900);
  const onScreen = titleMarkup({ title: `${info.label} from ${info.from} to ${info.to}`, subtitle: info.conditions }, width, false);
  const heading = titleMarkup({
    title: `${info.project} · ${info.label} (${info.unit}) from ${info.from} to ${info.to}`,
    subtitle: `${info.conditions} · exported ${info.date} · ${waterfallLegendText(info)}`,
  }, width, false);
  const top = Math.round(26 + heading.lines * 17);
  const screenTop = Math.round(26 + onScreen.lines * 17);
  return { layout: { title: { text: heading.text }, margin: { t: top } }, extraHeight: Math.max(0, top - screenTop) };
}

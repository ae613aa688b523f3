// The targets on one metric as lines for a chart drawn in the metric's own unit.
import type { TargetView } from '@shared/api-types';
import { conversionFactor } from '@shared/targets/target-units';
import { targetStatement } from './target-status';

/** Lines (label, value in `unit`) for the targets on `metric`; targets in a unit that does not convert are left out. */
export function targetLinesFor(targets: TargetView[] | undefined, metric: string, unit: string): { label: string; value: number }[] {
  const lines: { label: string; value: number }[] = [];
  for (const t of targets ?? []) {
    if (t.metric !== metric) continue;
    const factor = conversionFactor(t.unit, unit);
    if (factor === null) continue;
    lines.push({ label: t.name ? `${t.name} (${targetStatement(t).replace(`${t.metricLabel} `, '')})` : targetStatement(t), value: t.value * factor });
  }
  return lines;
}

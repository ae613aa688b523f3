// A grid of any function of a full recipe over two continuous factors, the others held: shared
// by the several-responses map.
import type { FactorDef } from '@shared/api-types';

export interface View {
  x: string;
  y: string;
  held: Record<string, number | string>;
}

const STEPS = 31;

export function axisValues(f: FactorDef): number[] {
  const low = f.low ?? 0;
  const high = f.high ?? 1;
  return Array.from({ length: STEPS }, (_, i) => low + ((high - low) * i) / (STEPS - 1));
}

/** z[j][i] at x[i], y[j]. */
export function gridOf(factors: FactorDef[], view: View, value: (point: Record<string, number | string>) => number) {
  const fx = factors.find((f) => f.key === view.x)!;
  const fy = factors.find((f) => f.key === view.y)!;
  const xs = axisValues(fx);
  const ys = axisValues(fy);
  const z = ys.map((yv) => xs.map((xv) => value({ ...view.held, [view.x]: xv, [view.y]: yv })));
  return { xs, ys, z, fx, fy };
}

export function heldLine(factors: FactorDef[], view: View): string {
  return factors
    .filter((f) => f.key !== view.x && f.key !== view.y)
    .map((f) => `${f.label} ${typeof view.held[f.key] === 'number' ? Number((view.held[f.key] as number).toPrecision(4)) : view.held[f.key]}${f.kind === 'continuous' && f.unit ? ` ${f.unit}` : ''}`)
    .join(' · ');
}

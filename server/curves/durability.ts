// Durability comparison of a project's builds: every durability / hold curve with its rate, 95 %
// interval, hours run, break-in and held conditions, read from the stored summaries (no points).
// Every log is listed; isRecord marks the one of each kind that stands for its build.
import { and, asc, eq, inArray } from 'drizzle-orm';
import type { AppContext } from '../context';
import { builds, curves, labs } from '../db/schema';
import type { ProjectAccess } from '../auth/access';
import { DEFAULT_ONSET_RULE, TYPICAL_DEGRADATION_BAND, kaplanMeier, survivalAt, survivalUnits } from '../../shared/durability';
import type { DurabilityComparison, DurabilityRow } from '../../shared/api-types';

const num = (value: unknown): number | null => (typeof value === 'number' && Number.isFinite(value) ? value : null);

function countInterruptions(text: unknown): number {
  try {
    const list = JSON.parse(String(text ?? '[]')) as unknown[];
    return Array.isArray(list) ? list.length : 0;
  } catch {
    return 0;
  }
}

export function durabilityComparison(ctx: AppContext, access: ProjectAccess): DurabilityRow[] {
  const buildRows = ctx.db
    .select({ id: builds.id, code: builds.code, status: builds.status, testConditions: builds.testConditions, labName: labs.name })
    .from(builds)
    .leftJoin(labs, eq(labs.id, builds.labId))
    .where(eq(builds.projectId, access.projectId))
    .all();
  if (buildRows.length === 0) return [];
  const byId = new Map(buildRows.map((b) => [b.id, b]));
  const rows = ctx.db
    .select({ id: curves.id, buildId: curves.buildId, kind: curves.kind, label: curves.label, metrics: curves.metrics, metricNotes: curves.metricNotes, summary: curves.summary, isRecord: curves.isRecord })
    .from(curves)
    .where(and(inArray(curves.buildId, [...byId.keys()]), inArray(curves.kind, ['durability', 'hold'])))
    .orderBy(asc(curves.buildId), asc(curves.id))
    .all();
  return rows.map((c) => {
    const b = byId.get(c.buildId)!;
    const s = c.summary as Record<string, unknown>;
    return {
      curveId: c.id,
      buildId: b.id,
      code: b.code,
      status: b.status,
      labName: b.labName ?? null,
      kind: c.kind as 'durability' | 'hold',
      label: c.label,
      degradationRate: num(c.metrics.degradationRate),
      low: num(s.degradationLow),
      high: num(s.degradationHigh),
      hoursRun: num(s.hoursRun),
      breakInHours: num(c.metrics.breakInHours),
      breakInSource: typeof s.breakInSource === 'string' ? s.breakInSource : null,
      voltageLossMv: num(s.voltageLossMv),
      hoursToLoss: num(s.hoursToLoss),
      projectedHoursToLoss: num(s.projectedHoursToLoss),
      lossFraction: num(s.lossFraction),
      interruptions: countInterruptions(s.interruptions),
      currentDensity: num(s.currentDensity),
      temperatureC: num(s.temperatureC) ?? num(b.testConditions?.temperatureC),
      note: c.metricNotes?.degradationRate ?? null,
      isRecord: c.isRecord,
      onsetHours: c.kind === 'durability' ? num(c.metrics.onsetHours) : null,
      onsetNote: c.kind === 'durability' ? (c.metricNotes as Record<string, string> | null)?.onsetHours ?? null : null,
      onsetRule: typeof s.onsetRule === 'string' ? s.onsetRule : null,
      holdDecay: c.kind === 'hold' ? num(c.metrics.holdDecay) : null,
      holdDecayLow: c.kind === 'hold' ? num(s.holdDecayLow) : null,
      holdDecayHigh: c.kind === 'hold' ? num(s.holdDecayHigh) : null,
      holdLoss: c.kind === 'hold' ? num(c.metrics.holdLoss) : null,
      holdRule: typeof s.holdRule === 'string' ? s.holdRule : null,
    };
  });
}

/**
 * Survival of the builds' durability logs of record: a build fails at its onset of rapid failure,
 * and a log without one is censored at its length (Kaplan–Meier).
 */
function survivalOf(rows: DurabilityRow[]): DurabilityComparison['survival'] {
  const logs = rows.filter((r) => r.kind === 'durability' && r.isRecord && r.hoursRun != null && r.hoursRun > 0);
  if (logs.length === 0) return null;
  const units = survivalUnits(logs.map((r) => ({ buildId: r.buildId, onsetHours: r.onsetHours, hoursRun: r.hoursRun! })));
  const curve = kaplanMeier(units);
  const longest = Math.max(...logs.map((r) => r.hoursRun!));
  // milestones: round hours the trade quotes, up to the longest log
  const milestones = [500, 1000, 2000, 3000, 5000].filter((hours) => hours <= longest);
  return {
    units: units.map((u) => ({ ...u, code: logs.find((r) => r.buildId === u.buildId)!.code })),
    steps: curve.steps,
    medianHours: curve.medianHours,
    method: curve.method,
    reached: milestones.map((hours) => survivalAt(units, hours)),
  };
}

/** GET /api/projects/:id/durability: the rows, the typical band to read them against, and survival. */
export function durabilityAnswer(ctx: AppContext, access: ProjectAccess): DurabilityComparison {
  const rows = durabilityComparison(ctx, access);
  return { curves: rows, typicalBand: TYPICAL_DEGRADATION_BAND, survival: survivalOf(rows), onsetRule: DEFAULT_ONSET_RULE };
}

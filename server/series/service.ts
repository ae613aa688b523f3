// Series across builds: the builds that differ only in cell temperature or back-pressure (picked
// by the recipe diff, or by hand), the current each gives at one iR-free voltage, and the
// apparent activation energy or reaction order from those currents.
import { and, eq, inArray } from 'drizzle-orm';
import type { AppContext } from '../context';
import type { ProjectAccess } from '../auth/access';
import { curves } from '../db/schema';
import { AppError } from '../lib/errors';
import { listBuilds } from '../builds/service';
import { listFactors } from '../projects/service';
import { readPoints } from '../curves/point-store';
import { analyseSeries, pickSeries } from '../../shared/series';
import type { SeriesCandidate, SeriesMember } from '../../shared/series';
import { STANDARD_ATMOSPHERE_KPA } from '../../shared/curves';
import type { z } from 'zod';
import type { seriesRequestSchema } from '../../shared/schemas/series';

type SeriesBody = z.output<typeof seriesRequestSchema>;

/** The recipe-diff keys that name the series variable: the test condition, and a factor that records it. */
function seriesKeysOf(variable: SeriesBody['variable'], factorKeys: { key: string; label: string; unit: string | null }[]): string[] {
  const condition = variable === 'temperature' ? 'conditions.temperatureC' : 'conditions.backPressureKPa';
  const pattern = variable === 'temperature' ? /temp/i : /press/i;
  const factor = factorKeys.filter((f) => pattern.test(f.key) || pattern.test(f.label)).map((f) => f.key);
  return [condition, ...factor];
}

export function analyseProjectSeries(ctx: AppContext, access: ProjectAccess, body: SeriesBody) {
  const all = listBuilds(ctx, access).filter((b) => b.status !== 'discarded');
  const factors = listFactors(ctx, access.projectId);
  const recipeFactors = factors.map((f) => ({ key: f.key, label: f.label, unit: f.unit ?? '' }));
  if (body.builds) {
    const known = new Set(all.map((b) => b.id));
    const fields = body.builds.flatMap((id, index) => (known.has(id) ? [] : [{ path: `builds.${index}`, message: `build ${id} is not in this project (or is discarded)` }]));
    if (fields.length) throw new AppError(400, 'validation', `Invalid request: ${fields.map((f) => `${f.path}: ${f.message}`).join('; ')}`, { fields });
  }
  const chosen = body.builds ? all.filter((b) => body.builds!.includes(b.id)) : all;
  // only builds with a polarization curve of record can join the series
  const recordRows = chosen.length === 0 ? [] : ctx.db
    .select({ id: curves.id, buildId: curves.buildId, points: curves.points })
    .from(curves)
    .where(and(inArray(curves.buildId, chosen.map((b) => b.id)), eq(curves.kind, 'polarization'), eq(curves.isRecord, true)))
    .all();
  const curveOf = new Map(recordRows.map((row) => [row.buildId, row]));
  // planned builds have no curves yet by nature; only built and tested ones are worth naming
  const noCurve = chosen.filter((b) => !curveOf.has(b.id) && b.status !== 'planned');
  const withCurve = chosen.filter((b) => curveOf.has(b.id));
  const leftOutWithoutCurve = noCurve.map((b) => ({ buildId: b.id, code: b.code, reason: 'no polarization curve of record' }));
  const keys = seriesKeysOf(body.variable, recipeFactors);
  const kind = body.variable === 'temperature' ? 'arrhenius' : 'order';
  const empty = (why: string) => ({
    kind, variable: body.variable, atVoltageIrFree: body.atVoltageIrFree, points: [], estimate: null, low: null, high: null,
    unit: kind === 'arrhenius' ? 'kJ/mol' : '', confidence: body.confidence, members: [], mismatches: [], leftOut: leftOutWithoutCurve,
    seriesKeys: keys, selection: body.builds ? 'as-given' : 'auto', notes: [why], method: null, xLabel: null, yLabel: null, fit: null, basis: null, noDependenceWithinNoise: null,
  });
  if (withCurve.length < 2) return empty(`${withCurve.length === 0 ? 'no build' : 'only one build'} ${body.builds ? 'picked' : 'of this project'} has a polarization curve of record: a series needs at least two`);
  const candidates: SeriesCandidate[] = withCurve.map((b) => ({
    buildId: b.id, code: b.code, factors: b.factors, loadingMgCm2: b.loadingMgCm2, metalLoadingMgCm2: b.metalLoadingMgCm2,
    catalystLot: b.catalystLot, labName: b.labName, testConditions: b.testConditions as Record<string, number | string | null | undefined>,
  }));
  const selection = pickSeries(candidates, keys, recipeFactors, { mode: body.builds ? 'as-given' : 'auto' });
  const byId = new Map(withCurve.map((b) => [b.id, b]));
  // back-pressure is recorded gauge: a reaction order needs the absolute pressure
  const valueOf = (value: number) => (body.variable === 'pressure' ? value + STANDARD_ATMOSPHERE_KPA : value);
  const members: SeriesMember[] = selection.values.map(({ buildId, value }) => {
    const data = readPoints(ctx.db, curveOf.get(buildId)!, 'polarization');
    const crossover = byId.get(buildId)!.testConditions?.h2CrossoverMAcm2;
    return { buildId, value: valueOf(value), curve: data, ...(crossover ? { h2CrossoverAcm2: crossover / 1000 } : {}) };
  });
  if (members.length < 2) return { ...empty(`only ${members.length} build${members.length === 1 ? '' : 's'} with a value of the ${body.variable}: a series needs at least two`), mismatches: selection.mismatches };
  const analysis = analyseSeries({ kind, voltage: body.atVoltageIrFree, members, confidence: body.confidence, ...(kind === 'order' && { variable: 'pressure' as const, unit: 'kPa' }) });
  const code = (id: number) => byId.get(id)?.code ?? String(id);
  const result = analysis.result;
  return {
    kind,
    variable: body.variable,
    atVoltageIrFree: body.atVoltageIrFree,
    points: result?.points ?? [],
    estimate: result?.estimate ?? null,
    low: result?.low ?? null,
    high: result?.high ?? null,
    unit: result?.unit ?? (kind === 'arrhenius' ? 'kJ/mol' : ''),
    confidence: result?.confidence ?? body.confidence,
    xLabel: result?.xLabel ?? null,
    yLabel: result?.yLabel ?? null,
    fit: result?.fit ?? null,
    method: result?.method ?? null,
    noDependenceWithinNoise: result?.noDependenceWithinNoise ?? null,
    basis: analysis.basis,
    members: analysis.readings.map((r) => ({
      buildId: r.buildId, code: code(r.buildId), value: r.value, valueUnit: body.variable === 'temperature' ? '°C' : 'kPa (absolute)',
      currentDensity: r.reading.currentDensity, irFreeCurrentDensity: r.reading.irFreeCurrentDensity, basis: r.reading.basis, note: r.reading.note, method: r.reading.method,
    })),
    mismatches: selection.mismatches.map((m) => ({ ...m, code: m.code ?? code(m.buildId) })),
    leftOut: [...leftOutWithoutCurve, ...analysis.leftOut.map((l) => ({ ...l, code: code(l.buildId) }))],
    seriesKeys: keys,
    selection: body.builds ? 'as-given' : 'auto',
    notes: [...analysis.notes, ...(result?.notes ?? []), ...(body.variable === 'pressure' ? ['back-pressure is recorded gauge: 101.325 kPa added to give the absolute pressure'] : [])],
  };
}

// Designed experiments for a project: generate a design over its factors, turn design runs into
// planned builds (all or nothing), fit a response surface on the tested builds, and propose the
// next builds. The statistics live in shared/doe; this file finds the data, checks the rules
// and turns input errors from the shared code into 4xx answers.
import { and, eq, inArray } from 'drizzle-orm';
import { CURVE_METRIC_INFO } from '../../shared/curves/metric-info';
import type { AppContext } from '../context';
import { builds, labs } from '../db/schema';
import { audit } from '../lib/audit';
import { AppError } from '../lib/errors';
import type { ProjectAccess } from '../auth/access';
import { createBuild, listBuilds } from '../builds/service';
import { listFactors, listResponses, METRIC_KEYS } from '../projects/service';
import type { FactorDef, ResponseDef } from '../../shared/schemas/project';
import type {
  Build,
  DesignBody,
  DesignFactorChoice,
  GeneratedDesign,
  PlanRun,
  PlanRunsBody,
  ProposalItem,
  ProposalsRequest,
  ProposalsResult,
  ResponseInfo,
  SurfaceRequest,
  SurfaceResult,
  SurfaceRun,
} from '../../shared/api-types';
import {
  canonicalAnalysis,
  checkExtrapolation,
  DesignInputError,
  DoeInputError,
  fitSurface,
  generateDesign,
  proposeBuilds,
  type DesignFactor,
  type Factor,
  type Observation,
  type ProposalGoal,
  type SurfaceFit,
} from '../../shared/doe/index';

type FieldIssue = { path: string; message: string };

function invalid(status: 400 | 422, code: string, message: string, fields: FieldIssue[] = []): AppError {
  return new AppError(status, code, message, fields.length ? { fields } : undefined);
}

/** Runs shared DOE code and turns its input errors into 422 answers naming the field. */
function guard<T>(work: () => T): T {
  try {
    return work();
  } catch (error) {
    if (error instanceof DesignInputError) {
      throw new AppError(422, 'design-input', error.message, { fields: [{ path: error.field, message: error.message }] });
    }
    if (error instanceof DoeInputError) {
      throw new AppError(422, error.code, error.message, error.details);
    }
    if (error instanceof RangeError) throw new AppError(422, 'invalid-input', error.message);
    throw error;
  }
}

// ---------------------------------------------------------------------------------------------
// Designs

function designFactors(defs: FactorDef[], chosen: (string | DesignFactorChoice)[]): DesignFactor[] {
  const issues: FieldIssue[] = [];
  const out: DesignFactor[] = [];
  const seen = new Set<string>();
  chosen.forEach((entry, index) => {
    const choice: DesignFactorChoice = typeof entry === 'string' ? { key: entry } : entry;
    const def = defs.find((f) => f.key === choice.key);
    const path = `factors.${index}`;
    if (!def) { issues.push({ path, message: `no factor "${choice.key}" in this project` }); return; }
    if (seen.has(def.key)) { issues.push({ path, message: `factor "${def.key}" is listed twice` }); return; }
    seen.add(def.key);
    if (def.kind === 'continuous') {
      const low = choice.low ?? def.low;
      const high = choice.high ?? def.high;
      if (low == null || high == null) { issues.push({ path, message: `${def.label} has no low/high range; set one in the project settings` }); return; }
      if (!(low < high)) { issues.push({ path, message: `${def.label}: low must be below high (${low}–${high})` }); return; }
      out.push({ key: def.key, kind: 'continuous', low, high });
    } else {
      const levels = choice.levels ?? def.levels ?? [];
      const unknown = levels.filter((level) => !(def.levels ?? []).includes(level));
      if (unknown.length) { issues.push({ path, message: `${def.label}: unknown level ${unknown.map((l) => `"${l}"`).join(', ')}` }); return; }
      if (levels.length < 1) { issues.push({ path, message: `${def.label} has no levels` }); return; }
      out.push({ key: def.key, kind: 'categorical', levels });
    }
  });
  if (issues.length) throw invalid(400, 'validation', `Invalid body: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`, issues);
  return out;
}

/** Generates a design over the project's factors (not stored: the client sends runs back to plan them). */
export function generateProjectDesign(ctx: AppContext, access: ProjectAccess, body: DesignBody): GeneratedDesign {
  const defs = listFactors(ctx, access.projectId);
  const factors = designFactors(defs, body.factors);
  const design = guard(() => generateDesign({ ...body, factors }));
  return { design, factors: defs.filter((f) => factors.some((d) => d.key === f.key)) };
}

// ---------------------------------------------------------------------------------------------
// Design runs → planned builds

function roundSetting(value: number): number {
  // designs carry 12 significant digits; a lab sheet needs far fewer, and rounding must not
  // push a value across a bound, so the bound check below runs on the rounded value
  return Number(value.toPrecision(6));
}

/** Turns design runs into planned builds in one transaction: every run is checked first, then all are created or none. */
export function planDesignRuns(ctx: AppContext, access: ProjectAccess, body: PlanRunsBody): { builds: Build[] } {
  const defs = listFactors(ctx, access.projectId);
  const issues: FieldIssue[] = [];
  const runs = [...body.runs].sort((a, b) => a.runOrder - b.runOrder);
  const prepared: { run: PlanRun; factors: Record<string, number | string> }[] = [];
  body.runs.forEach((run, index) => {
    const factors: Record<string, number | string> = {};
    for (const [key, value] of Object.entries(run.actual)) {
      const def = defs.find((f) => f.key === key);
      const path = `runs.${index}.actual.${key}`;
      if (!def) { issues.push({ path, message: `no factor "${key}" in this project` }); continue; }
      if (def.kind === 'continuous') {
        if (typeof value !== 'number' || !Number.isFinite(value)) { issues.push({ path, message: `${def.label} must be a number` }); continue; }
        const rounded = roundSetting(value);
        if (def.low != null && def.high != null && (rounded < def.low || rounded > def.high)) {
          issues.push({ path, message: `run ${run.runOrder}${run.pointType ? ` (${run.pointType})` : ''}: ${def.label} = ${rounded}${def.unit ? ` ${def.unit}` : ''} is outside the factor's range ${def.low}–${def.high}; use an inscribed or face-centred design, a smaller alpha, or widen the range in settings` });
          continue;
        }
        factors[key] = rounded;
      } else {
        if (typeof value !== 'string' || !(def.levels ?? []).includes(value)) { issues.push({ path, message: `${def.label} must be one of ${(def.levels ?? []).join(', ')}` }); continue; }
        factors[key] = value;
      }
    }
    prepared.push({ run, factors });
  });
  const labIds = new Set<number>();
  if (body.labId != null) labIds.add(body.labId);
  for (const [block, labId] of Object.entries(body.labsByBlock ?? {})) {
    if (!/^\d+$/.test(block)) issues.push({ path: `labsByBlock.${block}`, message: 'block numbers are whole numbers' });
    labIds.add(labId);
  }
  if (labIds.size) {
    const found = new Set(ctx.db.select({ id: labs.id }).from(labs).where(inArray(labs.id, [...labIds])).all().map((l) => l.id));
    for (const id of labIds) if (!found.has(id)) issues.push({ path: 'labId', message: `lab ${id} does not exist` });
  }
  if (body.parentId != null) {
    const parent = ctx.db.select({ id: builds.id }).from(builds).where(and(eq(builds.id, body.parentId), eq(builds.projectId, access.projectId))).get();
    if (!parent) issues.push({ path: 'parentId', message: `build ${body.parentId} is not in this project` });
  }
  if (issues.length) {
    throw invalid(422, 'plan-invalid', `No builds were planned: ${issues.slice(0, 5).map((i) => `${i.path}: ${i.message}`).join('; ')}${issues.length > 5 ? `; and ${issues.length - 5} more` : ''}`, issues);
  }
  const total = runs.length;
  const created = ctx.db.transaction(() => {
    const out: Build[] = [];
    for (const { run, factors } of [...prepared].sort((a, b) => a.run.runOrder - b.run.runOrder)) {
      const block = run.block ?? 1;
      const labId = body.labsByBlock?.[String(block)] ?? body.labId ?? null;
      const where = `design run ${run.runOrder} of ${total}${run.block ? `, block ${run.block}` : ''}${run.pointType ? `, ${run.pointType} point` : ''}`;
      const changeNote = (body.note ? `${body.note} — ${where}` : where).slice(0, 500);
      const notes = [
        body.designKind ? `Design: ${body.designKind}` : null,
        body.seed != null ? `seed ${body.seed}` : null,
        run.standardOrder != null ? `standard order ${run.standardOrder}` : null,
        `run order ${run.runOrder}`,
      ].filter(Boolean).join(', ');
      out.push(
        createBuild(ctx, access, {
          status: 'planned',
          factors,
          parentId: body.parentId ?? null,
          labId,
          changeNote,
          notes,
          loadingMgCm2: body.loadingMgCm2 ?? null,
          areaCm2: body.areaCm2 ?? null,
          testConditions: {},
        }),
      );
    }
    audit(ctx.db, { userId: access.user.id, action: 'plan', entity: 'design', projectId: access.projectId, after: { designKind: body.designKind ?? null, seed: body.seed ?? null, buildIds: out.map((b) => b.id), codes: out.map((b) => b.code) } });
    return out;
  });
  return { builds: created };
}

// ---------------------------------------------------------------------------------------------
// Surface


function responseInfo(defs: ResponseDef[], key: string, path = 'response'): ResponseInfo {
  if (METRIC_KEYS.includes(key)) {
    const info = CURVE_METRIC_INFO[key];
    return { key, label: key, unit: info?.unit ?? '', source: 'curve', goal: info?.goal ?? 'maximize', target: null };
  }
  const def = defs.find((d) => d.key === key);
  if (!def) {
    const known = [...METRIC_KEYS, ...defs.map((d) => d.key)].join(', ');
    throw invalid(400, 'validation', `Invalid body: ${path}: "${key}" is neither a curve metric nor a hand-entered response of this project (one of ${known})`, [{ path, message: 'unknown response' }]);
  }
  return { key, label: def.label, unit: def.unit, source: 'hand-entered', goal: def.goal, target: def.target ?? null };
}

interface FitContext {
  response: ResponseInfo;
  defs: FactorDef[];
  chosen: FactorDef[];
  fit: SurfaceFit;
  used: Build[];
  all: Build[];
  skipped: { buildId: number; code: string; reason: string }[];
  omitted: { key: string; reason: string }[];
}

function fitContext(ctx: AppContext, access: ProjectAccess, body: SurfaceRequest): FitContext {
  const defs = listFactors(ctx, access.projectId);
  const response = responseInfo(listResponses(ctx, access.projectId), body.response);
  const all = listBuilds(ctx, access);
  const omitted: { key: string; reason: string }[] = [];
  const keys = body.factors ?? defaultFactorKeys(defs, all, response.key, omitted);
  const issues: FieldIssue[] = [];
  const chosen: FactorDef[] = [];
  keys.forEach((key, index) => {
    const def = defs.find((f) => f.key === key);
    if (!def) issues.push({ path: `factors.${index}`, message: `no factor "${key}" in this project` });
    else if (chosen.includes(def)) issues.push({ path: `factors.${index}`, message: `factor "${key}" is listed twice` });
    else chosen.push(def);
  });
  if (issues.length) throw invalid(400, 'validation', `Invalid body: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`, issues);
  if (chosen.length === 0) {
    const why = omitted.length ? ` (${omitted.map((o) => o.reason).join('; ')})` : '';
    throw invalid(422, 'too-few-runs', `No factor can be fitted yet${why}.`, [{ path: 'factors', message: 'choose at least one factor' }]);
  }
  const exclude = new Set(body.exclude ?? []);
  const used: Build[] = [];
  const skipped: FitContext['skipped'] = [];
  for (const build of all) {
    if (build.status !== 'tested' && build.status !== 'reviewed') continue;
    if (exclude.has(build.id)) { skipped.push({ buildId: build.id, code: build.code, reason: 'left out by you' }); continue; }
    const y = build.values[response.key];
    if (y == null || !Number.isFinite(y)) { skipped.push({ buildId: build.id, code: build.code, reason: `no ${response.key} value` }); continue; }
    const missing = chosen.filter((f) => build.factors[f.key] === undefined || build.factors[f.key] === '');
    if (missing.length) { skipped.push({ buildId: build.id, code: build.code, reason: `no value for ${missing.map((f) => f.label).join(', ')}` }); continue; }
    used.push(build);
  }
  if (used.length === 0) {
    throw new AppError(422, 'too-few-runs', `No tested or reviewed build has a ${response.key} value and all chosen factors, so there is nothing to fit yet.`, { skipped });
  }
  const factors: Factor[] = chosen.map((f) =>
    f.kind === 'continuous'
      ? { key: f.key, label: f.label, unit: f.unit, kind: 'continuous', low: f.low ?? undefined, high: f.high ?? undefined }
      : { key: f.key, label: f.label, unit: f.unit, kind: 'categorical', levels: f.levels ?? [] },
  );
  const rows: Observation[] = used.map((b) => ({
    factors: Object.fromEntries(chosen.map((f) => [f.key, b.factors[f.key]!])),
    y: b.values[response.key] as number,
    buildId: b.id,
  }));
  const fit = guard(() => fitSurface({ factors, rows, model: body.model, responseKey: response.key }));
  return { response, defs, chosen, fit, used, all, skipped, omitted };
}

/**
 * Factors fitted when the caller names none: those every candidate build has a value for and
 * that vary among them (a factor added after the builds were made, or held constant, cannot be
 * estimated). The others are reported, not silently dropped.
 */
function defaultFactorKeys(defs: FactorDef[], all: Build[], responseKey: string, omitted: { key: string; reason: string }[]): string[] {
  const candidates = all.filter((b) => (b.status === 'tested' || b.status === 'reviewed') && b.values[responseKey] != null && Number.isFinite(b.values[responseKey]));
  const keys: string[] = [];
  for (const f of defs) {
    const values = candidates.map((b) => b.factors[f.key]).filter((v) => v !== undefined && v !== '');
    if (candidates.length > 0 && values.length < candidates.length) {
      omitted.push({ key: f.key, reason: `${candidates.length - values.length} of ${candidates.length} builds have no ${f.label} value` });
      continue;
    }
    if (candidates.length > 0 && new Set(values.map(String)).size < 2) {
      omitted.push({ key: f.key, reason: `${f.label} is the same in every build` });
      continue;
    }
    keys.push(f.key);
  }
  return keys;
}

function observedMaxima(defs: FactorDef[], all: Build[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const f of defs) {
    if (f.kind !== 'continuous') continue;
    for (const b of all) {
      if (b.status === 'planned' || b.status === 'discarded') continue;
      const v = b.factors[f.key];
      if (typeof v === 'number' && (out[f.key] === undefined || v > out[f.key]!)) out[f.key] = v;
    }
  }
  return out;
}

function gasesOf(used: Build[]): string[] {
  const set = new Set<string>();
  for (const b of used) {
    const c = b.testConditions ?? {};
    if (c.anodeGas || c.cathodeGas) set.add(`${c.anodeGas ?? '?'}/${c.cathodeGas ?? '?'}`);
  }
  return [...set];
}

/** Fits the chosen response over the chosen factors on the project's tested and reviewed builds. */
export function fitProjectSurface(ctx: AppContext, access: ProjectAccess, body: SurfaceRequest): SurfaceResult {
  const { response, defs, chosen, fit, used, all, skipped, omitted } = fitContext(ctx, access, body);
  let canonical: SurfaceResult['canonical'] = null;
  if (fit.terms.some((t) => t.includes('^2'))) {
    try {
      canonical = canonicalAnalysis(fit);
    } catch {
      canonical = null; // not a full quadratic in the continuous factors: nothing to report
    }
  }
  const runs: SurfaceRun[] = used.map((b, i) => ({
    buildId: b.id,
    code: b.code,
    labName: b.labName,
    factors: b.factors,
    observed: b.values[response.key] as number,
    predicted: fit.predicted[i]!,
    residual: fit.residuals[i]!,
    leverage: fit.leverage[i]!,
  }));
  return { response, factors: chosen, fit, runs, skipped, omittedFactors: omitted, canonical, observedMax: observedMaxima(defs, all), gases: gasesOf(used) };
}

// ---------------------------------------------------------------------------------------------
// Proposals

function codedDistance(chosen: FactorDef[], a: Record<string, number | string>, b: Record<string, number | string>): number {
  let sum = 0;
  for (const f of chosen) {
    if (f.kind === 'continuous') {
      const half = ((f.high ?? 1) - (f.low ?? 0)) / 2 || 1;
      const d = ((a[f.key] as number) - (b[f.key] as number)) / half;
      sum += d * d;
    } else if (a[f.key] !== b[f.key]) sum += 1;
  }
  return Math.sqrt(sum);
}

const FUEL = /\b(h2|hydrogen|methanol|meoh|ethanol|dme|dimethyl|fuel|reformate|co)\b/i;

function cautionsFor(proposal: Record<string, number | string>, defs: FactorDef[], observedMax: Record<string, number>, gases: string[]): string[] {
  const out: string[] = [];
  for (const f of defs) {
    const value = proposal[f.key];
    if (f.kind === 'continuous' && typeof value === 'number') {
      const isTemperature = /temp/i.test(f.key) || f.unit === '°C';
      const isPressure = /press/i.test(f.key) || /^(k?pa|bar|psi|mpa)/i.test(f.unit);
      const max = observedMax[f.key];
      if (isTemperature && max !== undefined && value > max + 1e-9) out.push(`${f.label} ${Number(value.toPrecision(4))} ${f.unit} is above the highest tested (${max} ${f.unit})`);
      if (isPressure) out.push(`${f.label} is set to ${Number(value.toPrecision(4))} ${f.unit}: pressurised gas lines`);
    } else if (typeof value === 'string' && FUEL.test(value) && /gas|fuel|anode/i.test(f.key)) {
      out.push(`${f.label} uses ${value}, a flammable fuel`);
    }
  }
  const fuels = gases.filter((g) => FUEL.test(g.split('/')[0] ?? ''));
  if (fuels.length) out.push(`tested on ${fuels.join(', ')}: flammable fuel on the anode`);
  return out;
}

/** Proposes the next builds from a fresh fit of the chosen response. */
export function proposeProjectBuilds(ctx: AppContext, access: ProjectAccess, body: ProposalsRequest): ProposalsResult {
  const { response, defs, chosen, fit, used, all } = fitContext(ctx, access, body);
  let goal: ProposalGoal;
  if (body.goal !== undefined) goal = body.goal;
  else if (response.goal === 'target') {
    if (response.target == null) throw invalid(400, 'validation', `Invalid body: goal: response "${response.key}" aims at a target but none is set; send goal: {target: number}`, [{ path: 'goal', message: 'a target value is needed' }]);
    goal = { target: response.target };
  } else goal = response.goal;
  const strategy = body.strategy ?? 'balance';
  const factors: Factor[] = defs.map((f) =>
    f.kind === 'continuous'
      ? { key: f.key, kind: 'continuous', low: f.low ?? undefined, high: f.high ?? undefined }
      : { key: f.key, kind: 'categorical', levels: f.levels ?? [] },
  );
  const proposals = guard(() => proposeBuilds({ fit, factors, goal, count: body.count, strategy, constraints: body.constraints ?? {}, seed: body.seed ?? 1 }));
  const observedMax = observedMaxima(defs, all);
  const gases = gasesOf(used);
  const items: ProposalItem[] = proposals.map((p) => {
    const point = Object.fromEntries(chosen.map((f) => [f.key, p.factors[f.key]!]));
    const check = guard(() => checkExtrapolation(fit, point));
    let nearest: ProposalItem['nearest'] = null;
    for (const b of used) {
      const distance = codedDistance(chosen, point, b.factors);
      if (!nearest || distance < nearest.distance) nearest = { buildId: b.id, code: b.code, distance };
    }
    return { ...p, extrapolationReasons: check.reasons, nearest, cautions: cautionsFor(p.factors, defs, observedMax, gases) };
  });
  return { proposals: items, response, goal, strategy, fit: { n: fit.n, r2: fit.r2, rmse: fit.rmse, predR2: fit.predR2, warnings: fit.warnings } };
}

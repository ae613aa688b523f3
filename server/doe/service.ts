// Designed experiments for a project: generate a design over its factors, turn design runs into
// planned builds (all or nothing), fit a response surface on the tested builds, and propose the
// next builds. The statistics live in shared/doe; this file finds the data, checks the rules
// and turns input errors from the shared code into 4xx answers.
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import { findResponse, knownResponseKeys } from '../../shared/curves/metric-catalogue';
import type { AppContext } from '../context';
import { builds, designs, labs, users } from '../db/schema';
import { audit } from '../lib/audit';
import { AppError } from '../lib/errors';
import type { ProjectAccess } from '../auth/access';
import { createBuild, listBuilds } from '../builds/service';
import { listFactors, listResponses } from '../projects/service';
import { roundSignificant, SETTING_DIGITS } from '../../shared/units/significant';
import { isFlammableFuel } from '../../shared/builds/flammable-fuel';
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
  TrustRegion,
  StoredDesign,
  PlanProposalBody,
  PlanProposalResult,
} from '../../shared/api-types';
import {
  boundPrediction,
  canonicalAnalysis,
  checkModelSupport,
  checkSupport,
  chooseModel,
  DesignInputError,
  DoeInputError,
  fitSurface,
  generateDesign,
  limitsAt,
  modelQuality,
  predict,
  proposeBuilds,
  roundForText,
  surfaceEffects,
  type DesignFactor,
  type Factor,
  type LimitContext,
  type ModelSpec,
  type ModelSupport,
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
      // the shared code names its function first ("fitSurface: …"); people read the rest
      const message = error.message.replace(/^[a-zA-Z]+: /, '');
      throw new AppError(422, error.code, message.charAt(0).toUpperCase() + message.slice(1), error.details);
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
  return roundSignificant(value, SETTING_DIGITS);
}

function checkValue(def: FactorDef, value: number | string, path: string, where: string, issues: FieldIssue[]): number | string | undefined {
  if (def.kind === 'continuous') {
    if (typeof value !== 'number' || !Number.isFinite(value)) { issues.push({ path, message: `${where}${def.label} must be a number` }); return undefined; }
    const rounded = roundSetting(value);
    if (def.low != null && def.high != null && (rounded < def.low || rounded > def.high)) {
      issues.push({ path, message: `${where}${def.label} = ${rounded}${def.unit ? ` ${def.unit}` : ''} is outside the factor's range ${def.low}–${def.high}; use an inscribed or face-centred design, a smaller alpha, or widen the range in settings` });
      return undefined;
    }
    return rounded;
  }
  if (typeof value !== 'string' || !(def.levels ?? []).includes(value)) { issues.push({ path, message: `${where}${def.label} must be one of ${(def.levels ?? []).join(', ')}` }); return undefined; }
  return value;
}

/**
 * Turns design runs into planned builds in one transaction: every run is checked first, then all
 * are created or none. Each build carries every project factor — those the design does not vary
 * at the held values sent, or else at the parent build's values — links to a stored record of
 * its design, and records the day it was planned.
 */
export function planDesignRuns(ctx: AppContext, access: ProjectAccess, body: PlanRunsBody): { builds: Build[]; designId: number } {
  const defs = listFactors(ctx, access.projectId);
  const issues: FieldIssue[] = [];
  const runs = [...body.runs].sort((a, b) => a.runOrder - b.runOrder);
  let parentFactors: Record<string, number | string> = {};
  if (body.parentId != null) {
    const parent = ctx.db.select({ id: builds.id, factors: builds.factorValues }).from(builds).where(and(eq(builds.id, body.parentId), eq(builds.projectId, access.projectId))).get();
    if (!parent) issues.push({ path: 'parentId', message: `build ${body.parentId} is not in this project` });
    else parentFactors = parent.factors;
  }
  const designed = new Set<string>();
  for (const run of body.runs) for (const key of Object.keys(run.actual)) designed.add(key);
  const held: Record<string, number | string> = {};
  for (const [key, value] of Object.entries(body.held ?? {})) {
    const def = defs.find((f) => f.key === key);
    if (!def) { issues.push({ path: `held.${key}`, message: `no factor "${key}" in this project` }); continue; }
    if (designed.has(key)) continue;
    const checked = checkValue(def, value, `held.${key}`, 'held value: ', issues);
    if (checked !== undefined) held[key] = checked;
  }
  for (const def of defs) {
    if (designed.has(def.key) || held[def.key] !== undefined) continue;
    const fromParent = parentFactors[def.key];
    if (fromParent !== undefined && fromParent !== '') held[def.key] = fromParent;
    else issues.push({ path: `held.${def.key}`, message: `${def.label} is not in the design: give the value every build should hold it at` });
  }
  const prepared: { run: PlanRun; factors: Record<string, number | string> }[] = [];
  body.runs.forEach((run, index) => {
    const factors: Record<string, number | string> = { ...held };
    for (const [key, value] of Object.entries(run.actual)) {
      const def = defs.find((f) => f.key === key);
      const path = `runs.${index}.actual.${key}`;
      if (!def) { issues.push({ path, message: `no factor "${key}" in this project` }); continue; }
      const checked = checkValue(def, value, path, `run ${run.runOrder}${run.pointType ? ` (${run.pointType})` : ''}: `, issues);
      if (checked !== undefined) factors[key] = checked;
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
  if (issues.length) {
    throw invalid(422, 'plan-invalid', `No builds were planned: ${issues.slice(0, 5).map((i) => `${i.path}: ${i.message}`).join('; ')}${issues.length > 5 ? `; and ${issues.length - 5} more` : ''}`, issues);
  }
  const total = runs.length;
  return ctx.db.transaction(() => {
    const settings: Record<string, unknown> = { ...(body.designSettings ?? {}), factors: [...designed], held };
    const settingsText = JSON.stringify(settings);
    const design = ctx.db
      .insert(designs)
      .values({ projectId: access.projectId, kind: body.designKind ?? 'design', seed: body.seed ?? null, settings: settingsText.length > 20000 ? { factors: [...designed], held } : settings, runCount: total, note: body.note ?? '', createdBy: access.user.id })
      .returning()
      .get();
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
        createBuild(
          ctx,
          access,
          {
            status: 'planned',
            factors,
            parentId: body.parentId ?? null,
            labId,
            changeNote,
            notes,
            loadingMgCm2: body.loadingMgCm2 ?? null,
            areaCm2: body.areaCm2 ?? null,
            testConditions: {},
          },
          { designId: design.id },
        ),
      );
    }
    audit(ctx.db, { userId: access.user.id, action: 'plan', entity: 'design', entityId: design.id, projectId: access.projectId, after: { designId: design.id, designKind: body.designKind ?? null, seed: body.seed ?? null, held, buildIds: out.map((b) => b.id), codes: out.map((b) => b.code) } });
    return { builds: out, designId: design.id };
  });
}

/** The designs planned in a project, newest first, each with its builds. */
export function listProjectDesigns(ctx: AppContext, access: ProjectAccess): StoredDesign[] {
  const rows = ctx.db
    .select({ d: designs, createdByName: users.name })
    .from(designs)
    .leftJoin(users, eq(users.id, designs.createdBy))
    .where(eq(designs.projectId, access.projectId))
    .orderBy(desc(designs.id))
    .all();
  if (rows.length === 0) return [];
  const members = ctx.db
    .select({ id: builds.id, code: builds.code, status: builds.status, designId: builds.designId })
    .from(builds)
    .where(and(eq(builds.projectId, access.projectId), inArray(builds.designId, rows.map((r) => r.d.id))))
    .orderBy(asc(builds.id))
    .all();
  return rows.map(({ d, createdByName }) => ({
    id: d.id,
    kind: d.kind,
    seed: d.seed,
    runCount: d.runCount,
    note: d.note,
    settings: d.settings,
    createdAt: d.createdAt,
    createdByName,
    builds: members.filter((m) => m.designId === d.id).map((m) => ({ id: m.id, code: m.code, status: m.status })),
  }));
}

// ---------------------------------------------------------------------------------------------
// Surface


function responseInfo(defs: ResponseDef[], key: string, path = 'response'): ResponseInfo {
  const found = findResponse(key, defs);
  if (found) return found;
  const known = knownResponseKeys(defs).join(', ');
  throw invalid(400, 'validation', `Invalid body: ${path}: "${key}" is neither a curve metric nor a hand-entered response of this project (one of ${known})`, [{ path, message: 'unknown response' }]);
}

const MODEL_NAMES: Record<string, string> = {
  linear: 'the main-effects model',
  interactions: 'the model with every two-factor interaction',
  quadratic: 'the full quadratic model',
  terms: 'your term list',
};

interface FitContext {
  response: ResponseInfo;
  defs: FactorDef[];
  chosen: FactorDef[];
  fit: SurfaceFit;
  used: Build[];
  all: Build[];
  skipped: { buildId: number; code: string; reason: string }[];
  omitted: { key: string; reason: string }[];
  model: SurfaceResult['model'];
  support: ModelSupport;
  limits: LimitContext;
}

/** The cell-temperature factor, when the project has one: a °C factor named for the cell. */
function cellTemperatureFactor(defs: FactorDef[]): FactorDef | undefined {
  return defs.find((f) => f.kind === 'continuous' && f.unit === '°C' && /cell/i.test(`${f.key} ${f.label}`));
}

/** The physical limits of a response in this project: cell temperature factor, lowest test temperature, highest OCV measured. */
function limitContext(defs: FactorDef[], all: Build[], used: Build[], responseKey: string): LimitContext {
  let lowestTest: number | null = null;
  for (const b of used) {
    const t = b.testConditions?.temperatureC;
    if (typeof t === 'number' && (lowestTest === null || t < lowestTest)) lowestTest = t;
  }
  let highestOcv: number | null = null;
  for (const b of all) {
    if (b.status !== 'tested' && b.status !== 'reviewed') continue;
    const v = b.values.ocv;
    if (typeof v === 'number' && Number.isFinite(v) && (highestOcv === null || v > highestOcv)) highestOcv = v;
  }
  return { response: responseKey, cellTemperatureFactor: cellTemperatureFactor(defs)?.key ?? null, testTemperatureC: lowestTest, highestOcvV: highestOcv };
}

function fitContext(ctx: AppContext, access: ProjectAccess, body: SurfaceRequest): FitContext {
  const defs = listFactors(ctx, access.projectId);
  const response = responseInfo(listResponses(ctx, access.projectId), body.response);
  const all = listBuilds(ctx, access);
  const omitted: { key: string; reason: string }[] = [];
  const keys = body.factors ?? defaultFactorKeys(defs, all, response, omitted);
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
    if (y == null || !Number.isFinite(y)) { skipped.push({ buildId: build.id, code: build.code, reason: `no ${response.label} value` }); continue; }
    const missing = chosen.filter((f) => build.factors[f.key] === undefined || build.factors[f.key] === '');
    if (missing.length) { skipped.push({ buildId: build.id, code: build.code, reason: `no value for ${missing.map((f) => f.label).join(', ')}` }); continue; }
    used.push(build);
  }
  if (used.length === 0) {
    throw new AppError(422, 'too-few-runs', `No tested or reviewed build has a ${response.label} value and all chosen factors, so there is nothing to fit yet.`, { skipped });
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
    label: b.code,
  }));
  let model: FitContext['model'];
  let spec: ModelSpec;
  if (body.model === 'auto') {
    const choice = guard(() => chooseModel({ factors, rows }));
    spec = { terms: choice.chosen.terms };
    model = { requested: 'auto', terms: choice.chosen.terms, termLabels: choice.chosen.termLabels, choice };
  } else {
    spec = body.model;
    model = { requested: typeof body.model === 'string' ? body.model : 'terms', terms: [], termLabels: [], choice: null };
  }
  const requestedName = MODEL_NAMES[model.requested] ?? 'this model';
  const support = guard(() => checkModelSupport(factors, rows, spec, model.requested === 'auto' ? 'the chosen model' : requestedName));
  if (!support.supported) {
    // refused before fitting: the runs cannot tell this model's terms apart
    throw new AppError(422, support.code ?? 'too-few-runs', support.reason, { support });
  }
  const fit = guard(() => fitSurface({ factors, rows, model: spec, responseKey: response.key }));
  if (model.requested !== 'auto') {
    model.terms = fit.terms.slice(1);
    model.termLabels = fit.anova.terms.map((t) => t.label);
  }
  return { response, defs, chosen, fit, used, all, skipped, omitted, model, support, limits: limitContext(defs, all, used, response.key) };
}

/**
 * Factors fitted when the caller names none: those every candidate build has a value for and
 * that vary among them (a factor added after the builds were made, or held constant, cannot be
 * estimated). The others are reported, not silently dropped.
 */
function defaultFactorKeys(defs: FactorDef[], all: Build[], response: ResponseInfo, omitted: { key: string; reason: string }[]): string[] {
  const candidates = all.filter((b) => (b.status === 'tested' || b.status === 'reviewed') && b.values[response.key] != null && Number.isFinite(b.values[response.key]));
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

function trustRegionOf(fit: SurfaceFit): TrustRegion {
  const ranges: TrustRegion['ranges'] = [];
  const levels: TrustRegion['levels'] = [];
  for (const f of fit.basis.factors) {
    if (f.kind === 'continuous') ranges.push({ key: f.key, label: f.label ?? f.key, unit: f.unit ?? '', low: f.dataMin ?? (f.low as number), high: f.dataMax ?? (f.high as number) });
    else levels.push({ key: f.key, label: f.label ?? f.key, levels: f.levelsRun ?? f.levels ?? [] });
  }
  return { leverageLimit: fit.basis.maxLeverage, ranges, levels };
}

/** Fits the chosen response over the chosen factors on the project's tested and reviewed builds. */
export function fitProjectSurface(ctx: AppContext, access: ProjectAccess, body: SurfaceRequest): SurfaceResult {
  const { response, defs, chosen, fit, used, all, skipped, omitted, model, support, limits } = fitContext(ctx, access, body);
  let canonical: SurfaceResult['canonical'] = null;
  if (fit.terms.some((t) => t.includes('^2'))) {
    try {
      canonical = canonicalAnalysis(fit);
    } catch {
      canonical = null; // not a full quadratic in the continuous factors: nothing to report
    }
  }
  const runs: SurfaceRun[] = used.map((b, i) => {
    const oneMinusH = 1 - fit.leverage[i]!;
    return {
      buildId: b.id,
      code: b.code,
      labName: b.labName,
      factors: b.factors,
      observed: b.values[response.key] as number,
      predicted: fit.predicted[i]!,
      residual: fit.residuals[i]!,
      leverage: fit.leverage[i]!,
      looResidual: oneMinusH > 1e-10 ? fit.residuals[i]! / oneMinusH : null,
    };
  });
  return {
    response,
    factors: chosen,
    fit,
    runs,
    skipped,
    omittedFactors: omitted,
    canonical,
    observedMax: observedMaxima(defs, all),
    gases: gasesOf(used),
    model,
    support,
    quality: modelQuality(fit),
    effects: surfaceEffects(fit),
    limits,
    trustRegion: trustRegionOf(fit),
  };
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
    } else if (typeof value === 'string' && isFlammableFuel(value) && /gas|fuel|anode/i.test(f.key)) {
      out.push(`${f.label} uses ${value}, a flammable fuel`);
    }
  }
  const fuels = gases.filter((g) => isFlammableFuel(g.split('/')[0]));
  if (fuels.length) out.push(`tested on ${fuels.join(', ')}: flammable fuel on the anode`);
  return out;
}

function goalOf(response: ResponseInfo, requested: ProposalGoal | undefined): ProposalGoal {
  if (requested !== undefined) return requested;
  if (response.goal === 'target') {
    if (response.target == null) throw invalid(400, 'validation', `Invalid body: goal: response "${response.label}" aims at a target but none is set; send goal: {target: number}`, [{ path: 'goal', message: 'a target value is needed' }]);
    return { target: response.target };
  }
  return response.goal;
}

/** Values for factors the fit does not use: those of the best build so far (by the goal). */
function heldValues(used: Build[], responseKey: string, goal: ProposalGoal): Record<string, number | string> {
  let best: Build | undefined;
  let bestScore = -Infinity;
  for (const b of used) {
    const y = b.values[responseKey] as number;
    const score = goal === 'maximize' ? y : goal === 'minimize' ? -y : -Math.abs(y - goal.target);
    if (score > bestScore) { bestScore = score; best = b; }
  }
  return best ? { ...best.factors } : {};
}

function projectFactorsForSearch(defs: FactorDef[]): Factor[] {
  return defs.map((f) =>
    f.kind === 'continuous'
      ? { key: f.key, label: f.label, unit: f.unit, kind: 'continuous', low: f.low ?? undefined, high: f.high ?? undefined }
      : { key: f.key, label: f.label, unit: f.unit, kind: 'categorical', levels: f.levels ?? [] },
  );
}

/** Proposes the next builds from a fresh fit of the chosen response. */
export function proposeProjectBuilds(ctx: AppContext, access: ProjectAccess, body: ProposalsRequest): ProposalsResult {
  const { response, defs, chosen, fit, used, all, model, limits } = fitContext(ctx, access, body);
  const goal = goalOf(response, body.goal);
  const strategy = body.strategy ?? 'balance';
  const chosenKeys = new Set(chosen.map((f) => f.key));
  const hold = Object.fromEntries(Object.entries(heldValues(used, response.key, goal)).filter(([key]) => !chosenKeys.has(key)));
  const format = (value: number) => `${roundForText(value, 4)}${response.unit ? ` ${response.unit}` : ''}`;
  const proposals = guard(() =>
    proposeBuilds({
      fit,
      factors: projectFactorsForSearch(defs),
      goal,
      count: body.count,
      strategy,
      constraints: body.constraints ?? {},
      seed: body.seed ?? 1,
      exploratory: body.exploratory ?? 0,
      hold,
      limits,
      responseLabel: response.label,
      format,
    }),
  );
  const observedMax = observedMaxima(defs, all);
  const gases = gasesOf(used);
  const items: ProposalItem[] = proposals.map((p) => {
    const point = Object.fromEntries(chosen.map((f) => [f.key, p.factors[f.key]!]));
    let nearest: ProposalItem['nearest'] = null;
    for (const b of used) {
      const distance = codedDistance(chosen, point, b.factors);
      if (!nearest || distance < nearest.distance) nearest = { buildId: b.id, code: b.code, distance };
    }
    return { ...p, extrapolationReasons: p.support.reasons, nearest, cautions: cautionsFor(p.factors, defs, observedMax, gases) };
  });
  const quality = modelQuality(fit);
  return {
    proposals: items,
    response,
    goal,
    strategy,
    fit: { n: fit.n, r2: fit.r2, rmse: fit.rmse, predR2: fit.predR2, warnings: fit.warnings },
    model: { terms: model.terms, termLabels: model.termLabels, looRmse: quality.looRmse },
  };
}

/**
 * Plans one proposal as a build. The server refits the same request and checks the recipe
 * itself: outside the builds' support or at a physical limit, it is planned only with a written
 * reason, stored on the build.
 */
export function planProposal(ctx: AppContext, access: ProjectAccess, body: PlanProposalBody): PlanProposalResult {
  const { response, chosen, fit, limits } = fitContext(ctx, access, body);
  const missing = chosen.filter((f) => body.recipe[f.key] === undefined);
  if (missing.length) {
    throw invalid(400, 'validation', `Invalid body: recipe: no value for ${missing.map((f) => f.label).join(', ')}`, missing.map((f) => ({ path: `recipe.${f.key}`, message: 'a value is needed' })));
  }
  const point = Object.fromEntries(chosen.map((f) => [f.key, body.recipe[f.key]!]));
  const support = guard(() => checkSupport(fit, point));
  const prediction = guard(() => predict(fit, point));
  const format = (value: number) => `${roundForText(value, 4)}${response.unit ? ` ${response.unit}` : ''}`;
  const limit = boundPrediction(limitsAt(limits, body.recipe), prediction.value, prediction.piLow, prediction.piHigh, format);
  const flags: string[] = [];
  if (!support.inside) flags.push(`Outside the builds' support. ${support.reasons.join(' ')}`);
  if (limit.hitsLimit && limit.note) flags.push(limit.note);
  const reason = body.reason?.trim() ?? '';
  if (flags.length > 0 && reason.length < 10) {
    throw new AppError(422, 'reason-required', `This recipe is flagged — ${flags.join(' ')} Say in a sentence (reason, at least 10 characters) why it should be built anyway.`, { fields: [{ path: 'reason', message: 'a reason of at least 10 characters is needed for a flagged proposal' }], flags });
  }
  const kind = flags.length > 0 ? 'flagged proposal' : 'proposal';
  const build = createBuild(ctx, access, {
    status: 'planned',
    factors: body.recipe,
    parentId: body.parentId ?? null,
    changeNote: (body.changeNote ?? `${kind} from the surface (${response.label})`).slice(0, 500),
    planReason: reason || null,
    testConditions: {},
  });
  return { build, flagged: flags.length > 0, flags, support, limit };
}

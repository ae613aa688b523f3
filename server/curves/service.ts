// Curves: from an uploaded file to stored points and metrics at the project's reference point.
import fs from 'node:fs';
import path from 'node:path';
import { and, asc, desc, eq, inArray, isNull, or } from 'drizzle-orm';
import type { AppContext } from '../context';
import { builds, curves, files, importProfiles, projects } from '../db/schema';
import { applyMapping, checkEnoughData, checkHoursAfterBreakIn, compareConditions, detectMapping, importNotes, polarizationMetrics } from '../../shared/curves';
import type { ConditionField, ConditionMismatch } from '../../shared/curves';
import { STANDARD_ATMOSPHERE_KPA } from '../../shared/curves';
import { recogniseHeaderUnit } from '../../shared/units/recognise-header-unit';
import { currentSlip, hfrSlip, voltageSlip } from '../../shared/curves/unit-plausibility';
import type { ParsedTable } from '../../shared/curves';
import { durabilityMetrics, downsampleForPlot, upperBound } from '../../shared/durability';
import { median } from '../../shared/stats/median';
import { CurveFileError } from '../../shared/curves/types';
import type { ColumnMapping, CurrentUnit, CurveData, CurveKind, CurveMetrics, HfrUnit, ImpedanceMapping, MetricsResult, ReferencePoint, VoltageUnit } from '../../shared/curves/types';
import { packPoints } from './points-codec';
import { readPoints, replacePoints, writePointPieces } from './point-store';
import { metricEntry, metricsOfKind, nullMetrics } from '../../shared/curves/metric-catalogue';
import { mapAndMeasureInPool, parseUpload } from '../uploads/parse-runner';
import type { ReadResult } from './read-upload';
import { audit } from '../lib/audit';
import { AppError, forbidden, notFound } from '../lib/errors';
import { actorOf, requireProfileLab, type ProjectAccess } from '../auth/access';
import { labForNewProfile } from '../../shared/auth/permissions';
import type { CurvePatch, ImportProfileCreate } from '../../shared/schemas/curves';
import type { ProgressReporter } from '../uploads/progress';
import type { UploadFields } from '../../shared/api-types';
import { notifyAfterUpload } from '../review/notify';
import { nextStatus } from '../../shared/builds/status';
import { deleteCurveKeepingRecord, recordOf } from './record';
import { holdMetricValues, holdRuleOf, impedanceResult, onsetMetric, onsetRuleOf, type OnsetOutcome } from './kind-metrics';
import type { OnsetRule } from '../../shared/durability';
import type { HoldRule } from '../../shared/hold';
import type { CircuitKind } from '../../shared/impedance';
import { detectImpedanceColumns, spectrumFromTable } from '../../shared/impedance';
import type { ProjectSettings } from '../../shared/schemas/project';

/** Give the event loop a turn between the long synchronous steps of a big upload. */
// a timer turn, not setImmediate: an immediate resumes in the same loop iteration, before timers
// and new I/O get their turn
const yieldToEventLoop = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

type BuildRow = typeof builds.$inferSelect;
type CurveRow = typeof curves.$inferSelect;

/** The upload form's fields (the router takes uploadId for progress) plus what the server adds. */
export interface UploadOptions extends Omit<UploadFields, 'uploadId'> {
  /** only detect and preview; store nothing */
  previewOnly?: boolean;
  /** where to report parsing / measuring / storing progress (large uploads) */
  progress?: ProgressReporter;
}

export interface DurabilityOptions {
  breakInHours?: number;
  windows?: { fromHours: number; toHours: number }[];
  lossFraction?: number;
  /** the onset rule of this curve, over the project's (durability logs) */
  onsetRule?: Partial<OnsetRule>;
  /** the settling rule of this curve, over the project's (holds) */
  holdRule?: Partial<HoldRule>;
  /** impedance: which equivalent circuit to fit (default charge-transfer) */
  circuit?: CircuitKind;
}

/** Error raised when the columns need a person to confirm them: 422 with a preview. */
export function mappingNeeded(table: ParsedTable, detection: ReturnType<typeof detectMapping>, extra: Record<string, unknown>) {
  const fileName = typeof extra.fileName === 'string' ? `${extra.fileName}: ` : '';
  return new AppError(
    422,
    'mapping-needed',
    `${fileName}please confirm the columns: ${detection.reasons.join('; ') || 'the columns could not be recognised'}.`,
    { preview: { ...previewOf(table), buildAreaCm2: extra.buildAreaCm2 ?? null }, detected: detection.mapping, kind: detection.kind, reasons: detection.reasons, ...extra },
  );
}

function previewOf(table: ParsedTable) {
  return {
    header: table.header,
    rows: table.preview,
    rowCount: table.rowCount,
    headerLine: table.headerLine,
    delimiter: table.delimiter,
    decimalComma: table.decimalComma,
    conditions: table.conditions,
  };
}

export function referencePoint(project: typeof projects.$inferSelect): ReferencePoint {
  return project.settings;
}

/**
 * Bumped whenever the way metrics are read off a curve changes (step grouping, sweeps, windows, intervals):
 * curves measured by an older rule are measured again at start-up, so no stored number predates
 * the rules the README states.
 */
export const METRICS_ALGORITHM = 4;

/**
 * `fitted`: the log's durability fit when it was already made (an upload's runs in the worker pool,
 * so a million-row log does not hold the event loop); otherwise it is made here.
 */
/** A log's fit made in the worker pool, with its onset search when it was made there too. */
type Fitted = ReturnType<typeof durabilityMetrics> & { onset?: OnsetOutcome };

export function computeMetrics(curve: CurveData, ref: ReferencePoint, build: BuildRow, options?: DurabilityOptions | null, fitted?: Fitted): MetricsResult {
  const result = measure(curve, ref, build, options, fitted);
  result.summary.metricsAlgorithm = METRICS_ALGORITHM;
  return result;
}

function measure(curve: CurveData, ref: ReferencePoint, build: BuildRow, options?: DurabilityOptions | null, fitted?: Fitted): MetricsResult {
  if (curve.kind === 'polarization') {
    return polarizationMetrics(curve, ref, { loadingMgCm2: build.loadingMgCm2, metalLoadingMgCm2: build.metalLoadingMgCm2 }, { h2CrossoverAcm2: (build.testConditions?.h2CrossoverMAcm2 ?? 0) / 1000 });
  }
  if (curve.kind === 'impedance') return impedanceResult(curve, { circuit: options?.circuit });
  const settings = ref as ReferencePoint & Partial<Pick<ProjectSettings, 'onsetRule' | 'holdRule'>>;
  let d = fitted ?? durabilityMetrics(curve, options ?? {});
  const extra: { metrics: Partial<CurveMetrics>; notes: MetricsResult['metricNotes']; method: MetricsResult['method']; summary: MetricsResult['summary'] } = { metrics: {}, notes: {}, method: {}, summary: {} };
  if (curve.kind === 'durability') {
    // the search starts after break-in unless a rule says where
    const startGiven = settings.onsetRule?.startHours !== undefined || options?.onsetRule?.startHours !== undefined;
    const rule = onsetRuleOf(settings.onsetRule, options?.onsetRule);
    if (!startGiven && d.breakInHours != null) rule.startHours = d.breakInHours;
    const onset = fitted?.onset ?? onsetMetric(curve, rule);
    extra.metrics.onsetHours = onset.value;
    if (onset.note) extra.notes.onsetHours = onset.note;
    extra.method.onsetHours = onset.method;
    extra.summary = onset.summary;
    // after an onset of rapid failure the loss is no longer the steady rate: fit the rate up to it
    if (onset.value !== null && curve.tHours && !(options?.windows?.length)) {
      const cut = upperBound(curve.tHours, onset.value);
      const part = (column: Float64Array | undefined) => column?.subarray(0, cut);
      try {
        const before = durabilityMetrics({ ...curve, j: curve.j.subarray(0, cut), v: curve.v.subarray(0, cut), hfr: part(curve.hfr), tHours: part(curve.tHours), temperatureC: part(curve.temperatureC), vIrFree: part(curve.vIrFree) }, options ?? {});
        const upTo = `rate fitted up to the onset of rapid failure at ${Math.round(onset.value)} h`;
        // the log ran its whole length: hours run and interruptions stay those of the whole log
        d = { ...before, hoursRun: d.hoursRun, interruptions: d.interruptions, method: before.method ? `${before.method}; ${upTo}` : upTo, notes: [...(before.notes ?? []), upTo] };
        extra.summary.rateUpToOnset = true;
      } catch (error) {
        if (!(error instanceof RangeError)) throw error;
      }
    }
  } else {
    const hold = holdMetricValues(curve, holdRuleOf(settings.holdRule, options?.holdRule));
    Object.assign(extra, { metrics: hold.metrics, notes: hold.notes, method: hold.method, summary: hold.summary });
  }
  return {
    metrics: {
      ...nullMetrics(metricsOfKind('polarization')),
      degradationRate: d.degradationRate, breakInHours: d.breakInHours,
      ...extra.metrics,
    },
    metricNotes: { ...(d.degradationRate == null ? { degradationRate: d.notes.join(' ') || 'not enough data after break-in' } : {}), ...extra.notes },
    method: {
      ...extra.method,
      degradationRate: {
        method: d.method || 'straight-line fit of voltage vs time after break-in; restarts and gaps fitted as separate segments; 95 % interval from the slope standard error',
        inputs: { fromHours: d.fitWindow?.fromHours ?? null, toHours: d.fitWindow?.toHours ?? null, breakInRule: d.breakInRule ?? null, assumptions: d.intervalAssumptions, stillInBreakIn: d.stillInBreakIn },
      },
      breakInHours: { method: d.breakInRule ?? 'given by the user', inputs: { breakInHours: d.breakInHours ?? null } },
    },
    summary: { ...durabilitySummary(d), ...extra.summary, currentDensity: sampledMedian(curve.j), temperatureC: sampledMedian(curve.temperatureC) },
  };
}

/** Median of at most ~10,000 evenly spaced finite values: the held condition of a long log, cheaply. */
function sampledMedian(values: Float64Array | undefined): number | null {
  if (!values || values.length === 0) return null;
  const stride = Math.max(1, Math.floor(values.length / 10_000));
  const sample: number[] = [];
  for (let i = 0; i < values.length; i += stride) if (Number.isFinite(values[i])) sample.push(values[i]);
  return sample.length === 0 ? null : median(sample);
}

function durabilitySummary(d: ReturnType<typeof durabilityMetrics>): Record<string, number | string | boolean | null> {
  return {
    degradationLow: d.low ?? null,
    degradationHigh: d.high ?? null,
    hoursRun: d.hoursRun ?? null,
    voltageLossMv: d.voltageLossMv ?? null,
    hoursToLoss: d.hoursToLoss ?? null,
    projectedHoursToLoss: d.projectedHoursToLoss?.hours ?? null,
    lossFraction: d.lossFraction ?? null,
    confidence: d.confidence ?? null,
    breakInSource: d.breakInSource ?? null,
    breakInRule: d.breakInRule ?? null,
    fitFromHours: d.fitWindow?.fromHours ?? null,
    fitToHours: d.fitWindow?.toHours ?? null,
    interruptions: JSON.stringify(d.interruptions ?? []),
    windows: JSON.stringify(d.windows ?? []),
    segments: JSON.stringify((d.segments ?? []).map((g) => ({ fromHours: g.fromHours, toHours: g.toHours, startV: g.startV, endV: g.endV, rate: g.rate }))),
    method: d.method,
    notes: (d.notes ?? []).join(' '),
    stillInBreakIn: d.stillInBreakIn,
    linearityVerdict: d.linearity?.verdict ?? null,
    firstHalfRate: d.linearity?.firstHalfRate ?? null,
    secondHalfRate: d.linearity?.secondHalfRate ?? null,
  };
}

/** Why values cannot be in the given unit (a unit slip), or null when they can. */
function unitSlipOf(quantity: string, unit: string, values: Float64Array, areaCm2: number | null, kind: CurveKind): string | null {
  const slip = quantity === 'voltage' || quantity === 'voltageIrFree' ? voltageSlip(values, unit as VoltageUnit)
    : quantity === 'current' ? currentSlip(values, unit as CurrentUnit, areaCm2, kind)
    : quantity === 'hfr' ? hfrSlip(values, unit as HfrUnit, areaCm2)
    : null;
  return slip ? slip.message : null;
}

/** The columns a profile must map for each kind of curve: what the metrics cannot do without. */
export const PROFILE_REQUIRES: Record<CurveKind, readonly (keyof ColumnMapping)[]> = {
  polarization: ['current', 'voltage'],
  durability: ['time', 'voltage'],
  hold: ['time', 'voltage'],
  impedance: ['frequency', 'zReal', 'zImag'],
};
const QUANTITY_WORDS: Record<string, string> = { current: 'current', voltage: 'voltage', hfr: 'HFR', time: 'time', temperature: 'temperature', frequency: 'frequency', zReal: 'Z′', zImag: 'Z″', magnitude: '|Z|', phase: 'phase' };

function missingForKind(kind: CurveKind, mapping: Partial<Record<string, unknown>>): string[] {
  // a file's own iR-free voltage column stands in for the cell voltage; |Z| with phase for Z′ and Z″
  return PROFILE_REQUIRES[kind].filter((quantity) => !mapping[quantity] && !(quantity === 'voltage' && mapping.voltageIrFree) && !((quantity === 'zReal' || quantity === 'zImag') && mapping.magnitude && mapping.phase));
}

/** A 400 unless the profile maps every column its kind of curve needs. */
export function requireCompleteProfile(kind: CurveKind, mapping: Partial<Record<string, unknown>>): void {
  const missing = missingForKind(kind, mapping);
  if (missing.length > 0) {
    throw new AppError(400, 'validation', `An import profile for ${kind} curves must map ${PROFILE_REQUIRES[kind].map((q) => QUANTITY_WORDS[q]).join(' and ')}; this one has no ${missing.map((q) => QUANTITY_WORDS[q]).join(' or ')} column. Nothing was saved.`, {
      fields: missing.map((q) => ({ path: `mapping.${q}`, message: 'required' })),
    });
  }
}

/**
 * Profile mapping is stored by header text; turn it into column indices for this file. The
 * profile fits only when it is for this kind of curve, maps every column the kind needs, finds
 * each header, and no unit it names contradicts the unit (or quantity) the header itself states.
 */
function profileToMapping(profile: typeof importProfiles.$inferSelect, table: ParsedTable, kind: CurveKind, areaCm2: number | null): { mapping: ColumnMapping; problem: null } | { mapping: null; problem: string } {
  const unfit = (why: string) => ({ mapping: null, problem: `the import profile "${profile.name}" was not used: ${why}` });
  if (profile.kind !== kind) return unfit(`it is for ${profile.kind} curves, this is a ${kind} curve`);
  const missing = missingForKind(kind, profile.mapping);
  if (missing.length > 0) return unfit(`it maps no ${missing.map((q) => QUANTITY_WORDS[q]).join(' or ')} column, which a ${kind} curve needs`);
  const mapping: Record<string, { column: number; unit: string; negated?: boolean }> = {};
  for (const [quantity, spec] of Object.entries(profile.mapping)) {
    const column = table.header.findIndex((h: string) => h.trim().toLowerCase() === spec.header.trim().toLowerCase());
    if (column < 0) return unfit(`the file has no column "${spec.header}"`);
    if (table.columns[column] == null) return unfit(`column "${table.header[column]}" holds text, not numbers`);
    const stated = recogniseHeaderUnit(table.header[column]!);
    if (stated.unit != null && stated.quantity !== quantity) return unfit(`column "${table.header[column]}" is headed as ${QUANTITY_WORDS[stated.quantity] ?? stated.quantity} (${stated.unit}), the profile reads it as ${QUANTITY_WORDS[quantity] ?? quantity}`);
    // A profile may knowingly correct a mislabelled header (volts logged under "mV"), but only
    // where the values are plausible in the profile's unit: a wrong profile cannot rescale a file.
    if (stated.unit != null && stated.unit !== spec.unit) {
      const slip = unitSlipOf(quantity, spec.unit, table.columns[column]!, areaCm2, kind);
      if (slip) return unfit(`column "${table.header[column]}" states ${stated.unit}, the profile says ${spec.unit}, and ${slip}`);
    }
    mapping[quantity] = { column, unit: spec.unit, ...(spec.negated !== undefined && { negated: spec.negated }) };
  }
  return { mapping: mapping as unknown as ColumnMapping, problem: null };
}

function mappingToProfile(mapping: ColumnMapping, table: ParsedTable) {
  const out: Record<string, { header: string; unit: string; negated?: boolean }> = {};
  for (const [quantity, spec] of Object.entries(mapping) as [string, { column: number; unit: string; negated?: boolean } | undefined][]) {
    if (!spec) continue;
    const header = table.header[spec.column];
    if (header === undefined) throw new AppError(400, 'validation', `mapping.${quantity}.column: column ${spec.column} does not exist (the file has ${table.header.length} columns)`);
    out[quantity] = { header, unit: spec.unit, ...(spec.negated !== undefined && { negated: spec.negated }) };
  }
  return out;
}

export function checkMappingColumns(mapping: ColumnMapping, table: ParsedTable) {
  for (const [quantity, spec] of Object.entries(mapping)) {
    if (!spec) continue;
    if (!Number.isInteger(spec.column) || spec.column < 0 || spec.column >= table.header.length) {
      throw new AppError(400, 'validation', `mapping.${quantity}.column: column ${spec.column} does not exist (the file has ${table.header.length} columns)`, { fields: [{ path: `mapping.${quantity}.column`, message: 'no such column' }] });
    }
    if (table.columns[spec.column] == null) {
      throw new AppError(422, 'text-column', `Column "${table.header[spec.column]}" holds text, not numbers; it cannot be the ${quantity} column.`, { column: table.header[spec.column] });
    }
  }
}

/**
 * Read, map, convert and measure an uploaded file, then store file + curve in one transaction.
 * The temporary upload is always removed; the kept copy is named by its SHA-256, once per content.
 */
export async function ingestUpload(
  ctx: AppContext,
  access: ProjectAccess,
  build: BuildRow,
  upload: { tmpPath: string; originalName: string; size: number; tableRead?: Promise<ReadResult | null> | null },
  options: UploadOptions,
) {
  const { db, env } = ctx;
  // the raw file goes to the store while the log is measured (a rename, or an object upload)
  let storing: { sha256: string; put: Promise<{ existed: boolean }> } | null = null;
  let stored = false;
  try {
    let read;
    try {
      // a text table was read while it arrived; a workbook (or one whose worker was lost) is read from disk
      const received = await upload.tableRead;
      // read while it arrived: every byte is parsed by now
      if (received) options.progress?.parsed(upload.size);
      read = received ?? await parseUpload(env, upload.tmpPath, { sheet: options.sheet, maxRows: env.UPLOAD_MAX_ROWS, onBytes: options.progress && ((bytes) => options.progress!.parsed(bytes)) }, upload.originalName);
    } catch (error) {
      if (error instanceof CurveFileError && error.code === 'too-many-rows') {
        throw new AppError(422, 'too-many-rows', `${upload.originalName}: more than ${env.UPLOAD_MAX_ROWS.toLocaleString('en-US')} data rows, the row limit per file (UPLOAD_MAX_ROWS); nothing was stored. Split the log or ask an administrator to raise the limit.`, { file: upload.originalName, limit: 'UPLOAD_MAX_ROWS', maxRows: env.UPLOAD_MAX_ROWS, line: error.line ?? null });
      }
      throw asUnprocessable(error, upload.originalName);
    }
    const { table } = read;
    // the area the upload will use: given with it, else the file's, else the build's record
    const areaCm2 = options.areaCm2 ?? table.conditions.areaCm2 ?? build.areaCm2 ?? null;
    let kind: CurveKind;
    let mapping: ColumnMapping | null = null;
    let mappingSource = 'detected';
    /** why a profile was not used, when one was asked for or named the file's headers */
    let profileNote: string | null = null;
    let data: CurveData & { areaCm2: number | null };
    let notes: string[];
    let mismatches: ConditionMismatch[];
    let result: MetricsResult;
    const project = db.select().from(projects).where(eq(projects.id, access.projectId)).get()!;
    const impedanceColumns = options.kind === undefined || options.kind === 'impedance' ? detectImpedanceColumns(table) : null;
    // a confirmed mapping without a frequency column is not a spectrum, whatever the headers suggest
    if (options.kind === 'impedance' || (impedanceColumns?.mapping && !(options.mapping && !options.mapping.frequency))) {
      // an impedance spectrum: frequency, Z′ and Z″ (or |Z| and phase), measured by the circuit fit
      kind = 'impedance';
      const confirmed = options.mapping as ImpedanceMapping | undefined;
      if (confirmed) {
        checkMappingColumns(confirmed as ColumnMapping, table);
        if (!confirmed.frequency) throw new AppError(400, 'validation', 'mapping.frequency: an impedance spectrum needs its frequency column.', { fields: [{ path: 'mapping.frequency', message: 'required' }] });
        mappingSource = 'confirmed';
      }
      const impedanceMapping = confirmed ?? impedanceColumns?.mapping ?? null;
      if (options.previewOnly) {
        return { preview: { ...previewOf(table), detected: impedanceColumns?.mapping ?? null, applied: impedanceMapping, mappingSource, profileNote, ambiguous: false, reasons: impedanceColumns?.reasons ?? [], kind, sheets: read.sheets, sheet: read.sheet, buildAreaCm2: build.areaCm2 ?? null } };
      }
      if (!impedanceMapping) {
        throw new AppError(422, 'mapping-needed', `${upload.originalName}: please confirm the columns: ${(impedanceColumns?.reasons ?? ['the frequency, Z′ and Z″ columns could not be recognised']).join('; ')}.`, { preview: { ...previewOf(table), buildAreaCm2: build.areaCm2 ?? null }, detected: null, kind, reasons: impedanceColumns?.reasons ?? [], fileName: upload.originalName });
      }
      mapping = impedanceMapping as ColumnMapping;
      let spectrum;
      try {
        spectrum = spectrumFromTable(table, impedanceMapping, areaCm2);
      } catch (error) {
        throw asUnprocessable(error, upload.originalName);
      }
      const n = spectrum.frequencyHz.length;
      data = { kind, j: new Float64Array(n).fill(NaN), v: new Float64Array(n).fill(NaN), frequencyHz: spectrum.frequencyHz, zReal: spectrum.zReal, zImag: spectrum.zImag, areaCm2: spectrum.areaFactor === 1 || spectrum.areaFactor === 1e-3 ? null : areaCm2 };
      notes = [...importNotes(table, []), ...(impedanceColumns && !confirmed ? impedanceColumns.reasons : []), ...spectrum.notes];
      const compared = compareConditions(table.conditions, build);
      mismatches = compared.mismatches;
      notes.push(...compared.notes);
      table.columns.fill(null);
      try {
        result = computeMetrics(data, referencePoint(project), build);
      } catch (error) {
        if (error instanceof RangeError) throw new AppError(422, 'cannot-measure', `${upload.originalName}: ${error.message.replace(/^\w+: /, '')}; nothing was stored.`, { file: upload.originalName });
        throw error;
      }
      result.summary.signConvention = spectrum.convention;
      result.summary.areaFactor = spectrum.areaFactor;
    } else {
      const detection = detectMapping(table, options.kind, { areaCm2 });
      kind = options.kind ?? detection.kind;
      const askExtra = { fileName: upload.originalName, sheets: read.sheets, sheet: read.sheet, buildAreaCm2: build.areaCm2 ?? null };

      if (options.mapping) {
        checkMappingColumns(options.mapping, table);
        mapping = options.mapping;
        mappingSource = 'confirmed';
      } else if (options.profileId) {
        const profile = db.select().from(importProfiles).where(eq(importProfiles.id, options.profileId)).get();
        if (!profile || (profile.projectId != null && profile.projectId !== access.projectId)) throw notFound(`Import profile ${options.profileId}`);
        const fit = profileToMapping(profile, table, kind, table.conditions.areaCm2 ?? build.areaCm2 ?? null);
        if (fit.mapping) {
          mapping = fit.mapping;
          mappingSource = `profile ${profile.name}`;
        } else {
          profileNote = `${fit.problem}; the columns were detected instead`;
          if (detection.mapping && !detection.ambiguous) mapping = detection.mapping;
        }
      } else {
        const match = findMatchingProfile(ctx, access.projectId, build.labId, table, kind, table.conditions.areaCm2 ?? build.areaCm2 ?? null);
        profileNote = match.note;
        if (match.profile) {
          mapping = match.mapping;
          mappingSource = `profile ${match.profile.name}`;
        } else if (detection.mapping && !detection.ambiguous) {
          mapping = detection.mapping;
        }
      }

      if (options.previewOnly) {
        return { preview: { ...previewOf(table), detected: detection.mapping, applied: mapping, mappingSource, profileNote, ambiguous: detection.ambiguous, reasons: detection.reasons, kind, sheets: read.sheets, sheet: read.sheet, buildAreaCm2: build.areaCm2 ?? null } };
      }
      if (!mapping) throw mappingNeeded(table, detection, { ...askExtra, ...(profileNote && { profileMismatch: profileNote }) });

      options.progress?.phase('measuring', null);
      await yieldToEventLoop();
      let fitted: Fitted | undefined;
      if (kind === 'durability' || kind === 'hold') {
        // a log is mapped and measured in the worker pool (its columns are moved there and back):
        // none of the passes over its million rows holds the event loop
        storing = { sha256: read.sha256, put: ctx.storage.put(read.sha256, upload.tmpPath) };
        // a log's onset search runs there too, with the project's rule (an upload has no curve options yet)
        const onset = kind === 'durability' ? { rule: onsetRuleOf(project.settings.onsetRule, undefined), startGiven: project.settings.onsetRule?.startHours !== undefined } : undefined;
        try {
          const moved = await mapAndMeasureInPool(env, table, mapping, { kind, areaCm2 }, {}, onset);
          data = moved.curve as typeof data;
          fitted = { ...moved.metrics, ...(moved.onset && { onset: moved.onset }) };
        } catch (error) {
          if (error instanceof RangeError && (error as { stage?: string }).stage === 'fit') throw new AppError(422, 'cannot-measure', `${upload.originalName}: ${error.message.replace(/^\w+: /, '')}; nothing was stored.`, { file: upload.originalName });
          throw asUnprocessable(placeWholeFileError(error, table, mapping!), upload.originalName);
        }
      } else {
        try {
          data = applyMapping(table, mapping, { kind, areaCm2, reuseColumns: true });
          checkEnoughData(data);
        } catch (error) {
          throw asUnprocessable(placeWholeFileError(error, table, mapping!), upload.originalName);
        }
      }
      notes = importNotes(table, (data as ReturnType<typeof applyMapping>).notes);
      if (mappingSource.startsWith('profile')) notes.unshift(`columns and units from the import ${mappingSource.replace(/^profile /, 'profile "')}"`);
      const compared = compareConditions(table.conditions, build);
      mismatches = compared.mismatches;
      notes.push(...compared.notes);
      // The mapped columns now live in `data` (converted in place); let the rest go before measuring.
      table.columns.fill(null);
      try {
        result = computeMetrics(data, referencePoint(project), build, null, fitted);
        if (kind === 'durability') checkHoursAfterBreakIn(data, result.metrics.breakInHours ?? null);
      } catch (error) {
        if (error instanceof RangeError) throw new AppError(422, 'cannot-measure', `${upload.originalName}: ${error.message.replace(/^\w+: /, '')}; nothing was stored.`, { file: upload.originalName });
        throw asUnprocessable(placeWholeFileError(error, table, mapping!), upload.originalName);
      }
      if (kind === 'polarization') refuseEmptyMetrics(result, data, upload.originalName, table, mapping!);
    }
    options.progress?.phase('storing', null);
    await yieldToEventLoop();
    // a long log's points are stored in pieces that are views of its columns: nothing is copied
    const { points, pieces } = packPoints(data);
    await yieldToEventLoop();

    storing ??= { sha256: read.sha256, put: ctx.storage.put(read.sha256, upload.tmpPath) };
    const { existed } = await storing.put;
    stored = true;

    try {
      const curve = db.transaction((tx) => {
        const file = tx
          .insert(files)
          .values({ sha256: read.sha256, sizeBytes: upload.size, originalName: upload.originalName.slice(0, 255), contentType: read.contentType, projectId: access.projectId, buildId: build.id, uploadedBy: access.user.id })
          .returning()
          .get();
        if (options.saveProfileAs) {
          // saved for the build's lab: the same rights and completeness as the profiles route
          requireProfileLab(access, build.labId);
          const saved = mappingToProfile(mapping!, table);
          requireCompleteProfile(kind, saved);
          tx.insert(importProfiles).values({ labId: build.labId, projectId: access.projectId, name: options.saveProfileAs, mapping: saved, kind, createdBy: access.user.id }).run();
        }
        // the first curve of its kind becomes the record; a later one waits for someone to choose it
        const isRecord = recordOf(tx, build.id, kind) === null;
        const row = tx
          .insert(curves)
          .values({
            isRecord,
            buildId: build.id,
            fileId: file.id,
            kind,
            label: options.label ?? upload.originalName.slice(0, 120),
            mapping,
            conditions: { ...table.conditions, ...(areaCm2 != null && { areaCm2 }) },
            pointCount: data.v.length,
            points,
            metrics: result.metrics,
            metricNotes: result.metricNotes as Record<string, string>,
            method: result.method as never,
            summary: { ...result.summary, mappingSource, sheet: read.sheet ?? null, importNotes: notes, conditionMismatches: mismatches, areaUsedCm2: data.areaCm2, ...(profileNote && { profileNote }) },
            metricsVersion: project.metricsVersion,
            createdBy: access.user.id,
          })
          // everything but the points: reading the blob straight back would double a big log's memory
          .returning(CURVE_COLUMNS_WITHOUT_POINTS)
          .get();
        writePointPieces(db, row.id, pieces);
        // a build with its first curve has been tested
        const status = nextStatus(build.status, { kind: 'upload' });
        if (status.ok && status.changed) {
          tx.update(builds).set({ status: status.status, testedOn: build.testedOn ?? new Date().toISOString().slice(0, 10), updatedAt: new Date().toISOString() }).where(eq(builds.id, build.id)).run();
        }
        audit(tx as never, { userId: access.user.id, action: 'upload', entity: 'curve', entityId: row.id, projectId: access.projectId, after: { buildId: build.id, kind, file: upload.originalName, sha256: read.sha256, points: data.v.length, isRecord: row.isRecord, importNotes: notes.length, conditionMismatches: mismatches.map((m) => m.field) } });
        return row;
      });
      await notifyAfterUpload(ctx, access, build, upload.originalName, { kind, isRecord: curve.isRecord });
      // the build's curve of record of this kind, to set the new curve's metrics beside it
      const record = curve.isRecord ? curve : db.select(CURVE_COLUMNS_WITHOUT_POINTS).from(curves).where(and(eq(curves.buildId, build.id), eq(curves.kind, kind), eq(curves.isRecord, true))).get();
      return { curve: curveView(curve), recordCurve: record ? curveView(record) : null };
    } catch (error) {
      // nothing half-stored: the bytes go too, unless a file row (another upload) uses them
      if (!existed && !db.select({ id: files.id }).from(files).where(eq(files.sha256, read.sha256)).get()) await ctx.storage.remove(read.sha256);
      throw error;
    }
  } catch (error) {
    // refused while the raw file was on its way to the store: nothing half-stored, the bytes go too
    if (storing && !stored) {
      const { sha256, put } = storing;
      const outcome = await put.catch(() => ({ existed: true }));
      if (!outcome.existed && !db.select({ id: files.id }).from(files).where(eq(files.sha256, sha256)).get()) await ctx.storage.remove(sha256);
    }
    throw error;
  } finally {
    fs.rmSync(upload.tmpPath, { force: true });
  }
}

export function asUnprocessable(error: unknown, fileName: string): unknown {
  if (error instanceof CurveFileError) {
    const where = [error.line != null ? `line ${error.line}` : null, error.column != null ? `column ${typeof error.column === 'number' ? error.column + 1 : `"${error.column}"`}` : null].filter(Boolean).join(', ');
    const prefix = where ? `${fileName}, ${where}: ` : `${fileName}: `;
    const message = /^lines? /.test(error.message) || error.message.includes(fileName) ? `${fileName}: ${error.message}` : prefix + error.message;
    const stored = /nothing was stored/.test(message) ? '' : /[.!?]$/.test(message) ? ' Nothing was stored.' : '; nothing was stored.';
    return new AppError(422, error.code, message + stored, { file: fileName, line: error.line ?? null, column: error.column ?? null });
  }
  return error;
}

/**
 * A refusal about the whole curve (too few steps, too short a log) names the lines of the data
 * and the column that falls short: the current for a polarization curve, the time for a log.
 */
export function placeWholeFileError(error: unknown, table: ParsedTable, mapping: ColumnMapping): unknown {
  if (!(error instanceof CurveFileError) || error.line != null || !['too-few-steps', 'too-few-points', 'too-short'].includes(error.code)) return error;
  const entry = error.code === 'too-few-steps' ? mapping.current : (mapping.time ?? mapping.voltage ?? mapping.voltageIrFree);
  const column = entry === undefined ? undefined : table.header[entry.column];
  const first = table.dataLines[0];
  const last = table.dataLines[table.dataLines.length - 1];
  const lines = first === last ? `line ${first}` : `lines ${first}–${last}`;
  return new CurveFileError(error.code, `${lines}${column ? `, column "${column}"` : ''}: ${error.message}`, { line: first, column });
}

// Metrics read off the loaded part of a curve: an OCV or HFR alone does not make a polarization curve.
const LOADED_METRICS = metricsOfKind('polarization').filter((key) => key !== 'ocv' && key !== 'hfr');

/** A polarization curve from which not one loaded-curve metric can be read is refused, with what the data span. */
export function refuseEmptyMetrics(result: MetricsResult, data: CurveData, fileName: string, table: ParsedTable, mapping: ColumnMapping) {
  if (LOADED_METRICS.some((key) => result.metrics[key] != null && Number.isFinite(result.metrics[key] as number))) return;
  const span = (values: Float64Array | undefined, digits: number) => {
    let low = Infinity;
    let high = -Infinity;
    for (const value of values ?? []) {
      if (value < low) low = value;
      if (value > high) high = value;
    }
    return low <= high ? `${low.toFixed(digits)} to ${high.toFixed(digits)}` : 'none';
  };
  const reasons = Object.entries(result.metricNotes).map(([key, note]) => `${metricEntry(key)?.label ?? key}: ${note}`).slice(0, 4).join('; ');
  const first = table.dataLines[0];
  const last = table.dataLines[table.dataLines.length - 1];
  const voltage = mapping.voltage ?? mapping.voltageIrFree;
  const column = voltage === undefined ? null : table.header[voltage.column];
  const columns = [mapping.current, voltage].filter((entry) => entry !== undefined).map((entry) => `"${table.header[entry!.column]}"`).join(' and ');
  throw new AppError(
    422,
    'no-metrics',
    `${fileName}: lines ${first}–${last}, columns ${columns}: not one metric can be read from this curve (current density ${span(data.j, 3)} A/cm², voltage ${span(data.v, 3)} V)${reasons ? ` — ${reasons}` : ''}; check the units of the columns. Nothing was stored.`,
    { file: fileName, line: first, column },
  );
}

/**
 * The newest of the lab's profiles that fits this file. Profiles that name the file's headers but
 * do not fit it (another kind, a column missing, a unit contradicting the header) are passed over
 * and named in `note`, so the upload can say why the columns were detected instead.
 */
function findMatchingProfile(ctx: AppContext, projectId: number, labId: number | null, table: ParsedTable, kind: CurveKind, areaCm2: number | null) {
  const candidates = ctx.db
    .select()
    .from(importProfiles)
    .where(and(or(eq(importProfiles.projectId, projectId), isNull(importProfiles.projectId)), labId == null ? isNull(importProfiles.labId) : eq(importProfiles.labId, labId)))
    .orderBy(desc(importProfiles.id))
    .all();
  const passedOver: string[] = [];
  const headers = new Set(table.header.map((h) => h.trim().toLowerCase()));
  for (const profile of candidates) {
    const fit = profileToMapping(profile, table, kind, areaCm2);
    if (fit.mapping) return { profile, mapping: fit.mapping, note: passedOver.length ? passedOver.join('; ') : null };
    // only profiles meant for files like this one are worth a word
    if (Object.values(profile.mapping).some((spec) => headers.has(spec.header.trim().toLowerCase()))) passedOver.push(fit.problem);
  }
  return { profile: null, mapping: null, note: passedOver.length ? `${passedOver.join('; ')}; the columns were detected instead` : null };
}

export function curveView(row: Omit<CurveRow, 'points'> & { points?: unknown }) {
  return {
    id: row.id,
    buildId: row.buildId,
    fileId: row.fileId,
    kind: row.kind,
    label: row.label,
    mapping: row.mapping,
    conditions: row.conditions,
    pointCount: row.pointCount,
    metrics: row.metrics,
    metricNotes: row.metricNotes,
    method: row.method,
    summary: row.summary,
    metricsVersion: row.metricsVersion,
    options: row.options,
    createdAt: row.createdAt,
    isRecord: row.isRecord,
  };
}

const CURVE_COLUMNS_WITHOUT_POINTS = {
  id: curves.id, buildId: curves.buildId, fileId: curves.fileId, kind: curves.kind, label: curves.label, mapping: curves.mapping,
  conditions: curves.conditions, pointCount: curves.pointCount, metrics: curves.metrics, metricNotes: curves.metricNotes,
  method: curves.method, summary: curves.summary, metricsVersion: curves.metricsVersion, options: curves.options, createdAt: curves.createdAt, createdBy: curves.createdBy,
  isRecord: curves.isRecord,
};

export function curvesForBuild(ctx: AppContext, buildId: number) {
  const rows = ctx.db
    .select(CURVE_COLUMNS_WITHOUT_POINTS)
    .from(curves)
    .where(eq(curves.buildId, buildId))
    .orderBy(asc(curves.id))
    .all();
  return rows.map(curveView);
}

export function loadCurve(ctx: AppContext, curveId: number): CurveRow {
  const row = ctx.db.select().from(curves).where(eq(curves.id, curveId)).get();
  if (!row) throw notFound(`Curve ${curveId}`);
  return row;
}

/** Points for plotting: polarization curves whole; long logs downsampled to maxPoints over [from, to]. */
export function curvePoints(ctx: AppContext, row: CurveRow, options: { maxPoints?: number; fromHours?: number; toHours?: number }) {
  const data = readPoints(ctx.db, row, row.kind);
  if (row.kind !== 'polarization' && data.tHours) {
    const max = options.maxPoints ?? 2000;
    // one bound given: the other is the log's own end, so the window is always finite
    const first = data.tHours.length ? data.tHours[0]! : 0;
    const last = data.tHours.length ? data.tHours[data.tHours.length - 1]! : 0;
    const range = options.fromHours != null || options.toHours != null ? { fromHours: options.fromHours ?? Math.min(first, options.toHours!), toHours: options.toHours ?? Math.max(last, options.fromHours!) } : undefined;
    const down = downsampleForPlot(data.tHours, data.v, max, range);
    return { tHours: Array.from(down.t), v: Array.from(down.v), downsampled: down.t.length < data.v.length, total: data.v.length };
  }
  return {
    j: Array.from(data.j),
    v: Array.from(data.v),
    hfr: data.hfr ? Array.from(data.hfr) : null,
    vIrFree: data.vIrFree ? Array.from(data.vIrFree) : null,
    tHours: data.tHours ? Array.from(data.tHours) : null,
    temperatureC: data.temperatureC ? Array.from(data.temperatureC) : null,
    ...(data.frequencyHz && { frequencyHz: Array.from(data.frequencyHz), zReal: Array.from(data.zReal!), zImag: Array.from(data.zImag!) }),
    downsampled: false,
    total: data.v.length,
  };
}

/** Measure stored curves again with their build and project as they are now, in one transaction. */
function remeasure(ctx: AppContext, rows: CurveRow[]): number {
  const { db } = ctx;
  if (rows.length === 0) return 0;
  const buildIds = [...new Set(rows.map((row) => row.buildId))];
  const buildRows = db.select().from(builds).where(inArray(builds.id, buildIds)).all();
  const byBuild = new Map(buildRows.map((b) => [b.id, b]));
  const projectRows = db.select().from(projects).where(inArray(projects.id, [...new Set(buildRows.map((b) => b.projectId))])).all();
  const byProject = new Map(projectRows.map((p) => [p.id, p]));
  let count = 0;
  db.transaction((tx) => {
    for (const row of rows) {
      const build = byBuild.get(row.buildId);
      const project = build && byProject.get(build.projectId);
      if (!build || !project) continue;
      let result: MetricsResult;
      try {
        result = computeMetrics(readPoints(db, row, row.kind), referencePoint(project), build, row.options as DurabilityOptions | null);
      } catch (error) {
        if (error instanceof RangeError) continue; // stored curves were measurable once; keep what they have
        throw error;
      }
      tx.update(curves)
        .set({ metrics: result.metrics, metricNotes: result.metricNotes as Record<string, string>, method: result.method as never, summary: { ...row.summary, ...result.summary }, metricsVersion: project.metricsVersion })
        .where(eq(curves.id, row.id))
        .run();
      count++;
    }
  });
  return count;
}

/** Re-measure a project's curves of the given kinds (polarization by default) after its settings changed. */
export function recomputeProjectMetrics(ctx: AppContext, projectId: number, kinds: CurveKind[] = ['polarization']): number {
  const { db } = ctx;
  const buildIds = db.select({ id: builds.id }).from(builds).where(eq(builds.projectId, projectId)).all().map((b) => b.id);
  if (buildIds.length === 0) return 0;
  return remeasure(ctx, db.select().from(curves).where(and(inArray(curves.buildId, buildIds), inArray(curves.kind, kinds))).all());
}

/** Re-measure a build's polarization curves after its loading or H₂ crossover changed. */
export function recomputeBuildMetrics(ctx: AppContext, buildId: number): number {
  return remeasure(ctx, ctx.db.select().from(curves).where(and(eq(curves.buildId, buildId), eq(curves.kind, 'polarization'))).all());
}

/** Curves measured by an older metrics rule are measured again (called at start-up). */
export function remeasureOutdatedCurves(ctx: AppContext): number {
  const ids = ctx.db.$client
    .prepare(`select id from curves where coalesce(json_extract(summary, '$.metricsAlgorithm'), 0) < ?`)
    .all(METRICS_ALGORITHM) as { id: number }[];
  let count = 0;
  // a few at a time: long logs are large
  for (let i = 0; i < ids.length; i += 20) {
    count += remeasure(ctx, ctx.db.select().from(curves).where(inArray(curves.id, ids.slice(i, i + 20).map((r) => r.id))).all());
  }
  return count;
}

/** Relabel a curve and/or set its durability options (which measures it again). */
export function patchCurve(ctx: AppContext, access: ProjectAccess, row: CurveRow, body: CurvePatch) {
  const { label, ...options } = body;
  let curve = curveView(row);
  if (Object.keys(options).length) curve = updateCurveOptions(ctx, access, row, options);
  if (label !== undefined) {
    ctx.db.update(curves).set({ label }).where(eq(curves.id, row.id)).run();
    audit(ctx.db, { userId: access.user.id, action: 'update', entity: 'curve', entityId: row.id, projectId: access.projectId, before: { label: row.label }, after: { label } });
    curve = { ...curve, label };
  }
  return curve;
}

/** The stored bytes of an uploaded file, or 404 when the store no longer has them. */
export async function openRawFile(ctx: AppContext, file: typeof files.$inferSelect) {
  const stream = await ctx.storage.get(file.sha256);
  if (!stream) throw notFound(`Stored bytes of file ${file.id}`);
  return stream;
}

export function listProfiles(ctx: AppContext, projectId: number) {
  return ctx.db.select().from(importProfiles).where(eq(importProfiles.projectId, projectId)).all();
}

/** Save an import profile: for the lab asked (default the person's own; partners always theirs), complete for its kind. */
export function saveProfile(ctx: AppContext, access: ProjectAccess, body: ImportProfileCreate) {
  const lab = labForNewProfile(actorOf(access), body.labId);
  if (lab.problem) throw forbidden(lab.problem);
  requireProfileLab(access, lab.labId);
  requireCompleteProfile(body.kind, body.mapping);
  const row = ctx.db.insert(importProfiles).values({ name: body.name, labId: lab.labId, projectId: access.projectId, kind: body.kind, mapping: body.mapping, createdBy: access.user.id }).returning().get();
  audit(ctx.db, { userId: access.user.id, action: 'create', entity: 'import-profile', entityId: row.id, projectId: access.projectId, after: row });
  return row;
}

/** Remove an import profile (who may, for which lab, is checked before: the route's permission). */
export function deleteProfile(ctx: AppContext, access: ProjectAccess, profile: typeof importProfiles.$inferSelect) {
  ctx.db.delete(importProfiles).where(eq(importProfiles.id, profile.id)).run();
  audit(ctx.db, { userId: access.user.id, action: 'delete', entity: 'import-profile', entityId: profile.id, projectId: access.projectId, before: profile });
}

/** Re-measure one curve with new options (e.g. a break-in the user set by hand). */
export function updateCurveOptions(ctx: AppContext, access: ProjectAccess, row: CurveRow, options: { [K in keyof DurabilityOptions]?: DurabilityOptions[K] | null }) {
  const { db } = ctx;
  const project = db.select().from(projects).where(eq(projects.id, access.projectId)).get()!;
  const build = db.select().from(builds).where(eq(builds.id, row.buildId)).get()!;
  const merged: DurabilityOptions = { ...(row.options as DurabilityOptions | null) };
  // breakInHours: null means "use the detected break-in again"
  for (const [key, value] of Object.entries(options)) {
    if (value === null) delete merged[key as keyof DurabilityOptions];
    else if (value !== undefined) (merged as Record<string, unknown>)[key] = value;
  }
  if (row.kind === 'polarization') throw new AppError(400, 'validation', 'Break-in, windows, loss fraction and the onset and settling rules apply to durability and hold curves only; the circuit to impedance spectra.', { fields: [{ path: Object.keys(options)[0] ?? 'breakInHours', message: 'not a durability curve' }] });
  if (row.kind === 'impedance' && Object.keys(options).some((key) => key !== 'circuit')) throw new AppError(400, 'validation', 'An impedance spectrum takes only the circuit option.', { fields: Object.keys(options).filter((key) => key !== 'circuit').map((key) => ({ path: key, message: 'not for an impedance spectrum' })) });
  if (row.kind !== 'impedance' && options.circuit != null) throw new AppError(400, 'validation', 'circuit: only an impedance spectrum is fitted with a circuit.', { fields: [{ path: 'circuit', message: 'not an impedance spectrum' }] });
  for (const w of merged.windows ?? []) {
    if (!(w.toHours > w.fromHours)) throw new AppError(400, 'validation', `windows: a window must end after it starts, got ${w.fromHours}–${w.toHours} h.`, { fields: [{ path: 'windows', message: 'toHours must be above fromHours' }] });
  }
  const result = (() => {
    try {
      return computeMetrics(readPoints(db, row, row.kind), referencePoint(project), build, merged);
    } catch (error) {
      if (error instanceof RangeError) throw new AppError(422, 'cannot-measure', error.message.replace(/^\w+: /, ''));
      throw error;
    }
  })();
  const after = db
    .update(curves)
    .set({ options: merged as Record<string, unknown>, metrics: result.metrics, metricNotes: result.metricNotes as Record<string, string>, method: result.method as never, summary: { ...row.summary, ...result.summary } })
    .where(eq(curves.id, row.id))
    .returning()
    .get();
  audit(db, { userId: access.user.id, action: 'update', entity: 'curve', entityId: row.id, projectId: access.projectId, before: { options: row.options, metrics: row.metrics }, after: { options: merged, metrics: result.metrics } });
  return curveView(after);
}

/** Delete a curve; a deleted record hands over to the oldest remaining curve of its kind (said in the answer). */
export function deleteCurve(ctx: AppContext, access: ProjectAccess, row: CurveRow) {
  return deleteCurveKeepingRecord(ctx, access, row, curveView(row));
}

const GAUGE_DIGITS = 1;

/** A build's value of one condition, in the units of ConditionMismatch (back-pressure absolute). */
function buildConditionValue(build: BuildRow, field: ConditionField): number | string | null {
  if (field === 'areaCm2') return build.areaCm2 ?? null;
  const recorded = build.testConditions ?? {};
  if (field === 'backPressureKPa') return recorded.backPressureKPa == null ? null : recorded.backPressureKPa + STANDARD_ATMOSPHERE_KPA;
  return (recorded[field] as number | string | null | undefined) ?? null;
}

// Equal as recorded: numbers within the rounding of the shown values (0.1 kPa, 0.1 °C, 0.001 cm²).
function sameCondition(a: number | string | null, b: number | string): boolean {
  if (a === null) return false;
  if (typeof a === 'number' && typeof b === 'number') return Math.abs(a - b) <= 0.06;
  return String(a).trim().toLowerCase() === String(b).trim().toLowerCase();
}

/**
 * The uploader says which value of a mismatched condition is right: the file's (the build's
 * record takes it) or the build's (kept). An area chosen that differs from the one used to
 * turn total current or cell resistance into densities re-scales the curve and re-measures it.
 * Audited; the choice is kept on the curve's mismatch (`chosen`).
 */
export function chooseCondition(ctx: AppContext, access: ProjectAccess, row: CurveRow, build: BuildRow, field: ConditionField, chosen: 'file' | 'build') {
  const { db } = ctx;
  const summary = { ...(row.summary as Record<string, unknown>) };
  const mismatches = [...((summary.conditionMismatches as ConditionMismatch[] | undefined) ?? [])];
  const index = mismatches.findIndex((mismatch) => mismatch.field === field);
  if (index < 0) {
    throw new AppError(400, 'validation', `field: curve ${row.id} shows no difference between the file and the build on ${field}; nothing to choose.`, { fields: [{ path: 'field', message: 'no such mismatch on this curve' }] });
  }
  const mismatch = mismatches[index];
  const target = chosen === 'file' ? mismatch.fileValue : mismatch.buildValue;

  // the build's record takes the chosen value (back to its own value when the build was chosen after the file)
  const buildChanges: Partial<BuildRow> = {};
  if (!sameCondition(buildConditionValue(build, field), target)) {
    if (field === 'areaCm2') buildChanges.areaCm2 = Number(target);
    else {
      const conditions = { ...(build.testConditions ?? {}) };
      if (field === 'temperatureC') conditions.temperatureC = Number(target);
      else if (field === 'backPressureKPa') conditions.backPressureKPa = Number((Number(target) - STANDARD_ATMOSPHERE_KPA).toFixed(GAUGE_DIGITS)) + 0;
      else conditions[field] = String(target);
      buildChanges.testConditions = conditions;
    }
  }

  // an area other than the one the curve's totals were converted with: re-scale and re-measure
  let curveChanges: Partial<CurveRow> = {};
  let remeasured: CurveData | null = null;
  const usedArea = typeof summary.areaUsedCm2 === 'number' ? summary.areaUsedCm2 : null;
  const notes = [...((summary.importNotes as string[] | undefined) ?? [])];
  if (field === 'areaCm2' && usedArea !== null && Math.abs(usedArea - Number(target)) > 1e-9 * Number(target)) {
    const newArea = Number(target);
    const data = readPoints(db, row, row.kind);
    const mapping = row.mapping;
    if (mapping?.current && (mapping.current.unit === 'A' || mapping.current.unit === 'mA')) for (let i = 0; i < data.j.length; i++) data.j[i] *= usedArea / newArea;
    if (mapping?.hfr && data.hfr && (mapping.hfr.unit === 'ohm' || mapping.hfr.unit === 'mohm')) for (let i = 0; i < data.hfr.length; i++) data.hfr[i] *= newArea / usedArea;
    const project = db.select().from(projects).where(eq(projects.id, access.projectId)).get()!;
    const measuredBuild = { ...build, ...buildChanges };
    let result: MetricsResult;
    try {
      result = computeMetrics(data, referencePoint(project), measuredBuild, row.options as DurabilityOptions | null);
    } catch (error) {
      if (error instanceof RangeError) throw new AppError(422, 'cannot-measure', `${error.message.replace(/^\w+: /, '')}; nothing was changed.`);
      throw error;
    }
    notes.push(`active area ${newArea} cm² chosen instead of ${usedArea} cm²: current density and HFR re-scaled and the curve measured again`);
    Object.assign(summary, result.summary, { areaUsedCm2: newArea });
    remeasured = data;
    curveChanges = {
      metrics: result.metrics,
      metricNotes: result.metricNotes as Record<string, string>,
      method: result.method as never,
      conditions: { ...(row.conditions ?? { raw: {} }), areaCm2: newArea },
    };
  }
  mismatches[index] = { ...mismatch, chosen };
  summary.conditionMismatches = mismatches;
  summary.importNotes = notes;

  const updated = db.transaction((tx) => {
    if (Object.keys(buildChanges).length > 0) tx.update(builds).set({ ...buildChanges, updatedAt: new Date().toISOString() }).where(eq(builds.id, build.id)).run();
    // the re-scaled points replace the stored ones (pieces of a long log too), in the same transaction
    const points = remeasured ? replacePoints(db, row.id, remeasured) : undefined;
    return tx.update(curves).set({ ...curveChanges, ...(points && { points }), summary }).where(eq(curves.id, row.id)).returning(CURVE_COLUMNS_WITHOUT_POINTS).get();
  });
  audit(db, {
    userId: access.user.id,
    action: 'choose-condition',
    entity: 'curve',
    entityId: row.id,
    projectId: access.projectId,
    before: { field, fileValue: mismatch.fileValue, buildValue: mismatch.buildValue, chosen: mismatch.chosen ?? null, build: Object.keys(buildChanges).length > 0 ? { areaCm2: build.areaCm2, testConditions: build.testConditions } : undefined },
    after: { field, chosen, build: Object.keys(buildChanges).length > 0 ? buildChanges : undefined, remeasured: curveChanges.metrics !== undefined },
  });
  const buildRow = db.select().from(builds).where(eq(builds.id, build.id)).get()!;
  return { curve: curveView(updated), build: { id: buildRow.id, areaCm2: buildRow.areaCm2, testConditions: buildRow.testConditions } };
}

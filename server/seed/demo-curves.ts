// Invented curves for the demo builds: polarization curves from the textbook semi-empirical
// model, with parameters driven by each build's recipe (an invented "truth" so that lineage,
// gains and the response surface tell a consistent story), plus noise; a few long durability
// logs. Each file is written in its lab's own invented station layout and goes through the
// real upload path, so raw files, import profiles and metrics are exactly what a user gets.
import fs from 'node:fs';
import path from 'node:path';
import os from 'node:os';
import type { AppContext, AuthUser } from '../context';
import type { DemoBuild, DemoReference } from './demo-data';
import type { ProjectSettings } from '../../shared/schemas/project';
import { generatePolarizationCurve, mulberry32, tafelSlopeTheory, writeCurveCsv, type SemiEmpiricalParams, type CurveCsvShape } from '../../shared/curves';
import { generateSyntheticLog, writeDurabilityCsv } from '../../shared/durability';
import { demoAcceleratedTest, demoImpedanceSpectrum, demoOcvHold, demoPressureSeries, demoTemperatureSeries } from '../../shared/demo';
import { builds, lots, users } from '../db/schema';
import { eq } from 'drizzle-orm';
import { ingestUpload, type UploadOptions } from '../curves/service';
import { importReferenceCurve } from '../benchmarks/service';
import { addLotFile } from '../lots/service';
import PDFDocument from 'pdfkit';
import { AppError } from '../lib/errors';

export interface DemoCurveJob {
  projectId: number;
  buildId: number;
  build: DemoBuild;
  settings: ProjectSettings;
  uploadedBy: number;
}

const LAB_SHAPE: Record<string, CurveCsvShape> = { home: 'metadata-header', kestrel: 'semicolon-decimal-comma', ridgeway: 'tab-total-current-mA' };

function hashSeed(text: string): number {
  let h = 2166136261;
  for (let i = 0; i < text.length; i++) h = Math.imul(h ^ text.charCodeAt(i), 16777619);
  return h >>> 0;
}

/** Invented recipe → model parameters. Optima: binder ≈ 30 wt %, activation ≈ 355 °C, longer is better. */
export function demoParams(b: DemoBuild): SemiEmpiricalParams {
  const f = b.factors as Record<string, number | string>;
  const cellTemp = Number(f.cellTemp ?? b.conditions.temperatureC ?? 180);
  if ('ruFraction' in f) {
    const ru = Number(f.ruFraction), load = Number(f.anodeLoading), support = f.support === 'graphitised carbon' ? 0.12 : 0;
    const lnJ0 = Math.log(4e-5) - ((ru - 48) / 18) ** 2 * 0.7 + 0.035 * (cellTemp - 200) + 0.45 * Math.log(load) + support;
    return { e0: 0.9 - 0.0004 * (cellTemp - 200), tafelSlope: tafelSlopeTheory(cellTemp + 273.15, 1.0), exchangeCurrentDensity: Math.exp(lnJ0), resistance: 0.11 - 0.0003 * (cellTemp - 200), massTransportCoefficient: 0.05, limitingCurrentDensity: 1.0 + 0.004 * (cellTemp - 200) };
  }
  const binder = Number(f.binder), aTemp = Number(f.activationTemp), aTime = Number(f.activationTime), paper = f.gdl === 'carbon paper';
  const lot = b.lot === 'FNC-24-11' ? 0.12 : 0;
  const lnJ0 = Math.log(1.6e-5) - ((binder - 30) / 14) ** 2 * 0.7 - ((aTemp - 355) / 35) ** 2 * 0.8 + 0.32 * Math.log(aTime) + 0.03 * (cellTemp - 160) - (paper ? 0.15 : 0) + lot;
  return {
    e0: 1.0 - 0.0003 * (cellTemp - 160),
    tafelSlope: tafelSlopeTheory(cellTemp + 273.15, 0.9),
    exchangeCurrentDensity: Math.exp(lnJ0),
    resistance: 0.12 + 0.0018 * (binder - 20) - 0.0006 * (cellTemp - 160) - (paper ? 0.01 : 0),
    massTransportCoefficient: 0.045,
    limitingCurrentDensity: 1.0 + 0.012 * (binder - 10) + (paper ? 0.1 : 0),
  };
}

const J_STEPS = [0, 0.005, 0.01, 0.02, 0.04, 0.06, 0.08, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8];

async function ingestText(ctx: AppContext, job: DemoCurveJob, user: AuthUser, fileName: string, text: string, options: UploadOptions) {
  const tmp = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'cw-seed-')), fileName);
  const build = ctx.db.select().from(builds).where(eq(builds.id, job.buildId)).get()!;
  const access = { projectId: job.projectId, role: 'admin' as const, user };
  const write = () => fs.writeFileSync(tmp, text);
  write();
  try {
    await ingestUpload(ctx, access, build, { tmpPath: tmp, originalName: fileName, size: Buffer.byteLength(text) }, options);
  } catch (error) {
    // A lab's first file in an ambiguous layout: confirm the detected columns and keep them as
    // that lab's import profile, as a person would on the upload page.
    if (error instanceof AppError && error.code === 'mapping-needed') {
      const details = error.details as { detected: UploadOptions['mapping'] | null };
      if (!details.detected) throw error;
      write();
      await ingestUpload(ctx, access, ctx.db.select().from(builds).where(eq(builds.id, job.buildId)).get()!, { tmpPath: tmp, originalName: fileName, size: Buffer.byteLength(text) }, { ...options, mapping: details.detected, saveProfileAs: `${job.build.lab} station export` });
    } else {
      throw error;
    }
  } finally {
    fs.rmSync(path.dirname(tmp), { recursive: true, force: true });
  }
}

export async function addDemoCurves(ctx: AppContext, job: DemoCurveJob): Promise<void> {
  const row = ctx.db.select().from(users).where(eq(users.id, job.uploadedBy)).get()!;
  const user: AuthUser = { id: row.id, email: row.email, name: row.name, isAdmin: row.isAdmin, labId: row.labId, labKind: null };
  const b = job.build;
  // Build-to-build scatter (ink batch, pressing, assembly): a seeded offset of about 5 mV SD,
  // so replicates differ as they do in a lab and small steps can fall within noise.
  const scatter = mulberry32(hashSeed(`${b.code}-scatter`));
  const offset = 0.005 * Math.sqrt(-2 * Math.log(1 - scatter())) * Math.cos(2 * Math.PI * scatter());
  const base = demoParams(b);
  let params = { ...base, e0: base.e0 + offset };
  const jMax = params.limitingCurrentDensity * 0.92;
  const series = b.series ? seriesMember(b.series) : null;
  if (series) params = series.params;
  const curve = series ? series.curve : generatePolarizationCurve(params, {
    jPoints: J_STEPS.filter((j) => j < jMax),
    readingsPerStep: 3,
    noiseV: 0.0015,
    seed: hashSeed(b.code),
    sweeps: 'up-down',
    downSweepOffsetV: 0.004,
  });
  const shape = LAB_SHAPE[b.lab] ?? 'comma-plain';
  const text = writeCurveCsv(curve, shape, {
    areaCm2: b.areaCm2,
    temperatureC: b.conditions.temperatureC ?? undefined,
    anodeGas: b.conditions.anodeGas ?? undefined,
    cathodeGas: b.conditions.cathodeGas ?? undefined,
    backPressureKPa: b.conditions.backPressureKPa ?? undefined,
    title: `${b.code} polarization`,
  }).replace(/^/, '');
  const ext = shape === 'tab-total-current-mA' || shape === 'whitespace-mV' ? 'txt' : 'csv';
  await ingestText(ctx, job, user, `${b.code}_polarization.${ext}`, text, { kind: 'polarization', areaCm2: shape === 'tab-total-current-mA' ? b.areaCm2 : undefined });

  if (b.durability) {
    const log = generateSyntheticLog({
      hours: b.durability.hours,
      stepMinutes: 10,
      v0: 0.56,
      breakInHours: 120,
      breakInDropMv: -18,
      rateUvPerH: b.durability.rateUvPerH,
      noiseMv: 0.8,
      noiseCorrelation: 0.6,
      restartAtHours: b.durability.restartAtHours,
      restartShiftMv: b.durability.restartAtHours ? 6 : undefined,
      currentDensity: 0.2,
      temperatureC: b.conditions.temperatureC ?? 180,
      seed: hashSeed(`${b.code}-durability`),
    });
    await ingestText(ctx, job, user, `${b.code}_durability_${b.durability.hours}h.csv`, writeDurabilityCsv(log), { kind: 'durability', label: `${b.durability.hours} h at 0.2 A/cm²` });
  }
  if (b.impedanceAt) {
    // a spectrum at the polarization curve's own parameters (R_Ω is the curve's HFR), total Ω as a station writes it
    const { spectrum } = demoImpedanceSpectrum(params, { dcCurrentDensity: b.impedanceAt, seed: hashSeed(`${b.code}-eis`), noiseFraction: 0.003 });
    const lines = [`# ${b.code} impedance at ${b.impedanceAt} A/cm²`, `Cell area: ${b.areaCm2} cm2`, "Freq (Hz),Z' (Ohm),-Z'' (Ohm)"];
    for (let k = 0; k < spectrum.frequencyHz.length; k++) lines.push([spectrum.frequencyHz[k].toPrecision(6), (spectrum.zReal[k] / b.areaCm2).toPrecision(6), (-spectrum.zImag[k] / b.areaCm2).toPrecision(6)].join(','));
    await ingestText(ctx, job, user, `${b.code}_eis_${Math.round(b.impedanceAt * 1000)}mA.csv`, lines.join('\n') + '\n', { kind: 'impedance', label: `impedance at ${b.impedanceAt} A/cm²` });
  }
  if (b.hold) {
    const hold = demoOcvHold({ hours: b.hold.hours, decayMvPerH: b.hold.decayMvPerH, temperatureC: b.conditions.temperatureC ?? 200, seed: hashSeed(`${b.code}-hold`) });
    await ingestText(ctx, job, user, `${b.code}_ocv_hold_${b.hold.hours}h.csv`, writeDurabilityCsv(hold), { kind: 'hold', label: `${b.hold.hours} h open-circuit hold` });
  }
  if (b.accelerated) {
    const log = demoAcceleratedTest({ hours: b.accelerated.hours, onsetHours: b.accelerated.onsetHours, currentDensity: 0.6, temperatureC: b.conditions.temperatureC ?? 180, seed: hashSeed(`${b.code}-ast`) });
    await ingestText(ctx, job, user, `${b.code}_accelerated_${b.accelerated.hours}h.csv`, writeDurabilityCsv(log), { kind: 'durability', label: `accelerated test, ${b.accelerated.hours} h at 0.6 A/cm²` });
  }
}

// One invented temperature series (Eₐ 55 kJ/mol) and one pressure series (order 0.5), made once.
let temperatureSeries: ReturnType<typeof demoTemperatureSeries> | null = null;
let pressureSeries: ReturnType<typeof demoPressureSeries> | null = null;
/** Apparent activation energy of the demo temperature series, kJ/mol (invented). */
export const DEMO_ACTIVATION_ENERGY = 55;
/** Apparent reaction order of the demo pressure series (invented). */
export const DEMO_REACTION_ORDER = 0.5;
function seriesMember(series: { kind: 'temperature' | 'pressure'; index: number }) {
  if (series.kind === 'temperature') {
    temperatureSeries ??= demoTemperatureSeries({ activationEnergyKJmol: DEMO_ACTIVATION_ENERGY, temperaturesC: [160, 180, 200], seed: 41 });
    return temperatureSeries[series.index]!;
  }
  pressureSeries ??= demoPressureSeries({ order: DEMO_REACTION_ORDER, pressuresKPa: [0, 50, 100, 150].map((gauge) => gauge + 101.325), temperatureC: 200, seed: 43 });
  return pressureSeries[series.index]!;
}

/** The project's invented reference curve, imported through the reference-curve route's own path. */
export async function addDemoReference(ctx: AppContext, projectId: number, userId: number, ref: DemoReference): Promise<void> {
  const row = ctx.db.select().from(users).where(eq(users.id, userId)).get()!;
  const user: AuthUser = { id: row.id, email: row.email, name: row.name, isAdmin: row.isAdmin, labId: row.labId, labKind: null };
  const cellTemp = ref.conditions.temperatureC ?? 160;
  const params: SemiEmpiricalParams = { e0: 1.0 - 0.0003 * (cellTemp - 160), tafelSlope: tafelSlopeTheory(cellTemp + 273.15, 0.9), exchangeCurrentDensity: ref.exchangeCurrentDensity, resistance: ref.resistance, massTransportCoefficient: 0.045, limitingCurrentDensity: 1.2 };
  // a digitised published curve: one reading per step, no sweeps back
  const curve = generatePolarizationCurve(params, { jPoints: J_STEPS.filter((j) => j < 1.1), readingsPerStep: 1, noiseV: 0.001, seed: hashSeed(ref.label), sweeps: 'up' });
  const text = writeCurveCsv(curve, 'comma-plain', { areaCm2: ref.areaCm2, title: ref.label });
  const fileName = 'round-robin-rr7-fig4.csv';
  const tmp = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'cw-seed-')), fileName);
  fs.writeFileSync(tmp, text);
  try {
    await importReferenceCurve(ctx, { projectId, role: 'admin', user }, { tmpPath: tmp, originalName: fileName, size: Buffer.byteLength(text) }, {
      label: ref.label, source: ref.source, sourceDate: ref.sourceDate, loadingMgCm2: ref.loadingMgCm2, metalLoadingMgCm2: ref.metalLoadingMgCm2, areaCm2: ref.areaCm2,
      temperatureC: ref.conditions.temperatureC ?? undefined, backPressureKPa: ref.conditions.backPressureKPa ?? undefined, anodeGas: ref.conditions.anodeGas ?? undefined, cathodeGas: ref.conditions.cathodeGas ?? undefined,
      notes: 'Invented for the demo: a curve as a partner consortium might publish it.',
    });
  } finally {
    fs.rmSync(path.dirname(tmp), { recursive: true, force: true });
  }
}

/** An invented certificate of analysis for a demo lot, as a one-page PDF. */
function certificatePdf(lot: { name: string; maker: string; batchSizeG: number | null; madeOn: string | null; metalWtPct: number | null }): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4', margin: 56, info: { Title: `Certificate of analysis ${lot.name} (invented)` } });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.font('Helvetica-Bold').fontSize(16).text('Certificate of analysis');
    doc.font('Helvetica').fontSize(10).fillColor('#555').text('Invented for the Cellwright demo: no real maker, batch or measurement.');
    doc.moveDown().fillColor('#000').fontSize(11);
    for (const [k, v] of [['Lot', lot.name], ['Maker', lot.maker], ['Batch size', lot.batchSizeG != null ? `${lot.batchSizeG} g` : 'not stated'], ['Made or received', lot.madeOn ?? 'not stated'], ['Metal content (ICP-OES)', lot.metalWtPct != null ? `${lot.metalWtPct} wt %` : 'not measured'], ['Moisture', '< 1 wt %']] as const) {
      doc.font('Helvetica-Bold').text(`${k}: `, { continued: true }).font('Helvetica').text(String(v));
    }
    doc.end();
  });
}

/** Each demo lot keeps its invented certificate, through the lot-file route's own path. */
export async function addDemoCertificates(ctx: AppContext, projectId: number, userId: number): Promise<void> {
  const row = ctx.db.select().from(users).where(eq(users.id, userId)).get()!;
  const user: AuthUser = { id: row.id, email: row.email, name: row.name, isAdmin: row.isAdmin, labId: row.labId, labKind: null };
  for (const lot of ctx.db.select().from(lots).where(eq(lots.projectId, projectId)).all()) {
    const bytes = await certificatePdf(lot);
    const fileName = `${lot.name}-certificate-of-analysis.pdf`;
    const tmp = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'cw-seed-')), fileName);
    fs.writeFileSync(tmp, bytes);
    try {
      await addLotFile(ctx, { projectId, role: 'admin', user }, lot, { tmpPath: tmp, originalName: fileName, size: bytes.length, contentType: 'application/pdf' });
    } finally {
      fs.rmSync(path.dirname(tmp), { recursive: true, force: true });
    }
  }
}

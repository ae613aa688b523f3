// The invented demo scenario: one development group, two partner labs, five demo people and two
// campaigns. Every name here is made up. Add builds by appending to the lists below.
import type { ProjectSettings, TestConditions } from '../../shared/schemas/project';

export const DEMO_PASSWORD = 'demo-password';

export const LABS = [
  { key: 'home', name: 'Northgate Electrode Group', kind: 'home' as const, city: 'Harwick' },
  { key: 'kestrel', name: 'Kestrel Institute Catalysis Lab', kind: 'partner' as const, city: 'Lowmere' },
  { key: 'ridgeway', name: 'Ridgeway Carbon Works', kind: 'partner' as const, city: 'Brackenford' },
];

export const PEOPLE = [
  { key: 'admin', email: 'admin@demo.cellwright.test', name: 'Mara Quellan', isAdmin: true, lab: 'home' },
  { key: 'pi', email: 'pi@demo.cellwright.test', name: 'Dr. Tobias Renwick', isAdmin: false, lab: 'home' },
  { key: 'researcher', email: 'researcher@demo.cellwright.test', name: 'Ayla Sorvik', isAdmin: false, lab: 'home' },
  { key: 'partner', email: 'partner@demo.cellwright.test', name: 'Jun Adebayo-Lind', isAdmin: false, lab: 'kestrel' },
  { key: 'viewer', email: 'viewer@demo.cellwright.test', name: 'Pella Hartwig', isAdmin: false, lab: 'home' },
  { key: 'partner2', email: 'r.castellane@ridgeway.example', name: 'Rosa Castellane', isAdmin: false, lab: 'ridgeway' },
];

export interface DemoFactor {
  key: string;
  label: string;
  unit: string;
  kind: 'continuous' | 'categorical';
  low?: number;
  high?: number;
  levels?: string[];
  /** a test condition (cell temperature, pressure …) rather than part of the electrode */
  testVariable?: boolean;
}

export interface DemoBuild {
  code: string;
  parent?: string;
  replicateOf?: string;
  changeNote?: string;
  factors: Record<string, number | string>;
  loadingMgCm2: number;
  metalLoadingMgCm2?: number;
  areaCm2: number;
  lot: string;
  lab: string;
  operator: string;
  status: 'planned' | 'built' | 'tested' | 'reviewed' | 'discarded';
  builtOn: string;
  testedOn?: string;
  /** the day a planned build was planned */
  plannedOn?: string;
  conditions: TestConditions;
  responses?: Record<string, number>;
  /** a durability log for this build (hours, seeded degradation rate µV/h) */
  durability?: { hours: number; rateUvPerH: number; restartAtHours?: number };
  /** a member of an invented temperature or pressure series: its polarization curve comes from the series generator */
  series?: { kind: 'temperature' | 'pressure'; index: number };
  /** an impedance spectrum at this DC current density, A/cm² */
  impedanceAt?: number;
  /** an open-circuit hold (hours, decay mV/h) */
  hold?: { hours: number; decayMvPerH: number };
  /** an accelerated test at 0.6 A/cm² (hours, onset of rapid failure in h or none) */
  accelerated?: { hours: number; onsetHours: number | null };
}

export interface DemoProject {
  name: string;
  description: string;
  codePrefix: string;
  settings: ProjectSettings;
  factors: DemoFactor[];
  responses: { key: string; label: string; unit: string; goal: 'maximize' | 'minimize' | 'target' }[];
  members: Record<string, 'pi' | 'researcher' | 'partner' | 'viewer'>;
  builds: DemoBuild[];
  /** catalyst lots (a small batch and its scale-up); builds name theirs in `lot` */
  lots: { name: string; maker: string; batchSizeG: number; madeOn: string; metalWtPct: number; notes: string }[];
  /** the programme's targets (one met by the demo builds, one not yet) */
  targets: { metric: string; comparator: '>=' | '<='; value: number; unit: string; basis?: 'catalyst' | 'metal'; conditions: string; dueDate: string; name: string }[];
  /** the build every polarization plot of the project shows as its benchmark */
  benchmark: { build: string; note: string };
  /** an invented outside curve the project keeps for comparison (no build), with its provenance */
  reference?: DemoReference;
}

export interface DemoReference {
  label: string;
  source: string;
  sourceDate: string;
  conditions: TestConditions;
  loadingMgCm2: number;
  metalLoadingMgCm2: number;
  areaCm2: number;
  /** the invented model behind the curve: exchange current density (A/cm²) and resistance (Ω·cm²) */
  exchangeCurrentDensity: number;
  resistance: number;
}

const cathodeConditions: TestConditions = { temperatureC: 180, anodeGas: 'H2', cathodeGas: 'air', backPressureKPa: 0, anodeStoich: 1.5, cathodeStoich: 2.0 };

/** Cathode campaign: binder fraction, activation protocol, GDL type and cell temperature. */
function cathodeBuilds(): DemoBuild[] {
  const b = (code: string, f: Record<string, number | string>, extra: Partial<DemoBuild>): DemoBuild => ({
    code,
    factors: f,
    conditions: { ...cathodeConditions, temperatureC: Number(f.cellTemp) },
    loadingMgCm2: 3.0,
    metalLoadingMgCm2: 0.06,
    areaCm2: 25,
    lot: 'FNC-24-07',
    lab: 'home',
    operator: 'researcher',
    status: 'tested',
    builtOn: '2026-09-01',
    ...extra,
  });
  const base = { binder: 20, activationTemp: 320, activationTime: 1, gdl: 'woven carbon', cellTemp: 160 };
  return [
    b('C-001', base, { changeNote: 'baseline: lot FNC-24-07, 20 wt % PTFE, 1 h at 320 °C', builtOn: '2026-08-18', testedOn: '2026-08-20', status: 'reviewed', durability: { hours: 1500, rateUvPerH: 13.5 } }),
    b('C-002', base, { replicateOf: 'C-001', changeNote: 'replicate of baseline', builtOn: '2026-08-19', testedOn: '2026-08-21' }),
    b('C-003', base, { replicateOf: 'C-001', changeNote: 'replicate of baseline', builtOn: '2026-08-19', testedOn: '2026-08-22' }),
    b('C-004', { ...base, activationTime: 3 }, { parent: 'C-001', changeNote: 'longer oven activation', builtOn: '2026-08-25', testedOn: '2026-08-27', status: 'reviewed' }),
    b('C-005', { ...base, activationTime: 3 }, { parent: 'C-001', replicateOf: 'C-004', changeNote: 'replicate: longer oven activation', builtOn: '2026-08-26', testedOn: '2026-08-28' }),
    b('C-006', { ...base, activationTime: 3, activationTemp: 350 }, { parent: 'C-004', changeNote: 'hotter activation', builtOn: '2026-09-02', testedOn: '2026-09-04', status: 'reviewed' }),
    b('C-007', { ...base, activationTime: 3, activationTemp: 350, binder: 30 }, { parent: 'C-006', changeNote: 'more PTFE binder', builtOn: '2026-09-09', testedOn: '2026-09-11', status: 'reviewed', durability: { hours: 2200, rateUvPerH: 7.5, restartAtHours: 1200 } }),
    b('C-008', { ...base, activationTime: 3, activationTemp: 350, binder: 30 }, { parent: 'C-006', replicateOf: 'C-007', changeNote: 'replicate: more PTFE binder', builtOn: '2026-09-10', testedOn: '2026-09-12' }),
    b('C-009', { ...base, activationTime: 3, activationTemp: 350, binder: 30, gdl: 'carbon paper' }, { parent: 'C-007', changeNote: 'carbon-paper GDL', builtOn: '2026-09-16', testedOn: '2026-09-18' }),
    b('C-010', { ...base, activationTime: 3, activationTemp: 350, binder: 30, cellTemp: 180 }, { parent: 'C-007', changeNote: 'cell at 180 °C', builtOn: '2026-09-23', testedOn: '2026-09-25', status: 'reviewed', durability: { hours: 3000, rateUvPerH: 5.2 } }),
    b('C-011', { ...base, activationTime: 3, activationTemp: 350, binder: 30, cellTemp: 180 }, { parent: 'C-010', lot: 'FNC-24-11', changeNote: 'new catalyst lot FNC-24-11', builtOn: '2026-09-30', testedOn: '2026-10-02' }),
    b('C-012', { ...base, activationTime: 3, activationTemp: 350, binder: 40, cellTemp: 180 }, { parent: 'C-010', changeNote: 'binder pushed to 40 wt %', builtOn: '2026-10-06', testedOn: '2026-10-08' }),
    b('C-013', { ...base, activationTime: 4, activationTemp: 380, binder: 30, cellTemp: 180 }, { parent: 'C-010', changeNote: 'activation 4 h at 380 °C', builtOn: '2026-10-13', testedOn: '2026-10-15', status: 'discarded', }),
    b('C-014', { binder: 10, activationTemp: 320, activationTime: 2, gdl: 'woven carbon', cellTemp: 170 }, { lab: 'kestrel', operator: 'partner', changeNote: 'partner check: low binder', builtOn: '2026-10-01', testedOn: '2026-10-06', lot: 'FNC-24-07' }),
    b('C-015', { binder: 25, activationTemp: 340, activationTime: 2, gdl: 'carbon paper', cellTemp: 170 }, { lab: 'kestrel', operator: 'partner', changeNote: 'partner check: mid recipe', builtOn: '2026-10-02', testedOn: '2026-10-07' }),
    b('C-016', { binder: 35, activationTemp: 360, activationTime: 2, gdl: 'woven carbon', cellTemp: 190 }, { lab: 'kestrel', operator: 'partner', changeNote: 'partner check: high binder, hot cell', builtOn: '2026-10-03', testedOn: '2026-10-08' }),
    b('C-017', { binder: 15, activationTemp: 370, activationTime: 4, gdl: 'carbon paper', cellTemp: 160 }, { lab: 'ridgeway', operator: 'partner2', changeNote: 'supplier check on own GDL', builtOn: '2026-10-05', testedOn: '2026-10-09' }),
    b('C-018', { binder: 30, activationTemp: 350, activationTime: 3, gdl: 'woven carbon', cellTemp: 200 }, { parent: 'C-010', changeNote: 'cell at 200 °C', builtOn: '2026-10-20', testedOn: '2026-10-22' }),
    b('C-019', { binder: 25, activationTemp: 335, activationTime: 2, gdl: 'woven carbon', cellTemp: 175 }, { changeNote: 'design centre point', builtOn: '2026-10-27', testedOn: '2026-10-29' }),
    b('C-020', { binder: 25, activationTemp: 335, activationTime: 2, gdl: 'woven carbon', cellTemp: 175 }, { replicateOf: 'C-019', changeNote: 'design centre point (replicate)', builtOn: '2026-10-27', testedOn: '2026-10-29' }),
    b('C-021', { binder: 32, activationTemp: 355, activationTime: 3, gdl: 'woven carbon', cellTemp: 185 }, { parent: 'C-010', changeNote: 'next recipe from the surface', status: 'planned', builtOn: '2026-11-24', plannedOn: '2026-11-17' }),
    // the lot question: the C-010 recipe once more on each lot, so the lot page has two builds a lot to judge the scale-up by
    b('C-022', { ...base, activationTime: 3, activationTemp: 350, binder: 30, cellTemp: 180 }, { parent: 'C-010', replicateOf: 'C-011', lot: 'FNC-24-11', changeNote: 'replicate: scale-up lot FNC-24-11', builtOn: '2026-10-07', testedOn: '2026-10-09', status: 'reviewed' }),
    b('C-023', { ...base, activationTime: 3, activationTemp: 350, binder: 30, cellTemp: 180 }, { parent: 'C-007', replicateOf: 'C-010', changeNote: 'replicate: cell at 180 °C on the small lot', builtOn: '2026-10-07', testedOn: '2026-10-09', status: 'reviewed' }),
  ];
}

const anodeConditions: TestConditions = { temperatureC: 200, anodeGas: 'methanol/water vapour', cathodeGas: 'air', backPressureKPa: 0, anodeStoich: 2.0, cathodeStoich: 2.5 };

/** Anode campaign: Ru fraction, anode loading, cell temperature, support. */
function anodeBuilds(): DemoBuild[] {
  const b = (code: string, f: Record<string, number | string>, extra: Partial<DemoBuild>): DemoBuild => ({
    code,
    factors: f,
    conditions: { ...anodeConditions, temperatureC: Number(f.cellTemp) },
    loadingMgCm2: Number(f.anodeLoading ?? 1.0),
    metalLoadingMgCm2: Number(f.anodeLoading ?? 1.0) * 0.4,
    areaCm2: 16,
    lot: 'PRA-26-02',
    lab: 'home',
    operator: 'researcher',
    status: 'tested',
    builtOn: '2026-10-01',
    ...extra,
  });
  const base = { ruFraction: 30, anodeLoading: 1.0, cellTemp: 200, support: 'carbon black' };
  return [
    b('A-001', base, { changeNote: 'baseline PtRu/C anode', builtOn: '2026-10-01', testedOn: '2026-10-03', status: 'reviewed', responses: { costPerCm2: 0.84 } }),
    b('A-002', base, { replicateOf: 'A-001', changeNote: 'replicate of baseline', builtOn: '2026-10-02', testedOn: '2026-10-04', responses: { costPerCm2: 0.84 } }),
    b('A-003', { ...base, ruFraction: 45 }, { parent: 'A-001', changeNote: 'more Ru', builtOn: '2026-10-08', testedOn: '2026-10-10', responses: { costPerCm2: 0.79 } }),
    b('A-004', { ...base, ruFraction: 45, cellTemp: 220 }, { parent: 'A-003', changeNote: 'cell at 220 °C', builtOn: '2026-10-15', testedOn: '2026-10-17', responses: { costPerCm2: 0.79 } }),
    b('A-005', { ...base, ruFraction: 45, cellTemp: 220, anodeLoading: 1.5 }, { parent: 'A-004', changeNote: 'heavier anode', builtOn: '2026-10-22', testedOn: '2026-10-24', responses: { costPerCm2: 1.18 } }),
    b('A-006', { ...base, ruFraction: 45, cellTemp: 220, support: 'graphitised carbon' }, { parent: 'A-004', changeNote: 'graphitised support', builtOn: '2026-10-29', testedOn: '2026-10-31', responses: { costPerCm2: 0.88 } }),
    b('A-007', { ...base, ruFraction: 60, cellTemp: 220 }, { parent: 'A-004', changeNote: 'Ru pushed to 60 at %', builtOn: '2026-11-05', testedOn: '2026-11-07', lab: 'ridgeway', operator: 'partner2', responses: { costPerCm2: 0.74 } }),
    b('A-008', { ...base, ruFraction: 45, cellTemp: 240, anodeLoading: 1.0 }, { parent: 'A-004', changeNote: 'cell at 240 °C', status: 'planned', builtOn: '2026-11-26', plannedOn: '2026-11-19' }),
    // a temperature series of one recipe (160/180/200 °C) and a pressure series at 200 °C
    ...[160, 180, 200].map((cellTemp, index) =>
      b(`A-0${10 + index}`, { ...base, ruFraction: 40, cellTemp }, { parent: 'A-003', changeNote: `temperature series: cell at ${cellTemp} °C`, builtOn: '2026-11-02', testedOn: '2026-11-04', status: 'reviewed', series: { kind: 'temperature', index }, impedanceAt: 0.2, responses: { costPerCm2: 0.79 } }),
    ),
    ...[0, 50, 100, 150].map((backPressureKPa, index) => ({
      ...b(`A-0${13 + index}`, { ...base, ruFraction: 40, anodeLoading: 1.5, cellTemp: 200 }, { parent: 'A-003', changeNote: `pressure series: ${backPressureKPa} kPa(g) back-pressure`, builtOn: '2026-11-09', testedOn: '2026-11-11', status: 'reviewed', series: { kind: 'pressure', index }, responses: { costPerCm2: 0.79 } }),
      conditions: { ...anodeConditions, backPressureKPa },
    })),
    b('A-017', { ...base, ruFraction: 40, anodeLoading: 2.0, cellTemp: 200 }, { parent: 'A-003', changeNote: '100 h open-circuit hold at 200 °C', builtOn: '2026-11-12', testedOn: '2026-11-16', status: 'reviewed', impedanceAt: 0.2, hold: { hours: 100, decayMvPerH: 0.9 } }),
    b('A-018', { ...base, ruFraction: 40, anodeLoading: 2.0, cellTemp: 200, support: 'graphitised carbon' }, { parent: 'A-003', changeNote: 'accelerated test at 0.6 A/cm², graphitised support', builtOn: '2026-11-12', testedOn: '2026-11-16', status: 'reviewed', accelerated: { hours: 1500, onsetHours: 900 }, hold: { hours: 100, decayMvPerH: 0.4 } }),
  ];
}

export const PROJECTS: DemoProject[] = [
  {
    name: 'PGM-free cathode for 180 °C stacks',
    description: 'Fe–N–C cathode on PBI/phosphoric-acid MEAs: binder fraction, oven activation and GDL choice, tested in H2/air. Target: 0.50 V at 0.2 A/cm² and under 8 µV/h.',
    codePrefix: 'C',
    settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' },
    factors: [
      { key: 'binder', label: 'PTFE binder', unit: 'wt %', kind: 'continuous', low: 10, high: 40 },
      { key: 'activationTemp', label: 'Activation temperature', unit: '°C', kind: 'continuous', low: 300, high: 380 },
      { key: 'activationTime', label: 'Activation time', unit: 'h', kind: 'continuous', low: 1, high: 4 },
      { key: 'gdl', label: 'GDL', unit: '', kind: 'categorical', levels: ['woven carbon', 'carbon paper'] },
      { key: 'cellTemp', label: 'Operating temperature', unit: '°C', kind: 'continuous', low: 160, high: 200, testVariable: true },
    ],
    responses: [{ key: 'thicknessUm', label: 'Electrode thickness', unit: 'µm', goal: 'target' }],
    members: { pi: 'pi', researcher: 'researcher', partner: 'partner', viewer: 'viewer', partner2: 'partner' },
    builds: cathodeBuilds(),
    lots: [
      { name: 'FNC-24-07', maker: 'own synthesis bench', batchSizeG: 5, madeOn: '2026-07-28', metalWtPct: 2.0, notes: 'small batch: pyrolysed in the tube furnace, acid-washed once' },
      { name: 'FNC-24-11', maker: 'own scale-up reactor', batchSizeG: 60, madeOn: '2026-09-22', metalWtPct: 1.8, notes: 'scale-up of FNC-24-07 in the rotary kiln, same precursor ratio' },
    ],
    targets: [
      { metric: 'degradationRate', comparator: '<=', value: 8, unit: 'µV/h', conditions: '0.2 A/cm², 180 °C, H2/air, ambient pressure', dueDate: '2026-12-15', name: 'Durability gate' },
      { metric: 'vAtRef', comparator: '>=', value: 650, unit: 'mV', conditions: '0.2 A/cm², 180 °C, H2/air, iR-free', dueDate: '2027-03-31', name: 'Stack-ready voltage' },
    ],
    benchmark: { build: 'C-001', note: 'the group’s standard cathode MEA (baseline recipe, lot FNC-24-07)' },
    reference: {
      label: 'Round-robin cathode MEA (invented)',
      source: 'Invented inter-lab round-robin report RR-7, figure 4 (digitised)',
      sourceDate: '2025-06-30',
      conditions: { temperatureC: 160, anodeGas: 'H2', cathodeGas: 'air', backPressureKPa: 0 },
      loadingMgCm2: 3.0,
      metalLoadingMgCm2: 0.06,
      areaCm2: 25,
      exchangeCurrentDensity: 2.4e-5,
      resistance: 0.13,
    },
  },
  {
    name: 'Methanol-tolerant anode at 200–240 °C',
    description: 'PtRu anode for cells fed methanol/water vapour: Ru fraction, loading, support and cell temperature. Trade activity against noble-metal cost.',
    codePrefix: 'A',
    settings: { refCurrentDensity: 0.2, refVoltage: 0.5, irFree: true, loadingBasis: 'metal', metalPrices: [{ metal: 'PtRu', pricePerGram: 29.5, currency: 'EUR', date: '2026-11-02', source: 'invented supplier quote, alloy blend per g' }] },
    factors: [
      { key: 'ruFraction', label: 'Ru fraction', unit: 'at %', kind: 'continuous', low: 20, high: 60 },
      { key: 'anodeLoading', label: 'Anode loading', unit: 'mg/cm²', kind: 'continuous', low: 0.5, high: 2.0 },
      { key: 'cellTemp', label: 'Operating temperature', unit: '°C', kind: 'continuous', low: 180, high: 240, testVariable: true },
      { key: 'support', label: 'Support', unit: '', kind: 'categorical', levels: ['carbon black', 'graphitised carbon'] },
    ],
    responses: [{ key: 'costPerCm2', label: 'Noble-metal cost', unit: '€/cm²', goal: 'minimize' }],
    members: { pi: 'pi', researcher: 'researcher', viewer: 'viewer', partner2: 'partner' },
    builds: anodeBuilds(),
    lots: [
      { name: 'PRA-26-02', maker: 'Quillstone Catalyst Works (supplier)', batchSizeG: 10, madeOn: '2026-09-15', metalWtPct: 40, notes: 'PtRu/C, received with certificate of analysis' },
      { name: 'PRA-26-05', maker: 'Quillstone Catalyst Works (supplier)', batchSizeG: 100, madeOn: '2026-11-10', metalWtPct: 39.5, notes: 'scale-up batch of the same grade; no builds yet' },
    ],
    targets: [
      { metric: 'costPerCm2', comparator: '<=', value: 0.8, unit: '€/cm²', conditions: 'the programme’s reference metal prices', dueDate: '2026-12-31', name: 'Cost ceiling' },
      { metric: 'vAtRef', comparator: '>=', value: 750, unit: 'mV', conditions: '0.2 A/cm², 220 °C, methanol/water vapour vs air, iR-free', dueDate: '2027-06-30', name: 'Methanol-fed voltage' },
    ],
    benchmark: { build: 'A-001', note: 'the baseline PtRu/C anode every change is judged against' },
  },
];

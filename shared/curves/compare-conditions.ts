// Conditions a file states (temperature, area, gases, back-pressure) against what the build
// records: every difference becomes a mismatch for the uploader to settle.
import type { FileConditions } from './types';
import { LOWEST_ABSOLUTE_KPA, STANDARD_ATMOSPHERE_KPA } from './read-conditions';

export type ConditionField = 'temperatureC' | 'areaCm2' | 'anodeGas' | 'cathodeGas' | 'backPressureKPa';

/** One condition on which the file and the build's record differ. */
export interface ConditionMismatch {
  field: ConditionField;
  label: string;
  fileValue: number | string;
  buildValue: number | string;
  /** unit of both values ('' for gases) */
  unit: string;
  /** the values as written, when that differs from the comparable number (back-pressure) */
  fileStated?: string;
  buildStated?: string;
  /** which one the uploader said is right, once chosen */
  chosen?: 'file' | 'build';
}

/** What the build records; back-pressure is gauge (kPa), as the build form asks for it. */
export interface BuildConditionRecord {
  areaCm2: number | null;
  testConditions: {
    temperatureC?: number | null;
    anodeGas?: string | null;
    cathodeGas?: string | null;
    backPressureKPa?: number | null;
  } | null;
}

// Differences below these are rounding or set point vs reading, not a different test
// (common practice in the trade: cells are held to ±1 °C, areas machined to ~1 %).
const TOLERANCE = { temperatureC: 1, areaRelative: 0.02, backPressureKPa: 5 };

const GAS_NAMES: readonly [RegExp, string][] = [
  [/^(?:h2|hydrogen|pure h2)$/, 'H2'],
  [/^(?:o2|oxygen|pure o2)$/, 'O2'],
  [/^(?:air|synthetic air|synth\.? air|dry air|compressed air)$/, 'air'],
  [/^(?:n2|nitrogen)$/, 'N2'],
  [/methanol|meoh|ch3oh/, 'methanol'],
  [/dimethyl ether|^dme\b/, 'dimethyl ether'],
  [/reformate/, 'reformate'],
];

/** A gas as written → a comparable name ("Hydrogen" and "H2" are one gas). */
export function canonicalGas(text: string): string {
  const plain = text.normalize('NFKC').toLowerCase().replace(/[₂]/g, '2').replace(/\s+/g, ' ').trim();
  for (const [pattern, name] of GAS_NAMES) if (pattern.test(plain)) return name;
  return plain.replace(/\s/g, '');
}

function round(value: number, digits: number): number {
  return Number(value.toFixed(digits));
}

/**
 * File conditions vs the build's record → mismatches (and notes for what the file states but
 * the build does not record). Tolerances: 1 °C, 2 % of the area, 5 kPa; gases by name
 * ("hydrogen" = "H2"). Back-pressure is compared absolute: the build's gauge value plus the
 * standard atmosphere (101.325 kPa); a file value that does not say gauge or absolute matches
 * when either reading does.
 * Cost: O(1).
 * @example compareConditions({ raw: {}, temperatureC: 180 }, { areaCm2: 25, testConditions: { temperatureC: 170 } }).mismatches[0].field // 'temperatureC'
 */
export function compareConditions(file: FileConditions, build: BuildConditionRecord): { mismatches: ConditionMismatch[]; notes: string[] } {
  const mismatches: ConditionMismatch[] = [];
  const notes: string[] = [];
  const recorded = build.testConditions ?? {};

  if (file.temperatureC !== undefined) {
    const buildValue = recorded.temperatureC;
    if (buildValue == null) notes.push(`the file states a cell temperature of ${round(file.temperatureC, 1)} °C; the build records none`);
    else if (Math.abs(file.temperatureC - buildValue) > TOLERANCE.temperatureC) {
      mismatches.push({ field: 'temperatureC', label: 'Cell temperature', fileValue: round(file.temperatureC, 1), buildValue, unit: '°C' });
    }
  }
  if (file.areaCm2 !== undefined) {
    const buildValue = build.areaCm2;
    if (buildValue == null) notes.push(`the file states an active area of ${round(file.areaCm2, 3)} cm²; the build records none`);
    else if (Math.abs(file.areaCm2 - buildValue) > TOLERANCE.areaRelative * buildValue) {
      const mismatch: ConditionMismatch = { field: 'areaCm2', label: 'Active area', fileValue: round(file.areaCm2, 3), buildValue, unit: 'cm²' };
      if (file.areaStated !== undefined) mismatch.fileStated = file.areaStated;
      mismatches.push(mismatch);
    }
  }
  for (const [field, label, fileGas, buildGas] of [
    ['anodeGas', 'Anode gas', file.anodeGas, recorded.anodeGas],
    ['cathodeGas', 'Cathode gas', file.cathodeGas, recorded.cathodeGas],
  ] as const) {
    if (fileGas === undefined) continue;
    if (buildGas == null || buildGas.trim() === '') notes.push(`the file states the ${label.toLowerCase()} as ${fileGas}; the build records none`);
    else if (canonicalGas(fileGas) !== canonicalGas(buildGas)) mismatches.push({ field, label, fileValue: fileGas, buildValue: buildGas, unit: '' });
  }
  if (file.backPressureKPa !== undefined) {
    const gauge = recorded.backPressureKPa;
    if (gauge == null) notes.push(`the file states a back-pressure of ${file.backPressureStated ?? `${round(file.backPressureKPa, 1)} kPa absolute`}; the build records none`);
    else {
      const buildAbsolute = gauge + STANDARD_ATMOSPHERE_KPA;
      const readings = [file.backPressureKPa];
      // an unmarked value read as absolute could also be gauge
      if (file.backPressureBasis === 'unstated' && file.backPressureKPa >= LOWEST_ABSOLUTE_KPA) readings.push(file.backPressureKPa + STANDARD_ATMOSPHERE_KPA);
      if (readings.every((reading) => Math.abs(reading - buildAbsolute) > TOLERANCE.backPressureKPa)) {
        mismatches.push({
          field: 'backPressureKPa',
          label: 'Back-pressure',
          fileValue: round(file.backPressureKPa, 1),
          buildValue: round(buildAbsolute, 1),
          unit: 'kPa absolute',
          fileStated: file.backPressureStated ?? `${round(file.backPressureKPa, 1)} kPa`,
          buildStated: `${gauge} kPa(g)`,
        });
      }
    }
  }
  return { mismatches, notes };
}

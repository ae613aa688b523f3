import type { OnsetRule, SurvivalAt, SurvivalStep, SurvivalUnit } from '../durability';
// Answer of GET /api/projects/:id/durability: every durability / hold curve of a project's builds
// with its rate, 95 % interval, hours run, break-in and held conditions (from stored summaries).

export interface DurabilityRow {
  curveId: number;
  buildId: number;
  code: string;
  status: string;
  labName: string | null;
  kind: 'durability' | 'hold';
  label: string;
  /** µV/h, positive = losing voltage */
  degradationRate: number | null;
  low: number | null;
  high: number | null;
  hoursRun: number | null;
  breakInHours: number | null;
  breakInSource: string | null;
  voltageLossMv: number | null;
  hoursToLoss: number | null;
  projectedHoursToLoss: number | null;
  lossFraction: number | null;
  interruptions: number;
  /** held current density, A/cm² (median of the log) */
  currentDensity: number | null;
  /** cell temperature, °C: the log's median, else the build's test conditions */
  temperatureC: number | null;
  note: string | null;
  /** the build's curve of record of this kind; comparisons use these rows */
  isRecord: boolean;
  /** durability: hours to the onset of rapid failure, null when none was found (see onsetNote) */
  onsetHours: number | null;
  onsetNote: string | null;
  /** the onset rule used, as JSON text */
  onsetRule: string | null;
  /** hold: open-circuit voltage decay, mV/h, with its 95 % interval, and the loss over the hold, mV */
  holdDecay: number | null;
  holdDecayLow: number | null;
  holdDecayHigh: number | null;
  holdLoss: number | null;
  /** the settling rule used, as JSON text */
  holdRule: string | null;
}

export interface DurabilityComparison {
  curves: DurabilityRow[];
  typicalBand: { standard: readonly [number, number]; improved: number };
  /** Kaplan–Meier survival of the durability logs of record (failure = onset), or null without logs */
  survival: {
    units: (SurvivalUnit & { code: string })[];
    steps: SurvivalStep[];
    medianHours: number | null;
    method: string;
    reached: SurvivalAt[];
  } | null;
  /** the default onset rule (a project setting or a curve option overrides it) */
  onsetRule: OnsetRule;
}

// The review pack: what a PI hands out before a programme review, as one answer.
import type { GainsData } from './lineage';
import type { TargetView } from '../schemas/targets';

export interface ReviewPackBuild {
  buildId: number;
  code: string;
  status: string;
  testedOn: string | null;
  changeNote: string | null;
  /** curve metrics of record and hand-entered responses, internal units */
  values: Record<string, number | null>;
}

export interface ReviewPackDurability {
  buildId: number;
  code: string;
  /** µV/h, positive = losing voltage */
  degradationRate: number | null;
  low: number | null;
  high: number | null;
  hoursRun: number | null;
  breakInHours: number | null;
}

export interface ReviewPackThread {
  buildId: number;
  code: string;
  testedOn: string | null;
  /** whole days since the build was tested (or last changed), as of the pack's date */
  waitingDays: number | null;
  lastComment: { author: string; body: string; at: string } | null;
}

export interface ReviewPack {
  project: { id: number; name: string; description: string; codePrefix: string; refCurrentDensity: number; refVoltage: number };
  period: { from: string | null; to: string | null };
  generatedAt: string;
  /** the response the pack ranks builds by and draws the waterfall of */
  response: { key: string; label: string; unit: string; goal: string };
  /** the programme's targets with their status (met by which build, or best so far and the gap) */
  targets: TargetView[];
  gains: GainsData | null;
  /** why there is no waterfall, when there is none */
  gainsNote: string | null;
  topBuilds: ReviewPackBuild[];
  durability: ReviewPackDurability[];
  openThreads: ReviewPackThread[];
}

// Messages between the upload parse pool (main thread) and its worker threads.
import type { ReadResult } from '../curves/read-upload';
import type { WorkbookLimits } from './workbook-guard';
import type { CurveData } from '../../shared/curves/types';
import type { DurabilityMetrics, DurabilityOptions, OnsetRule } from '../../shared/durability';
import type { OnsetOutcome } from '../curves/kind-metrics';

export interface ParseRequest {
  type?: 'parse';
  id: number;
  path: string;
  sheet?: string;
  maxRows: number;
  limits: WorkbookLimits;
}

/** The durability fit of a mapped curve, run beside the parse so a long log does not hold the event loop. */
export interface DurabilityRequest {
  type: 'durability';
  id: number;
  curve: CurveData;
  options: DurabilityOptions;
  /** also search the log for the onset of rapid failure with this rule (its start is the fit's break-in unless `startGiven`) */
  onset?: { rule: OnsetRule; startGiven: boolean };
}

export type WorkerRequest = ParseRequest | DurabilityRequest;

export type SerializedError =
  | { kind: 'curve'; code: string; message: string; line: number | null; column: number | string | null }
  | { kind: 'app'; status: number; code: string; message: string; details: unknown }
  | { kind: 'range'; message: string }
  | { kind: 'other'; message: string };

export type ParseReply =
  | { id: 0; type: 'ready' }
  | { id: number; type: 'bytes'; bytes: number }
  | { id: number; type: 'done'; result: ReadResult }
  | { id: number; type: 'durability'; curve: CurveData; metrics: DurabilityMetrics; onset?: OnsetOutcome }
  | { id: number; type: 'error'; error: SerializedError };

/** The distinct buffers under a curve's columns, to move them between threads instead of copying. */
export function curveBuffers(curve: CurveData): ArrayBuffer[] {
  const buffers = new Set<ArrayBuffer>();
  for (const value of Object.values(curve)) if (value instanceof Float64Array) buffers.add(value.buffer as ArrayBuffer);
  return [...buffers];
}

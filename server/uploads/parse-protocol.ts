// Messages between the upload parse pool (main thread) and its worker threads.
import type { ReadResult } from '../curves/read-upload';
import type { WorkbookLimits } from './workbook-guard';
import type { ColumnMapping, CurveData } from '../../shared/curves/types';
import type { AppliedCurve, ParsedTable } from '../../shared/curves';
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

/**
 * A parsed log mapped to a curve (applyMapping, checkEnoughData) and then measured
 * (durabilityMetrics, and with `onset` the onset search, its start the fit's break-in unless
 * `startGiven`), in one job: the table's columns move to the worker and come back as the curve's,
 * and the event loop holds none of the passes over a million rows.
 */
export interface MapAndMeasureRequest {
  type: 'map-durability';
  id: number;
  table: ParsedTable;
  mapping: ColumnMapping;
  kind: 'durability' | 'hold';
  areaCm2: number | null;
  options: DurabilityOptions;
  onset?: { rule: OnsetRule; startGiven: boolean };
}

/**
 * A text file read while it is received: `stream-start`, then its bytes in order (`stream-chunk`,
 * moved not copied), then `stream-end`; `stream-abort` drops it. The worker answers `done`, `error`,
 * or `not-text` when the file's head is a workbook (read from disk once received instead).
 */
export interface StreamStart {
  type: 'stream-start';
  id: number;
  maxRows: number;
  /** an upper bound of the file's size (the request's length), to size the columns once */
  sizeHintBytes?: number;
}
export type StreamMessage = StreamStart | { type: 'stream-chunk'; id: number; bytes: Uint8Array } | { type: 'stream-end'; id: number } | { type: 'stream-abort'; id: number };

export type WorkerRequest = ParseRequest | MapAndMeasureRequest | StreamMessage;

export type SerializedError =
  | { kind: 'curve'; code: string; message: string; line: number | null; column: number | string | null }
  | { kind: 'app'; status: number; code: string; message: string; details: unknown }
  | { kind: 'range'; message: string }
  | { kind: 'other'; message: string };

export type ParseReply =
  | { id: 0; type: 'ready' }
  | { id: number; type: 'bytes'; bytes: number }
  | { id: number; type: 'done'; result: ReadResult }
  | { id: number; type: 'not-text' }
  /** a received piece read and done with, moved back to be filled again (a stream's memory stays a few pieces) */
  | { id: number; type: 'stream-piece'; bytes: Uint8Array }
  | { id: number; type: 'map-durability'; curve: AppliedCurve; metrics: DurabilityMetrics; onset?: OnsetOutcome }
  /** a map-and-measure job refused: at which stage, and the table's line numbers back */
  | { id: number; type: 'map-error'; stage: 'map' | 'fit'; error: SerializedError; dataLines: Int32Array }
  | { id: number; type: 'error'; error: SerializedError };

/** The buffers of a parsed table's columns and line numbers, to move the table between threads. */
export function tableBuffers(result: ReadResult): ArrayBuffer[] {
  const buffers = new Set<ArrayBuffer>();
  for (const column of result.table.columns) if (column) buffers.add(column.buffer as ArrayBuffer);
  buffers.add(result.table.dataLines.buffer as ArrayBuffer);
  return [...buffers];
}

/** The distinct buffers under a curve's columns, to move them between threads instead of copying. */
export function curveBuffers(curve: CurveData): ArrayBuffer[] {
  const buffers = new Set<ArrayBuffer>();
  for (const value of Object.values(curve)) if (value instanceof Float64Array) buffers.add(value.buffer as ArrayBuffer);
  return [...buffers];
}

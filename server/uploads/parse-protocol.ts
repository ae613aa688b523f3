// Messages between the upload parse pool (main thread) and its worker threads.
import type { ReadResult } from '../curves/read-upload';
import type { WorkbookLimits } from './workbook-guard';

export interface ParseRequest {
  id: number;
  path: string;
  sheet?: string;
  maxRows: number;
  limits: WorkbookLimits;
}

export type SerializedError =
  | { kind: 'curve'; code: string; message: string; line: number | null; column: number | string | null }
  | { kind: 'app'; status: number; code: string; message: string; details: unknown }
  | { kind: 'other'; message: string };

export type ParseReply =
  | { id: 0; type: 'ready' }
  | { id: number; type: 'bytes'; bytes: number }
  | { id: number; type: 'done'; result: ReadResult }
  | { id: number; type: 'error'; error: SerializedError };

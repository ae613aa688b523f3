// Uploaded files are parsed off the main event loop, in a small pool of worker threads with a
// memory limit each and a time limit per file, so one hostile or huge upload can never stall
// the requests of everyone else (health checks, lists, curve reads). A worker that runs out of
// time or memory is ended and replaced; the upload gets a 422 naming the limit.
import fs from 'node:fs';
import { createHash } from 'node:crypto';
import os from 'node:os';
import { Worker } from 'node:worker_threads';
import type { Env } from '../env';
import { CurveFileError } from '../../shared/curves/types';
import { MAX_CELLS_PER_ROW } from '../../shared/curves/parse-delimited';
import { AppError } from '../lib/errors';
import type { ReadOptions, ReadResult } from '../curves/read-upload';
import type { WorkbookLimits } from './workbook-guard';
import { guardedCopyPath } from './guarded-read';
import type { ColumnMapping } from '../../shared/curves/types';
import type { AppliedCurve, ParsedTable } from '../../shared/curves';
import type { DurabilityMetrics, DurabilityOptions, OnsetRule } from '../../shared/durability';
import type { OnsetOutcome } from '../curves/kind-metrics';
import { tableBuffers, type ParseReply, type SerializedError, type StreamMessage, type WorkerRequest } from './parse-protocol';

export interface ParsePoolOptions {
  workers: number;
  timeoutMs: number;
  memoryMb: number;
}

interface Job {
  request: WorkerRequest;
  fileName: string;
  onBytes?: (bytes: number) => void;
  resolve: (result: never) => void;
  reject: (error: unknown) => void;
  /** a table moved to the worker to be mapped: its line numbers come back to it */
  table?: ParsedTable;
  /** a file read while it is received: its messages wait here until the worker has the job */
  stream?: { waiting: { message: StreamMessage; transfer: ArrayBuffer[] }[]; send: ((message: StreamMessage, transfer: ArrayBuffer[]) => void) | null; ended: boolean; onEnd: (() => void) | null; settled: boolean; abort: (() => void) | null; recycle: ((bytes: Uint8Array) => void) | null };
}

/** A text file read by a worker while the upload is received (ParsePool.parseStream). */
export interface ParseStream {
  /** the next bytes received (copied: the caller may reuse its buffer; given to `onPiece` in 1 MB pieces) */
  push(bytes: Uint8Array): void;
  /** every byte was pushed: the table, or null when the file is a workbook (read it from disk once received) */
  end(): Promise<ReadResult | null>;
  /** the upload was refused or broke off: the worker drops what it read */
  abort(): void;
}

/** Received bytes go to the worker in pieces of this size (fewer messages, each moved not copied). */
const STREAM_PIECE_BYTES = 1 << 20;

const WORKER_ENTRY = new URL('./parse-worker-boot.mjs', import.meta.url);

/** Default pool size: one thread per spare core, at least one, at most four. */
export function defaultParseWorkers(): number {
  const cores = typeof os.availableParallelism === 'function' ? os.availableParallelism() : os.cpus().length;
  return Math.max(1, Math.min(4, cores - 1));
}

function rebuild(error: SerializedError, fileName: string): Error {
  if (error.kind === 'curve') return new CurveFileError(error.code, error.message, { line: error.line ?? undefined, column: error.column ?? undefined });
  if (error.kind === 'app') return new AppError(error.status, error.code, `${fileName}: ${error.message}`, error.details);
  if (error.kind === 'range') return new RangeError(error.message);
  return new Error(error.message);
}

export class ParsePool {
  private readonly idle: Worker[] = [];
  private readonly all = new Set<Worker>();
  private readonly queue: Job[] = [];
  private nextId = 1;

  constructor(private readonly options: ParsePoolOptions) {}

  parse(path: string, options: ReadOptions, limits: WorkbookLimits, fileName = 'the file'): Promise<ReadResult> {
    return new Promise<ReadResult>((resolve, reject) => {
      this.queue.push({ request: { id: this.nextId++, path, sheet: options.sheet, maxRows: options.maxRows, limits }, fileName, onBytes: options.onBytes, resolve, reject });
      this.dispatch();
    });
  }

  /**
   * A text file parsed while it is received, on a worker it shares with other jobs (a free one if
   * there is one). The clock of the time limit runs from `end()`; the result is readUpload's for
   * the same bytes, or null for a workbook (read it from disk once received).
   */
  parseStream(options: { maxRows: number; sizeHintBytes?: number; fileName?: string; onPiece?: (bytes: Uint8Array) => void }): ParseStream {
    const id = this.nextId++;
    const stream: NonNullable<Job['stream']> = { waiting: [], send: null, ended: false, onEnd: null, settled: false, abort: null, recycle: null };
    const send = (message: StreamMessage, transfer: ArrayBuffer[] = []) => {
      if (stream.settled) return;
      if (stream.send) stream.send(message, transfer);
      else stream.waiting.push({ message, transfer });
    };
    // the bytes are hashed here as they are pushed: the worker's thread has the parse to do
    const hash = createHash('sha256');
    const result = new Promise<ReadResult | null>((resolve, reject) => {
      const job: Job = { request: { type: 'stream-start', id, maxRows: options.maxRows, sizeHintBytes: options.sizeHintBytes }, fileName: options.fileName ?? 'the file', resolve, reject, stream };
      // a stream shares a worker with whatever else it does: between pieces the thread waits on the
      // network, and a slow partner's upload must not hold the only worker for minutes
      this.run(this.workerForStream(), job, { shared: true });
    });
    // an aborted stream's refusal is nobody's business
    result.catch(() => {});
    // pieces the worker has read come back to be filled again
    const spare: Uint8Array[] = [];
    stream.recycle = (bytes) => {
      // once every byte is sent, a piece given back is let go (the request may live on for seconds)
      if (bytes.length === STREAM_PIECE_BYTES && !stream.ended) spare.push(bytes);
    };
    let piece: Uint8Array = new Uint8Array(STREAM_PIECE_BYTES);
    let filled = 0;
    const flush = () => {
      if (filled === 0) return;
      // `onPiece` (the file on disk) sees every byte in order, in pieces of 1 MB, even once the worker is done with the stream
      options.onPiece?.(piece.subarray(0, filled));
      if (stream.settled) {
        filled = 0;
        return;
      }
      // a whole piece is moved (a fresh or given-back one takes its place); a last, partial one is copied
      const whole = filled === piece.length;
      const bytes = whole ? piece : piece.slice(0, filled);
      send({ type: 'stream-chunk', id, bytes }, [bytes.buffer as ArrayBuffer]);
      if (whole) piece = spare.pop() ?? new Uint8Array(STREAM_PIECE_BYTES);
      filled = 0;
    };
    return {
      push(bytes) {
        if (stream.ended || (stream.settled && !options.onPiece)) return;
        if (!stream.settled) hash.update(bytes);
        let at = 0;
        while (at < bytes.length) {
          const take = Math.min(bytes.length - at, piece.length - filled);
          piece.set(bytes.subarray(at, at + take), filled);
          filled += take;
          at += take;
          if (filled === piece.length) flush();
        }
      },
      end() {
        if (!stream.ended) {
          flush();
          stream.ended = true;
          // the pieces kept for refilling are not needed any more
          spare.length = 0;
          piece = new Uint8Array(0);
          send({ type: 'stream-end', id });
          stream.onEnd?.();
        }
        return result.then((read) => read && { ...read, sha256: hash.copy().digest('hex') });
      },
      abort: () => {
        if (stream.settled) return;
        send({ type: 'stream-abort', id });
        stream.ended = true;
        stream.abort?.();
      },
    };
  }

  /**
   * applyMapping and checkEnoughData of a parsed log, then its durability fit (durabilityMetrics)
   * and, given a rule, the onset search from the fit's break-in, in one worker job: the table's columns are moved there and come back as
   * the curve's (the table keeps only what is not a column). A refusal says its stage: `map`
   * (the mapping or the data) or `fit` (the measuring).
   */
  mapAndMeasure(table: ParsedTable, mapping: ColumnMapping, curve: { kind: 'durability' | 'hold'; areaCm2: number | null }, options: DurabilityOptions, onset?: { rule: OnsetRule; startGiven: boolean }): Promise<{ curve: AppliedCurve; metrics: DurabilityMetrics; onset?: OnsetOutcome }> {
    return new Promise((resolve, reject) => {
      this.queue.push({ request: { type: 'map-durability', id: this.nextId++, table, mapping, kind: curve.kind, areaCm2: curve.areaCm2, options, onset }, fileName: 'the curve', resolve, reject, table });
      this.dispatch();
    });
  }

  /** A worker for a stream: a free one, else a new one while the pool has room, else the one with the fewest streams. */
  private workerForStream(): Worker {
    let worker = this.idle[this.idle.length - 1];
    if (!worker && this.all.size < this.options.workers) {
      worker = this.spawn();
      this.idle.push(worker);
    }
    if (!worker) worker = [...this.all].sort((a, b) => (this.streamsOn.get(a) ?? 0) - (this.streamsOn.get(b) ?? 0))[0]!;
    return worker;
  }
  private readonly streamsOn = new Map<Worker, number>();

  /** Threads running now (busy or idle), for tests and the health of the pool. */
  get size(): number {
    return this.all.size;
  }

  /** Files being parsed right now (streams being received included). */
  get busy(): number {
    return this.running + this.streaming;
  }
  private running = 0;
  private streaming = 0;

  async close(): Promise<void> {
    const workers = [...this.all];
    this.all.clear();
    this.idle.length = 0;
    await Promise.all(workers.map((w) => w.terminate()));
  }

  /** workers whose code has loaded (a fresh thread takes about a second to load tsx and the readers) */
  private readonly ready = new WeakMap<Worker, Promise<void>>();

  private spawn(): Worker {
    const worker = new Worker(WORKER_ENTRY, {
      // a small young generation: the parser's short-lived chunk strings are collected early,
      // which keeps the process's peak memory during a big upload near that of a main-thread parse
      resourceLimits: { maxOldGenerationSizeMb: this.options.memoryMb, maxYoungGenerationSizeMb: 16 },
    });
    this.all.add(worker);
    this.ready.set(worker, new Promise<void>((resolve, reject) => {
      const onMessage = (reply: ParseReply) => {
        if (reply.type !== 'ready') return;
        worker.off('message', onMessage);
        worker.off('error', reject);
        resolve();
      };
      worker.on('message', onMessage);
      worker.once('error', reject);
    }));
    // an idle worker must not keep the process alive
    worker.unref();
    return worker;
  }

  /** Start the threads now rather than with the first upload. */
  warm(): void {
    while (this.all.size < this.options.workers) this.idle.push(this.spawn());
  }

  private dispatch(): void {
    while (this.queue.length > 0) {
      let worker = this.idle.pop();
      if (!worker) {
        if (this.all.size >= this.options.workers) return;
        worker = this.spawn();
      }
      this.run(worker, this.queue.shift()!);
    }
  }

  private retire(worker: Worker): void {
    this.all.delete(worker);
    this.streamsOn.delete(worker);
    const at = this.idle.indexOf(worker);
    if (at >= 0) this.idle.splice(at, 1);
    void worker.terminate();
  }

  /** `shared`: the job does not take the worker out of the free ones (a stream, see parseStream). */
  private run(worker: Worker, job: Job, { shared = false } = {}): void {
    let settled = false;
    if (shared) {
      this.streaming++;
      this.streamsOn.set(worker, (this.streamsOn.get(worker) ?? 0) + 1);
    } else {
      this.running++;
      worker.ref();
    }
    const finish = (outcome: { result?: unknown; error?: unknown }, keepWorker: boolean) => {
      if (settled) return;
      settled = true;
      if (job.stream) job.stream.settled = true;
      if (shared) {
        this.streaming--;
        this.streamsOn.set(worker, (this.streamsOn.get(worker) ?? 1) - 1);
      } else this.running--;
      clearTimeout(timer);
      worker.off('message', onMessage);
      worker.off('error', onError);
      worker.off('exit', onExit);
      if (keepWorker) {
        if (!shared) {
          worker.unref();
          this.idle.push(worker);
        }
      } else {
        this.retire(worker);
        // an ended worker could not remove its guarded copy of a workbook
        if (job.request.type === undefined || job.request.type === 'parse') fs.rmSync(guardedCopyPath(job.request.path), { force: true });
      }
      if (outcome.error !== undefined) job.reject(outcome.error);
      else job.resolve(outcome.result as never);
      this.dispatch();
    };
    const onMessage = (reply: ParseReply) => {
      if (reply.type === 'ready' || reply.id !== job.request.id) return;
      if (reply.type === 'bytes') job.onBytes?.(reply.bytes);
      else if (reply.type === 'stream-piece') job.stream?.recycle?.(reply.bytes);
      else if (reply.type === 'done') finish({ result: reply.result }, true);
      else if (reply.type === 'not-text') finish({ result: null }, true);
      else if (reply.type === 'map-durability') {
        if (job.table) job.table.dataLines = reply.curve.dataLines;
        finish({ result: { curve: reply.curve, metrics: reply.metrics, onset: reply.onset } }, true);
      } else if (reply.type === 'map-error') {
        if (job.table) job.table.dataLines = reply.dataLines;
        finish({ error: Object.assign(rebuild(reply.error, job.fileName), { stage: reply.stage }) }, true);
      }
      else finish({ error: rebuild(reply.error, job.fileName) }, true);
    };
    const onError = (error: Error & { code?: string }) => {
      if (error.code === 'ERR_WORKER_OUT_OF_MEMORY') {
        finish({ error: new CurveFileError('parse-memory', `reading the file needed more than ${this.options.memoryMb} MB of memory, the limit per upload (UPLOAD_PARSE_MEMORY_MB); nothing was stored. Split the file or save it as CSV.`) }, false);
      } else {
        finish({ error }, false);
      }
    };
    const onExit = (code: number) => finish({ error: new Error(`the upload parse worker stopped (exit code ${code})`) }, false);
    worker.on('message', onMessage);
    worker.on('error', onError);
    worker.on('exit', onExit);
    let timer: ReturnType<typeof setTimeout> | undefined;
    const startClock = () => {
      timer = setTimeout(() => {
        finish({ error: new CurveFileError('parse-timeout', `reading the file took longer than ${Number((this.options.timeoutMs / 1000).toFixed(2))} s, the limit per upload (UPLOAD_PARSE_TIMEOUT_MS); nothing was stored. Split the file or save it as CSV.`) }, false);
      }, this.options.timeoutMs);
    };
    const stream = job.stream;
    if (stream) stream.abort = () => finish({ error: new Error('the upload was dropped') }, true);
    this.ready.get(worker)!.then(
      () => {
        if (settled) return;
        const request = job.request;
        if (stream) {
          // a file read while it is received: the bytes so far, then each as it comes; the clock
          // runs from its last byte (receiving is the network's time, not the reader's)
          worker.postMessage(request);
          stream.send = (message, transfer) => worker.postMessage(message, transfer);
          for (const { message, transfer } of stream.waiting.splice(0)) worker.postMessage(message, transfer);
          if (stream.ended) startClock();
          else stream.onEnd = startClock;
          return;
        }
        // the clock runs from when the loaded worker gets the file
        startClock();
        if (request.type === 'map-durability') worker.postMessage(request, tableBuffers({ table: request.table } as ReadResult));
        else worker.postMessage(request);
      },
      (error: unknown) => finish({ error }, false),
    );
  }
}

const pools = new Map<string, ParsePool>();

/** One pool per process and setting (tests run apps with different limits side by side). */
export function parsePool(env: Env): ParsePool {
  const options: ParsePoolOptions = { workers: env.UPLOAD_PARSE_WORKERS ?? defaultParseWorkers(), timeoutMs: env.UPLOAD_PARSE_TIMEOUT_MS, memoryMb: env.UPLOAD_PARSE_MEMORY_MB };
  const key = `${options.workers}|${options.timeoutMs}|${options.memoryMb}`;
  let pool = pools.get(key);
  if (!pool) {
    pool = new ParsePool(options);
    pools.set(key, pool);
  }
  return pool;
}

export function workbookLimits(env: Env): WorkbookLimits {
  return {
    maxPartBytes: env.UPLOAD_XLSX_MAX_PART_BYTES,
    maxTotalBytes: 2 * env.UPLOAD_XLSX_MAX_PART_BYTES,
    maxRatio: env.UPLOAD_XLSX_MAX_RATIO,
    maxCells: env.UPLOAD_XLSX_MAX_CELLS,
    maxColumns: MAX_CELLS_PER_ROW,
    // a few title rows above the data are fine
    maxRows: env.UPLOAD_MAX_ROWS + 1000,
  };
}

/** ParsePool.mapAndMeasure in the process's pool. */
export function mapAndMeasureInPool(env: Env, ...args: Parameters<ParsePool['mapAndMeasure']>) {
  return parsePool(env).mapAndMeasure(...args);
}

/** readUpload's work, in the pool: same options, same result, or the same errors. */
export function parseUpload(env: Env, path: string, options: ReadOptions, fileName?: string): Promise<ReadResult> {
  return parsePool(env).parse(path, options, workbookLimits(env), fileName);
}

// The upload parse worker: reads uploaded files (guarded workbook, delimited text from disk or as it
// is received) off the main event loop, under the memory limit the pool gave the thread, and sends
// the parsed table back with its column buffers transferred, not copied; a log's table comes back
// here to be mapped and measured (map-durability) in one job.
import { parentPort } from 'node:worker_threads';
import { CurveFileError } from '../../shared/curves/types';
import { AppError } from '../lib/errors';
import { readUploadGuarded } from './guarded-read';
import { durabilityMetrics } from '../../shared/durability';
import { withSelectionMemo } from '../../shared/stats/median';
import { onsetMetric } from '../curves/kind-metrics';
import { createTextReader, type TextReader } from '../curves/read-upload';
import { applyMapping, checkEnoughData, sniffBytes } from '../../shared/curves';
import type { AppliedCurve } from '../../shared/curves';
import type { CurveData } from '../../shared/curves/types';
import type { MapAndMeasureRequest } from './parse-protocol';
import { curveBuffers, tableBuffers, type StreamMessage, type WorkerRequest, type ParseReply, type SerializedError } from './parse-protocol';

function serialize(error: unknown): SerializedError {
  if (error instanceof CurveFileError) return { kind: 'curve', code: error.code, message: error.message, line: error.line ?? null, column: error.column ?? null };
  if (error instanceof AppError) return { kind: 'app', status: error.status, code: error.code, message: error.message, details: error.details ?? null };
  if (error instanceof RangeError) return { kind: 'range', message: error.message };
  return { kind: 'other', message: error instanceof Error ? error.message : String(error) };
}

const port = parentPort!;

/** The head sniffed for the kind and encoding: the first 64 kB, as a file read from disk gives. */
const HEAD_BYTES = 65536;

interface Streamed {
  maxRows: number;
  sizeHintBytes?: number;
  /** bytes before the head is complete */
  pending: Uint8Array[];
  pendingBytes: number;
  reader: TextReader | null;
}
const streams = new Map<number, Streamed>();

/** A piece read and done with goes back to the sender, to be filled again. */
function giveBack(id: number, bytes: Uint8Array) {
  port.postMessage({ id, type: 'stream-piece', bytes } satisfies ParseReply, [bytes.buffer as ArrayBuffer]);
}

function fail(id: number, error: unknown) {
  streams.delete(id);
  port.postMessage({ id, type: 'error', error: serialize(error) } satisfies ParseReply);
}

/** With the head complete (or the whole file shorter): a text reader, or `not-text` for a workbook. */
function startReading(id: number, state: Streamed): boolean {
  const all = new Uint8Array(state.pendingBytes);
  let at = 0;
  for (const piece of state.pending) {
    all.set(piece, at);
    at += piece.length;
    giveBack(id, piece);
  }
  state.pending = [];
  const head = all.subarray(0, HEAD_BYTES);
  if (sniffBytes(head) === 'xlsx') {
    streams.delete(id);
    port.postMessage({ id, type: 'not-text' } satisfies ParseReply);
    return false;
  }
  try {
    // the receiving thread hashes the bytes as they arrive (it waits on the network, this thread parses)
    state.reader = createTextReader(head, { maxRows: state.maxRows, sizeHintBytes: state.sizeHintBytes, hash: false });
    state.reader.push(all);
    return true;
  } catch (error) {
    fail(id, error);
    return false;
  }
}

function onStream(message: StreamMessage) {
  if (message.type === 'stream-start') {
    streams.set(message.id, { maxRows: message.maxRows, sizeHintBytes: message.sizeHintBytes, pending: [], pendingBytes: 0, reader: null });
    return;
  }
  const state = streams.get(message.id);
  // a stream that failed or was dropped: its remaining messages are for nothing
  if (!state) return;
  if (message.type === 'stream-abort') {
    streams.delete(message.id);
    return;
  }
  if (message.type === 'stream-chunk') {
    if (state.reader) {
      try {
        state.reader.push(message.bytes);
      } catch (error) {
        fail(message.id, error);
        return;
      }
      // the reader keeps no view of the bytes (a line left open is kept as text)
      giveBack(message.id, message.bytes);
      return;
    }
    state.pending.push(message.bytes);
    state.pendingBytes += message.bytes.length;
    if (state.pendingBytes >= HEAD_BYTES) startReading(message.id, state);
    return;
  }
  // stream-end
  if (!state.reader && !startReading(message.id, state)) return;
  streams.delete(message.id);
  try {
    const result = state.reader!.finish();
    port.postMessage({ id: message.id, type: 'done', result } satisfies ParseReply, tableBuffers(result));
  } catch (error) {
    fail(message.id, error);
  }
}
/** The durability fit, then the onset search with the fit's break-in as its start unless the rule says where. */
function measure(curve: CurveData, options: MapAndMeasureRequest['options'], onsetOf: MapAndMeasureRequest['onset']) {
  // the fit's median current and the onset's held current are one selection over the same column
  return withSelectionMemo(() => {
    const metrics = durabilityMetrics(curve, options);
    let onset;
    if (onsetOf) {
      const rule = { ...onsetOf.rule };
      if (!onsetOf.startGiven && metrics.breakInHours != null) rule.startHours = metrics.breakInHours;
      onset = onsetMetric(curve, rule);
    }
    return { metrics, onset };
  });
}

// the imports above are loaded: the pool starts a job's clock only from here
port.postMessage({ id: 0, type: 'ready' } satisfies ParseReply);
port.on('message', async (request: WorkerRequest) => {
  if (request.type === 'stream-start' || request.type === 'stream-chunk' || request.type === 'stream-end' || request.type === 'stream-abort') {
    onStream(request);
    return;
  }
  if (request.type === 'map-durability') {
    const { table } = request;
    let curve: AppliedCurve;
    try {
      curve = applyMapping(table, request.mapping, { kind: request.kind, areaCm2: request.areaCm2, reuseColumns: true });
      checkEnoughData(curve);
    } catch (error) {
      port.postMessage({ id: request.id, type: 'map-error', stage: 'map', error: serialize(error), dataLines: table.dataLines } satisfies ParseReply, [table.dataLines.buffer as ArrayBuffer]);
      return;
    }
    // the mapped columns live in the curve now (converted in place); the others go
    table.columns.fill(null);
    try {
      const { metrics, onset } = measure(curve, request.options, request.onset);
      port.postMessage({ id: request.id, type: 'map-durability', curve, metrics, onset } satisfies ParseReply, [...new Set([...curveBuffers(curve), curve.dataLines.buffer as ArrayBuffer])]);
    } catch (error) {
      port.postMessage({ id: request.id, type: 'map-error', stage: 'fit', error: serialize(error), dataLines: curve.dataLines } satisfies ParseReply, [curve.dataLines.buffer as ArrayBuffer]);
    }
    return;
  }
  let lastReport = 0;
  try {
    const result = await readUploadGuarded(request.path, {
      sheet: request.sheet,
      maxRows: request.maxRows,
      onBytes: (bytes) => {
        // a few progress messages a second is plenty
        const now = Date.now();
        if (now - lastReport < 100) return;
        lastReport = now;
        port.postMessage({ id: request.id, type: 'bytes', bytes } satisfies ParseReply);
      },
    }, request.limits);
    port.postMessage({ id: request.id, type: 'done', result } satisfies ParseReply, tableBuffers(result));
  } catch (error) {
    port.postMessage({ id: request.id, type: 'error', error: serialize(error) } satisfies ParseReply);
  }
});

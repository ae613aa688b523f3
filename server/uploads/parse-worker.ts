// The upload parse worker: reads one uploaded file at a time (guarded workbook or delimited
// text) off the main event loop, under the memory limit the pool gave the thread, and sends the
// parsed table back with its column buffers transferred, not copied.
import { parentPort } from 'node:worker_threads';
import { CurveFileError } from '../../shared/curves/types';
import { AppError } from '../lib/errors';
import { readUploadGuarded } from './guarded-read';
import { durabilityMetrics } from '../../shared/durability';
import { onsetMetric } from '../curves/kind-metrics';
import { curveBuffers, type WorkerRequest, type ParseReply, type SerializedError } from './parse-protocol';

function serialize(error: unknown): SerializedError {
  if (error instanceof CurveFileError) return { kind: 'curve', code: error.code, message: error.message, line: error.line ?? null, column: error.column ?? null };
  if (error instanceof AppError) return { kind: 'app', status: error.status, code: error.code, message: error.message, details: error.details ?? null };
  if (error instanceof RangeError) return { kind: 'range', message: error.message };
  return { kind: 'other', message: error instanceof Error ? error.message : String(error) };
}

const port = parentPort!;
// the imports above are loaded: the pool starts a job's clock only from here
port.postMessage({ id: 0, type: 'ready' } satisfies ParseReply);
port.on('message', async (request: WorkerRequest) => {
  if (request.type === 'durability') {
    try {
      const metrics = durabilityMetrics(request.curve, request.options);
      // the onset search after the fit, here too: it starts at the fit's break-in unless the rule says where
      let onset;
      if (request.onset) {
        const rule = { ...request.onset.rule };
        if (!request.onset.startGiven && metrics.breakInHours != null) rule.startHours = metrics.breakInHours;
        onset = onsetMetric(request.curve, rule);
      }
      // the columns go back as they came, moved rather than copied
      port.postMessage({ id: request.id, type: 'durability', curve: request.curve, metrics, onset } satisfies ParseReply, curveBuffers(request.curve));
    } catch (error) {
      port.postMessage({ id: request.id, type: 'error', error: serialize(error) } satisfies ParseReply);
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
    const buffers = new Set<ArrayBuffer>();
    for (const column of result.table.columns) if (column) buffers.add(column.buffer as ArrayBuffer);
    buffers.add(result.table.dataLines.buffer as ArrayBuffer);
    port.postMessage({ id: request.id, type: 'done', result } satisfies ParseReply, [...buffers]);
  } catch (error) {
    port.postMessage({ id: request.id, type: 'error', error: serialize(error) } satisfies ParseReply);
  }
});

// Processing progress of large uploads, kept in memory per process: the upload handler reports
// phase and fraction while it parses, measures and stores; the browser polls it by uploadId.
// Entries belong to the user who sent the file and expire a few minutes after they finish.

import type { UploadPhase, UploadProgress } from '../../shared/api-types';

interface Entry extends UploadProgress {
  userId: number;
  expiresAt: number;
}

/** how long a finished (done / error) entry stays readable, ms */
const KEEP_FINISHED_MS = 5 * 60_000;
/** how long an unfinished entry may sit without an update before it is dropped, ms */
const KEEP_STALLED_MS = 30 * 60_000;
/** at most this many entries at once; the oldest go first */
const MAX_ENTRIES = 2000;

const entries = new Map<string, Entry>();

function sweep(now: number) {
  for (const [key, entry] of entries) if (entry.expiresAt <= now) entries.delete(key);
  while (entries.size > MAX_ENTRIES) {
    const oldest = entries.keys().next().value;
    if (oldest === undefined) break;
    entries.delete(oldest);
  }
}

const keyOf = (userId: number, uploadId: string) => `${userId}:${uploadId}`;

export interface ProgressReporter {
  phase(phase: Exclude<UploadPhase, 'done' | 'error'>, fraction?: number | null): void;
  parsed(bytesParsed: number): void;
  done(curveId: number | null): void;
  fail(message: string): void;
}

/** A reporter that writes nothing, for uploads that sent no uploadId. */
export const silentProgress: ProgressReporter = { phase() {}, parsed() {}, done() {}, fail() {} };

/** Starts tracking one upload for one user; a repeated id replaces the older entry. */
export function trackUpload(userId: number, uploadId: string, bytesTotal: number): ProgressReporter {
  const now = Date.now();
  sweep(now);
  const key = keyOf(userId, uploadId);
  const entry: Entry = {
    uploadId, userId, phase: 'parsing', fraction: 0, bytesParsed: 0, bytesTotal, curveId: null, message: null,
    updatedAt: new Date(now).toISOString(), expiresAt: now + KEEP_STALLED_MS,
  };
  entries.delete(key);
  entries.set(key, entry);
  const touch = (finished: boolean) => {
    const at = Date.now();
    entry.updatedAt = new Date(at).toISOString();
    entry.expiresAt = at + (finished ? KEEP_FINISHED_MS : KEEP_STALLED_MS);
  };
  return {
    phase(phase, fraction = null) {
      entry.phase = phase;
      entry.fraction = fraction;
      touch(false);
    },
    parsed(bytesParsed) {
      entry.phase = 'parsing';
      entry.bytesParsed = bytesParsed;
      entry.fraction = bytesTotal > 0 ? Math.min(1, bytesParsed / bytesTotal) : null;
      touch(false);
    },
    done(curveId) {
      entry.phase = 'done';
      entry.fraction = 1;
      entry.curveId = curveId;
      touch(true);
    },
    fail(message) {
      entry.phase = 'error';
      entry.message = message;
      touch(true);
    },
  };
}

/**
 * The progress of one upload as its sender sees it. An id not (yet) known — the file is still
 * on its way, or it belongs to someone else — reads as "receiving" with no fraction, so a poll
 * that starts before the server has the file is not an error and nothing leaks across users.
 */
export function readProgress(userId: number, uploadId: string): UploadProgress & { known: boolean } {
  sweep(Date.now());
  const entry = entries.get(keyOf(userId, uploadId));
  if (!entry) {
    return { uploadId, phase: 'receiving', fraction: null, bytesParsed: 0, bytesTotal: 0, curveId: null, message: null, updatedAt: new Date().toISOString(), known: false };
  }
  const { userId: _owner, expiresAt: _expires, ...view } = entry;
  return { ...view, known: true };
}

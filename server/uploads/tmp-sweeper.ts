// Temporary upload files (multer's partial and finished bodies, guarded workbook copies) live in
// <UPLOADS_DIR>/tmp until the upload is done. A process killed mid-upload leaves them behind:
// they are removed at start-up, and by age while the server runs.
import fs from 'node:fs';
import path from 'node:path';

/** how often the running server looks for stale temporary files, ms */
export const SWEEP_INTERVAL_MS = 10 * 60_000;

/**
 * Remove the files in `dir` last written more than `maxAgeMs` ago (every file when maxAgeMs is 0).
 * Files still being written keep a fresh modification time, so a slow upload is never cut off.
 */
export function sweepTemporaryUploads(dir: string, maxAgeMs: number): { removed: number; bytes: number } {
  let removed = 0;
  let bytes = 0;
  let entries: fs.Dirent[];
  try {
    entries = fs.readdirSync(dir, { withFileTypes: true });
  } catch {
    return { removed, bytes };
  }
  const cutoff = Date.now() - maxAgeMs;
  for (const entry of entries) {
    if (!entry.isFile()) continue;
    const full = path.join(dir, entry.name);
    try {
      const stat = fs.statSync(full);
      if (maxAgeMs > 0 && stat.mtimeMs > cutoff) continue;
      fs.rmSync(full, { force: true });
      removed++;
      bytes += stat.size;
    } catch {
      // gone meanwhile (its upload finished): nothing to do
    }
  }
  return { removed, bytes };
}

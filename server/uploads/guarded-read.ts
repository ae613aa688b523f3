// readUpload behind the workbook guard: a workbook is first checked and cut down to the parts a
// curve needs (workbook-guard.ts); the unchanged reader then opens that copy. The result is the
// reader's, with the SHA-256 of the file as uploaded.
import fs from 'node:fs';
import { sniffBytes } from '../../shared/curves';
import { hashFile, readUpload, type ReadOptions, type ReadResult } from '../curves/read-upload';
import { guardWorkbook, type WorkbookLimits } from './workbook-guard';

async function head(path: string): Promise<Uint8Array> {
  const handle = await fs.promises.open(path, 'r');
  try {
    const buffer = Buffer.alloc(65536);
    const { bytesRead } = await handle.read(buffer, 0, buffer.length, 0);
    return buffer.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

/** Where the guarded copy of an uploaded workbook is written (beside the upload, in the temporary folder). */
export const guardedCopyPath = (path: string) => `${path}.guarded.xlsx`;

export async function readUploadGuarded(path: string, options: ReadOptions, limits: WorkbookLimits): Promise<ReadResult> {
  if (sniffBytes(await head(path)) !== 'xlsx') return readUpload(path, options);
  const guarded = guardedCopyPath(path);
  try {
    await guardWorkbook(path, guarded, limits, options.sheet);
    const result = await readUpload(guarded, options);
    return { ...result, sha256: await hashFile(path) };
  } finally {
    fs.rmSync(guarded, { force: true });
  }
}

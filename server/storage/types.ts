// Where the raw bytes of uploaded files live, behind one small interface: a local folder (the
// default) or an S3-compatible object store. Files are named by their SHA-256, so identical
// bytes are kept once and what comes back is exactly what was uploaded.
import type { Readable } from 'node:stream';

export interface RawStore {
  /** "local" or "s3", and a description for logs and the admin page (no secrets) */
  readonly kind: 'local' | 's3';
  describe(): string;
  /**
   * Keep the file at `localPath` under its SHA-256. The local folder moves the file in; other
   * stores copy it (the caller removes the temporary file). `existed`: the bytes were kept already.
   */
  put(sha256: string, localPath: string): Promise<{ existed: boolean }>;
  /** the stored bytes as a stream, or null when there are none */
  get(sha256: string): Promise<Readable | null>;
  has(sha256: string): Promise<boolean>;
  remove(sha256: string): Promise<void>;
  /** every stored SHA-256 (for backups and checks) */
  list(): AsyncIterable<string>;
}

export const SHA256_HEX = /^[0-9a-f]{64}$/;

export function assertSha256(sha256: string): void {
  if (!SHA256_HEX.test(sha256)) throw new RangeError(`raw store: "${sha256.slice(0, 80)}" is not a SHA-256 in hex`);
}

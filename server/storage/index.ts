// The raw store the environment asks for: the local uploads folder unless STORAGE=s3.
import type { Env } from '../env';
import { localStore } from './local-store';
import { s3Store } from './s3-store';
import type { RawStore } from './types';

export type { RawStore } from './types';

export function createRawStore(env: Env): RawStore {
  if (env.STORAGE !== 's3') return localStore(env.uploadsDir);
  if (!env.S3_BUCKET) throw new Error('Invalid environment:\n  S3_BUCKET: required when STORAGE=s3');
  return s3Store({
    bucket: env.S3_BUCKET,
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    prefix: env.S3_PREFIX,
    forcePathStyle: env.S3_FORCE_PATH_STYLE ?? Boolean(env.S3_ENDPOINT),
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
  });
}

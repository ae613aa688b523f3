// Raw files in an S3-compatible object store through the AWS SDK for JavaScript (v3):
// objects <prefix><first two hex digits>/<sha256>. Credentials come from the environment (the
// SDK's usual chain, or S3_ACCESS_KEY_ID / S3_SECRET_ACCESS_KEY).
import fs from 'node:fs';
import type { Readable } from 'node:stream';
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client, type S3ClientConfig } from '@aws-sdk/client-s3';
import { assertSha256, SHA256_HEX, type RawStore } from './types';

export interface S3StoreOptions {
  bucket: string;
  /** e.g. https://objects.lab.example or http://127.0.0.1:9000; unset for AWS itself */
  endpoint?: string;
  region: string;
  /** key prefix inside the bucket, e.g. "cellwright/raw/" */
  prefix: string;
  forcePathStyle: boolean;
  accessKeyId?: string;
  secretAccessKey?: string;
}

function isNotFound(error: unknown): boolean {
  const e = error as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === 'NotFound' || e?.name === 'NoSuchKey' || e?.$metadata?.httpStatusCode === 404;
}

export function s3Store(options: S3StoreOptions): RawStore {
  const config: S3ClientConfig = {
    region: options.region,
    endpoint: options.endpoint,
    forcePathStyle: options.forcePathStyle,
    // plain signed requests: some S3-compatible stores do not take the SDK's default trailing checksums
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    ...(options.accessKeyId && options.secretAccessKey && { credentials: { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey } }),
  };
  const client = new S3Client(config);
  const key = (sha256: string) => {
    assertSha256(sha256);
    return `${options.prefix}${sha256.slice(0, 2)}/${sha256}`;
  };
  const has = async (sha256: string) => {
    try {
      await client.send(new HeadObjectCommand({ Bucket: options.bucket, Key: key(sha256) }));
      return true;
    } catch (error) {
      if (isNotFound(error)) return false;
      throw error;
    }
  };
  return {
    kind: 's3',
    describe: () => `S3 bucket ${options.bucket}${options.prefix ? `/${options.prefix}` : ''}${options.endpoint ? ` at ${options.endpoint}` : ''}`,
    has,
    async put(sha256, localPath) {
      if (await has(sha256)) return { existed: true };
      const { size } = await fs.promises.stat(localPath);
      await client.send(new PutObjectCommand({ Bucket: options.bucket, Key: key(sha256), Body: fs.createReadStream(localPath), ContentLength: size, ContentType: 'application/octet-stream', Metadata: { sha256 } }));
      return { existed: false };
    },
    async get(sha256) {
      try {
        const answer = await client.send(new GetObjectCommand({ Bucket: options.bucket, Key: key(sha256) }));
        return (answer.Body as Readable | undefined) ?? null;
      } catch (error) {
        if (isNotFound(error)) return null;
        throw error;
      }
    },
    async remove(sha256) {
      await client.send(new DeleteObjectCommand({ Bucket: options.bucket, Key: key(sha256) }));
    },
    async *list() {
      let token: string | undefined;
      do {
        const page = await client.send(new ListObjectsV2Command({ Bucket: options.bucket, Prefix: options.prefix, ContinuationToken: token }));
        for (const item of page.Contents ?? []) {
          const name = item.Key?.slice(options.prefix.length).split('/')[1];
          if (name && SHA256_HEX.test(name)) yield name;
        }
        token = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (token);
    },
  };
}

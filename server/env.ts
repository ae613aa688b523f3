// Environment, read and validated once at start-up.
import { z } from 'zod';
import path from 'node:path';

const emptyIsUnset = (value: unknown) => (value === '' ? undefined : value);

function isHostEntry(entry: string): boolean {
  if (entry === '') return true;
  try {
    const url = new URL(entry.includes('://') ? entry : `http://${entry}`);
    return /^https?:$/.test(url.protocol) && url.pathname === '/' && !url.search && !url.username && url.host.length > 0;
  } catch {
    return false;
  }
}

const envSchema = z.object({
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_PATH: z.string().default('data/cellwright.db'),
  UPLOADS_DIR: z.string().default('data/uploads'),
  SMTP_URL: z.string().optional(),
  MAIL_FROM: z.string().default('Cellwright <no-reply@cellwright.test>'),
  PUBLIC_URL: z.preprocess(emptyIsUnset, z.url({ protocol: /^https?$/, error: 'must be an http(s) address like https://cellwright.lab.example' }).optional()),
  /** comma-separated host[:port] (or scheme://host) names the app also answers to */
  ALLOWED_HOSTS: z.preprocess(
    emptyIsUnset,
    z
      .string()
      .refine((list) => list.split(',').every((entry) => isHostEntry(entry.trim())), 'each entry must be host, host:port or http(s)://host[:port], comma-separated')
      .optional(),
  ),
  UPLOAD_MAX_BYTES: z.coerce.number().int().positive().default(50 * 1024 * 1024),
  UPLOAD_MAX_ROWS: z.coerce.number().int().positive().default(2_000_000),
  /** worker threads that parse uploads (default: one per spare core, 1–4) */
  UPLOAD_PARSE_WORKERS: z.coerce.number().int().min(1).max(16).optional(),
  /** read a text upload in a worker while it is received (default on; `false` reads it from disk once received) */
  UPLOAD_PARSE_WHILE_RECEIVING: z.preprocess((v) => (v === '' || v === undefined ? undefined : !(v === 'false' || v === '0')), z.boolean().default(true)),
  /** longest time one file may take to parse, ms */
  UPLOAD_PARSE_TIMEOUT_MS: z.coerce.number().int().positive().default(60_000),
  /** heap limit of a parse worker, MB */
  UPLOAD_PARSE_MEMORY_MB: z.coerce.number().int().min(64).default(1024),
  /** largest expanded size of one workbook part (a sheet, the shared strings), bytes */
  UPLOAD_XLSX_MAX_PART_BYTES: z.coerce.number().int().positive().default(100 * 1024 * 1024),
  /** largest expanded ÷ compressed size of a workbook part */
  UPLOAD_XLSX_MAX_RATIO: z.coerce.number().positive().default(100),
  /** most cells read from one workbook sheet */
  UPLOAD_XLSX_MAX_CELLS: z.coerce.number().int().positive().default(1_000_000),
  /** temporary upload files untouched for this long are removed while the server runs, ms */
  UPLOAD_TMP_MAX_AGE_MS: z.coerce.number().int().positive().default(60 * 60_000),
  LOGIN_RATE_LIMIT: z.coerce.number().int().positive().default(20),
  /** where raw uploaded files are kept: the UPLOADS_DIR folder, or an S3-compatible bucket */
  STORAGE: z.enum(['local', 's3']).default('local'),
  S3_BUCKET: z.preprocess(emptyIsUnset, z.string().optional()),
  S3_ENDPOINT: z.preprocess(emptyIsUnset, z.url({ protocol: /^https?$/ }).optional()),
  S3_REGION: z.string().default('us-east-1'),
  /** key prefix inside the bucket ("" or ending in "/") */
  S3_PREFIX: z.string().regex(/^$|\/$/, 'must be empty or end with "/"').default(''),
  S3_FORCE_PATH_STYLE: z.preprocess((v) => (v === '' || v === undefined ? undefined : v === 'true' || v === '1'), z.boolean().optional()),
  S3_ACCESS_KEY_ID: z.preprocess(emptyIsUnset, z.string().optional()),
  S3_SECRET_ACCESS_KEY: z.preprocess(emptyIsUnset, z.string().optional()),
  /** where `npm run backup` and the admin page write backups */
  BACKUP_DIR: z.string().default('data/backups'),
  SEED_DEMO: z.enum(['auto', 'never']).default('auto'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'silent']).default('info'),
  NODE_ENV: z.string().default('development'),
});

export type Env = z.infer<typeof envSchema> & { databasePath: string; uploadsDir: string; backupDir: string };

export function readEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Invalid environment:\n${lines}`);
  }
  const env = parsed.data;
  return {
    ...env,
    databasePath: env.DATABASE_PATH === ':memory:' ? ':memory:' : path.resolve(env.DATABASE_PATH),
    uploadsDir: path.resolve(env.UPLOADS_DIR),
    backupDir: path.resolve(env.BACKUP_DIR),
  };
}

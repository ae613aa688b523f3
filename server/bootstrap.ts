// Assembles the context: environment, database (migrated), mailer, logger, raw store.
import { pino } from 'pino';
import fs from 'node:fs';
import path from 'node:path';
import { readEnv, type Env } from './env';
import { openDatabase } from './db';
import { createMailer } from './lib/mail';
import type { AppContext } from './context';
import { sweepTemporaryUploads } from './uploads/tmp-sweeper';
import { createRawStore } from './storage';

export function createContext(overrides: Partial<NodeJS.ProcessEnv> = {}): AppContext {
  const env: Env = readEnv({ ...process.env, ...overrides });
  const logger = pino({ level: env.LOG_LEVEL });
  fs.mkdirSync(env.uploadsDir, { recursive: true });
  // whatever a previous process left half-received is of no use now
  const swept = sweepTemporaryUploads(path.join(env.uploadsDir, 'tmp'), 0);
  const db = openDatabase(env.databasePath);
  const mailer = createMailer(db, { smtpUrl: env.SMTP_URL, from: env.MAIL_FROM });
  if (swept.removed > 0) logger.info(`removed ${swept.removed} temporary upload file(s), ${swept.bytes} bytes, left by an earlier run`);
  const storage = createRawStore(env);
  return { db, env, mailer, logger, storage };
}

// Assembles the context: environment, database (migrated), mailer, logger; seeds the demo if empty.
import { pino } from 'pino';
import fs from 'node:fs';
import { readEnv, type Env } from './env';
import { openDatabase } from './db';
import { createMailer } from './lib/mail';
import type { AppContext } from './context';

export function createContext(overrides: Partial<NodeJS.ProcessEnv> = {}): AppContext {
  const env: Env = readEnv({ ...process.env, ...overrides });
  const logger = pino({ level: env.LOG_LEVEL });
  fs.mkdirSync(env.uploadsDir, { recursive: true });
  const db = openDatabase(env.databasePath);
  const mailer = createMailer(db, { smtpUrl: env.SMTP_URL, from: env.MAIL_FROM });
  return { db, env, mailer, logger };
}

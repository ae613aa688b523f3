// What every router and service needs: the database, the settings, the mailer, the logger, the raw store.
import type { Db } from './db';
import type { Env } from './env';
import type { Mailer } from './lib/mail';
import type { Logger } from 'pino';
import type { RawStore } from './storage';

export interface AppContext {
  db: Db;
  env: Env;
  mailer: Mailer;
  logger: Logger;
  /** where raw uploaded bytes are kept (local folder or S3-compatible store) */
  storage: RawStore;
}

export interface AuthUser {
  id: number;
  email: string;
  name: string;
  isAdmin: boolean;
  labId: number | null;
  labKind: 'home' | 'partner' | null;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      user?: AuthUser;
      authVia?: 'cookie' | 'token';
      sessionId?: number;
      /** the API token used, when authVia is 'token' */
      tokenId?: number;
      tokenScope?: 'read' | 'upload' | 'full';
      csrfToken?: string;
    }
  }
}

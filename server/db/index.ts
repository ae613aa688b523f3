// Opens the SQLite database, applies the committed migrations, and exposes the Drizzle handle.
import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import * as schema from './schema';

export type Db = BetterSQLite3Database<typeof schema> & { $client: Database.Database };

const migrationsFolder = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../drizzle');

export function openDatabase(databasePath: string): Db {
  if (databasePath !== ':memory:') fs.mkdirSync(path.dirname(databasePath), { recursive: true });
  const sqlite = new Database(databasePath);
  // large pages for a new database (an existing one keeps its own): a 10⁶-row log's 32 MB points
  // blob is written as 500 pages, not 8,000, so its insert holds the event loop a fraction as long
  sqlite.pragma('page_size = 65536');
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  sqlite.pragma('synchronous = NORMAL');
  const db = drizzle(sqlite, { schema }) as Db;
  migrate(db, { migrationsFolder });
  if (databasePath !== ':memory:') checkpointElsewhere(sqlite, databasePath);
  return db;
}

/** How often the checkpoint thread copies the write-ahead log into the database file, ms. */
const CHECKPOINT_INTERVAL_MS = 2000;

/**
 * The WAL is checkpointed by a thread of its own (checkpoint-worker.mjs) instead of by whichever
 * commit crosses SQLite's 1,000-page mark: that commit would copy up to 64 MB on the event loop.
 * Closing the connection closes the thread's connection first, then its own (the last, which
 * checkpoints and removes the WAL).
 */
function checkpointElsewhere(sqlite: Database.Database, databasePath: string): void {
  const closed = new Int32Array(new SharedArrayBuffer(4));
  const worker = new Worker(new URL('./checkpoint-worker.mjs', import.meta.url), { workerData: { path: databasePath, intervalMs: CHECKPOINT_INTERVAL_MS, closed } });
  worker.unref();
  worker.on('error', () => {
    // without the thread, SQLite's own checkpoints again (on the event loop, but never an unbounded WAL)
    if (sqlite.open) sqlite.pragma('wal_autocheckpoint = 1000');
  });
  sqlite.pragma('wal_autocheckpoint = 0');
  const close = sqlite.close.bind(sqlite);
  sqlite.close = () => {
    // the thread's connection first (waited for, at most 2 s), then this one: the last to close
    // checkpoints and removes the WAL, and nothing writes the files once close has returned
    worker.postMessage('stop');
    Atomics.wait(closed, 0, 0, 2000);
    return close();
  };
}

export { schema };

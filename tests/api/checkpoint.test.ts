// The write-ahead log is copied into the database file by a thread of its own, not by the commit
// that crosses SQLite's page mark: the serving connection has automatic checkpoints off, a big
// write lands in the WAL first and reaches the database file within a few seconds, and closing
// the connection stops the thread.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openDatabase } from '../../server/db';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-checkpoint-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe('WAL checkpoints off the event loop', () => {
  it('the serving connection never checkpoints by itself; the thread copies a big write into the file', async () => {
    const file = path.join(dir, 'db.sqlite');
    const db = openDatabase(file);
    const sqlite = db.$client;
    expect(sqlite.pragma('wal_autocheckpoint', { simple: true })).toBe(0);
    sqlite.exec('create table scratch (id integer primary key, bytes blob not null)');
    const before = fs.statSync(file).size;
    // 8 MB, more than SQLite's own 1,000-page mark would let pass at 4 kB pages
    sqlite.prepare('insert into scratch (bytes) values (?)').run(Buffer.alloc(8 * 1024 * 1024, 1));
    expect(fs.statSync(`${file}-wal`).size).toBeGreaterThan(8 * 1024 * 1024);
    let after = fs.statSync(file).size;
    for (let i = 0; i < 100 && after < before + 8 * 1024 * 1024; i++) {
      await new Promise((resolve) => setTimeout(resolve, 100));
      after = fs.statSync(file).size;
    }
    expect(after).toBeGreaterThanOrEqual(before + 8 * 1024 * 1024);
    sqlite.close();
    expect(sqlite.open).toBe(false);
    // both connections are closed once close returns: the last one took the WAL with it
    expect(fs.existsSync(`${file}-wal`)).toBe(false);
    expect(fs.existsSync(`${file}-shm`)).toBe(false);
  });

  it('an in-memory database has no thread and keeps SQLite’s own checkpoints', () => {
    const db = openDatabase(':memory:');
    expect(db.$client.pragma('wal_autocheckpoint', { simple: true })).toBe(1000);
    db.$client.close();
  });
});

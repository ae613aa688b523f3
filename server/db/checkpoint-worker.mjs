// The database's WAL checkpoints, on a thread of their own: the serving connection never copies
// the write-ahead log into the database file itself (for a 32 MB points blob that copy held the
// event loop ~100 ms, every other big upload). PASSIVE: never waits for, nor blocks, a reader or
// the writer; what a busy moment leaves is copied on the next turn.
import Database from 'better-sqlite3';
import { parentPort, workerData } from 'node:worker_threads';

const db = new Database(workerData.path);
db.pragma('busy_timeout = 1000');
const checkpoint = () => {
  try {
    db.pragma('wal_checkpoint(PASSIVE)');
  } catch {
    // busy or locked: the next turn copies it
  }
};
const timer = setInterval(checkpoint, workerData.intervalMs);
parentPort.on('message', (message) => {
  if (message === 'checkpoint') checkpoint();
  if (message === 'stop') {
    // closed before the serving connection, which then checkpoints and removes the WAL itself;
    // the flag lets that close wait for this one (so nothing touches the files after it returns)
    clearInterval(timer);
    db.close();
    Atomics.store(workerData.closed, 0, 1);
    Atomics.notify(workerData.closed, 0);
    parentPort.close();
  }
});

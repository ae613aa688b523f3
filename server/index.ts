// Starts Cellwright on one port: API + built client. Seeds the demo lab into an empty database.
import { createContext } from './bootstrap';
import { createApp } from './app';
import { seedIfEmpty } from './seed/seed';
import { sendDigests } from './review/notify';
import { remeasureOutdatedCurves } from './curves/service';
import path from 'node:path';
import { sweepTemporaryUploads, SWEEP_INTERVAL_MS } from './uploads/tmp-sweeper';
import { parsePool } from './uploads/parse-runner';
import { linkBase } from './lib/base-url';

const ctx = createContext();
if (ctx.env.NODE_ENV === 'production' && !linkBase(ctx.env)) {
  ctx.logger.warn('PUBLIC_URL (or ALLOWED_HOSTS) is not set: invitations are refused until it is, and writes are only accepted from pages on the host they were sent to');
}
// the upload parse threads load while the database is seeded and the port opens
parsePool(ctx.env).warm();
await seedIfEmpty(ctx);
const remeasured = remeasureOutdatedCurves(ctx);
if (remeasured > 0) ctx.logger.info(`measured ${remeasured} curve(s) again under the current metric rules`);
const app = createApp(ctx);
const server = app.listen(ctx.env.PORT, () => {
  ctx.logger.info(`Cellwright listening on http://localhost:${ctx.env.PORT} (database ${ctx.env.databasePath})`);
});

// The daily digest of notices for people who asked for one; admins can also send it now.
const digestTimer = setInterval(() => {
  sendDigests(ctx).catch((error) => ctx.logger.error({ err: error }, 'daily digest failed'));
}, 24 * 3600 * 1000);
digestTimer.unref();

// Temporary upload files nobody has written to for the age limit belong to no live upload.
const sweepTimer = setInterval(() => {
  const swept = sweepTemporaryUploads(path.join(ctx.env.uploadsDir, 'tmp'), ctx.env.UPLOAD_TMP_MAX_AGE_MS);
  if (swept.removed > 0) ctx.logger.warn(`removed ${swept.removed} stale temporary upload file(s), ${swept.bytes} bytes`);
}, SWEEP_INTERVAL_MS);
sweepTimer.unref();

function shutdown(signal: string) {
  ctx.logger.info(`${signal}: shutting down`);
  server.close(() => {
    ctx.db.$client.close();
    process.exit(0);
  });
  setTimeout(() => process.exit(0), 5000).unref();
}
process.on('SIGINT', () => shutdown('SIGINT'));
process.on('SIGTERM', () => shutdown('SIGTERM'));

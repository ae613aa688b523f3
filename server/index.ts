// Starts Cellwright on one port: API + built client. Seeds the demo lab into an empty database.
import { createContext } from './bootstrap';
import { createApp } from './app';
import { seedIfEmpty } from './seed/seed';
import { sendDigests } from './review/notify';
import { remeasureOutdatedCurves } from './curves/service';

const ctx = createContext();
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

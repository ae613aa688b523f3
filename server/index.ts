// Starts Cellwright on one port: API + built client. Seeds the demo lab into an empty database.
import { createContext } from './bootstrap';
import { createApp } from './app';
import { seedIfEmpty } from './seed/seed';

const ctx = createContext();
await seedIfEmpty(ctx);
const app = createApp(ctx);
const server = app.listen(ctx.env.PORT, () => {
  ctx.logger.info(`Cellwright listening on http://localhost:${ctx.env.PORT} (database ${ctx.env.databasePath})`);
});

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

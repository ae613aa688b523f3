// Builds the Express app (exported apart from listen, so tests use it without a port).
import express, { type Express } from 'express';
import helmet from 'helmet';
import cookieParser from 'cookie-parser';
import compression from 'compression';
import { pinoHttp } from 'pino-http';
import path from 'node:path';
import fs from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { AppContext } from './context';
import { authenticate, csrfGuard, tokenScopeGuard } from './auth/sessions';
import { errorMiddleware } from './lib/error-middleware';
import { AppError } from './lib/errors';
import { openApiDocument } from './openapi';
import { FEATURES } from './features';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export function createApp(ctx: AppContext, options: { serveClient?: boolean } = {}): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'script-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'"],
          'worker-src': ["'self'", 'blob:'],
          'upgrade-insecure-requests': null,
        },
      },
    }),
  );
  if (ctx.env.LOG_LEVEL !== 'silent') {
    app.use(
      pinoHttp({
        logger: ctx.logger,
        autoLogging: { ignore: (req) => !req.url?.startsWith('/api') },
        // method, path and status only: headers carry session cookies and tokens
        serializers: {
          req: (req: { method: string; url: string }) => ({ method: req.method, url: req.url.split('?')[0] }),
          res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
        },
      }),
    );
  }
  // gzip for JSON answers and the client's text assets above 1 kB (smaller answers gain less than
  // the header costs). Server-sent events and stored files (sent as uploaded, hash in a header)
  // go out as they are.
  app.use(
    compression({
      threshold: 1024,
      filter: (req, res) => {
        const type = String(res.getHeader('Content-Type') ?? '');
        if (type.includes('text/event-stream') || res.getHeader('X-Content-SHA256')) return false;
        if (!/json|javascript|text\/css|text\/html|image\/svg/.test(type)) return false;
        return compression.filter(req, res);
      },
    }),
  );
  app.use(cookieParser());
  app.use(express.json({ limit: '2mb' }));

  const api = express.Router();
  api.use(authenticate(ctx));
  api.use(csrfGuard(ctx));
  api.use(tokenScopeGuard());
  api.get('/openapi.json', (_req, res) => res.json(openApiDocument()));
  api.get('/health', (_req, res) => res.json({ ok: true }));
  for (const feature of FEATURES) api.use(feature.router(ctx));
  api.use((req, _res, next) => next(new AppError(404, 'not-found', `No API route ${req.method} /api${req.path}.`)));
  app.use('/api', api);

  if (options.serveClient !== false) {
    const dist = path.join(root, 'dist');
    if (fs.existsSync(path.join(dist, 'index.html'))) {
      app.use(express.static(dist, { index: false, maxAge: '1h' }));
      app.get('/{*splat}', (_req, res) => res.sendFile(path.join(dist, 'index.html')));
    }
  }
  app.use(errorMiddleware(ctx.logger));
  return app;
}

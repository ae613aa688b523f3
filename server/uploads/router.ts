// HTTP for upload progress: a polling JSON route (GET) and the same as server-sent events when
// the client asks for text/event-stream.
import { Router } from 'express';
import type { AppContext } from '../context';
import { requireUser } from '../auth/access';
import { AppError } from '../lib/errors';
import { readProgress, UPLOAD_ID_PATTERN } from './progress';

/** SSE: how often the stream re-reads the registry, ms, and how long it may stay open at most */
const SSE_INTERVAL_MS = 250;
const SSE_MAX_MS = 30 * 60_000;

export function uploadsRouter(_ctx: AppContext): Router {
  const router = Router();

  router.get('/uploads/:uploadId/progress', (req, res) => {
    const user = requireUser(req.user);
    const uploadId = String(req.params.uploadId);
    if (!UPLOAD_ID_PATTERN.test(uploadId)) {
      throw new AppError(400, 'validation', 'uploadId must be 8–64 letters, digits, "-" or "_".', { fields: [{ path: 'uploadId', message: 'bad format' }] });
    }
    if (!String(req.headers.accept ?? '').includes('text/event-stream')) {
      res.setHeader('Cache-Control', 'no-store');
      res.json({ progress: readProgress(user.id, uploadId) });
      return;
    }
    res.writeHead(200, { 'Content-Type': 'text/event-stream', 'Cache-Control': 'no-store', Connection: 'keep-alive' });
    let last = '';
    const started = Date.now();
    const tick = () => {
      const progress = readProgress(user.id, uploadId);
      const text = JSON.stringify({ ...progress, updatedAt: undefined });
      if (text !== last) {
        last = text;
        res.write(`event: progress\ndata: ${JSON.stringify(progress)}\n\n`);
      }
      if (progress.phase === 'done' || progress.phase === 'error' || Date.now() - started > SSE_MAX_MS) stop();
    };
    const timer = setInterval(tick, SSE_INTERVAL_MS);
    const stop = () => {
      clearInterval(timer);
      res.end();
    };
    req.on('close', () => clearInterval(timer));
    tick();
  });

  return router;
}

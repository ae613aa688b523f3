// HTTP for upload progress: a polling JSON route (GET) and the same as server-sent events when
// the client asks for text/event-stream.
import { UPLOAD_ID_PATTERN, UPLOAD_ID_RULE } from '../../shared/schemas/curves';
import { AppError } from '../lib/errors';
import { defineFeature, route } from '../lib/route';
import { readProgress } from './progress';

/** SSE: how often the stream re-reads the registry, ms, and how long it may stay open at most */
const SSE_INTERVAL_MS = 250;
const SSE_MAX_MS = 30 * 60_000;

export const uploadsFeature = defineFeature('uploads', [
  route({
    method: 'get', path: '/api/uploads/{uploadId}/progress', tag: 'curves', permission: 'signed-in',
    summary: 'Processing progress of an upload sent with an uploadId field: phase (receiving, parsing, measuring, storing, done, error) and fraction; JSON for polling, or server-sent events with Accept: text/event-stream',
    handle: ({ req, res, user, texts }) => {
      const uploadId = texts.uploadId!;
      if (!UPLOAD_ID_PATTERN.test(uploadId)) {
        throw new AppError(400, 'validation', `uploadId ${UPLOAD_ID_RULE}.`, { fields: [{ path: 'uploadId', message: 'bad format' }] });
      }
      if (!String(req.headers.accept ?? '').includes('text/event-stream')) {
        res.setHeader('Cache-Control', 'no-store');
        return { progress: readProgress(user.id, uploadId) };
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
      return undefined;
    },
  }),
]);

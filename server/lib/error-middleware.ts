// The one place errors become HTTP answers: known errors keep their status and code; body
// parsing errors are 400; anything else is logged and answered 500 without internals.
import type { ErrorRequestHandler } from 'express';
import type { Logger } from 'pino';
import { AppError } from './errors';
import { CurveFileError } from '../../shared/curves/types';
import { multipartProblem } from './multipart-errors';

export function errorMiddleware(logger: Logger): ErrorRequestHandler {
  return (error, req, res, _next) => {
    if (res.headersSent) return res.end();
    error = multipartProblem(error) ?? error;
    if (error instanceof AppError) {
      return res.status(error.status).json({ error: { code: error.code, message: error.message, details: error.details ?? null } });
    }
    if (error instanceof CurveFileError) {
      return res.status(422).json({ error: { code: error.code, message: error.message, details: { line: error.line ?? null, column: error.column ?? null } } });
    }
    const status = typeof error?.status === 'number' ? error.status : typeof error?.statusCode === 'number' ? error.statusCode : 500;
    if (status >= 400 && status < 500) {
      const message = error.type === 'entity.parse.failed' ? `The request body is not valid JSON: ${error.message}` : error.type === 'entity.too.large' ? 'The request body is too large.' : String(error.message ?? 'Bad request');
      return res.status(status).json({ error: { code: error.type ?? 'bad-request', message, details: null } });
    }
    logger.error({ err: error, url: req.originalUrl, method: req.method }, 'unhandled error');
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server; the error has been logged.', details: null } });
  };
}

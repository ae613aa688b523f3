// One file of a multipart request, received into the uploads' tmp folder within the size limit
// (curve uploads, reference curves, lot certificates); the file never outlives its request.
import type { Request, Response, NextFunction } from 'express';
import multer from 'multer';
import fs from 'node:fs';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import type { AppContext } from '../context';
import type { ReadResult } from '../curves/read-upload';
import { parsePool, type ParseStream } from '../uploads/parse-runner';
import { AppError } from './errors';
import { CurveFileError } from '../../shared/curves/types';
import { checkedFileName, multipartProblem } from './multipart-errors';

/** 52428800 → "50 MB", 1500 → "1.5 kB": the limit in the words of the message. */
function formatBytes(bytes: number): string {
  if (bytes >= 1048576) return `${Number((bytes / 1048576).toFixed(1))} MB`;
  if (bytes >= 1024) return `${Number((bytes / 1024).toFixed(1))} kB`;
  return `${bytes} bytes`;
}

/** The table read while the file was received (receiveFile with `parseText`), by request. */
const parsedWhileReceived = new WeakMap<Request, Promise<ReadResult | null>>();
const streamsOf = new WeakMap<Request, ParseStream>();

/**
 * The table a worker read from the file's bytes as they arrived: null when the route does not
 * read while receiving, the file is a workbook, or the worker was lost (read it from disk then).
 */
export function tableReadWhileReceived(req: Request): Promise<ReadResult | null> | null {
  return parsedWhileReceived.get(req) ?? null;
}

/**
 * The request's length bounds the file's size, so the parser sizes its columns once from it — but
 * never from more than the upload limit: the header is the client's word, the limit is ours.
 * @example sizeHintOf('1048576', 52428800) // 1048576; sizeHintOf('99999999999', 52428800) // 52428800
 */
export function sizeHintOf(contentLength: string | undefined, limitBytes: number): number | undefined {
  const length = Number(contentLength);
  return Number.isFinite(length) && length > 0 ? Math.min(length, limitBytes) : undefined;
}

/**
 * A multer storage engine that writes the file to the tmp folder and, as the bytes come, gives them
 * to a parse worker (one pass over the network's bytes instead of a second one over the disk's).
 * The bytes are gathered into pieces of 1 MB: each is written with one call, then moved to the
 * worker — 33 writes for a 33 MB log instead of one per network chunk on the event loop.
 */
function readingDiskStorage(tmpDir: string, start: (req: Request, fileName: string, onPiece: (bytes: Uint8Array) => void) => ParseStream): multer.StorageEngine {
  return {
    _handleFile(req, file, callback) {
      const filename = randomBytes(16).toString('hex');
      const filePath = path.join(tmpDir, filename);
      let fd: number;
      try {
        fd = fs.openSync(filePath, 'w');
      } catch (error) {
        return callback(error as Error);
      }
      let size = 0;
      let done = false;
      const finish = (error: Error | null) => {
        if (done) return;
        done = true;
        file.stream.removeListener('data', onData);
        try {
          fs.closeSync(fd);
        } catch {
          // closed already
        }
        if (error) {
          stream.abort();
          fs.rmSync(filePath, { force: true });
          return callback(error);
        }
        callback(null, { destination: tmpDir, filename, path: filePath, size });
      };
      const stream = start(req, file.originalname, (bytes) => {
        let at = 0;
        while (at < bytes.length) at += fs.writeSync(fd, bytes, at, bytes.length - at);
      });
      streamsOf.set(req, stream);
      const onData = (chunk: Buffer) => {
        size += chunk.length;
        try {
          stream.push(chunk);
        } catch (error) {
          // the disk refused the bytes (full, gone): the upload ends here
          finish(error as Error);
        }
      };
      file.stream.on('data', onData);
      file.stream.once('error', (error: Error) => finish(error));
      file.stream.once('end', () => {
        if (done) return;
        let tableRead: Promise<ReadResult | null>;
        try {
          // the last piece is written (and sent) here
          tableRead = stream.end();
        } catch (error) {
          return finish(error as Error);
        }
        // a refusal of the file stands; a worker lost on the way (ended for another job) leaves the disk path
        const read = tableRead.catch((reason: unknown) => {
          if (reason instanceof CurveFileError || reason instanceof AppError) throw reason;
          return null;
        });
        // a request refused before its handler (a limit) never asks for the table: no unhandled refusal then
        read.catch(() => {});
        parsedWhileReceived.set(req, read);
        finish(null);
      });
    },
    _removeFile(req, file, callback) {
      streamsOf.get(req)?.abort();
      fs.rm(file.path, { force: true }, () => callback(null));
    },
  };
}

/**
 * Receives the one file of a multipart upload into the uploads' tmp folder, within the size limit.
 * `parseText`: a worker reads a text table from the bytes while they arrive (curve uploads).
 */
export function receiveFile(ctx: AppContext, options: { parseText?: boolean } = {}) {
  const { env } = ctx;
  const tmpDir = path.join(env.uploadsDir, 'tmp');
  fs.mkdirSync(tmpDir, { recursive: true });
  const limits = { fileSize: env.UPLOAD_MAX_BYTES, files: 1, fields: 20 };
  const upload = options.parseText && env.UPLOAD_PARSE_WHILE_RECEIVING
    ? multer({
      limits,
      storage: readingDiskStorage(tmpDir, (req, fileName, onPiece) => {
        const sizeHintBytes = sizeHintOf(req.headers['content-length'], env.UPLOAD_MAX_BYTES);
        return parsePool(env).parseStream({ maxRows: env.UPLOAD_MAX_ROWS, sizeHintBytes, fileName, onPiece });
      }),
    })
    : multer({ dest: tmpDir, limits });
  return (req: Request, res: Response, next: NextFunction) => {
    upload.single('file')(req, res, (error: unknown) => {
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') {
          return next(new AppError(413, 'too-large', `The file is larger than the upload limit of ${formatBytes(env.UPLOAD_MAX_BYTES)} (UPLOAD_MAX_BYTES = ${env.UPLOAD_MAX_BYTES} bytes); nothing was stored. Split the log or ask an administrator to raise the limit.`, { limit: 'UPLOAD_MAX_BYTES', maxBytes: env.UPLOAD_MAX_BYTES }));
        }
        return next(new AppError(400, 'bad-upload', `Upload refused: ${error.message} (field "${error.field ?? 'file'}"). Send one file in the multipart field "file".`));
      }
      if (error) {
        // a refused body leaves no temporary file behind, however far multer got
        removeReceivedFile(req);
        return next(multipartProblem(error) ?? error);
      }
      next();
    });
  };
}

/** The received file never outlives its request, whatever the answer was. */
export function removeReceivedFile(req: Request) {
  streamsOf.get(req)?.abort();
  if (typeof req.file?.path === 'string') fs.rmSync(req.file.path, { force: true });
}


/** The file multer received, with its checked name; 400 when the request sent none. */
export function receivedFile(req: Request): { tmpPath: string; originalName: string; size: number; contentType: string } {
  const file = req.file;
  if (!file) throw new AppError(400, 'validation', 'Send the file in the multipart field "file".', { fields: [{ path: 'file', message: 'required' }] });
  return { tmpPath: file.path, originalName: checkedFileName(file.originalname), size: file.size, contentType: file.mimetype };
}

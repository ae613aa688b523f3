// One file of a multipart request, received into the uploads' tmp folder within the size limit
// (curve uploads, reference curves, lot certificates); the file never outlives its request.
import type { Request, Response, NextFunction } from 'express';
import multer from 'multer';
import fs from 'node:fs';
import path from 'node:path';
import { Transform, pipeline } from 'node:stream';
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
 * Multer's disk storage with a tap: the bytes written to the tmp file also go, as they come, to a
 * parse worker (one pass over the network's bytes instead of a second one over the disk's).
 */
function readingDiskStorage(tmpDir: string, start: (req: Request, fileName: string) => ParseStream): multer.StorageEngine {
  const disk = multer.diskStorage({ destination: tmpDir });
  return {
    _handleFile(req, file, callback) {
      const stream = start(req, file.originalname);
      streamsOf.set(req, stream);
      const tap = new Transform({
        transform(chunk: Buffer, _encoding, done) {
          stream.push(chunk);
          done(null, chunk);
        },
      });
      // a body cut off (client gone, limit) ends the tap with an error too, so the disk storage
      // removes its partial file and the worker drops its stream
      pipeline(file.stream, tap, () => {});
      // the same file object multer tracks (the disk storage writes its path there), reading the tap
      Object.defineProperty(file, 'stream', { value: tap, configurable: true, enumerable: false });
      disk._handleFile(req, file, (error, info) => {
        if (error) {
          stream.abort();
          return callback(error);
        }
        // a refusal of the file stands; a worker lost on the way (ended for another job) leaves the disk path
        parsedWhileReceived.set(req, stream.end().catch((reason: unknown) => {
          if (reason instanceof CurveFileError || reason instanceof AppError) throw reason;
          return null;
        }));
        callback(null, info);
      });
    },
    _removeFile(req, file, callback) {
      streamsOf.get(req)?.abort();
      disk._removeFile(req, file, callback);
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
      storage: readingDiskStorage(tmpDir, (req, fileName) => {
        const sizeHintBytes = sizeHintOf(req.headers['content-length'], env.UPLOAD_MAX_BYTES);
        return parsePool(env).parseStream({ maxRows: env.UPLOAD_MAX_ROWS, sizeHintBytes, fileName });
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

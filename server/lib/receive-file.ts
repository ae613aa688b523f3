// One file of a multipart request, received into the uploads' tmp folder within the size limit
// (curve uploads, reference curves, lot certificates); the file never outlives its request.
import type { Request, Response, NextFunction } from 'express';
import multer from 'multer';
import fs from 'node:fs';
import path from 'node:path';
import type { AppContext } from '../context';
import { AppError } from './errors';
import { checkedFileName, multipartProblem } from './multipart-errors';

/** 52428800 → "50 MB", 1500 → "1.5 kB": the limit in the words of the message. */
function formatBytes(bytes: number): string {
  if (bytes >= 1048576) return `${Number((bytes / 1048576).toFixed(1))} MB`;
  if (bytes >= 1024) return `${Number((bytes / 1024).toFixed(1))} kB`;
  return `${bytes} bytes`;
}

/** Receives the one file of a multipart upload into the uploads' tmp folder, within the size limit. */
export function receiveFile(ctx: AppContext) {
  const { env } = ctx;
  const tmpDir = path.join(env.uploadsDir, 'tmp');
  fs.mkdirSync(tmpDir, { recursive: true });
  const upload = multer({ dest: tmpDir, limits: { fileSize: env.UPLOAD_MAX_BYTES, files: 1, fields: 20 } });
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
  if (typeof req.file?.path === 'string') fs.rmSync(req.file.path, { force: true });
}


/** The file multer received, with its checked name; 400 when the request sent none. */
export function receivedFile(req: Request): { tmpPath: string; originalName: string; size: number; contentType: string } {
  const file = req.file;
  if (!file) throw new AppError(400, 'validation', 'Send the file in the multipart field "file".', { fields: [{ path: 'file', message: 'required' }] });
  return { tmpPath: file.path, originalName: checkedFileName(file.originalname), size: file.size, contentType: file.mimetype };
}

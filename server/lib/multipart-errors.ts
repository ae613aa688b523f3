// Errors from reading a multipart body (busboy, under multer) are the sender's problem: a
// truncated body, no or the wrong boundary, a malformed part header. They become a 400 that
// says what was wrong; only system errors (disk full, permissions) stay server errors.
import { AppError } from './errors';

const KNOWN: { pattern: RegExp; message: string }[] = [
  {
    pattern: /^Unexpected end of (form|file)/i,
    message: 'The upload ended before the multipart body was complete: it was cut off, or its boundary does not match the one in the Content-Type header. Nothing was stored; send it again.',
  },
  {
    pattern: /Boundary not found/i,
    message: 'The Content-Type header says multipart/form-data but names no boundary (e.g. "multipart/form-data; boundary=…"). Nothing was stored.',
  },
  {
    pattern: /Malformed part header/i,
    message: 'A part header of the multipart body is malformed (for example a control character such as NUL in the file name, or a missing Content-Disposition). Nothing was stored.',
  },
  {
    pattern: /Unsupported content type|Malformed content type/i,
    message: 'The upload must be sent as multipart/form-data with the file in the field "file". Nothing was stored.',
  },
];

/** A multipart parsing error as a 400, or null when the error is not about the request body. */
export function multipartProblem(error: unknown): AppError | null {
  if (!(error instanceof Error) || error instanceof AppError) return null;
  // system errors (ENOSPC, EACCES …) carry a syscall: those are the server's, not the sender's
  if ('syscall' in error) return null;
  const known = KNOWN.find((k) => k.pattern.test(error.message));
  if (known) return new AppError(400, 'bad-multipart', known.message, { reason: error.message });
  if (/busboy|multer|multipart/i.test(error.stack ?? '')) {
    return new AppError(400, 'bad-multipart', `The multipart body could not be read (${error.message.slice(0, 200)}). Nothing was stored.`, { reason: error.message });
  }
  return null;
}

/** Control characters (NUL, line breaks, DEL …) have no place in a file name. */
const CONTROL = /[\u0000-\u001f\u007f]/;

/** The uploaded file's name as the person gave it, or a 400 when it holds control characters. */
export function checkedFileName(latin1Name: string): string {
  const name = Buffer.from(latin1Name, 'latin1').toString('utf8');
  if (CONTROL.test(name)) {
    throw new AppError(400, 'bad-file-name', 'The file name holds a control character (such as NUL or a line break); rename the file and upload it again. Nothing was stored.', { fields: [{ path: 'file', message: 'control character in the file name' }] });
  }
  if (name.length > 255) throw new AppError(400, 'bad-file-name', `The file name is ${name.length} characters long; at most 255 are allowed. Nothing was stored.`, { fields: [{ path: 'file', message: 'name too long' }] });
  return name;
}

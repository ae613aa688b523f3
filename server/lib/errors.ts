// Known errors carry an HTTP status and a stable code; the error middleware turns them into
// {"error": {"code", "message", "details"}}.
export class AppError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details?: unknown;
  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

export const badRequest = (message: string, details?: unknown) => new AppError(400, 'bad-request', message, details);
export const unauthorized = (message = 'Sign in first.') => new AppError(401, 'unauthorized', message);
export const forbidden = (message = 'Your role in this project does not allow this.') => new AppError(403, 'forbidden', message);
export const notFound = (what: string) => new AppError(404, 'not-found', `${what} not found.`);
export const conflict = (message: string, details?: unknown) => new AppError(409, 'conflict', message, details);
export const unprocessable = (code: string, message: string, details?: unknown) => new AppError(422, code, message, details);

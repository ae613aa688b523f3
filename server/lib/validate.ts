// zod validation for request bodies, params and queries: a 400 naming every bad field.
import type { z } from 'zod';
import { AppError } from './errors';

export function parseInput<S extends z.ZodType>(schema: S, input: unknown, where = 'body'): z.output<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const fields = result.error.issues.map((issue) => ({
    path: issue.path.map(String).join('.') || where,
    message: issue.message,
  }));
  const summary = fields.map((f) => `${f.path}: ${f.message}`).join('; ');
  throw new AppError(400, 'validation', `Invalid ${where}: ${summary}`, { fields });
}

export function idParam(value: unknown, name = 'id'): number {
  const n = Number(value);
  if (!Number.isInteger(n) || n <= 0) throw new AppError(400, 'validation', `${name} must be a positive whole number, got "${String(value)}"`, { fields: [{ path: name, message: 'must be a positive whole number' }] });
  return n;
}

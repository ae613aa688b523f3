// Forms checked by the request schemas the server validates with. A form holds what its inputs
// hold (text, ticks); `schemaResolver` maps those values to the request, checks it with the
// shared zod schema and puts each issue on the input it came from, in plain words. On success
// react-hook-form hands the checked request itself to the submit handler.
import type { FieldErrors, FieldValues, Resolver } from 'react-hook-form';
import type { z } from 'zod';

/** An issue as zod reports it (the fields a plain sentence needs). */
export interface SchemaIssue {
  code: string;
  message: string;
  path: PropertyKey[];
  expected?: unknown;
  origin?: unknown;
  minimum?: unknown;
  maximum?: unknown;
  inclusive?: boolean;
}

/** The schema's issue in the words of a form; the schema's own messages, where it has them, as they are. */
export function plainMessage(issue: SchemaIssue): string {
  if (issue.code === 'invalid_type') return issue.expected === 'int' ? 'must be a whole number' : 'must be a number';
  if (issue.origin === 'number' && issue.code === 'too_small' && !issue.message.startsWith('Too small')) return issue.message;
  if (issue.origin === 'number' && issue.code === 'too_small') return issue.inclusive === false ? `must be above ${String(issue.minimum)}` : `must be at least ${String(issue.minimum)}`;
  if (issue.origin === 'number' && issue.code === 'too_big' && !issue.message.startsWith('Too big')) return issue.message;
  if (issue.origin === 'number' && issue.code === 'too_big') return issue.inclusive === false ? `must be below ${String(issue.maximum)}` : `must be at most ${String(issue.maximum)}`;
  if (issue.origin === 'string' && issue.code === 'too_big' && issue.message.startsWith('Too big')) return `must be at most ${String(issue.maximum)} characters`;
  if (issue.origin === 'string' && issue.code === 'too_small' && issue.message.startsWith('Too small')) return `must be at least ${String(issue.minimum)} characters`;
  return issue.message;
}

/** Set `value` at a dotted path in a nested record (`held.pt_loading` → { held: { pt_loading } }). */
function setAt(target: Record<string, unknown>, path: string, value: unknown) {
  const parts = path.split('.');
  let node = target;
  for (const part of parts.slice(0, -1)) node = (node[part] ??= {}) as Record<string, unknown>;
  node[parts[parts.length - 1]!] ??= value;
}

export interface SchemaFormOptions<TValues, TBody> {
  /** the request schema the server validates the body with */
  schema: z.ZodType<TBody>;
  /** the request the form's values stand for (numbers read from text, blanks left out) */
  toBody: (values: TValues) => unknown;
  /** the input (a dotted form path) an issue at this request path belongs to; `root` for the form as a whole */
  fieldOf: (path: PropertyKey[]) => string;
  /** checks the schema cannot make alone (e.g. against the project's factor ranges), as issues at request paths */
  extra?: (body: TBody) => { path: PropertyKey[]; message: string }[];
  /** a message of the form's own for an issue, when the plain one would not read well */
  message?: (issue: SchemaIssue) => string | undefined;
}

/** The first issue of each input wins: it is the one a person fixes first. */
export function schemaResolver<TValues extends FieldValues, TBody>(options: SchemaFormOptions<TValues, TBody>): Resolver<TValues> {
  return async (values) => {
    const body = options.toBody(values);
    const parsed = options.schema.safeParse(body);
    // the extra checks run on the request as sent even when the schema refused part of it, so
    // every input's problem shows at once (the schema's issue comes first where both apply)
    const extra = (options.extra?.((parsed.success ? parsed.data : body) as TBody) ?? []).map((i) => ({ code: 'custom', ...i }));
    const issues: SchemaIssue[] = [...(parsed.success ? [] : (parsed.error.issues as unknown as SchemaIssue[])), ...extra];
    if (parsed.success && issues.length === 0) return { values: parsed.data as unknown as TValues, errors: {} };
    const errors: Record<string, unknown> = {};
    for (const issue of issues) {
      const field = options.fieldOf(issue.path);
      setAt(errors, field, { type: 'schema', message: options.message?.(issue) ?? plainMessage(issue) });
    }
    return { values: {}, errors: errors as FieldErrors<TValues> };
  };
}

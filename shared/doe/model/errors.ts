// One error type for every input problem in the response-surface code, so the server can turn
// it into a 4xx `{error: {code, message, details}}` without parsing messages.
// Message form, always: "<function>: <what was wrong> (<where>)".

export type DoeErrorCode =
  | 'invalid-factor'
  | 'invalid-row'
  | 'invalid-model'
  | 'too-few-runs'
  | 'aliased-terms'
  | 'invalid-point'
  | 'invalid-goal'
  | 'invalid-constraint'
  | 'not-quadratic';

export class DoeInputError extends RangeError {
  readonly code: DoeErrorCode;
  readonly details?: Record<string, unknown>;

  constructor(code: DoeErrorCode, message: string, details?: Record<string, unknown>) {
    super(message);
    this.name = 'DoeInputError';
    this.code = code;
    this.details = details;
  }
}

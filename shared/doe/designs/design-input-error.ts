// The one error type the design generators throw for bad input, so the server can answer 422
// with the offending field, and every message reads "<function>: <field>: <what is wrong>".

/** Bad design input; `field` names the request field (e.g. "factors[2].high", "generators[0]"). */
export class DesignInputError extends RangeError {
  readonly field: string;

  constructor(functionName: string, field: string, problem: string) {
    super(`${functionName}: ${field}: ${problem}`);
    this.name = 'DesignInputError';
    this.field = field;
  }
}

/**
 * A rule of a pure computation broken by one input: a stable code for the API's problem JSON and
 * the input it concerns, so the server can name the request's field and the form its control.
 */
export class InputRuleError<Code extends string, Field extends string> extends Error {
  readonly code: Code;
  readonly field: Field;
  constructor(code: Code, field: Field, message: string) {
    super(message);
    this.name = new.target.name;
    this.code = code;
    this.field = field;
  }
}

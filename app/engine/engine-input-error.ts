/**
 * Invalid physics input: the message says what to change in words a physicist understands,
 * `field` names the request field (`"thetaDeg[2]"`, `"energy.kinetic"`, `"unit"`), `code` is a
 * stable machine-readable kind. The web layer maps it to HTTP 422, the command line to exit 2.
 */
export class EngineInputError extends Error {
  readonly code: string;
  readonly field: string;

  constructor(code: string, field: string, message: string) {
    super(message);
    this.name = "EngineInputError";
    this.code = code;
    this.field = field;
  }
}

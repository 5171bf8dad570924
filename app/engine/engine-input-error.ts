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

const QUOTE_MAX_CHARS = 40;

/**
 * A bad value as an error message quotes it: JSON, cut to its first 40 characters (with the
 * full length named), so that a 50 MB string never comes back whole in an answer.
 */
export function quoteValue(v: unknown): string {
  const text = typeof v === "string" ? JSON.stringify(v) : (JSON.stringify(v) ?? String(v));
  if (text.length <= QUOTE_MAX_CHARS) return text;
  const length = typeof v === "string" ? `${v.length.toLocaleString("en")} characters` : `${text.length.toLocaleString("en")} characters as JSON`;
  return `${text.slice(0, QUOTE_MAX_CHARS)}… (${length})`;
}

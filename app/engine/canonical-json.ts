/**
 * Canonical JSON of a plain value, for hashing (docs/decisions/0003):
 * - object keys sorted by UTF-16 code units (JavaScript's default sort), no whitespace;
 * - numbers in ECMAScript's shortest round-trip form (Number.prototype.toString, as JSON.stringify
 *   writes them), so 1, 1.0 and 1e0 in the input all become `1`; −0 becomes `0`;
 * - NaN, ±Infinity, undefined, functions, symbols and bigints are rejected (TypeError), as are
 *   array holes; strings are escaped as JSON.stringify escapes them.
 */
export function canonicalJson(value: unknown): string {
  return write(value, "$");
}

function write(value: unknown, path: string): string {
  if (value === null) return "null";
  switch (typeof value) {
    case "boolean":
      return value ? "true" : "false";
    case "string":
      return JSON.stringify(value);
    case "number":
      if (!Number.isFinite(value)) throw new TypeError(`canonical JSON: ${path} is ${value}, not a finite number`);
      return Object.is(value, -0) ? "0" : JSON.stringify(value);
    case "object": {
      if (Array.isArray(value)) {
        const parts: string[] = [];
        for (let i = 0; i < value.length; i++) {
          if (!(i in value)) throw new TypeError(`canonical JSON: ${path}[${i}] is a hole`);
          parts.push(write(value[i], `${path}[${i}]`));
        }
        return `[${parts.join(",")}]`;
      }
      const record = value as Record<string, unknown>;
      const keys = Object.keys(record).sort();
      return `{${keys.map((k) => `${JSON.stringify(k)}:${write(record[k], `${path}.${k}`)}`).join(",")}}`;
    }
    default:
      throw new TypeError(`canonical JSON: ${path} is a ${typeof value}`);
  }
}

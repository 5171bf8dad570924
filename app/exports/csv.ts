// CSV for the submission bundle: RFC 4180 quoting, numbers that read back to the same double, and
// escaping against formula injection (OWASP, "CSV Injection"): a spreadsheet that opens the file
// must never run a cell as a formula. Pure: runs in the browser too.

/** Characters that make a spreadsheet read a cell as a formula (OWASP "CSV Injection"). */
const FORMULA_START = /^[=+\-@\t\r]/;
/** A decimal number as a spreadsheet reads it: such a cell stays as it is (−3.5 is data, not a formula). */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * A number printed so that parsing it gives back the same double: ECMAScript's Number::toString
 * is the shortest such decimal (e.g. 0.1, 1.0000000000000002, 6.02214076e+23). Infinite and NaN
 * values have no place in a table of measured or computed numbers and are refused.
 */
export function formatNumber(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`cannot write ${value} to a CSV cell: only finite numbers`);
  return Object.is(value, -0) ? "0" : String(value);
}

/**
 * One cell: numbers with full precision, null as empty, text escaped. Text that starts with
 * =, +, -, @, tab or carriage return and is not a number gets a leading apostrophe, which
 * spreadsheets show as text (OWASP "CSV Injection"); then the cell is quoted if it holds a comma,
 * a double quote or a line break (RFC 4180, doubled quotes inside).
 */
export function csvCell(value: string | number | null): string {
  if (value === null) return "";
  if (typeof value === "number") return formatNumber(value);
  const text = FORMULA_START.test(value) && !DECIMAL.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvRow(cells: (string | number | null)[]): string {
  return cells.map(csvCell).join(",");
}

/**
 * JSON whose text a spreadsheet cannot split into a formula cell: commas inside strings are
 * written as \u002c, so every comma left is JSON's own, and a string that starts with a formula
 * character starts with its \u escape instead. JSON.parse gives back exactly the same value.
 */
export function spreadsheetSafeJson(value: unknown): string {
  return JSON.stringify(value).replace(/"(?:[^"\\]|\\.)*"/g, (literal) =>
    literal.replace(/,/g, "\\u002c").replace(/^"([=+\-@])/, (_, c: string) => `"\\u${c.charCodeAt(0).toString(16).padStart(4, "0")}`),
  );
}

/**
 * A header comment line `# key: value`, the value as spreadsheet-safe JSON (a string in quotes,
 * a number, an object). The line starts with '#', so numpy (comments="#") and pandas
 * (comment="#") skip it, and no piece of it between commas can start a formula.
 */
export function commentLine(key: string, value: unknown): string {
  if (!/^[a-z][a-z0-9_ ]*$/.test(key)) throw new Error(`comment key "${key}": lower-case letters, digits, spaces and _ only`);
  return `# ${key}: ${spreadsheetSafeJson(value)}`;
}

/** Lines joined with CRLF and ended with one (RFC 4180). */
export function csvDocument(lines: string[]): string {
  return lines.map((l) => `${l}\r\n`).join("");
}

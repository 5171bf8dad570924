export type NumberFieldResult =
  | { ok: true; value: number }
  | { ok: false; code: "empty-value" | "not-a-number" | "decimal-comma" | "not-finite"; reason: string };

// A plain decimal with an optional exponent; no thousands separators, no hex, no Fortran "d".
const DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
// "1,5", "-0,25e-3", "1.234,5": a comma where a decimal point is expected.
const DECIMAL_COMMA = /^[+-]?(?:\d{1,3}(?:\.\d{3})*|\d+),\d*(?:[eE][+-]?\d+)?$/;
const NOT_FINITE = /^[+-]?(?:nan|inf|infinity|∞)$/i;

/**
 * The hot path of `parseNumberField` for a trimmed field: the number, or NaN when the field is
 * anything but a plain finite decimal (then `parseNumberField` says why).
 */
export function readPlainDecimal(text: string): number {
  // Number() accepts exactly the plain decimals of DECIMAL, plus "Infinity" (not finite),
  // "" (0) and unsigned 0x/0o/0b literals; excluding those three is cheaper than the regex,
  // which matters at a few million fields per upload.
  if (text.length === 0 || hasRadixPrefix(text)) return NaN;
  const value = Number(text);
  return value - value === 0 ? value : NaN;
}

/**
 * `Number(shiftDecimalText(text, k))` for a trimmed text without an exponent, given
 * `exponent = "e" + k`, or NaN when the text is not a plain decimal (or the result is not
 * finite): one Number() call both checks and reads the field. The radix prefix is refused
 * first, or "0x" + "e3" would read as the hexadecimal 0xE3.
 */
export function readShiftedDecimal(text: string, exponent: string): number {
  if (hasRadixPrefix(text)) return NaN;
  const value = Number(text + exponent);
  return value - value === 0 ? value : NaN;
}

function hasRadixPrefix(text: string): boolean {
  if (text.length < 2 || text.charCodeAt(0) !== 48 /* "0" */) return false;
  const c = text.charCodeAt(1) | 0x20;
  return c === 120 /* x */ || c === 111 /* o */ || c === 98 /* b */;
}

/**
 * Reads one CSV field as a number, strictly: surrounding spaces are ignored, anything else
 * that is not a plain decimal number is refused with a reason that says what to write instead.
 */
export function parseNumberField(raw: string): NumberFieldResult {
  const text = raw.trim();
  if (text === "") return { ok: false, code: "empty-value", reason: "is empty; write a number" };
  if (DECIMAL.test(text)) {
    const value = Number(text);
    if (Number.isFinite(value)) return { ok: true, value };
    return {
      ok: false,
      code: "not-finite",
      reason: `"${text}" is too large for a double-precision number; write it in a smaller unit or check the exponent`,
    };
  }
  if (DECIMAL_COMMA.test(text)) {
    const suggestion = text.replace(/\./g, "").replace(",", ".");
    return {
      ok: false,
      code: "decimal-comma",
      reason: `"${text}" has a comma where a decimal point is expected: write ${suggestion} (numbers take a decimal point and no thousands separators)`,
    };
  }
  if (NOT_FINITE.test(text)) {
    return {
      ok: false,
      code: "not-finite",
      reason: `"${text}" is not a finite number; give a measured value or remove the row`,
    };
  }
  return {
    ok: false,
    code: "not-a-number",
    reason: `"${truncate(text)}" is not a number; write a plain decimal number such as 0.25 or 2.5e-3`,
  };
}

function truncate(text: string): string {
  return text.length > 40 ? `${text.slice(0, 40)}…` : text;
}

/**
 * The decimal text `text · 10^power`, for a text that `readPlainDecimal` accepted: the
 * exponent is shifted, so Number() of the result is the correctly rounded value of the exact
 * decimal, with no rounding of a multiplication in between.
 */
export function shiftDecimalText(text: string, power: number): string {
  if (power === 0) return text;
  let e = text.indexOf("e");
  if (e === -1) e = text.indexOf("E");
  if (e === -1) return `${text}e${power}`;
  return `${text.slice(0, e)}e${Number(text.slice(e + 1)) + power}`;
}

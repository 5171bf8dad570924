import Decimal from "decimal.js";

/** Significant digits kept in the normal form: far above any measurement, below float noise. */
export const CANONICAL_DIGITS = 12;

/**
 * The value a number takes in the dataset normal form: rounded to 12 significant digits
 * (decimal rounding as `toPrecision` defines it), with -0 turned into 0. Unit conversion
 * leaves binary noise in the last digits (1500 pb/sr and 1.5 nb/sr differ by one ulp after
 * scaling); rounding removes it so that both give the same revision hash.
 */
export function canonicalNumber(value: number): number {
  if (value === 0) return 0;
  return Number(value.toPrecision(CANONICAL_DIGITS));
}

/**
 * The text of a number in the normal form: the canonical value written as the shortest
 * decimal that reads back to it (ECMAScript Number::toString: "1.5", "0.000001", "1e-7",
 * "1.5e+21"). Expects a finite number.
 */
export function formatCanonicalNumber(value: number): string {
  return String(canonicalNumber(value));
}

// Plain decimals that Number::toString writes exactly so: no sign but "-", no redundant
// zeros, not below 1e-6 (written with an exponent there). "0" on its own is canonical too.
const ALREADY_CANONICAL = /^-?(?:[1-9]\d*(?:\.\d*[1-9])?|0\.0{0,5}[1-9](?:\d*[1-9])?)$|^0$/;

/**
 * `formatCanonicalNumber(Number(text))` for a plain decimal `text` of at most 12 characters
 * (so at most 12 significant digits: the value is its own canonical value), without
 * formatting the number again when the text is already written the canonical way.
 */
export function canonicalTextOfShortDecimal(text: string, value: number): string {
  return ALREADY_CANONICAL.test(text) ? text : String(value === 0 ? 0 : value);
}

/**
 * `formatCanonicalNumber(v)` from `p = v.toPrecision(12)`, which the caller has computed
 * anyway for the canonical value: the 12 digits with trailing zeros removed are the shortest
 * decimal that reads back to Number(p) (no other decimal of 12 digits or fewer lies within
 * half an ulp of it), and toPrecision and Number::toString switch to an exponent at the same
 * point below 1e-6. Above 1e12 toPrecision uses an exponent where Number::toString does not,
 * so those few are formatted again, as are three-digit exponents (subnormal numbers have
 * fewer than 12 significant digits, where the argument fails). Expects p of a non-zero
 * finite number.
 */
export function canonicalTextFromPrecision(p: string): string {
  const e = p.indexOf("e");
  if (e !== -1 && (p.charCodeAt(e + 1) === 43 /* "+" */ || p.length - e > 4)) return String(Number(p));
  if (p.indexOf(".") === -1) return p;
  const mantissaEnd = e === -1 ? p.length : e;
  let end = mantissaEnd;
  while (p.charCodeAt(end - 1) === 48 /* "0" */) end--;
  if (p.charCodeAt(end - 1) === 46 /* "." */) end--;
  return e === -1 ? p.slice(0, end) : p.slice(0, end) + p.slice(e);
}

// Enough digits that the sum of two doubles' decimals (exponents from −324 to 308, 12 digits
// each) and its half are exact: the one rounding is the final one to 12 digits.
const ExactDecimal = Decimal.clone({ precision: 1000 });

/**
 * The centre of a bin given by the canonical texts of its edges: the exact decimal midpoint
 * (lo + hi) / 2, rounded to 12 significant digits with ties away from zero (as `toPrecision`
 * rounds an exact value), as a canonical value and its text. Decimal arithmetic, not doubles,
 * so that the centre does not depend on how the edges' sum happens to round in binary
 * (docs/decisions/0013-bins-without-a-centre.md).
 */
export function canonicalMidpoint(loText: string, hiText: string): { value: number; text: string } {
  const mid = new ExactDecimal(loText).plus(hiText).div(2).toSignificantDigits(CANONICAL_DIGITS, Decimal.ROUND_HALF_UP);
  const value = mid.isZero() ? 0 : mid.toNumber();
  return { value, text: String(value) };
}

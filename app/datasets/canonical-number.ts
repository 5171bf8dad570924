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

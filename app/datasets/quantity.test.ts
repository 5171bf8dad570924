import { describe, expect, it } from "vitest";
import { columnMappingSchema } from "./column-mapping";
import { parseUnit } from "~/engine/units";
import { NATURAL_Y_UNIT, quantitySchema, Y_DIMENSIONS, Y_KINDS } from "./quantity";

const issues = (r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  r.error?.issues.map((i) => [i.path.join("."), i.message]) ?? [];

describe("quantitySchema", () => {
  it("accepts units that fit the y kind", () => {
    for (const [kind, unit] of [
      ["dsigma_domega", "nb/sr"],
      ["dsigma_domega", "GeV^-2/sr"],
      ["dsigma_dcos", "ub"],
      ["sigma", "pb"],
      ["dsigma_dt", "nb/GeV^2"],
      ["dsigma_dt", "GeV^-4"],
    ] as const) {
      expect(quantitySchema.safeParse({ x: { kind: "theta_cm_deg" }, y: { kind, unit } }).success, `${kind} ${unit}`).toBe(true);
    }
  });

  it("refuses a unit of the wrong dimension and says which would do", () => {
    const r = quantitySchema.safeParse({ x: { kind: "cos_theta" }, y: { kind: "dsigma_domega", unit: "nb" } });
    expect(r.success).toBe(false);
    const [[field, message]] = issues(r);
    expect(field).toBe("y.unit");
    expect(message).toContain("an area per steradian");
    expect(message).toContain("nb/sr");
  });

  it("passes on the engine's message for a unit it does not know", () => {
    const r = quantitySchema.safeParse({ x: { kind: "cos_theta" }, y: { kind: "sigma", unit: "furlong" } });
    expect(issues(r)).toEqual([["y.unit", expect.stringContaining('"furlong" is not known')]]);
  });

  it("needs a unit for t and energies, and only the listed ones", () => {
    expect(quantitySchema.safeParse({ x: { kind: "t" }, y: { kind: "dsigma_dt", unit: "GeV^-4" } }).success).toBe(false);
    expect(quantitySchema.safeParse({ x: { kind: "sqrt_s", unit: "TeV" }, y: { kind: "sigma", unit: "nb" } }).success).toBe(false);
    expect(quantitySchema.safeParse({ x: { kind: "beam_kinetic", unit: "keV" }, y: { kind: "sigma", unit: "nb" } }).success).toBe(true);
  });
});

describe("columnMappingSchema", () => {
  it("accepts a full mapping", () => {
    const m = {
      x: "theta",
      xLow: "lo",
      xHigh: "hi",
      y: "y",
      stat: { kind: "symmetric", column: "stat" },
      syst: { kind: "asymmetric", minus: "sm", plus: "sp" },
    };
    expect(columnMappingSchema.parse(m)).toEqual(m);
  });

  it("needs both bin edges or neither", () => {
    expect(issues(columnMappingSchema.safeParse({ x: "theta", xLow: "lo", y: "y" }))).toEqual([
      ["xHigh", expect.stringContaining("both")],
    ]);
  });

  it("refuses a column mapped twice", () => {
    const r = columnMappingSchema.safeParse({ x: "theta", y: "y", stat: { kind: "asymmetric", minus: "e", plus: "e" } });
    expect(issues(r)).toEqual([["stat.plus", expect.stringContaining('"e" is already mapped as stat.minus')]]);
  });

  it("refuses blank names and a missing y", () => {
    expect(columnMappingSchema.safeParse({ x: " ", y: "y" }).success).toBe(false);
    expect(columnMappingSchema.safeParse({ x: "x" }).success).toBe(false);
  });
});

describe("NATURAL_Y_UNIT", () => {
  it("names, for every y kind, a unit of the kind's dimension that the engine takes as its natural unit (factor 1)", () => {
    for (const kind of Y_KINDS) {
      const unit = parseUnit(NATURAL_Y_UNIT[kind]);
      expect(unit.dimension, kind).toBe(Y_DIMENSIONS[kind]);
      expect(unit.toNatural, kind).toBe(1);
    }
  });
});

import { describe, expect, it } from "vitest";
import { EngineInputError } from "./engine-input-error";
import { parseUnit } from "./units";

// Conversions: 1 GeV⁻² = (ħc)² = 0.3893793721 mb (CODATA 2018); 1 b = 100 fm² = 1e-24 cm² (the barn's definition).
const GEV2_IN_MB = 0.3893793721;

describe("parseUnit", () => {
  it.each([
    ["GeV^-2", "area", 1],
    ["1/GeV^2", "area", 1],
    ["GeV⁻²", "area", 1],
    ["mb", "area", 1 / GEV2_IN_MB],
    ["b", "area", 1000 / GEV2_IN_MB],
    ["ub", "area", 1e-3 / GEV2_IN_MB],
    ["µb", "area", 1e-3 / GEV2_IN_MB],
    ["μb", "area", 1e-3 / GEV2_IN_MB],
    ["nb", "area", 1e-6 / GEV2_IN_MB],
    ["pb", "area", 1e-9 / GEV2_IN_MB],
    ["fb", "area", 1e-12 / GEV2_IN_MB],
    ["fm^2", "area", 10 / GEV2_IN_MB],
    ["fm²", "area", 10 / GEV2_IN_MB],
    ["cm^2", "area", 1e27 / GEV2_IN_MB],
    ["cm2", "area", 1e27 / GEV2_IN_MB],
    ["ub/sr", "area/sr", 1e-3 / GEV2_IN_MB],
    ["GeV^-2/sr", "area/sr", 1],
    ["cm^2/sr", "area/sr", 1e27 / GEV2_IN_MB],
    ["nb/GeV^2", "area/GeV2", 1e-6 / GEV2_IN_MB],
    ["nb/GeV2", "area/GeV2", 1e-6 / GEV2_IN_MB],
    ["GeV^-4", "area/GeV2", 1],
  ])("%s is %s with toNatural %d", (text, dimension, toNatural) => {
    const u = parseUnit(text);
    expect(u.dimension).toBe(dimension);
    expect(u.toNatural / toNatural - 1).toBeCloseTo(0, 14);
    expect(u.text).toBe(text);
  });

  it("gives 1 GeV⁻² = 0.3893793721 mb and σ_T = 0.66524587321 b = 66.524587321 fm²", () => {
    expect(1 / parseUnit("mb").toNatural).toBeCloseTo(GEV2_IN_MB, 15);
    const sigmaNatural = 0.66524587321 * parseUnit("b").toNatural;
    expect(sigmaNatural / parseUnit("fm^2").toNatural).toBeCloseTo(66.524587321, 9);
  });

  it.each(["", "  ", "Mb", "barn", "nb/s", "GeV", "nb/sr/sr", "kg", "mb/GeV"])("rejects %j with a typed error naming the field", (text) => {
    let caught: unknown;
    try {
      parseUnit(text);
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(EngineInputError);
    expect((caught as EngineInputError).field).toBe("unit");
    expect((caught as EngineInputError).code).toBe("unknown_unit");
  });
});

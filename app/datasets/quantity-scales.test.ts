import { describe, expect, it } from "vitest";
import { parseUnit } from "~/engine/units";
import type { QuantityDescription } from "./quantity";
import { resolveQuantityScales } from "./quantity-scales";

const withY = (unit: string, kind: QuantityDescription["y"]["kind"] = "dsigma_domega"): QuantityDescription => ({
  x: { kind: "theta_cm_deg" },
  y: { kind, unit },
});

describe("resolveQuantityScales", () => {
  it("takes barn-family units to mb by a decimal shift, then to GeV^-2 by the engine's factor", () => {
    const mbPerSr = parseUnit("mb/sr").toNatural;
    expect(resolveQuantityScales(withY("pb/sr"))).toMatchObject({ yShift: -9, yFactor: mbPerSr });
    expect(resolveQuantityScales(withY("nb/sr"))).toMatchObject({ yShift: -6, yFactor: mbPerSr });
    expect(resolveQuantityScales(withY("µb/sr"))).toMatchObject({ yShift: -3, yFactor: mbPerSr });
    expect(resolveQuantityScales(withY("fm^2/sr"))).toMatchObject({ yShift: 1, yFactor: mbPerSr });
    expect(resolveQuantityScales(withY("cm^2/sr"))).toMatchObject({ yShift: 27, yFactor: mbPerSr });
    expect(resolveQuantityScales(withY("nb/GeV^2", "dsigma_dt"))).toMatchObject({ yShift: -6, yFactor: parseUnit("mb/GeV^2").toNatural });
  });

  it("leaves GeV^-2 units unshifted with factor 1", () => {
    expect(resolveQuantityScales(withY("GeV^-2/sr"))).toMatchObject({ yShift: 0, yFactor: 1 });
    expect(resolveQuantityScales(withY("GeV^-4", "dsigma_dt"))).toMatchObject({ yShift: 0, yFactor: 1 });
  });

  it("agrees with the engine's toNatural for every unit", () => {
    for (const unit of ["b/sr", "mb/sr", "ub/sr", "nb/sr", "pb/sr", "fb/sr", "fm^2/sr", "cm^2/sr", "GeV^-2/sr"]) {
      const s = resolveQuantityScales(withY(unit));
      const expected = parseUnit(unit).toNatural;
      expect(Math.abs(10 ** s.yShift * s.yFactor - expected) / expected, unit).toBeLessThan(1e-14);
    }
  });

  it("shifts MeV, keV and MeV^2 into GeV and GeV^2", () => {
    const y = { kind: "sigma", unit: "nb" } as const;
    expect(resolveQuantityScales({ x: { kind: "sqrt_s", unit: "MeV" }, y })).toMatchObject({ xShift: -3, xCanonicalUnit: "GeV" });
    expect(resolveQuantityScales({ x: { kind: "beam_kinetic", unit: "keV" }, y })).toMatchObject({ xShift: -6 });
    expect(resolveQuantityScales({ x: { kind: "t", unit: "MeV^2" }, y })).toMatchObject({ xShift: -6, xCanonicalUnit: "GeV^2" });
    expect(resolveQuantityScales({ x: { kind: "cos_theta" }, y })).toMatchObject({ xShift: 0, xCanonicalUnit: "1" });
  });
});

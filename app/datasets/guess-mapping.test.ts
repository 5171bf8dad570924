import { describe, expect, it } from "vitest";
import { guessMapping } from "./guess-mapping";

describe("guessMapping", () => {
  it("guesses a full mapping from clear headers", () => {
    const g = guessMapping(["theta_cm (deg)", "x_low", "x_high", "dsigma/dOmega [nb/sr]", "stat", "sys_minus", "sys_plus"]);
    expect(g.mapping).toEqual({
      x: "theta_cm (deg)",
      xLow: "x_low",
      xHigh: "x_high",
      y: "dsigma/dOmega [nb/sr]",
      stat: { kind: "symmetric", column: "stat" },
      syst: { kind: "asymmetric", minus: "sys_minus", plus: "sys_plus" },
    });
    expect(g.xKind).toBe("theta_cm_deg");
    expect(g.guessed).toEqual(["x", "bin", "y", "stat", "syst"]);
    expect(g.notGuessed).toEqual([]);
    expect(g.ambiguous).toEqual([]);
  });

  it("recognises y headers abbreviated with a unit after them", () => {
    for (const y of ["dsdo_ub_sr", "dsdomega", "ds_dcos", "dsdt", "xsec_nb", "sigma_nb", "dxs"]) {
      expect(guessMapping(["theta_cm", y, "stat"]).mapping.y, y).toBe(y);
    }
    // …without taking an error column or an unrelated name for y.
    expect(guessMapping(["theta_cm", "sigma_stat", "dsdo"]).mapping.y).toBe("dsdo");
    expect(guessMapping(["theta_cm", "design", "stat"]).mapping.y).toBeUndefined();
  });

  it("reads + and - suffixes and short bin names", () => {
    const g = guessMapping(["cos", "xlo", "xhi", "xsec", "stat-", "stat+", "syst"]);
    expect(g.mapping.stat).toEqual({ kind: "asymmetric", minus: "stat-", plus: "stat+" });
    expect(g.mapping.syst).toEqual({ kind: "symmetric", column: "syst" });
    expect(g.mapping.xLow).toBe("xlo");
    expect(g.mapping.xHigh).toBe("xhi");
    expect(g.xKind).toBe("cos_theta");
  });

  it("guesses bin_low/bin_high and knows sqrt_s", () => {
    const g = guessMapping(["sqrt_s", "bin_low", "bin_high", "sigma", "stat_err"]);
    expect(g.mapping).toMatchObject({ x: "sqrt_s", xLow: "bin_low", xHigh: "bin_high", y: "sigma" });
    expect(g.mapping.stat).toEqual({ kind: "symmetric", column: "stat_err" });
    expect(g.xKind).toBe("sqrt_s");
    expect(g.notGuessed).toEqual(["syst"]);
  });

  it("guesses nothing for a field with two candidates", () => {
    const g = guessMapping(["theta", "angle", "y"]);
    expect(g.mapping.x).toBeUndefined();
    expect(g.ambiguous).toEqual([{ field: "x", headers: ["theta", "angle"] }]);
    expect(g.mapping.y).toBe("y");
    expect(g.xKind).toBeNull();
  });

  it("does not say lab or CM for a bare theta", () => {
    const g = guessMapping(["theta", "y"]);
    expect(g.mapping.x).toBe("theta");
    expect(g.xKind).toBeNull();
  });

  it("guesses no bin from one edge and no asymmetric error from one side", () => {
    const g = guessMapping(["theta", "theta_min", "y", "stat_minus"]);
    expect(g.mapping.xLow).toBeUndefined();
    expect(g.mapping.xHigh).toBeUndefined();
    expect(g.mapping.stat).toBeUndefined();
    expect(g.notGuessed).toEqual(["bin", "stat", "syst"]);
  });

  it("guesses nothing when symmetric and asymmetric columns both exist", () => {
    const g = guessMapping(["x", "y", "stat", "stat_minus", "stat_plus"]);
    expect(g.mapping.stat).toBeUndefined();
    expect(g.ambiguous).toEqual([{ field: "stat", headers: ["stat", "stat_minus", "stat_plus"] }]);
  });

  it("leaves unclear headers alone", () => {
    const g = guessMapping(["a", "b", "error", "comment"]);
    expect(g.mapping).toEqual({});
    expect(g.guessed).toEqual([]);
    expect(g.notGuessed).toEqual(["x", "bin", "y", "stat", "syst"]);
  });
});

describe("guessMapping with frames and units in brackets", () => {
  it("keeps a frame written in brackets and drops a unit", () => {
    expect(guessMapping(["θ (CM)", "y"]).xKind).toBe("theta_cm_deg");
    expect(guessMapping(["theta [lab]", "y"]).xKind).toBe("theta_lab_deg");
    expect(guessMapping(["theta (c.m.)", "y"]).xKind).toBe("theta_cm_deg");
    expect(guessMapping(["theta (deg)", "y"]).xKind).toBeNull();
    expect(guessMapping(["theta (deg)", "y"]).mapping.x).toBe("theta (deg)");
  });
});

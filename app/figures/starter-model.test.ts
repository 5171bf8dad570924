import { describe, expect, it } from "vitest";
import { describeFigure, plainTextTex, reactionTex, unitTex, xLabelTex, yLabelTex } from "./figure-labels";
import { emptyFigureModel, figureModelFromDataset } from "./starter-model";

const ID = "3d3c2b1a-0f9e-4d8c-b7a6-123456789abc";

describe("default labels", () => {
  it("set units upright with µ and powers as superscripts", () => {
    expect(unitTex("ub/sr")).toBe("\\mu\\mathrm{b}/\\mathrm{sr}");
    expect(unitTex("GeV^-2/sr")).toBe("\\mathrm{GeV}^{-2}/\\mathrm{sr}");
    expect(unitTex("pb/GeV^2")).toBe("\\mathrm{pb}/\\mathrm{GeV}^{2}");
    expect(unitTex("nb")).toBe("\\mathrm{nb}");
  });

  it("name the frame of frame-dependent quantities only", () => {
    expect(xLabelTex("thetaDeg", "lab", "GeV")).toBe("\\theta_{\\mathrm{lab}}\\ [\\mathrm{deg}]");
    expect(xLabelTex("t", "cm", "GeV")).toBe("t\\ [\\mathrm{GeV}^{2}]");
    expect(yLabelTex("dsigma/dOmega", "nb/sr", "cm")).toBe("(\\mathrm{d}\\sigma/\\mathrm{d}\\Omega)_{\\mathrm{CM}}\\ [\\mathrm{nb}/\\mathrm{sr}]");
    expect(yLabelTex("sigma", "nb", "lab")).toBe("\\sigma\\ [\\mathrm{nb}]");
  });

  it("write reactions in TeX", () => {
    expect(reactionTex("e⁺e⁻ → γγ")).toBe("e^{+}e^{-}\\to \\gamma \\gamma");
    expect(reactionTex("φ⁺φ⁻ → γγ")).toBe("\\phi ^{+}\\phi ^{-}\\to \\gamma \\gamma");
  });
});

describe("a figure started from a dataset", () => {
  it("uses the dataset's x variable, frame, y observable and unit, and compares it with the prediction its metadata names", () => {
    const m = figureModelFromDataset({
      id: ID, name: "Run 7", revisionNumber: 3, process: "pair-annihilation", beamEnergyGeV: 0.5 + 0.00051099895,
      quantity: { x: { kind: "theta_lab_deg" }, y: { kind: "dsigma_domega", unit: "nb/sr" } },
    });
    expect(m.x).toMatchObject({ variable: "thetaDeg", frame: "lab" });
    expect(m.y).toMatchObject({ observable: "dsigma/dOmega", unit: "nb/sr" });
    const [prediction, data] = m.panels[0].layers;
    expect(prediction).toMatchObject({ kind: "prediction", process: "pair-annihilation", energy: { kind: "beam", value: 0.50051099895, unit: "GeV" } });
    expect(data).toMatchObject({ kind: "dataset", datasetId: ID, revisionNumber: 3, compareWith: prediction.id });
    expect(m.panels[0].strip).toBe("ratio");
  });

  it("holds the data alone when the metadata names no process, or one without the dataset's frame", () => {
    const alone = figureModelFromDataset({ id: ID, name: "x", revisionNumber: 1, process: null, beamEnergyGeV: null, quantity: { x: { kind: "cos_theta" }, y: { kind: "dsigma_dcos", unit: "pb" } } });
    expect(alone.panels[0].layers.map((l) => l.kind)).toEqual(["dataset"]);
    expect(alone.panels[0].strip).toBe("none");
    // γγ → e⁺e⁻ has no lab frame (a photon cannot be at rest).
    const noLab = figureModelFromDataset({ id: ID, name: "x", revisionNumber: 1, process: "breit-wheeler", beamEnergyGeV: 1, quantity: { x: { kind: "theta_lab_deg" }, y: { kind: "dsigma_domega", unit: "nb/sr" } } });
    expect(noLab.panels[0].layers.map((l) => l.kind)).toEqual(["dataset"]);
  });

  it("an empty figure is a valid model with one empty panel, described in words", () => {
    const m = emptyFigureModel();
    expect(m.panels).toHaveLength(1);
    expect(m.panels[0].layers).toEqual([]);
    expect(describeFigure(m, { x: [0, 180], y: [0.01, 100] })).toBe(
      "dσ/dΩ in ub/sr (log scale, 0.01 to 100) against θ (lab, degrees) from 0 to 180, 0 measured datasets with error bars and 0 predictions.",
    );
  });
});

describe("plain words as TeX", () => {
  it("typesets a dataset name with reaction signs and TeX specials without a TeX error", async () => {
    const { renderTex } = await import("./tex/render-tex");
    const name = "e⁺e⁻ → γγ photon angular distribution, T = 0.5 GeV (synthetic) 100% {run_7} & more";
    const tex = plainTextTex(name);
    expect(tex).toContain("\\text{e}^{+}\\text{e}^{-}\\text{ }\\to \\text{ }\\gamma \\gamma \\text{ photon");
    expect(tex).toContain("100\\% \\{run\\_7\\} \\& more");
    const rendered = await renderTex(tex, { fontSizePt: 8 });
    expect(rendered.widthPt).toBeGreaterThan(100);
  });
});

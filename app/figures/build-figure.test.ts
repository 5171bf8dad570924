import { describe, expect, it } from "vitest";
import { buildFigure, type MeasureTex } from "./build-figure";
import { computeFigureData } from "./compute-figure-data";
import { datasetInputKey, type DatasetInput } from "./figure-inputs";
import { figureModelSchema } from "./figure-model";
import { findPreset } from "./journal-presets";

const ID = "5a0e1f2d-3c4b-4a59-8e7f-0a1b2c3d4e5f";
// Rows are in natural units (GeV⁻²/sr) and so is the y axis here, so numbers pass unchanged.
// Text sizes do not matter for these checks: every label measures 10 × 6 pt.
const measure: MeasureTex = () => ({ widthPt: 10, heightPt: 6, depthPt: 0 });

function figure(yScale: "log" | "linear", rows: DatasetInput["rows"]) {
  const model = figureModelSchema.parse({
    version: 1, preset: "single-column", panelHeightMm: 50, fontSizePt: 8, lineWidthPt: 0.5,
    x: { variable: "thetaDeg", frame: "cm", label: "\\theta" },
    y: { observable: "dsigma/dOmega", unit: "GeV^-2/sr", scale: yScale, domain: yScale === "log" ? [0.5, 20] : [-5, 20], label: "y" },
    legend: { position: "none", statistics: "none" },
    panels: [{ id: "main", layers: [{ kind: "dataset", id: "data", label: "d", datasetId: ID, revisionNumber: 1, colour: "#1b1a17", marker: "disc" }] }],
  });
  const input: DatasetInput = {
    datasetId: ID, datasetName: "d", revisionNumber: 1, revisionId: "r1", contentHash: "0".repeat(64), latestRevisionNumber: 1,
    quantity: { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "GeV^-2/sr" } }, rows,
  };
  const built = buildFigure(model, computeFigureData(model, { [datasetInputKey(ID, 1)]: input }), findPreset("single-column")!, measure);
  const layers = (built.plots[0].spec as { layer: { data: { values: Record<string, number>[] }; mark: { type: string } }[] }).layer;
  return { built, layers };
}

const row = (x: number, y: number, statMinus: number, statPlus: number, systMinus = 0, systPlus = 0) => ({ x, xLow: x - 1, xHigh: x + 1, y, statMinus, statPlus, systMinus, systPlus });

describe("buildFigure: error bars", () => {
  it("draws asymmetric errors the right way round: stat caps at y − down and y + up, total bar stat ⊕ syst", () => {
    const { layers } = figure("linear", [row(40, 10, 1, 3, 2, 4)]);
    const rows = layers[0].data.values;
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ x: 40, y: 10, slo: 9, shi: 13, blo: 39, bhi: 41 });
    expect(rows[0].lo).toBeCloseTo(10 - Math.hypot(1, 2), 12);
    expect(rows[0].hi).toBeCloseTo(10 + Math.hypot(3, 4), 12);
  });

  it("on a log axis draws a lower error that reaches zero or below to the axis edge, and keeps the point", () => {
    const { layers } = figure("log", [row(40, 2, 3, 1), row(60, 5, 1, 1)]);
    const rows = layers[0].data.values;
    expect(rows.map((r) => r.x)).toEqual([40, 60]);
    expect(rows[0].slo).toBe(0.5); // the axis' lower end, not dropped
    expect(rows[0].lo).toBe(0.5);
    expect(rows[0].shi).toBe(3);
    expect(rows[1].slo).toBe(4);
  });

  it("is deterministic: the same input gives the same spec, byte for byte", () => {
    const a = JSON.stringify(figure("log", [row(40, 2, 0.3, 0.4), row(60, 5, 1, 1)]).built);
    const b = JSON.stringify(figure("log", [row(40, 2, 0.3, 0.4), row(60, 5, 1, 1)]).built);
    expect(a).toBe(b);
  });
});

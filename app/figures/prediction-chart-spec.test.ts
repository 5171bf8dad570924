import { compile } from "vega-lite";
import { describe, expect, it } from "vitest";
import { runPrediction } from "~/engine";
import { type ChartedResponse, chartRowsOf, DEFAULT_VIEW, predictionChartSpec, tickText } from "./prediction-chart-spec";

// The layers of a spec, loosely typed for inspection.
type Layer = { mark: { type: string; point?: unknown }; encoding: Record<string, { field?: string; title?: string; scale?: Record<string, unknown>; axis?: { values?: number[]; labelExpr?: string } }> };
const layersOf = (spec: unknown) => (spec as { layer: Layer[] }).layer;

const compton = (extra: Record<string, unknown>) =>
  runPrediction({ process: "compton", frame: "lab", energy: { beam: 1, unit: "MeV" }, unit: "ub/sr", ...extra });

describe("predictionChartSpec", () => {
  it("draws values at points as one line on a log axis over the whole θ range, with titles and a description", () => {
    const r = compton({ thetaDeg: [0, 30, 60, 90, 120, 150, 180] });
    const { spec, description } = predictionChartSpec(r);
    const [line] = layersOf(spec);
    expect(layersOf(spec)).toHaveLength(1);
    expect(line.mark).toMatchObject({ type: "line", point: false });
    expect(line.encoding.x).toMatchObject({ field: "x", title: "θ (lab), degrees", scale: { domain: [0, 180], nice: false } });
    expect(line.encoding.y).toMatchObject({ field: "y", title: "dσ/dΩ, µb/sr", scale: { type: "log" } });
    expect((spec as { data: { values: unknown } }).data.values).toEqual(r.points!.map((x, i) => ({ x, y: r.values[i] })));
    expect(description).toBe(`dσ/dΩ, µb/sr (log) against θ (lab), degrees (linear), ${r.conventions.reaction}`);
  });

  it("draws a bin mean as a level across its bin, joined by a thin line through the bin centres", () => {
    const r = compton({ thetaDegBins: [[20, 40], [40, 60], [60, 80]] });
    const { spec } = predictionChartSpec(r);
    const [level, joint] = layersOf(spec);
    expect(level.mark.type).toBe("rule");
    expect(level.encoding.x2).toEqual({ field: "x2" });
    expect(joint.encoding.x.field).toBe("xc");
    expect((spec as { transform: unknown }).transform).toEqual([{ calculate: "(datum.x + datum.x2) / 2", as: "xc" }]);
    expect(level.encoding.y.title).toBe("dσ/dΩ (bin mean), µb/sr");
    // A span under 90° keeps the axis on the data.
    expect(level.encoding.x.scale).toEqual({ type: "linear", zero: false, nice: false, domain: [20, 80] });
    expect(chartRowsOf(r)).toEqual([[20, 40], [40, 60], [60, 80]].map(([x, x2], i) => ({ x, x2, y: r.values[i] })));
  });

  it("shows the whole cos θ range for a wide curve, and marks the points of a curve of fewer than three", () => {
    const wide = predictionChartSpec(compton({ observable: "dsigma/dcos", unit: "ub", cosTheta: [-0.9, 0, 0.9] })).spec;
    expect(layersOf(wide)[0].encoding.x).toMatchObject({ title: "cos θ (lab)", scale: { domain: [-1, 1] } });
    const two = predictionChartSpec(compton({ thetaDeg: [30, 60] })).spec;
    expect(layersOf(two)[0].mark.point).toEqual({ filled: true, color: "#25241f" });
  });

  it("uses a linear axis as soon as one value is not positive, so that a sign change stays visible", () => {
    const r: ChartedResponse = { ...compton({ thetaDeg: [30, 60, 90] }), values: [1, 0, -1] };
    const { spec, notes } = predictionChartSpec(r);
    expect(layersOf(spec)[0].encoding.y.scale).toMatchObject({ type: "linear", zero: false });
    expect(notes).toEqual(["The y axis is linear: a log axis needs every value and both ends above zero."]);
  });

  it("draws the scales and ranges asked for, with ticks at powers of ten on a log axis", () => {
    const r = compton({ thetaDeg: [10, 30, 60, 90] });
    const { spec, notes } = predictionChartSpec(r, { xScale: "log", yScale: "log", x: [1, 100], y: [1e-3, 1e5] });
    const [line] = layersOf(spec);
    expect(notes).toEqual([]);
    expect(line.encoding.x.scale).toMatchObject({ type: "log", domain: [1, 100] });
    expect(line.encoding.y.scale).toMatchObject({ type: "log", domain: [1e-3, 1e5] });
    // Eight decades: every decade labelled as a power of ten (axis-ticks.ts).
    expect(line.encoding.y.axis?.values).toEqual([1e-3, 1e-2, 1e-1, 1, 10, 100, 1e3, 1e4, 1e5]);
    expect(line.encoding.y.axis?.labelExpr).toContain('"10⁻³"');
    expect(line.encoding.y.axis?.labelExpr).toContain('"10⁵"');
    const linear = predictionChartSpec(r, { ...DEFAULT_VIEW, yScale: "linear", y: [0, 2e7] }).spec;
    // Large linear values as a × 10ⁿ rather than "10,000,000".
    expect(layersOf(linear)[0].encoding.y.axis?.labelExpr).toContain("× 10⁷");
  });

  it("writes TeX tick labels as plain text", () => {
    expect(tickText("10^{-3}")).toBe("10⁻³");
    expect(tickText("2 \\times 10^{5}")).toBe("2 × 10⁵");
    expect(tickText("-0.5")).toBe("−0.5");
  });

  it("is a spec that the Vega-Lite compiler accepts, binned or not", () => {
    for (const [r, view] of [
      [compton({ thetaDeg: [30, 60, 90] }), DEFAULT_VIEW],
      [compton({ thetaDegBins: [[20, 40], [40, 60]] }), { ...DEFAULT_VIEW, xScale: "log" as const, y: [1, null] as [number, null] }],
    ] as const) {
      const { spec: vega } = compile(predictionChartSpec(r, view).spec);
      expect(vega.marks?.length).toBeGreaterThan(0);
    }
  });
});

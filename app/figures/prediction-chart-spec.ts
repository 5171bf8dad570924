// The Predictions page's quick-look curve as a Vega-Lite spec: a pure function of the engine's
// response, so that the page only embeds it (and the figure composer can grow from it).
import type { TopLevelSpec } from "vega-lite";
import type { Observable, PredictionResponse } from "~/engine";
import { unitLabel } from "~/components/predictions/unit-choices";
import { axisTicks, type ScaleType } from "./axis-ticks";

/** One value of the curve; `x2` is present when the value is the mean over the bin [x, x2]. */
export type ChartRow = { x: number; y: number; x2?: number };

export type ChartedResponse = Pick<
  PredictionResponse,
  "observable" | "binned" | "unit" | "variable" | "frame" | "parameters" | "points" | "bins" | "values" | "conventions"
>;

export const OBSERVABLE_TITLE: Record<Observable, string> = { "dsigma/dOmega": "dσ/dΩ", "dsigma/dcos": "dσ/dcosθ", "dsigma/dt": "dσ/dt", sigma: "σ" };

/** The title of the variable the values are a function of, with its frame or unit. */
export function xTitleOf(r: Pick<PredictionResponse, "frame" | "parameters" | "variable">): string {
  const frame = r.frame === "cm" ? "CM" : "lab";
  const eUnit = r.parameters.scan?.unit ?? "GeV";
  switch (r.variable) {
    case "thetaDeg": return `θ (${frame}), degrees`;
    case "cosTheta": return `cos θ (${frame})`;
    case "t": return "t, GeV²";
    case "sqrtS": return `√s, ${eUnit}`;
    case "beam": return `total beam energy, ${eUnit}`;
    case "kinetic": return `beam kinetic energy, ${eUnit}`;
    default: return "";
  }
}

export function chartRowsOf(r: Pick<PredictionResponse, "binned" | "bins" | "points" | "values">): ChartRow[] {
  return r.values.map((y, i) => (r.binned ? { x: r.bins![i][0], x2: r.bins![i][1], y } : { x: r.points![i], y }));
}

const INK = "#25241f";
const AXIS = {
  gridColor: "#e6e0d2", domainColor: "#8a8578", tickColor: "#8a8578", labelColor: INK, titleColor: INK,
  titleFontWeight: 500 as const, labelFont: "IBM Plex Sans", titleFont: "IBM Plex Sans", labelFontSize: 12, titleFontSize: 13,
};

/** How the reader wants the axes: scale and, where given, the ends of each range. */
export interface ChartView {
  xScale: ScaleType;
  yScale: ScaleType;
  x: [number | null, number | null];
  y: [number | null, number | null];
}

export const DEFAULT_VIEW: ChartView = { xScale: "linear", yScale: "log", x: [null, null], y: [null, null] };

/** A tick label of axis-ticks.ts (TeX) as plain text: 10^{-3} → 10⁻³, 2 \times 10^{5} → 2 × 10⁵. */
export function tickText(tex: string): string {
  const SUP: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };
  return tex
    .replace(/\\times/g, "×")
    .replace(/\^\{(-?\d+)\}/g, (_, e: string) => [...e].map((c) => SUP[c]).join(""))
    .replace(/^-/, "−");
}

function extent(values: number[]): [number, number] {
  return [Math.min(...values), Math.max(...values)];
}

/** The domain from the reader's ends where given and from the data otherwise. */
function domainOf(data: [number, number], wanted: [number | null, number | null], fixed?: [number, number]): [number, number] {
  const base = fixed ?? data;
  return [wanted[0] ?? base[0], wanted[1] ?? base[1]];
}

/** Axis settings of explicit ticks with readable labels (powers of ten on a log axis). */
function axisOf(domain: [number, number], scale: ScaleType) {
  const ticks = domain[0] < domain[1] ? axisTicks(domain, scale, 7) : [];
  if (ticks.length === 0) return {};
  const values = ticks.map((t) => t.value);
  const labels = ticks.map((t) => tickText(t.tex));
  return {
    values,
    labelExpr: `indexof(${JSON.stringify(values)}, datum.value) >= 0 ? ${JSON.stringify(labels)}[indexof(${JSON.stringify(values)}, datum.value)] : ''`,
  };
}

/**
 * The curve of a prediction with values over a variable (not a single σ), its description for
 * assistive technology, and notes on what of the wanted view could not be applied.
 */
export function predictionChartSpec(r: ChartedResponse, view: ChartView = DEFAULT_VIEW): { spec: TopLevelSpec; description: string; notes: string[] } {
  const rows = chartRowsOf(r);
  const notes: string[] = [];
  const xs = rows.flatMap((row) => (row.x2 === undefined ? [row.x] : [row.x, row.x2]));
  const span = Math.max(...xs) - Math.min(...xs);
  // The full angular range gives the shape its context, unless the curve covers a small part of it.
  const fullRange: [number, number] | undefined =
    r.variable === "thetaDeg" && span >= 90 ? [0, 180] : r.variable === "cosTheta" && span >= 1 ? [-1, 1] : undefined;
  const yTitle = `${OBSERVABLE_TITLE[r.observable]}${r.binned ? " (bin mean)" : ""}, ${unitLabel(r.unit)}`;
  const xTitle = xTitleOf(r);

  // A log axis only when every value (and the wanted range) allows it; a sign change would otherwise vanish silently.
  let yType = view.yScale;
  if (yType === "log" && !(rows.every((row) => row.y > 0) && view.y.every((v) => v === null || v > 0))) {
    yType = "linear";
    if (view.yScale === "log") notes.push("The y axis is linear: a log axis needs every value and both ends above zero.");
  }
  let xType = view.xScale;
  if (xType === "log" && !(xs.every((v) => v > 0) && view.x.every((v) => v === null || v > 0))) {
    xType = "linear";
    notes.push("The x axis is linear: a log axis needs every value and both ends above zero.");
  }
  const xDomain = domainOf(extent(xs), view.x, xType === "linear" ? fullRange : undefined);
  const yDomain = domainOf(extent(rows.map((row) => row.y)), view.y);
  if (!(xDomain[0] < xDomain[1]) && view.x.some((v) => v !== null)) notes.push("The x range is ignored: its end must be above its start.");
  if (!(yDomain[0] < yDomain[1]) && view.y.some((v) => v !== null)) notes.push("The y range is ignored: its end must be above its start.");
  const xOk = xDomain[0] < xDomain[1];
  const yOk = yDomain[0] < yDomain[1];
  const xScale = { type: xType, nice: false, zero: false, ...(xOk ? { domain: xDomain } : {}) };
  const yScale = { type: yType, nice: false, zero: false, ...(yOk ? { domain: yDomain } : {}) };
  const binned = rows.some((row) => row.x2 !== undefined);
  const x = { field: "x", type: "quantitative" as const, title: xTitle, scale: xScale, axis: xOk ? axisOf(xDomain, xType) : {} };
  const y = { field: "y", type: "quantitative" as const, title: yTitle, scale: yScale, axis: yOk ? axisOf(yDomain, yType) : {} };
  const spec: TopLevelSpec = {
    $schema: "https://vega.github.io/schema/vega-lite/v6.json",
    width: "container",
    height: 340,
    background: "#fbf9f3",
    data: { values: rows },
    layer: binned
      ? [
          // A bin mean is a value over the whole bin: drawn as a level across it, not a point.
          { mark: { type: "rule", clip: true, color: INK, strokeWidth: 1.5 }, encoding: { x, x2: { field: "x2" }, y } },
          { mark: { type: "line", clip: true, color: INK, strokeWidth: 0.6, strokeDash: [2, 3] }, encoding: { x: { ...x, field: "xc" }, y } },
        ]
      : [{ mark: { type: "line", clip: true, color: INK, strokeWidth: 1.5, point: rows.length < 3 ? { filled: true, color: INK } : false }, encoding: { x, y } }],
    transform: binned ? [{ calculate: "(datum.x + datum.x2) / 2", as: "xc" }] : [],
    config: { font: "IBM Plex Sans", axis: AXIS, view: { stroke: "#d8d1c0" } },
  };
  return { spec, description: `${yTitle} (${yType}) against ${xTitle} (${xType}), ${r.conventions.reaction}`, notes };
}

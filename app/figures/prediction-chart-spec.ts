// The Predictions page's quick-look curve as a Vega-Lite spec: a pure function of the engine's
// response, so that the page only embeds it (and the figure composer can grow from it).
import type { TopLevelSpec } from "vega-lite";
import type { Observable, PredictionResponse } from "~/engine";
import { unitLabel } from "~/components/predictions/unit-choices";

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
  titleFontWeight: 500 as const, labelFont: "IBM Plex Sans", titleFont: "IBM Plex Sans",
};

/** The curve of a prediction with values over a variable (not a single σ), and its description for assistive technology. */
export function predictionChartSpec(r: ChartedResponse): { spec: TopLevelSpec; description: string } {
  const rows = chartRowsOf(r);
  const xs = rows.flatMap((row) => (row.x2 === undefined ? [row.x] : [row.x, row.x2]));
  const span = Math.max(...xs) - Math.min(...xs);
  // The full angular range gives the shape its context, unless the curve covers a small part of it.
  const xDomain: [number, number] | undefined =
    r.variable === "thetaDeg" && span >= 90 ? [0, 180] : r.variable === "cosTheta" && span >= 1 ? [-1, 1] : undefined;
  const yTitle = `${OBSERVABLE_TITLE[r.observable]}${r.binned ? " (bin mean)" : ""}, ${unitLabel(r.unit)}`;
  const xTitle = xTitleOf(r);

  // A log axis only when every value allows it; a sign change would otherwise vanish silently.
  const yScale = rows.every((row) => row.y > 0) ? { type: "log" as const } : { type: "linear" as const, zero: false };
  const xScale = xDomain ? { domain: xDomain, nice: false } : { zero: false, nice: false };
  const binned = rows.some((row) => row.x2 !== undefined);
  const x = { field: "x", type: "quantitative" as const, title: xTitle, scale: xScale };
  const y = { field: "y", type: "quantitative" as const, title: yTitle, scale: yScale };
  const spec: TopLevelSpec = {
    $schema: "https://vega.github.io/schema/vega-lite/v6.json",
    width: "container",
    height: 340,
    background: "#fbf9f3",
    data: { values: rows },
    layer: binned
      ? [
          // A bin mean is a value over the whole bin: drawn as a level across it, not a point.
          { mark: { type: "rule", color: INK, strokeWidth: 1.5 }, encoding: { x, x2: { field: "x2" }, y } },
          { mark: { type: "line", color: INK, strokeWidth: 0.6, strokeDash: [2, 3] }, encoding: { x: { ...x, field: "xc" }, y } },
        ]
      : [{ mark: { type: "line", color: INK, strokeWidth: 1.5, point: rows.length < 3 ? { filled: true, color: INK } : false }, encoding: { x, y } }],
    transform: binned ? [{ calculate: "(datum.x + datum.x2) / 2", as: "xc" }] : [],
    config: { font: "IBM Plex Sans", axis: AXIS, view: { stroke: "#d8d1c0" } },
  };
  return { spec, description: `${yTitle} against ${xTitle}, ${r.conventions.reaction}` };
}

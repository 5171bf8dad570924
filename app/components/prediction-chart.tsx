import { useEffect, useRef } from "react";
import type { VisualizationSpec } from "vega-embed";

/** One value of the curve; `x2` is present when the value is the mean over the bin [x, x2]. */
export type ChartRow = { x: number; y: number; x2?: number };

type Props = { rows: ChartRow[]; xTitle: string; yTitle: string; xDomain?: [number, number]; description: string };

const INK = "#25241f";
const AXIS = {
  gridColor: "#e6e0d2", domainColor: "#8a8578", tickColor: "#8a8578", labelColor: INK, titleColor: INK,
  titleFontWeight: 500 as const, labelFont: "IBM Plex Sans", titleFont: "IBM Plex Sans",
};

function chartSpec({ rows, xTitle, yTitle, xDomain }: Props): VisualizationSpec {
  // A log axis only when every value allows it; a sign change would otherwise vanish silently.
  const yScale = rows.every((r) => r.y > 0) ? { type: "log" as const } : { type: "linear" as const, zero: false };
  const xScale = xDomain ? { domain: xDomain, nice: false } : { zero: false, nice: false };
  const binned = rows.some((r) => r.x2 !== undefined);
  const x = { field: "x", type: "quantitative" as const, title: xTitle, scale: xScale };
  const y = { field: "y", type: "quantitative" as const, title: yTitle, scale: yScale };
  return {
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
}

/** The quick-look curve of a prediction; vega-embed is loaded lazily so that pages without charts stay small. */
export function PredictionChart(props: Props) {
  const ref = useRef<HTMLDivElement>(null);
  const { rows, xTitle, yTitle, xDomain } = props;
  useEffect(() => {
    let cancelled = false;
    let finalize: (() => void) | undefined;
    const spec = chartSpec({ rows, xTitle, yTitle, xDomain, description: "" });
    import("vega-embed").then(({ default: embed }) => {
      if (cancelled || !ref.current) return;
      embed(ref.current, spec, { actions: false, renderer: "svg" }).then((r) => {
        if (cancelled) r.finalize();
        else finalize = () => r.finalize();
      });
    });
    return () => {
      cancelled = true;
      finalize?.();
    };
  }, [rows, xTitle, yTitle, xDomain]);
  return <div ref={ref} className="w-full" role="img" aria-label={props.description} data-testid="prediction-chart" />;
}

import { useEffect, useRef } from "react";

type Props = { thetas: number[]; values: number[]; unit: string; frame: string };

/** A quick-look curve; vega-embed is loaded lazily so that pages without charts stay small. */
export function PredictionChart({ thetas, values, unit, frame }: Props) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    let cancelled = false;
    let finalize: (() => void) | undefined;
    const positive = values.every((v) => v > 0);
    const spec = {
      $schema: "https://vega.github.io/schema/vega-lite/v6.json",
      width: "container" as const,
      height: 340,
      background: "#fbf9f3",
      data: { values: thetas.map((t, i) => ({ theta: t, y: values[i] })) },
      mark: { type: "line" as const, color: "#25241f", strokeWidth: 1.5 },
      encoding: {
        x: { field: "theta", type: "quantitative" as const, title: `θ (${frame === "cm" ? "CM" : "lab"}), degrees`, scale: { domain: [0, 180] } },
        y: { field: "y", type: "quantitative" as const, title: `dσ/dΩ (${unit.replace("ub", "µb")})`, scale: { type: positive ? ("log" as const) : ("linear" as const) } },
      },
      config: { font: "IBM Plex Sans", axis: { gridColor: "#e6e0d2", domainColor: "#8a8578", tickColor: "#8a8578", labelColor: "#25241f", titleColor: "#25241f", titleFontWeight: 500 }, view: { stroke: "#d8d1c0" } },
    };
    import("vega-embed").then(({ default: embed }) => {
      if (cancelled || !ref.current) return;
      embed(ref.current, spec as never, { actions: false, renderer: "svg" }).then((r) => {
        if (cancelled) r.finalize();
        else finalize = () => r.finalize();
      });
    });
    return () => { cancelled = true; finalize?.(); };
  }, [thetas, values, unit, frame]);
  return <div ref={ref} className="w-full" role="img" aria-label={`Predicted dσ/dΩ in ${unit} against θ`} data-testid="prediction-chart" />;
}

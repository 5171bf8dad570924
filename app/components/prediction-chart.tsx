import { useEffect, useRef } from "react";
import type { TopLevelSpec } from "vega-lite";

type Props = { spec: TopLevelSpec; description: string };

/** The quick-look curve of a prediction; vega-embed is loaded lazily so that pages without charts stay small. */
export function PredictionChart({ spec, description }: Props) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    let cancelled = false;
    let finalize: (() => void) | undefined;
    // vega's interpreter instead of Function()-compiled expressions: the Content-Security-Policy
    // has no 'unsafe-eval' (docs/decisions/0012-hardening.md).
    Promise.all([import("vega-embed"), import("vega-interpreter")]).then(([{ default: embed }, { expressionInterpreter }]) => {
      if (cancelled || !ref.current) return;
      embed(ref.current, spec, { actions: false, renderer: "svg", ast: true, expr: expressionInterpreter }).then((r) => {
        if (cancelled) r.finalize();
        else finalize = () => r.finalize();
      });
    });
    return () => {
      cancelled = true;
      finalize?.();
    };
  }, [spec]);
  return <div ref={ref} className="w-full" role="img" aria-label={description} data-testid="prediction-chart" />;
}

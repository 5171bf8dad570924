import { useEffect, useRef } from "react";
import type { TopLevelSpec } from "vega-lite";

type Props = { spec: TopLevelSpec; description: string };

/** The quick-look curve of a prediction; vega-embed is loaded lazily so that pages without charts stay small. */
export function PredictionChart({ spec, description }: Props) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    let cancelled = false;
    let finalize: (() => void) | undefined;
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
  }, [spec]);
  return <div ref={ref} className="w-full" role="img" aria-label={description} data-testid="prediction-chart" />;
}

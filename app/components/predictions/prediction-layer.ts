import type { ProcessInfo } from "~/engine";
import type { PredictionFormState } from "./prediction-form-state";

/**
 * The page's prediction as a figure's prediction layer (app/figures/figure-model.ts), without
 * the id and colour that the figure gives it; null while the form has no valid request. The
 * figure draws the layer on its own axes, so the page's variable and range are not carried.
 */
export function predictionLayerOf(f: PredictionFormState, info: ProcessInfo, body: Record<string, unknown> | null): Record<string, unknown> | null {
  if (body === null) return null;
  const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : null);
  const energyValue = f.variable === "energy" ? num(Number(f.from.trim())) : num((body.energy as Record<string, unknown> | undefined)?.[f.energyKind]);
  if (energyValue === null || !(energyValue > 0)) return null;
  const acceptance = (body.acceptance as { thetaDeg?: unknown[] } | undefined)?.thetaDeg;
  return {
    label: `${info.theory}, Born`,
    process: f.process,
    energy: { kind: f.energyKind, value: energyValue, unit: f.energyUnit },
    fixedThetaDeg: f.variable === "energy" && f.observable !== "sigma" ? num((body.thetaDeg as unknown[] | undefined)?.[0]) : null,
    acceptanceThetaDeg: acceptance && num(acceptance[0]) !== null && num(acceptance[1]) !== null ? [acceptance[0], acceptance[1]] : null,
    mass: num(body.mass),
    finalMass: num(body.finalMass),
    alpha: num(body.alpha),
    formFactor: (body.formFactor as Record<string, unknown> | undefined) ?? null,
  };
}

import { X_LABELS, Y_LABELS } from "~/datasets/quantity";
import { parseUnit } from "~/engine/units";

type Q = { x: { kind: keyof typeof X_LABELS; unit?: string }; y: { kind: keyof typeof Y_LABELS; unit: string } };

/** "dσ/dΩ [nb/sr] against θ (CM) [°]" */
export function describeQuantity(q: unknown): string {
  const { x, y } = q as Q;
  const xUnit = x.kind.startsWith("theta") ? "°" : x.kind === "cos_theta" ? "" : (x.unit ?? "");
  return `${Y_LABELS[y.kind]} [${y.unit.replace("ub", "µb")}] against ${X_LABELS[x.kind]}${xUnit ? ` [${xUnit}]` : ""}`;
}

/**
 * Revisions store y in the engine's natural units (GeV⁻², per sr or per GeV² where it applies);
 * tables show it in the unit the dataset declares.
 */
export function displayScale(q: unknown): { yFactor: number; yUnit: string; xUnit: string } {
  const { x, y } = q as Q;
  return {
    yFactor: 1 / parseUnit(y.unit).toNatural,
    yUnit: y.unit.replace("ub", "µb"),
    xUnit: x.kind.startsWith("theta") ? "°" : x.kind === "cos_theta" ? "" : x.kind === "t" ? "GeV²" : "GeV",
  };
}

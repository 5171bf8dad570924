import { X_LABELS, Y_LABELS } from "~/datasets/quantity";

type Q = { x: { kind: keyof typeof X_LABELS; unit?: string }; y: { kind: keyof typeof Y_LABELS; unit: string } };

/** "dσ/dΩ [nb/sr] against θ (CM) [°]" */
export function describeQuantity(q: unknown): string {
  const { x, y } = q as Q;
  const xUnit = x.kind.startsWith("theta") ? "°" : x.kind === "cos_theta" ? "" : (x.unit ?? "");
  return `${Y_LABELS[y.kind]} [${y.unit.replace("ub", "µb")}] against ${X_LABELS[x.kind]}${xUnit ? ` [${xUnit}]` : ""}`;
}

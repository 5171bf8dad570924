import { X_LABELS, Y_LABELS } from "~/datasets/quantity";
import { parseUnit } from "~/engine/units";

type Q = { x: { kind: keyof typeof X_LABELS; unit?: string }; y: { kind: keyof typeof Y_LABELS; unit: string } };

/** "dσ/dΩ [nb/sr] against θ (CM) [°]" */
export function describeQuantity(q: unknown): string {
  const { x, y } = q as Q;
  const xUnit = x.kind.startsWith("theta") ? "°" : x.kind === "cos_theta" ? "" : (x.unit ?? "");
  return `${Y_LABELS[y.kind]} [${y.unit.replace("ub", "µb")}] against ${X_LABELS[x.kind]}${xUnit ? ` [${xUnit}]` : ""}`;
}

/** Stored x is in the normal form's canonical unit (docs/decisions/0004). */
const CANONICAL_X_LABEL: Record<Q["x"]["kind"], string> = { theta_lab_deg: "°", theta_cm_deg: "°", cos_theta: "", t: "GeV²", sqrt_s: "GeV", beam_energy: "GeV", beam_kinetic: "GeV" };

/**
 * Revisions store y in the engine's natural units (GeV⁻², per sr or per GeV² where it applies);
 * tables show it in the unit the dataset declares.
 */
export function displayScale(q: unknown): { yFactor: number; yUnit: string; xUnit: string } {
  const { x, y } = q as Q;
  return {
    yFactor: 1 / parseUnit(y.unit).toNatural,
    yUnit: y.unit.replace("ub", "µb"),
    xUnit: CANONICAL_X_LABEL[x.kind],
  };
}

/** A stored value as tables show it: 8 significant digits, "—" where there is none. */
export function formatValue(v: number | null): string {
  return v == null ? "—" : Number(v.toPrecision(8)).toString();
}

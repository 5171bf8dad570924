import { RANGE_FIELDS } from "./build-prediction-request";
import type { PredictionFormState } from "./prediction-form-state";

/** The page's inputs that can carry an error message beside them. */
export type ErrorSlot =
  | "process" | "frame" | "energy" | "mass" | "finalMass" | "alpha" | "observable" | "unit"
  | "range" | typeof RANGE_FIELDS.from | typeof RANGE_FIELDS.to | typeof RANGE_FIELDS.count
  | "fixedAngle" | "acceptance" | "formFactor" | "formFactor.lambda" | "formFactor.mass" | "formFactor.width" | "formFactor.q2"
  | "general";

const DIRECT: Record<string, ErrorSlot> = {
  process: "process", frame: "frame", mass: "mass", finalMass: "finalMass", alpha: "alpha", observable: "observable", unit: "unit",
  "formFactor.lambda": "formFactor.lambda", "formFactor.mass": "formFactor.mass", "formFactor.width": "formFactor.width",
  "formFactor.q2": "formFactor.q2", formFactor: "formFactor", "formFactor.model": "formFactor",
  [RANGE_FIELDS.from]: RANGE_FIELDS.from, [RANGE_FIELDS.to]: RANGE_FIELDS.to, [RANGE_FIELDS.count]: RANGE_FIELDS.count,
};

/**
 * Which input an error's `field` (the API's path into the request, e.g. `energy.kinetic`,
 * `thetaDeg[3]`, `scan.sqrtSBins[0][1]`) belongs to. The page generates the point lists from
 * the range inputs, so the first point belongs to "from", the last to "to", the others to the
 * range as a whole.
 */
export function inputForError(field: string, f: PredictionFormState): ErrorSlot {
  if (field in DIRECT) return DIRECT[field];
  if (field === "energy" || field.startsWith("energy.")) return "energy";
  if (field.startsWith("acceptance")) return "acceptance";
  const list = /^(?:scan\.)?(?:thetaDeg|cosTheta|t|sqrtS|beam|kinetic)(Bins)?(?:\[(\d+)\](?:\[([01])\])?)?$/.exec(field);
  if (list === null) return "general";
  if (f.variable === "energy" && !field.startsWith("scan")) return "fixedAngle";
  const [, bins, index, edge] = list;
  if (index === undefined) return "range";
  const n = Number(f.count);
  const i = Number(index);
  const last = bins ? i === n - 1 && edge !== "0" : i === n - 1;
  const first = bins ? i === 0 && edge !== "1" : i === 0;
  // A single bin's whole-bin error names both ends: keep it on the range.
  if (bins && edge === undefined) return "range";
  if (first) return RANGE_FIELDS.from;
  if (last) return RANGE_FIELDS.to;
  return "range";
}

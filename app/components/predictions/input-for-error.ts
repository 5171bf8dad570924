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

const ENERGY_WORDS: Record<string, string> = { sqrtS: "√s", beam: "the total beam energy", kinetic: "the beam kinetic energy" };
const LIST_WORDS: Record<string, [string, string]> = {
  thetaDeg: ["θ", "°"], cosTheta: ["cos θ", ""], t: ["t", " GeV²"], sqrtS: ["√s", ""], beam: ["the total beam energy", ""], kinetic: ["the beam kinetic energy", ""],
};
const PLAIN: Record<string, string> = {
  mass: "the mass", finalMass: "the final mass", alpha: "α", unit: "the unit", frame: "the frame", process: "the process", observable: "the observable",
  "formFactor.lambda": "Λ", "formFactor.mass": "m_V", "formFactor.width": "Γ_V", "formFactor.q2": "q²", formFactor: "the form factor",
};

/** The words of the form for an API path such as `energy.sqrtS` or `thetaDeg[3]` (with the value when it helps). */
function wordsFor(field: string, request: Record<string, unknown> | null): string {
  if (field in PLAIN) return PLAIN[field];
  const energy = /^energy\.(sqrtS|beam|kinetic)$/.exec(field);
  if (energy) return ENERGY_WORDS[energy[1]];
  if (field.startsWith("acceptance")) return "the acceptance";
  const list = /^(scan\.)?(thetaDeg|cosTheta|t|sqrtS|beam|kinetic)(Bins)?\[(\d+)\](?:\[([01])\])?$/.exec(field);
  if (list) {
    const [, scan, name, bins, index, edge] = list;
    const holder = (scan ? (request?.scan as Record<string, unknown> | undefined) : request) ?? {};
    const values = holder[`${name}${bins ?? ""}`] as unknown[] | undefined;
    const item = values?.[Number(index)];
    const value = Array.isArray(item) ? (edge === undefined ? null : item[Number(edge)]) : item;
    const [word, unit] = LIST_WORDS[name];
    const energyUnit = scan ? ` ${String((request?.scan as { unit?: string } | undefined)?.unit ?? "GeV")}` : "";
    if (typeof value === "number") return `${word} = ${value}${unit || energyUnit}`;
    return bins ? `the bin ${Array.isArray(item) ? `${item[0]} to ${item[1]}` : Number(index) + 1} of ${word}` : word;
  }
  return field;
}

/**
 * A problem's message in the form's words: the API names its fields by their path in the
 * request (`energy.sqrtS must be a number …`, `… at thetaDeg[0]`), which means nothing to a
 * reader of the page. Each such path becomes the input's name (and value, for a list point).
 */
export function inFormWords(message: string, field: string | undefined, request: Record<string, unknown> | null): string {
  let out = message;
  if (field) out = out.split(field).join(wordsFor(field, request));
  out = out.replace(/\bas sqrtS\b/, "as √s");
  return out.charAt(0).toUpperCase() + out.slice(1);
}

import type { ProcessInfo } from "~/engine";
import type { PredictionFormState } from "./prediction-form-state";

/** A problem found before anything is sent, in the API's error shape (field names the input). */
export interface FormProblem {
  code: string;
  message: string;
  field: string;
}

export type BuiltRequest = { body: Record<string, unknown>; problem: null } | { body: null; problem: FormProblem };

/** The page's own grid inputs; the API never sees these names. */
export const RANGE_FIELDS = { from: "range.from", to: "range.to", count: "range.count" } as const;
const MAX_COUNT = 1000;

/**
 * A number as typed, or the text itself when it is not one: the engine then refuses it with
 * its own message ("must be a number, got "abc""), so one place explains every bad number.
 * Accepts the typographic minus and, for α, a fraction such as 1/137.
 */
function numberOrText(text: string, allowFraction = false): number | string {
  const t = text.trim().replace(/\u2212/g, "-");
  const fraction = allowFraction ? /^([0-9.eE+-]+)\s*\/\s*([0-9.eE+-]+)$/.exec(t) : null;
  if (fraction) {
    const v = Number(fraction[1]) / Number(fraction[2]);
    if (Number.isFinite(v)) return v;
  }
  const v = t === "" ? Number.NaN : Number(t);
  return Number.isFinite(v) ? v : t;
}

function gridNumber(text: string, field: string, what: string): number | FormProblem {
  const v = numberOrText(text);
  return typeof v === "number" ? v : { code: "not_a_number", field, message: `${what} must be a number${text.trim() ? `, not “${text.trim()}”` : ""}` };
}

/** n equally spaced points from a to b, both ends exact, free of binary noise in the text. */
function gridPoints(a: number, b: number, n: number): number[] {
  if (n === 1) return [a];
  return Array.from({ length: n }, (_, i) => (i === n - 1 ? b : Number((a + ((b - a) * i) / (n - 1)).toPrecision(12))));
}

function gridBins(a: number, b: number, n: number): [number, number][] {
  const edges = gridPoints(a, b, n + 1);
  return edges.slice(0, -1).map((lo, i) => [lo, edges[i + 1]]);
}

function grid(f: PredictionFormState, what: string): { points: number[] | null; bins: [number, number][] | null } | FormProblem {
  const a = gridNumber(f.from, RANGE_FIELDS.from, `the start of the ${what} range`);
  if (typeof a !== "number") return a;
  const b = gridNumber(f.to, RANGE_FIELDS.to, `the end of the ${what} range`);
  if (typeof b !== "number") return b;
  const n = Number(f.count.trim());
  if (!Number.isInteger(n) || n < 1 || n > MAX_COUNT) {
    return { code: "invalid_count", field: RANGE_FIELDS.count, message: `the number of ${f.binned ? "bins" : "points"} must be a whole number from 1 to ${MAX_COUNT}` };
  }
  if (f.binned && !(a < b)) return { code: "invalid_bin", field: RANGE_FIELDS.to, message: `bins need “to” above “from” (${a} to ${b})` };
  return f.binned ? { points: null, bins: gridBins(a, b, n) } : { points: gridPoints(a, b, n), bins: null };
}

/**
 * The request body exactly as `POST /api/v1/predictions` and `npm run predict` take it
 * (docs/product.md "Prediction contract", docs/decisions/0003), or the first problem with the
 * page's own range inputs.
 */
export function buildPredictionRequest(f: PredictionFormState, info: ProcessInfo): BuiltRequest {
  const body: Record<string, unknown> = { process: f.process, frame: f.frame, observable: f.observable };
  const differential = f.observable !== "sigma";

  if (f.variable === "energy") {
    const g = grid(f, "energy");
    if ("field" in g) return { body: null, problem: g };
    body.scan = g.points ? { [f.energyKind]: g.points, unit: f.energyUnit } : { [`${f.energyKind}Bins`]: g.bins, unit: f.energyUnit };
    if (differential) body.thetaDeg = [numberOrText(f.fixedAngle)];
  } else {
    body.energy = { [f.energyKind]: numberOrText(f.energy), unit: f.energyUnit };
    if (differential && f.variable !== "none") {
      const g = grid(f, f.variable === "thetaDeg" ? "θ" : f.variable === "cosTheta" ? "cos θ" : "t");
      if ("field" in g) return { body: null, problem: g };
      if (g.points) body[f.variable] = g.points;
      else body[`${f.variable}Bins`] = g.bins;
    }
  }

  if (f.observable === "sigma" && f.acceptance) body.acceptance = { thetaDeg: [numberOrText(f.acceptanceFrom), numberOrText(f.acceptanceTo)] };
  if (f.mass.trim()) body.mass = numberOrText(f.mass);
  if (info.defaultFinalMass !== null && f.finalMass.trim()) body.finalMass = numberOrText(f.finalMass);
  if (f.alpha.trim()) body.alpha = numberOrText(f.alpha, true);
  if (info.acceptsScalarFormFactor && f.formFactor !== "none") {
    body.formFactor =
      f.formFactor === "monopole"
        ? { model: "monopole", lambda: numberOrText(f.formFactorLambda), q2: f.formFactorQ2 }
        : { model: "vmd", mass: numberOrText(f.formFactorMass), width: numberOrText(f.formFactorWidth), q2: f.formFactorQ2 };
  }
  body.unit = f.unit;
  return { body, problem: null };
}

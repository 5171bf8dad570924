import { z } from "zod";
import type { ProcessInfo } from "~/engine";
import { initialFormState, type PredictionFormState } from "./prediction-form-state";

/**
 * The Predictions form in the page's address, so that a reload or a link sent to a co-author
 * reproduces the curve. Only what differs from the process's starting state is written; a
 * value that does not fit its field falls back to that starting state.
 */
const text = z.string().max(200);
const SearchSchema = z
  .object({
    process: z.string(),
    frame: z.enum(["lab", "cm"]),
    energyKind: z.enum(["sqrtS", "beam", "kinetic"]),
    energy: text,
    energyUnit: z.enum(["GeV", "MeV", "keV"]),
    mass: text,
    finalMass: text,
    alpha: text,
    observable: z.enum(["dsigma/dOmega", "dsigma/dcos", "dsigma/dt", "sigma"]),
    variable: z.enum(["thetaDeg", "cosTheta", "t", "energy", "none"]),
    from: text,
    to: text,
    count: text,
    binned: z.enum(["1", "0"]).transform((v) => v === "1"),
    fixedAngle: text,
    acceptance: z.enum(["1", "0"]).transform((v) => v === "1"),
    acceptanceFrom: text,
    acceptanceTo: text,
    formFactor: z.enum(["none", "monopole", "vmd"]),
    formFactorLambda: text,
    formFactorMass: text,
    formFactorWidth: text,
    formFactorQ2: z.enum(["s", "t"]),
    unit: text,
    xScale: z.enum(["linear", "log"]),
    yScale: z.enum(["linear", "log"]),
    xMin: text,
    xMax: text,
    yMin: text,
    yMax: text,
  })
  .partial();

const KEYS = Object.keys(SearchSchema.shape) as (keyof PredictionFormState)[];

/** The form state a URL's search part describes (the first process when it names none). */
export function formFromSearch(search: URLSearchParams, processes: readonly ProcessInfo[]): PredictionFormState {
  const info = processes.find((p) => p.id === search.get("process")) ?? processes[0];
  const start = initialFormState(info);
  const state: Record<string, unknown> = { ...start };
  for (const key of KEYS) {
    const raw = search.get(key);
    if (raw === null || key === "process") continue;
    const parsed = SearchSchema.shape[key].safeParse(raw);
    if (parsed.success && parsed.data !== undefined) state[key] = parsed.data;
  }
  const form = state as unknown as PredictionFormState;
  if (!info.frames.includes(form.frame)) form.frame = start.frame;
  if (info.needsSqrtS || !info.frames.includes("lab")) form.energyKind = "sqrtS";
  return form;
}

/** The search part for a form state: the process, then whatever differs from its start. */
export function searchOfForm(form: PredictionFormState, processes: readonly ProcessInfo[]): URLSearchParams {
  const info = processes.find((p) => p.id === form.process) ?? processes[0];
  const start = initialFormState(info);
  const out = new URLSearchParams({ process: form.process });
  for (const key of KEYS) {
    if (key === "process" || form[key] === start[key]) continue;
    const v = form[key];
    out.set(key, typeof v === "boolean" ? (v ? "1" : "0") : String(v));
  }
  return out;
}

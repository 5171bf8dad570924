import { DEFAULT_RELATIVE_TOLERANCE } from "./adaptive-quadrature";
import { EngineInputError, quoteValue } from "./engine-input-error";
import type { FormFactorSpec } from "./form-factor";
import type { EnergyKind } from "./mandelstam-s-from-energy";
import type { AngleVariable, Observable } from "./observables";
import type { Frame, ProcessDefinition } from "./process-definition";
import { findProcess, PROCESSES } from "./process-registry";
import { PHYSICAL_CONSTANTS } from "./physical-constants";
import { parseUnit, type ParsedUnit } from "./units";

export type EnergyUnit = "GeV" | "MeV" | "keV";

/**
 * The request after validation, defaults filled in: exactly what the prediction depends on.
 * Hashed into `parametersHash` (docs/decisions/0007-parameters-hash-number-lists.md). Lists of
 * points are the request's own arrays (not copied), so a caller must not change a request's
 * lists while it still uses the response.
 */
export interface PredictionParameters {
  process: ProcessDefinition["info"]["id"];
  frame: Frame;
  observable: Observable;
  energy: { kind: EnergyKind; value: number; unit: EnergyUnit } | null;
  mass: number;
  finalMass: number | null;
  alpha: number;
  angle: { variable: AngleVariable; points: number[] | null; bins: [number, number][] | null } | null;
  acceptance: { variable: "thetaDeg" | "cosTheta"; range: [number, number] } | null;
  scan: { variable: EnergyKind; unit: EnergyUnit; points: number[] | null; bins: [number, number][] | null } | null;
  formFactor: FormFactorSpec | null;
  relativeTolerance: number;
  unit: string;
}

export interface ValidatedRequest {
  parameters: PredictionParameters;
  definition: ProcessDefinition;
  unit: ParsedUnit;
}

const OBSERVABLES: readonly Observable[] = ["dsigma/dOmega", "dsigma/dcos", "dsigma/dt", "sigma"];
const ENERGY_KINDS: readonly EnergyKind[] = ["sqrtS", "beam", "kinetic"];
const ENERGY_UNITS: readonly EnergyUnit[] = ["GeV", "MeV", "keV"];
const ANGLE_VARIABLES: readonly AngleVariable[] = ["thetaDeg", "cosTheta", "t"];
const TOP_LEVEL = new Set([
  "process", "frame", "energy", "mass", "finalMass", "alpha", "observable", "thetaDeg", "cosTheta", "t",
  "thetaDegBins", "cosThetaBins", "tBins", "acceptance", "scan", "formFactor", "relativeTolerance", "unit",
]);
const NATURAL_UNIT: Record<Observable, string> = {
  "dsigma/dOmega": "GeV^-2/sr",
  "dsigma/dcos": "GeV^-2",
  "dsigma/dt": "GeV^-4",
  sigma: "GeV^-2",
};
const DIMENSION_OF: Record<Observable, ParsedUnit["dimension"]> = {
  "dsigma/dOmega": "area/sr",
  "dsigma/dcos": "area",
  "dsigma/dt": "area/GeV2",
  sigma: "area",
};
const OBSERVABLE_LABEL: Record<Observable, string> = {
  "dsigma/dOmega": "dσ/dΩ (an area per steradian, e.g. nb/sr)",
  "dsigma/dcos": "dσ/dcosθ (an area, e.g. nb)",
  "dsigma/dt": "dσ/dt (an area per GeV², e.g. nb/GeV^2)",
  sigma: "σ (an area, e.g. nb)",
};

const fail = (code: string, field: string, message: string): never => {
  throw new EngineInputError(code, field, message);
};

/** A field name from the request, cut like a quoted value (an unknown key may be huge). */
const shortField = (name: string) => (name.length > 40 ? `${name.slice(0, 40)}…` : name);

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function finiteNumber(v: unknown, field: string, what: string): number {
  if (typeof v !== "number") fail("not_a_number", field, `${field} must be a number (${what}), got ${quoteValue(v)}`);
  if (!Number.isFinite(v as number)) fail("not_a_number", field, `${field} must be a finite number (${what}), got ${String(v)}`);
  return v as number;
}

/**
 * A non-empty list of finite numbers, returned as it is (not copied: a list may hold 10⁶ angles,
 * and fresh memory costs more than evaluating them); an element's field is named only on failure.
 */
function numberList(v: unknown, field: string, what: string): number[] {
  if (!Array.isArray(v) || v.length === 0) fail("invalid_list", field, `${field} must be a non-empty list of numbers (${what})`);
  const list = v as unknown[];
  for (let i = 0; i < list.length; i++) {
    const x = list[i];
    if (typeof x !== "number" || !Number.isFinite(x)) finiteNumber(x, `${field}[${i}]`, what);
  }
  return list as number[];
}

function binList(v: unknown, field: string, what: string): [number, number][] {
  if (!Array.isArray(v) || v.length === 0) fail("invalid_list", field, `${field} must be a non-empty list of [low, high] bins (${what})`);
  return (v as unknown[]).map((bin, i) => {
    if (!Array.isArray(bin) || bin.length !== 2) fail("invalid_bin", `${field}[${i}]`, `${field}[${i}] must be [low, high]`);
    const lo = finiteNumber((bin as unknown[])[0], `${field}[${i}][0]`, what);
    const hi = finiteNumber((bin as unknown[])[1], `${field}[${i}][1]`, what);
    if (!(lo < hi)) fail("invalid_bin", `${field}[${i}]`, `bin ${field}[${i}] = [${lo}, ${hi}] must have low < high`);
    return [lo, hi] as [number, number];
  });
}

function positive(v: unknown, field: string, what: string, code = "invalid_mass"): number {
  const x = finiteNumber(v, field, what);
  if (!(x > 0)) fail(code, field, `${what} must be positive, got ${x}`);
  return x;
}

function onlyKeys(record: Record<string, unknown>, allowed: readonly string[], prefix: string): void {
  for (const key of Object.keys(record)) {
    if (!allowed.includes(key)) fail("unknown_field", shortField(`${prefix}${key}`), `unknown field ${quoteValue(prefix + key)}; allowed here: ${allowed.join(", ")}`);
  }
}

function energyUnit(v: unknown, field: string): EnergyUnit {
  if (v === undefined) return "GeV";
  if (!ENERGY_UNITS.includes(v as EnergyUnit)) fail("unknown_unit", field, `${field} must be one of ${ENERGY_UNITS.join(", ")}, got ${quoteValue(v)}`);
  return v as EnergyUnit;
}

function parseFormFactor(v: unknown, definition: ProcessDefinition): FormFactorSpec | null {
  if (v === undefined || v === null) return null;
  if (!definition.info.acceptsScalarFormFactor) {
    fail("not_applicable", "formFactor", `a composite-scalar form factor does not apply to ${definition.info.reaction} (no scalar in it)`);
  }
  if (!isRecord(v)) return fail("invalid_form_factor", "formFactor", `formFactor must be an object with "model": "monopole" or "vmd"`);
  const defaultQ2 = definition.info.id === "scalar-pair-production" ? "s" : "t";
  const q2 = v.q2 ?? defaultQ2;
  if (q2 !== "s" && q2 !== "t") fail("invalid_form_factor", "formFactor.q2", `formFactor.q2 must be "s" or "t"`);
  if (v.model === "monopole") {
    onlyKeys(v, ["model", "lambda", "q2"], "formFactor.");
    return { model: "monopole", lambda: positive(v.lambda, "formFactor.lambda", "the monopole scale Λ (GeV)", "invalid_form_factor"), q2: q2 as "s" | "t" };
  }
  if (v.model === "vmd") {
    onlyKeys(v, ["model", "mass", "width", "q2"], "formFactor.");
    const width = finiteNumber(v.width, "formFactor.width", "the vector-meson width Γ (GeV)");
    if (width < 0) fail("invalid_form_factor", "formFactor.width", `the vector-meson width must not be negative, got ${width}`);
    return {
      model: "vmd",
      mass: positive(v.mass, "formFactor.mass", "the vector-meson mass (GeV)", "invalid_form_factor"),
      width,
      q2: q2 as "s" | "t",
    };
  }
  return fail("invalid_form_factor", "formFactor.model", `formFactor.model must be "monopole" or "vmd", got ${quoteValue(v.model)}`);
}

/**
 * Validates a prediction request (docs/product.md "Prediction contract" plus the optional
 * fields of docs/decisions/0003-engine-conventions.md) and fills in the defaults. Throws
 * EngineInputError naming the field. Physics checks that need kinematics (thresholds,
 * divergent angles, t ranges) are done when the prediction is computed.
 */
export function validatePredictionRequest(request: unknown): ValidatedRequest {
  if (!isRecord(request)) return fail("invalid_request", "", "the request must be a JSON object");
  for (const key of Object.keys(request)) {
    if (!TOP_LEVEL.has(key)) fail("unknown_field", shortField(key), `unknown field ${quoteValue(key)}; allowed: ${[...TOP_LEVEL].join(", ")}`);
  }
  if (typeof request.process !== "string") fail("missing_field", "process", `process is required: one of ${PROCESSES.map((p) => p.id).join(", ")}`);
  const definition = findProcess(request.process as string);
  if (definition === undefined) {
    return fail("unknown_process", "process", `unknown process ${quoteValue(request.process)}: use one of ${PROCESSES.map((p) => p.id).join(", ")}`);
  }
  const info = definition.info;
  const frame = request.frame;
  if (frame !== "lab" && frame !== "cm") fail("unknown_frame", "frame", `frame must be "lab" or "cm", got ${quoteValue(frame)}`);
  if (!info.frames.includes(frame as Frame)) {
    fail("frame_not_offered", "frame", `${info.reaction} is offered in the ${info.frames.join(" and ")} frame only, not ${quoteValue(frame)}`);
  }
  const observable = (request.observable ?? "dsigma/dOmega") as Observable;
  if (!OBSERVABLES.includes(observable)) fail("unknown_observable", "observable", `observable must be one of ${OBSERVABLES.join(", ")}`);

  const mass = request.mass === undefined ? info.defaultMass : positive(request.mass, "mass", `mass (${info.massMeaning})`);
  let finalMass: number | null = null;
  if (info.defaultFinalMass === null) {
    if (request.finalMass !== undefined) fail("not_applicable", "finalMass", `finalMass does not apply to ${info.reaction}: its only mass is "mass" (${info.massMeaning})`);
  } else {
    finalMass = request.finalMass === undefined ? info.defaultFinalMass : positive(request.finalMass, "finalMass", `finalMass (${info.finalMassMeaning})`);
  }
  const alpha = request.alpha === undefined ? PHYSICAL_CONSTANTS.alpha : finiteNumber(request.alpha, "alpha", "the fine-structure constant");
  if (!(alpha > 0 && alpha < 1)) fail("invalid_alpha", "alpha", `alpha must lie between 0 and 1 (α(0) = 1/137.035999084), got ${alpha}`);

  let relativeTolerance = DEFAULT_RELATIVE_TOLERANCE;
  if (request.relativeTolerance !== undefined) {
    relativeTolerance = finiteNumber(request.relativeTolerance, "relativeTolerance", "the quadrature's relative tolerance");
    if (!(relativeTolerance >= 1e-14 && relativeTolerance <= 1e-3)) fail("invalid_tolerance", "relativeTolerance", `relativeTolerance must lie in [1e-14, 1e-3], got ${relativeTolerance}`);
  }

  const unitText = request.unit === undefined ? NATURAL_UNIT[observable] : request.unit;
  if (typeof unitText !== "string") return fail("unknown_unit", "unit", `unit must be a string such as "${NATURAL_UNIT[observable]}"`);
  const unit = parseUnit(unitText);
  if (unit.dimension !== DIMENSION_OF[observable]) {
    fail("unit_mismatch", "unit", `unit ${quoteValue(unitText)} does not fit ${OBSERVABLE_LABEL[observable]}`);
  }

  // energy, or an energy scan
  let energy: PredictionParameters["energy"] = null;
  let scan: PredictionParameters["scan"] = null;
  if (request.scan !== undefined && request.energy !== undefined) {
    fail("conflicting_fields", "scan", "give either energy (one energy) or scan (several), not both");
  }
  if (request.scan !== undefined) {
    const sc = request.scan;
    if (!isRecord(sc)) return fail("invalid_scan", "scan", `scan must be an object such as { "sqrtS": [1, 2, 3], "unit": "GeV" }`);
    onlyKeys(sc, [...ENERGY_KINDS, ...ENERGY_KINDS.map((k) => `${k}Bins`), "unit"], "scan.");
    const present = Object.keys(sc).filter((k) => k !== "unit");
    if (present.length !== 1) fail("invalid_scan", "scan", `scan needs exactly one of ${ENERGY_KINDS.join(", ")} (points) or ${ENERGY_KINDS.map((k) => `${k}Bins`).join(", ")}`);
    const key = present[0];
    const binned = key.endsWith("Bins");
    const variable = (binned ? key.slice(0, -4) : key) as EnergyKind;
    scan = {
      variable,
      unit: energyUnit(sc.unit, "scan.unit"),
      points: binned ? null : numberList(sc[key], `scan.${key}`, "energies"),
      bins: binned ? binList(sc[key], `scan.${key}`, "energy bins") : null,
    };
  } else {
    const en = request.energy;
    if (!isRecord(en)) return fail("missing_field", "energy", `energy is required, e.g. { "sqrtS": 1.2 }, { "beam": 0.64 } or { "kinetic": 0.5, "unit": "GeV" }`);
    onlyKeys(en, [...ENERGY_KINDS, "unit"], "energy.");
    const kinds = ENERGY_KINDS.filter((k) => en[k] !== undefined);
    if (kinds.length !== 1) fail("invalid_energy", "energy", `energy needs exactly one of sqrtS, beam, kinetic (got ${kinds.length === 0 ? "none" : kinds.join(" and ")})`);
    const kind = kinds[0];
    energy = { kind, value: finiteNumber(en[kind], `energy.${kind}`, "an energy"), unit: energyUnit(en.unit, "energy.unit") };
  }

  // angles
  const pointKeys = ANGLE_VARIABLES.filter((k) => request[k] !== undefined);
  const binKeys = ANGLE_VARIABLES.filter((k) => request[`${k}Bins`] !== undefined);
  const given = [...pointKeys, ...binKeys.map((k) => `${k}Bins`)];
  if (given.length > 1) fail("conflicting_fields", given[1], `give one angle variable, not ${given.join(" and ")}`);
  let angle: PredictionParameters["angle"] = null;
  if (observable === "sigma") {
    if (given.length > 0) fail("not_applicable", given[0], `σ is integrated over angles: use "acceptance" to restrict them, not ${given[0]}`);
  } else {
    if (given.length === 0) {
      fail("missing_field", "thetaDeg", `give the angles, e.g. "thetaDeg": [30, 60, 90] (or cosTheta, t, or thetaDegBins / cosThetaBins / tBins)`);
    }
    const variable = (pointKeys[0] ?? binKeys[0]) as AngleVariable;
    const what = variable === "thetaDeg" ? "angles in degrees" : variable === "cosTheta" ? "cos θ values" : "t values in GeV²";
    angle =
      pointKeys.length === 1
        ? { variable, points: numberList(request[variable], variable, what), bins: null }
        : { variable, points: null, bins: binList(request[`${variable}Bins`], `${variable}Bins`, what) };
    if (scan !== null && (angle.bins !== null || angle.points!.length !== 1)) {
      fail("invalid_scan", angle.bins !== null ? `${variable}Bins` : variable, `an energy scan of ${observable} needs exactly one angle, e.g. "${variable}": [90]`);
    }
  }

  let acceptance: PredictionParameters["acceptance"] = null;
  if (request.acceptance !== undefined) {
    if (observable !== "sigma") fail("not_applicable", "acceptance", `acceptance applies to observable "sigma" only`);
    const acc = request.acceptance;
    if (!isRecord(acc)) return fail("invalid_acceptance", "acceptance", `acceptance must be { "thetaDeg": [low, high] } or { "cosTheta": [low, high] }`);
    onlyKeys(acc, ["thetaDeg", "cosTheta"], "acceptance.");
    const keys = Object.keys(acc);
    if (keys.length !== 1) fail("invalid_acceptance", "acceptance", `acceptance needs exactly one of thetaDeg, cosTheta`);
    const variable = keys[0] as "thetaDeg" | "cosTheta";
    const [range] = binList([acc[variable]], `acceptance.${variable}`, variable === "thetaDeg" ? "angles in degrees" : "cos θ values");
    acceptance = { variable, range };
  }

  const formFactor = parseFormFactor(request.formFactor, definition);

  return {
    definition,
    unit,
    parameters: {
      process: info.id,
      frame: frame as Frame,
      observable,
      energy,
      mass,
      finalMass,
      alpha,
      angle,
      acceptance,
      scan,
      formFactor,
      relativeTolerance,
      unit: unitText,
    },
  };
}

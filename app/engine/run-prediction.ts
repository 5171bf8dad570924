import { integrateAdaptive } from "./adaptive-quadrature";
import { EngineInputError } from "./engine-input-error";
import { ENGINE_VERSION } from "./engine-version";
import { checkFormFactorRange, formFactorSquared } from "./form-factor";
import { mandelstamSFromEnergy, type EnergyKind } from "./mandelstam-s-from-energy";
import { evaluateAngles } from "./evaluate-angles";
import { binMean, sigmaInAcceptance, type AngleVariable, type DifferentialObservable, type Observable } from "./observables";
import { parametersHash } from "./parameters-hash";
import type { Frame, ProcessDefinition, ProcessId } from "./process-definition";
import { createProcessKernel, type ProcessKernel } from "./process-kernel";
import { validatePredictionRequest, type EnergyUnit, type PredictionParameters } from "./prediction-request";
import { mandelstamT, reactionThreshold } from "./two-body-kinematics";

export interface PredictionResponse {
  engineVersion: string;
  process: ProcessId;
  frame: Frame;
  observable: Observable;
  /** What the values are a function of; null for a single σ. */
  variable: AngleVariable | EnergyKind | null;
  /** True when each value is the mean over a bin of `variable`. */
  binned: boolean;
  unit: string;
  /** √s in GeV: one number at fixed energy, one per value in an energy scan. */
  sqrtS: number | number[];
  points: number[] | null;
  bins: [number, number][] | null;
  values: number[];
  conventions: {
    reaction: string;
    referenceParticle: string;
    axisParticle: string;
    identicalFinalParticles: boolean;
    note: string;
  };
  quadrature: { relativeTolerance: number; converged: boolean } | null;
  parameters: PredictionParameters;
  parametersHash: string;
}

const ENERGY_FACTOR: Record<EnergyUnit, number> = { GeV: 1, MeV: 1e-3, keV: 1e-6 };
const DEG = Math.PI / 180;
const PLANCK_ENERGY_GEV = 1.22089e19;
const round = (x: number) => Number(x.toPrecision(4));

/** A process at one energy, with every physics check on that energy done. */
function kernelAt(def: ProcessDefinition, p: PredictionParameters, kind: EnergyKind, valueGeV: number, field: string, atBinEdge = false): ProcessKernel {
  const info = def.info;
  const finalMass = p.finalMass ?? p.mass;
  const masses = def.reactionMasses(p.mass, finalMass);
  const s = mandelstamSFromEnergy(kind, valueGeV, info, masses, field);
  const threshold = reactionThreshold(masses);
  if (atBinEdge ? s < threshold : !(s > threshold)) {
    const pair = (masses.axis + masses.partner) ** 2 >= (masses.reference + masses.recoil) ** 2 ? `${info.beamParticle}${info.targetParticle}` : info.finalStateLabel;
    throw new EngineInputError(
      "below_threshold",
      field,
      `√s = ${round(Math.sqrt(s))} GeV is ${atBinEdge ? "below" : "at or below"} the ${pair} threshold ${round(Math.sqrt(threshold))} GeV` +
        (kind === "sqrtS" ? "" : ` (${kind === "beam" ? "total beam energy" : "beam kinetic energy"} ${valueGeV} GeV on the ${info.targetParticle} at rest)`),
    );
  }
  // Above the Planck energy (1.22 × 10¹⁹ GeV, Review of Particle Physics, "Physical constants")
  // a Born QED curve means nothing, and much higher up s², s³ overflow double precision: the
  // energy is refused by name rather than a non-finite value being blamed on an angle.
  if (!(s <= PLANCK_ENERGY_GEV ** 2)) {
    throw new EngineInputError(
      "energy_too_high",
      field,
      (kind === "sqrtS" ? `√s = ${round(valueGeV)} GeV` : `the ${kind === "beam" ? "total beam energy" : "beam kinetic energy"} ${round(valueGeV)} GeV on the ${info.targetParticle} at rest`) +
        " is above the Planck energy 1.22 × 10¹⁹ GeV, where a tree-level prediction has no meaning",
    );
  }
  const ff = p.formFactor === null ? null : formFactorSquared(p.formFactor);
  const kernel = createProcessKernel(def, s, p.mass, finalMass, p.alpha, ff);
  if (p.formFactor !== null) {
    const tLo = mandelstamT(kernel.kinematics, -1);
    p.formFactor.q2 === "s" ? checkFormFactorRange(p.formFactor, s, s) : checkFormFactorRange(p.formFactor, tLo, kernel.kinematics.tForward);
  }
  return kernel;
}

/** The CM cos θ* of an angle point, with the range and divergence checks of the variable. */
function checkAngle(kernel: ProcessKernel, frame: Frame, variable: AngleVariable, x: number, field: string): void {
  const info = kernel.definition.info;
  let cosCm: number;
  if (variable === "thetaDeg") {
    if (x < 0 || x > 180) throw new EngineInputError("angle_out_of_range", field, `θ = ${x}° is outside [0°, 180°]`);
    cosCm = kernel.cmCos(frame, Math.cos(x * DEG));
  } else if (variable === "cosTheta") {
    if (x < -1 || x > 1) throw new EngineInputError("angle_out_of_range", field, `cos θ = ${x} is outside [−1, 1]`);
    cosCm = kernel.cmCos(frame, x);
  } else {
    const tMax = kernel.kinematics.tForward;
    const tMin = mandelstamT(kernel.kinematics, -1);
    if (x < tMin || x > tMax) {
      throw new EngineInputError("t_out_of_range", field, `t = ${x} GeV² is outside the physical range [${tMin}, ${tMax}] GeV² at √s = ${round(kernel.kinematics.sqrtS)} GeV`);
    }
    cosCm = x === tMax ? 1 : x === tMin ? -1 : 1 - (tMax - x) / (2 * kernel.kinematics.pIn * kernel.kinematics.pOut);
  }
  if ((info.divergesForward && cosCm >= 1) || (info.divergesBackward && cosCm <= -1)) {
    const where = cosCm >= 1 ? "θ = 0°" : "θ = 180°";
    throw new EngineInputError(
      "divergent_angle",
      field,
      `the tree-level ${info.reaction} cross section diverges at ${where} (photon exchange with zero momentum transfer): choose an angle away from it`,
    );
  }
}

function checkAngleBin(kernel: ProcessKernel, frame: Frame, variable: AngleVariable, bin: [number, number], field: string): void {
  checkAngle(kernel, frame, variable, bin[0], `${field}[0]`);
  checkAngle(kernel, frame, variable, bin[1], `${field}[1]`);
}

/** cos θ range (in the frame) of σ's acceptance, checked against divergences. */
function acceptanceRange(kernel: ProcessKernel, p: PredictionParameters): [number, number] {
  const info = kernel.definition.info;
  let lo = -1;
  let hi = 1;
  if (p.acceptance !== null) {
    const [a, b] = p.acceptance.range;
    const field = `acceptance.${p.acceptance.variable}`;
    checkAngle(kernel, p.frame, p.acceptance.variable, a, field);
    checkAngle(kernel, p.frame, p.acceptance.variable, b, field);
    [lo, hi] = p.acceptance.variable === "thetaDeg" ? [Math.cos(b * DEG), Math.cos(a * DEG)] : [a, b];
  } else if (info.divergesForward || info.divergesBackward) {
    throw new EngineInputError(
      "divergent_total",
      "acceptance",
      `the total ${info.reaction} cross section diverges at tree level (forward${info.divergesBackward ? " and backward" : ""} peak): give an acceptance such as { "thetaDeg": [10, 170] }`,
    );
  }
  return [lo, hi];
}

/** The differential observable at the request's angle points, checked and in the unit `toUnit`. */
function pointValues(kernel: ProcessKernel, p: PredictionParameters, xs: readonly number[], toUnit: number, fieldOf: (i: number) => string): number[] {
  const variable = p.angle!.variable;
  const check = (x: number, field: string) => checkAngle(kernel, p.frame, variable, x, field);
  return evaluateAngles(kernel, p.frame, p.observable as DifferentialObservable, variable, xs, toUnit, check, fieldOf);
}

function finite(values: number[], field: (i: number) => string): number[] {
  values.forEach((v, i) => {
    if (!Number.isFinite(v)) throw new EngineInputError("non_finite_result", field(i), `the prediction is not finite at ${field(i)}: move it away from the singular point`);
  });
  return values;
}

/**
 * The prediction contract (docs/product.md, "Prediction contract"; request fields in
 * docs/decisions/0003-engine-conventions.md): validates the request, computes the values in the
 * requested unit and returns them with the engine version and the parameters' SHA-256
 * (docs/decisions/0007-parameters-hash-number-lists.md). Arrays of angle points go through the
 * process's own loop (`evaluateAngles`); bin means are σ(bin)/ΔX
 * (docs/decisions/0006-bin-means.md). Pure and deterministic: the same request gives
 * bit-identical output. The response shares the request's number lists (not copied).
 * Throws EngineInputError (HTTP 422 / exit status 2) naming the field to change.
 */
export function runPrediction(request: unknown): PredictionResponse {
  const { parameters: p, definition: def, unit } = validatePredictionRequest(request);
  const toUnit = 1 / unit.toNatural;
  const tol = p.relativeTolerance;
  let converged = true;
  let usedQuadrature = false;
  const mean = (f: (x: number) => number, lo: number, hi: number) => {
    usedQuadrature = true;
    const r = integrateAdaptive(f, lo, hi, { relativeTolerance: tol, maxIntervals: 400 });
    converged &&= r.converged;
    return r.value / (hi - lo);
  };
  const sigma = (kernel: ProcessKernel) => {
    usedQuadrature = true;
    const [lo, hi] = acceptanceRange(kernel, p);
    const r = sigmaInAcceptance(kernel, p.frame, lo, hi, tol);
    converged &&= r.converged;
    return r.value;
  };

  let sqrtS: number | number[];
  let values: number[];
  let variable: PredictionResponse["variable"];
  let points: number[] | null = null;
  let bins: [number, number][] | null = null;

  if (p.scan === null) {
    const en = p.energy!;
    const kernel = kernelAt(def, p, en.kind, en.value * ENERGY_FACTOR[en.unit], `energy.${en.kind}`);
    sqrtS = kernel.kinematics.sqrtS;
    if (p.observable === "sigma") {
      variable = null;
      values = [sigma(kernel) * toUnit];
    } else {
      const a = p.angle!;
      variable = a.variable;
      const observable = p.observable as DifferentialObservable;
      if (a.points !== null) {
        points = a.points;
        values = pointValues(kernel, p, a.points, toUnit, (i) => `${a.variable}[${i}]`);
      } else {
        bins = a.bins!;
        bins.forEach((b, i) => checkAngleBin(kernel, p.frame, a.variable, b, `${a.variable}Bins[${i}]`));
        values = bins.map(([lo, hi]) => {
          usedQuadrature = true;
          const r = binMean(kernel, p.frame, observable, a.variable, lo, hi, tol);
          converged &&= r.converged;
          return r.value * toUnit;
        });
      }
    }
    const name = variable ?? "sigma";
    values = finite(values, (i) => (variable === null ? "observable" : `${name}${bins ? "Bins" : ""}[${i}]`));
  } else {
    const sc = p.scan;
    variable = sc.variable;
    const factor = ENERGY_FACTOR[sc.unit];
    const valueAt = (kernel: ProcessKernel) => {
      if (p.observable === "sigma") return sigma(kernel);
      const a = p.angle!;
      return pointValues(kernel, p, a.points!, 1, (i) => `${a.variable}[${i}]`)[0];
    };
    if (sc.points !== null) {
      points = sc.points;
      const kernels = sc.points.map((x, i) => kernelAt(def, p, sc.variable, x * factor, `scan.${sc.variable}[${i}]`));
      sqrtS = kernels.map((k) => k.kinematics.sqrtS);
      values = kernels.map((k) => valueAt(k) * toUnit);
    } else {
      bins = sc.bins!;
      sqrtS = bins.map(([lo, hi], i) => {
        kernelAt(def, p, sc.variable, lo * factor, `scan.${sc.variable}Bins[${i}][0]`, true);
        return kernelAt(def, p, sc.variable, 0.5 * (lo + hi) * factor, `scan.${sc.variable}Bins[${i}]`).kinematics.sqrtS;
      });
      values = bins.map(([lo, hi], i) => {
        kernelAt(def, p, sc.variable, hi * factor, `scan.${sc.variable}Bins[${i}][1]`);
        const g = (x: number) => valueAt(kernelAt(def, p, sc.variable, x * factor, `scan.${sc.variable}Bins[${i}]`, true));
        return mean(g, lo, hi) * toUnit;
      });
    }
    values = finite(values, (i) => `scan.${sc.variable}${bins ? "Bins" : ""}[${i}]`);
  }

  const info = def.info;
  return {
    engineVersion: ENGINE_VERSION,
    process: info.id,
    frame: p.frame,
    observable: p.observable,
    variable,
    binned: bins !== null,
    unit: p.unit,
    sqrtS,
    points,
    bins,
    values,
    conventions: {
      reaction: info.reaction,
      referenceParticle: info.referenceParticle,
      axisParticle: info.axisParticle,
      identicalFinalParticles: info.identicalFinalParticles,
      note: info.identicalFinalParticles
        ? "identical final particles: dσ/dΩ counts one particle in dΩ (no ½); σ is ½∫ over the acceptance (full acceptance: the total)"
        : "θ is the reference particle's polar angle against the axis particle's direction",
    },
    quadrature: usedQuadrature ? { relativeTolerance: tol, converged } : null,
    parameters: p,
    parametersHash: parametersHash(p),
  };
}

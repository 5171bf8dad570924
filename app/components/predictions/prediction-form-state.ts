import type { Observable, ProcessInfo } from "~/engine";
import { carryUnit } from "./unit-choices";

export type EnergyKind = "sqrtS" | "beam" | "kinetic";
export type EnergyUnit = "GeV" | "MeV" | "keV";
/** What the curve runs over: an angle variable, the energy (a scan), or nothing (one σ). */
export type CurveVariable = "thetaDeg" | "cosTheta" | "t" | "energy" | "none";

/** Everything the page's inputs hold, as typed: numbers stay text until the request is built. */
export interface PredictionFormState {
  process: ProcessInfo["id"];
  frame: ProcessInfo["frames"][number];
  energyKind: EnergyKind;
  energy: string;
  energyUnit: EnergyUnit;
  mass: string;
  finalMass: string;
  alpha: string;
  observable: Observable;
  variable: CurveVariable;
  from: string;
  to: string;
  count: string;
  binned: boolean;
  /** θ in degrees at which a differential observable is scanned over the energy. */
  fixedAngle: string;
  acceptance: boolean;
  acceptanceFrom: string;
  acceptanceTo: string;
  formFactor: "none" | "monopole" | "vmd";
  formFactorLambda: string;
  formFactorMass: string;
  formFactorWidth: string;
  formFactorQ2: "s" | "t";
  unit: string;
}

// Collider processes are usually quoted at √s; fixed-target ones at the beam's kinetic energy.
function naturalEnergyKind(info: ProcessInfo): EnergyKind {
  return info.needsSqrtS || !info.frames.includes("lab") ? "sqrtS" : "kinetic";
}

function defaultQ2(info: ProcessInfo): "s" | "t" {
  return info.id === "scalar-pair-production" ? "s" : "t";
}

export function initialFormState(info: ProcessInfo): PredictionFormState {
  return {
    process: info.id,
    frame: info.frames[0],
    energyKind: naturalEnergyKind(info),
    energy: info.needsSqrtS ? "1" : "0.5",
    energyUnit: "GeV",
    mass: "",
    finalMass: "",
    alpha: "",
    observable: "dsigma/dOmega",
    variable: "thetaDeg",
    ...rangeFor("thetaDeg", "0.5"),
    binned: false,
    fixedAngle: "90",
    acceptance: false,
    acceptanceFrom: "20",
    acceptanceTo: "160",
    formFactor: "none",
    // Starting values near the ρ(770) (PDG, recalled); shown in the inputs so nothing is hidden.
    formFactorLambda: "0.71",
    formFactorMass: "0.77526",
    formFactorWidth: "0.1491",
    formFactorQ2: defaultQ2(info),
    unit: "ub/sr",
  };
}

/** A sensible range for a newly chosen variable; an energy scan starts at the current energy. */
export function rangeFor(variable: CurveVariable, energy: string): Pick<PredictionFormState, "from" | "to" | "count"> {
  switch (variable) {
    case "thetaDeg":
      return { from: "5", to: "175", count: "69" };
    case "cosTheta":
      return { from: "-0.95", to: "0.95", count: "77" };
    case "t":
      return { from: "-0.1", to: "-0.001", count: "50" };
    case "energy": {
      const e = Number(energy);
      const start = Number.isFinite(e) && e > 0 ? e : 1;
      return { from: String(start), to: String(Number((4 * start).toPrecision(6))), count: "40" };
    }
    case "none":
      return { from: "", to: "", count: "" };
  }
}

/** The state after picking another process: keep what still applies, reset what does not. */
export function withProcess(f: PredictionFormState, info: ProcessInfo): PredictionFormState {
  const frame = info.frames.includes(f.frame) ? f.frame : info.frames[0];
  const energyKind = info.needsSqrtS || !info.frames.includes("lab") ? "sqrtS" : f.energyKind;
  return {
    ...f,
    process: info.id,
    frame,
    energyKind,
    mass: "",
    finalMass: "",
    formFactor: info.acceptsScalarFormFactor ? f.formFactor : "none",
    formFactorQ2: defaultQ2(info),
  };
}

/** The state after picking another observable: σ has no angle variable, others need one. */
export function withObservable(f: PredictionFormState, observable: Observable): PredictionFormState {
  let variable = f.variable;
  if (observable === "sigma" && (variable === "thetaDeg" || variable === "cosTheta" || variable === "t")) variable = "none";
  if (observable !== "sigma" && variable === "none") variable = "thetaDeg";
  const range = variable === f.variable ? {} : rangeFor(variable, f.energy);
  return { ...f, observable, variable, ...range, unit: carryUnit(f.unit, observable) };
}

export function withVariable(f: PredictionFormState, variable: CurveVariable): PredictionFormState {
  return { ...f, variable, ...rangeFor(variable, f.energy) };
}

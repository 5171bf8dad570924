import { equivalentEnergy, type Observable, type ProcessInfo } from "~/engine";
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
  /** How the chart draws the curve: scale and range of each axis (empty: from the curve). */
  xScale: AxisScale;
  yScale: AxisScale;
  xMin: string;
  xMax: string;
  yMin: string;
  yMax: string;
}

export type AxisScale = "linear" | "log";

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
    xScale: "linear",
    yScale: "log",
    xMin: "",
    xMax: "",
    yMin: "",
    yMax: "",
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

export const ENERGY_NAMES: Record<EnergyKind, string> = { sqrtS: "√s", beam: "total beam energy", kinetic: "beam kinetic energy" };
const GEV_PER: Record<EnergyUnit, number> = { GeV: 1, MeV: 1e-3, keV: 1e-6 };

/** A number written without binary noise: 2 GeV in MeV is "2000", not "2000.0000000000002". */
function tidy(v: number, digits = 12): string {
  return String(Number(v.toPrecision(digits)));
}

function massOrNull(text: string): number | null {
  const v = Number(text.trim());
  return text.trim() !== "" && Number.isFinite(v) ? v : null;
}

/** The state after a change of the energy unit: the energies keep their value, written in the new unit. */
export function withEnergyUnit(f: PredictionFormState, unit: EnergyUnit): PredictionFormState {
  const factor = GEV_PER[f.energyUnit] / GEV_PER[unit];
  const convert = (text: string) => {
    const v = Number(text.trim());
    return text.trim() !== "" && Number.isFinite(v) ? tidy(v * factor) : text;
  };
  const scan = f.variable === "energy";
  return { ...f, energyUnit: unit, energy: convert(f.energy), from: scan ? convert(f.from) : f.from, to: scan ? convert(f.to) : f.to };
}

/** A change of the process, and what the page says about the energy it carried over. */
export interface ProcessChange {
  state: PredictionFormState;
  /** A sentence for beside the energy, or null when the energy was kept as it was. */
  note: string | null;
}

/**
 * The state after picking another process: keep what still applies, reset what does not. The
 * energy keeps its kind and number where the new process takes that kind; otherwise it becomes
 * the new kind with the same √s (the same Mandelstam s, engine's equivalentEnergy), and when no
 * such energy exists (below the new threshold) it is reset to the process's default, saying so.
 */
export function withProcess(f: PredictionFormState, info: ProcessInfo, previous?: ProcessInfo): ProcessChange {
  const frame = info.frames.includes(f.frame) ? f.frame : info.frames[0];
  const energyKind: EnergyKind = info.needsSqrtS || !info.frames.includes("lab") ? "sqrtS" : f.energyKind;
  const base: PredictionFormState = {
    ...f,
    process: info.id,
    frame,
    energyKind,
    mass: "",
    finalMass: "",
    formFactor: info.acceptsScalarFormFactor ? f.formFactor : "none",
    formFactorQ2: defaultQ2(info),
  };
  if (energyKind === f.energyKind || previous === undefined) return { state: base, note: null };

  const g = GEV_PER[f.energyUnit];
  const convert = (text: string): number | null => {
    const v = Number(text.trim());
    if (text.trim() === "" || !Number.isFinite(v)) return null;
    const out = equivalentEnergy(
      { process: previous.id, kind: f.energyKind, valueGeV: v * g, mass: massOrNull(f.mass), finalMass: massOrNull(f.finalMass) },
      { process: info.id, kind: energyKind, mass: null, finalMass: null },
    );
    return out === null ? null : out / g;
  };
  const was = `${ENERGY_NAMES[f.energyKind]} ${f.variable === "energy" ? `${f.from} to ${f.to}` : f.energy} ${f.energyUnit} (${previous.reaction})`;
  if (f.variable === "energy") {
    const from = convert(f.from);
    const to = convert(f.to);
    if (from !== null && to !== null) {
      return { state: { ...base, from: tidy(from, 6), to: tidy(to, 6) }, note: `${info.reaction} takes √s only: the scan over ${was} is the same √s, ${tidy(from, 6)} to ${tidy(to, 6)} ${f.energyUnit}.` };
    }
    const fresh = rangeFor("energy", defaultEnergy(info, f.energyUnit));
    return { state: { ...base, ...fresh, count: f.count }, note: `${info.reaction} takes √s only, and ${was} has no √s above its threshold: the scan was reset to ${fresh.from} to ${fresh.to} ${f.energyUnit}.` };
  }
  const e = convert(f.energy);
  if (e !== null) return { state: { ...base, energy: tidy(e, 6) }, note: `${info.reaction} takes √s only: ${was} is the same √s = ${tidy(e, 6)} ${f.energyUnit}.` };
  const fresh = defaultEnergy(info, f.energyUnit);
  return { state: { ...base, energy: fresh }, note: `${info.reaction} takes √s only, and ${was} has no √s above its threshold: the energy was reset to √s = ${fresh} ${f.energyUnit}.` };
}

/** The starting energy of a process (1 GeV of √s or 0.5 GeV of beam kinetic energy) in a unit. */
function defaultEnergy(info: ProcessInfo, unit: EnergyUnit): string {
  return tidy((info.needsSqrtS ? 1 : 0.5) / GEV_PER[unit]);
}

/** The state after picking another observable: σ has no angle variable, others need one. */
export function withObservable(f: PredictionFormState, observable: Observable): PredictionFormState {
  let variable = f.variable;
  if (observable === "sigma" && (variable === "thetaDeg" || variable === "cosTheta" || variable === "t")) variable = "none";
  if (observable !== "sigma" && variable === "none") variable = "thetaDeg";
  const range = variable === f.variable ? {} : { ...rangeFor(variable, f.energy), ...(f.count.trim() && variable !== "none" ? { count: f.count } : {}) };
  return { ...f, observable, variable, ...range, unit: carryUnit(f.unit, observable), yMin: "", yMax: "" };
}

/** The state after picking another variable: a range that fits it, the same number of points. */
export function withVariable(f: PredictionFormState, variable: CurveVariable): PredictionFormState {
  const range = rangeFor(variable, f.energy);
  return { ...f, variable, ...range, count: variable === "none" || f.count.trim() === "" ? range.count : f.count, xMin: "", xMax: "", xScale: "linear" };
}

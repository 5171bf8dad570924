import { EngineInputError } from "./engine-input-error";
import { cmCosFromLab, cmPerLabSolidAngle, labCosFromCm, labFrameMap } from "./lab-frame-map";
import { mandelstamSFromEnergy, type EnergyKind } from "./mandelstam-s-from-energy";
import type { AngleVariable, DifferentialObservable } from "./observables";
import type { Frame } from "./process-definition";
import { findProcess } from "./process-registry";
import { reactionThreshold, twoBodyKinematics, type TwoBodyKinematics } from "./two-body-kinematics";

/** Where an angle lives: its variable (θ in degrees, cos θ, t in GeV²) and its frame. */
export interface AngleCoordinate {
  variable: AngleVariable;
  frame: Frame;
}

/** How a differential cross section is expressed: per which variable, in which frame. */
export interface DifferentialCoordinate {
  observable: DifferentialObservable;
  frame: Frame;
}

export interface ReactionAtEnergy {
  process: string;
  energy: { kind: EnergyKind; valueGeV: number };
  /** GeV; the process's defaults when null. */
  mass: number | null;
  finalMass: number | null;
}

const DEG = Math.PI / 180;

/**
 * The kinematics of one reaction at one energy, for moving measured points between angle
 * variables and frames without any dynamics: only the CM ↔ lab map and $t(\cos\theta^*)$
 * (docs/decisions/0003-engine-conventions.md). Everything goes through the CM cos θ*:
 * - θ, cos θ in the CM frame: cos θ* itself; in the lab frame: the aberration map;
 * - $t = t_1 - 2p_{in}p_{out}(1-\cos\theta^*)$.
 * Differential cross sections transform with the derivative of the variable they are per,
 * taken against c = cos θ*: the CM solid angle gives 2π; the lab solid angle 2π/J with
 * J = dΩ* per dΩ_lab (lab-frame-map.ts); t gives 2 p_in p_out. dσ is the same whatever the
 * variable, so at a point dσ/dX₂ = dσ/dX₁ · (dX₁/dc)/(dX₂/dc), and for a bin mean
 * (σ(bin)/ΔX, docs/decisions/0006) exactly ȳ₂ = ȳ₁ · ΔX₁/ΔX₂.
 */
export interface AngleConverter {
  readonly kinematics: TwoBodyKinematics;
  /** cos θ* of an angle coordinate value. */
  cmCos(from: AngleCoordinate, x: number): number;
  /** An angle coordinate's value at cos θ*. */
  fromCmCos(to: AngleCoordinate, cosCm: number): number;
  convert(from: AngleCoordinate, to: AngleCoordinate, x: number): number;
  /** The derivative dX by dcos θ* of the observable's variable X at cos θ* (its sign ignored). */
  measureDerivative(y: DifferentialCoordinate, cosCm: number): number;
  /** X of the observable's variable at cos θ* (up to a constant), for bin widths ΔX. */
  measure(y: DifferentialCoordinate, cosCm: number): number;
}

/**
 * Domain: a process of the registry at an energy above its threshold; a lab frame only where
 * the process has one. Throws EngineInputError otherwise.
 */
export function angleConverter(reaction: ReactionAtEnergy): AngleConverter {
  const def = findProcess(reaction.process);
  if (def === undefined) throw new EngineInputError("unknown_process", "process", `unknown process "${reaction.process}"`);
  const info = def.info;
  const mass = reaction.mass ?? info.defaultMass;
  const finalMass = reaction.finalMass ?? info.defaultFinalMass ?? mass;
  const masses = def.reactionMasses(mass, finalMass);
  const s = mandelstamSFromEnergy(reaction.energy.kind, reaction.energy.valueGeV, info, masses, "energy");
  if (!(s > reactionThreshold(masses))) {
    throw new EngineInputError("below_threshold", "energy", `√s = ${Math.sqrt(s).toPrecision(4)} GeV is at or below the threshold of ${info.reaction}`);
  }
  const kin = twoBodyKinematics(s, masses);
  const lab = info.frames.includes("lab") ? labFrameMap(kin) : null;
  const needLab = () => {
    if (lab === null) throw new EngineInputError("frame_not_offered", "frame", `${info.reaction} has no lab frame (no particle at rest)`);
    return lab;
  };
  const twoPP = 2 * kin.pIn * kin.pOut;
  const frameCos = (frame: Frame, cosCm: number) => (frame === "cm" ? cosCm : labCosFromCm(needLab(), cosCm));
  const cmCosOfFrame = (frame: Frame, c: number) => (frame === "cm" ? c : cmCosFromLab(needLab(), c));

  const converter: AngleConverter = {
    kinematics: kin,
    cmCos(from, x) {
      if (from.variable === "t") return 1 - (kin.tForward - x) / twoPP;
      const c = from.variable === "thetaDeg" ? Math.cos(x * DEG) : x;
      return cmCosOfFrame(from.frame, c);
    },
    fromCmCos(to, cosCm) {
      if (to.variable === "t") return kin.tForward - twoPP * (1 - cosCm);
      const c = frameCos(to.frame, cosCm);
      return to.variable === "cosTheta" ? c : Math.acos(Math.min(1, Math.max(-1, c))) / DEG;
    },
    convert(from, to, x) {
      return converter.fromCmCos(to, converter.cmCos(from, x));
    },
    measureDerivative(y, cosCm) {
      if (y.observable === "dsigma/dt") return twoPP;
      const perCos = y.frame === "cm" ? 1 : 1 / cmPerLabSolidAngle(needLab(), cosCm);
      return y.observable === "dsigma/dOmega" ? 2 * Math.PI * perCos : perCos;
    },
    measure(y, cosCm) {
      if (y.observable === "dsigma/dt") return kin.tForward - twoPP * (1 - cosCm);
      const c = frameCos(y.frame, cosCm);
      return y.observable === "dsigma/dOmega" ? 2 * Math.PI * c : c;
    },
  };
  return converter;
}

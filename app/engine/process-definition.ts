import type { ReactionMasses, TwoBodyKinematics } from "./two-body-kinematics";

export type ProcessId =
  | "scalar-annihilation"
  | "scalar-compton"
  | "photon-fusion-scalar"
  | "scalar-pair-production"
  | "pair-annihilation"
  | "compton"
  | "breit-wheeler"
  | "muon-pair"
  | "bhabha"
  | "moller";

export type Frame = "lab" | "cm";

/** What the page prints beside a prediction: the conventions of one process (docs/decisions/0003-engine-conventions.md). */
export interface ProcessInfo {
  readonly id: ProcessId;
  /** The reaction in Unicode, e.g. "φ⁺φ⁻ → γγ". */
  readonly reaction: string;
  readonly theory: "scalar QED" | "QED" | "QED + point-like scalar";
  readonly frames: readonly Frame[];
  /** The particle whose polar angle θ is. */
  readonly referenceParticle: string;
  /** The particle whose direction is the z axis (the beam in the lab frame). */
  readonly axisParticle: string;
  /** Lab frame and beam energies: the beam on the target at rest. */
  readonly beamParticle: string;
  readonly targetParticle: string;
  /** dσ/dΩ counts one particle in dΩ (no ½); totals are ½∫4π. */
  readonly identicalFinalParticles: boolean;
  /** Default of the request's "mass", GeV, and what it means. */
  readonly defaultMass: number;
  readonly massMeaning: string;
  /** Default of the request's "finalMass", GeV, or null when the process has none. */
  readonly defaultFinalMass: number | null;
  readonly finalMassMeaning: string | null;
  /** Label of the final pair for threshold messages, e.g. "φ⁺φ⁻". */
  readonly finalStateLabel: string;
  /** The tree-level dσ/dΩ diverges at θ = 0 / θ = 180° (t- or u-channel photon exchange). */
  readonly divergesForward: boolean;
  readonly divergesBackward: boolean;
  /** A composite-scalar form factor may multiply this process. */
  readonly acceptsScalarFormFactor: boolean;
  /** The initial state has no massive particle that could be at rest (γγ): only √s is meaningful. */
  readonly needsSqrtS: boolean;
}

/**
 * A process: its conventions and its closed form. `fillCm` is dσ/dΩ in the CM frame (GeV⁻²/sr)
 * at fixed s for an array of cos θ, from the unpolarised (initial-averaged, final-summed)
 * $\overline{|\mathcal M|^2}$ at $e^2 = 4\pi\alpha$ documented in the process's file:
 * $\frac{d\sigma}{d\Omega^*} = \frac{p_{out}}{64\pi^2 s\,p_{in}}\overline{|\mathcal M|^2}$. It is the only
 * evaluation of the closed form: `runPrediction` sends every array of angle points through it
 * (evaluate-angles.ts), and the kernel's scalar dσ/dΩ* (quadratures) calls it on one point.
 */
export interface ProcessDefinition {
  readonly info: ProcessInfo;
  reactionMasses(mass: number, finalMass: number): ReactionMasses;
  /**
   * Each process writes this loop out itself, calling its own closed form directly. Tried and
   * measured (npm run bench:engine, 10⁶ points): one shared loop taking the closed form as a
   * callback makes the call inside the loop megamorphic — 2–4× fewer evaluations per second
   * and 1.9× slower than numpy instead of 0.44× — so the near-copies stay.
   */
  fillCm(kin: TwoBodyKinematics, e2: number, cosTheta: Float64Array, out: Float64Array): void;
}

import { cmCosFromLab, cmPerLabSolidAngle, labCosFromCm, labFrameMap, type LabFrameMap } from "./lab-frame-map";
import type { Frame, ProcessDefinition } from "./process-definition";
import { mandelstamT, twoBodyKinematics, type TwoBodyKinematics } from "./two-body-kinematics";

/**
 * A process at one energy, ready to evaluate: the CM kinematics, the lab-frame map (when the
 * process has a lab frame) and e² = 4πα are computed once, so that every evaluation is a few
 * arithmetic operations. `formFactor` multiplies dσ/dΩ by |F|² as a function of (s, t).
 * Arrays of angle points go through `evaluateAngles`; these scalar functions serve the
 * quadratures (bin means, σ). Both evaluate the process's own loop `fillCm`.
 */
export interface ProcessKernel {
  readonly definition: ProcessDefinition;
  readonly kinematics: TwoBodyKinematics;
  readonly lab: LabFrameMap | null;
  readonly e2: number;
  /** |F|² multiplying dσ/dΩ, or null. */
  readonly formFactor: FormFactorSquared | null;
  readonly mass: number;
  readonly finalMass: number;
  /** $d\sigma/d\Omega^{*}$ in the CM frame at $\cos\theta^{*}$, GeV⁻²/sr. */
  dsigmaDOmegaCm(cosCm: number): number;
  /** $d\sigma/d\Omega$ in `frame` at the frame's $\cos\theta$, GeV⁻²/sr (lab: $d\sigma/d\Omega^{*}\cdot d\Omega^{*}/d\Omega_{lab}$). */
  dsigmaDOmega(frame: Frame, cosTheta: number): number;
  /** $\cos\theta^{*}$ from the frame's $\cos\theta$ (identity in the CM frame). */
  cmCos(frame: Frame, cosTheta: number): number;
  /** The frame's $\cos\theta$ from $\cos\theta^{*}$. */
  frameCos(frame: Frame, cosCm: number): number;
}

export type FormFactorSquared = (s: number, t: number) => number;

/**
 * Domain: s above the reaction threshold, masses > 0 where the process has them; the request
 * layer checks these and raises EngineInputError. Units: GeV, GeV².
 */
export function createProcessKernel(
  definition: ProcessDefinition,
  s: number,
  mass: number,
  finalMass: number,
  alpha: number,
  formFactor: FormFactorSquared | null = null,
): ProcessKernel {
  const kinematics = twoBodyKinematics(s, definition.reactionMasses(mass, finalMass));
  const lab = definition.info.frames.includes("lab") ? labFrameMap(kinematics) : null;
  const e2 = 4 * Math.PI * alpha;
  // one point through the process's own loop, so that a point, a bin mean and σ all evaluate
  // the same closed form in the same algebraic form
  const cosOne = new Float64Array(1);
  const valueOne = new Float64Array(1);
  const dsigmaDOmegaCm = (c: number): number => {
    cosOne[0] = c;
    definition.fillCm(kinematics, e2, cosOne, valueOne);
    const value = valueOne[0];
    return formFactor === null ? value : value * formFactor(s, mandelstamT(kinematics, c));
  };
  const requireLab = (): LabFrameMap => {
    if (lab === null) throw new RangeError(`${definition.info.id} has no lab frame`);
    return lab;
  };
  return {
    definition,
    kinematics,
    lab,
    e2,
    formFactor,
    mass,
    finalMass,
    dsigmaDOmegaCm,
    dsigmaDOmega(frame, cosTheta) {
      if (frame === "cm") return dsigmaDOmegaCm(cosTheta);
      const map = requireLab();
      const cosCm = cmCosFromLab(map, cosTheta);
      return dsigmaDOmegaCm(cosCm) * cmPerLabSolidAngle(map, cosCm);
    },
    cmCos(frame, cosTheta) {
      return frame === "cm" ? cosTheta : cmCosFromLab(requireLab(), cosTheta);
    },
    frameCos(frame, cosCm) {
      return frame === "cm" ? cosCm : labCosFromCm(requireLab(), cosCm);
    },
  };
}

import { PHYSICAL_CONSTANTS } from "../physical-constants";
import type { ProcessDefinition } from "../process-definition";

/**
 * φ⁺(p₁) φ⁻(p₂) → γ(k₁) γ(k₂), scalar QED, tree level, summed over photon polarisations:
 * $\sum|\mathcal M|^2 = 4e^4\left[1 + \left(1 - \frac{2m^2 s}{(t-m^2)(u-m^2)}\right)^2\right]$,
 * $t = (p_1-k_1)^2$, $u = (p_1-k_2)^2$. Scalars carry no spin, so there is nothing to average.
 * Units: dimensionless (e² = 4πα). Domain: s > 4m².
 * Source: derived here (docs/decisions/0003): in the rest frame of one scalar, transverse
 * polarisations without time component make both exchange diagrams vanish, the contact vertex
 * gives $4e^4(1+\cos^2\theta_{12})$, and $\cos\theta_{12}$ is written invariantly.
 */
export function scalarAnnihilationAmplitudeSquared(s: number, t: number, u: number, m: number, e2: number): number {
  const m2 = m * m;
  const c12 = 1 - (2 * m2 * s) / ((t - m2) * (u - m2));
  return 4 * e2 * e2 * (1 + c12 * c12);
}

export const scalarAnnihilation: ProcessDefinition = {
  info: {
    id: "scalar-annihilation",
    reaction: "φ⁺φ⁻ → γγ",
    theory: "scalar QED",
    frames: ["lab", "cm"],
    referenceParticle: "either photon",
    axisParticle: "the incoming φ⁺ (the beam in the lab frame; φ⁻ is the target at rest)",
    beamParticle: "φ⁺",
    targetParticle: "φ⁻",
    identicalFinalParticles: true,
    defaultMass: PHYSICAL_CONSTANTS.chargedPionMass,
    massMeaning: "mass of the charged scalar φ± (GeV)",
    defaultFinalMass: null,
    finalMassMeaning: null,
    finalStateLabel: "φ⁺φ⁻",
    divergesForward: false,
    divergesBackward: false,
    acceptsScalarFormFactor: true,
    needsSqrtS: false,
  },
  reactionMasses: (mass) => ({ axis: mass, partner: mass, reference: 0, recoil: 0 }),
  fillCm(kin, e2, cosTheta, out) {
    const m = kin.masses.axis;
    const pref = kin.pOut / (64 * Math.PI * Math.PI * kin.s * kin.pIn);
    const pp2 = 2 * kin.pIn * kin.pOut;
    const t1 = kin.tForward;
    const u1 = kin.uBackward;
    const s = kin.s;
    for (let i = 0; i < cosTheta.length; i++) {
      const c = cosTheta[i];
      out[i] = pref * scalarAnnihilationAmplitudeSquared(s, t1 - pp2 * (1 - c), u1 - pp2 * (1 + c), m, e2);
    }
  },
};

import { PHYSICAL_CONSTANTS } from "../physical-constants";
import type { ProcessDefinition } from "../process-definition";

/**
 * γ(k₁) γ(k₂) → φ⁻(p₋) φ⁺(p₊), scalar QED, tree level, averaged over both photon polarisations:
 * $\overline{|\mathcal M|^2} = e^4\left[1 + \left(1 - \frac{2m^2 s}{(t-m^2)(u-m^2)}\right)^2\right]$,
 * $t = (k_1-p_-)^2$, $u = (k_1-p_+)^2$. Dimensionless. Domain: s > 4m².
 * Source: derived here, the reverse of `scalarAnnihilationAmplitudeSquared` with the ¼ average
 * over the two photons' polarisations (docs/decisions/0003).
 */
export function photonFusionScalarAmplitudeSquared(s: number, t: number, u: number, m: number, e2: number): number {
  const m2 = m * m;
  const c12 = 1 - (2 * m2 * s) / ((t - m2) * (u - m2));
  return e2 * e2 * (1 + c12 * c12);
}

export const photonFusionScalar: ProcessDefinition = {
  info: {
    id: "photon-fusion-scalar",
    reaction: "γγ → φ⁺φ⁻",
    theory: "scalar QED",
    frames: ["cm"],
    referenceParticle: "the outgoing φ⁻",
    axisParticle: "one incoming photon",
    beamParticle: "γ",
    targetParticle: "γ",
    identicalFinalParticles: false,
    defaultMass: PHYSICAL_CONSTANTS.chargedPionMass,
    massMeaning: "mass of the produced charged scalar φ± (GeV)",
    defaultFinalMass: null,
    finalMassMeaning: null,
    finalStateLabel: "φ⁺φ⁻",
    divergesForward: false,
    divergesBackward: false,
    acceptsScalarFormFactor: true,
    needsSqrtS: true,
  },
  reactionMasses: (mass) => ({ axis: 0, partner: 0, reference: mass, recoil: mass }),
  fillCm(kin, e2, cosTheta, out) {
    const m = kin.masses.reference;
    const pref = kin.pOut / (64 * Math.PI * Math.PI * kin.s * kin.pIn);
    const pp2 = 2 * kin.pIn * kin.pOut;
    const t1 = kin.tForward;
    const u1 = kin.uBackward;
    const s = kin.s;
    for (let i = 0; i < cosTheta.length; i++) {
      const c = cosTheta[i];
      out[i] = pref * photonFusionScalarAmplitudeSquared(s, t1 - pp2 * (1 - c), u1 - pp2 * (1 + c), m, e2);
    }
  },
};

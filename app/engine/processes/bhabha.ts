import { PHYSICAL_CONSTANTS } from "../physical-constants";
import type { ProcessDefinition } from "../process-definition";

/**
 * e⁻(p₁) e⁺(p₂) → e⁻(p₃) e⁺(p₄), QED, tree level (t-channel exchange and s-channel
 * annihilation, relative sign −1), averaged over the initial and summed over the final spins,
 * electron mass m kept:
 * $\overline{|\mathcal M|^2} = 2e^4\left[\frac{s^2+u^2+8m^2t-8m^4}{t^2} + \frac{u^2+t^2+8m^2s-8m^4}{s^2}
 *   + \frac{2(u-2m^2)(u-6m^2)}{st}\right]$, $t = (p_1-p_3)^2$, $u = (p_1-p_4)^2$.
 * Dimensionless. Domain: s > 4m², t < 0 (diverges at θ = 0; finite at θ = 180°).
 * Massless limit: $2e^4[(s^2+u^2)/t^2 + (u^2+t^2)/s^2 + 2u^2/(st)]$ (H. J. Bhabha, Proc. Roy. Soc.
 * A154 (1936) 195; standard textbook form, *memory*).
 * Source: derived here by crossing `mollerAmplitudeSquared` (s ↔ u, docs/decisions/0003);
 * verified against the numerical amplitude.
 */
export function bhabhaAmplitudeSquared(s: number, t: number, u: number, m: number, e2: number): number {
  const m2 = m * m;
  const m4 = m2 * m2;
  return (
    2 * e2 * e2 *
    ((s * s + u * u + 8 * m2 * t - 8 * m4) / (t * t) +
      (u * u + t * t + 8 * m2 * s - 8 * m4) / (s * s) +
      (2 * (u - 2 * m2) * (u - 6 * m2)) / (s * t))
  );
}

export const bhabha: ProcessDefinition = {
  info: {
    id: "bhabha",
    reaction: "e⁺e⁻ → e⁺e⁻",
    theory: "QED",
    frames: ["cm"],
    referenceParticle: "the outgoing e⁻",
    axisParticle: "the incoming e⁻",
    beamParticle: "e⁺",
    targetParticle: "e⁻",
    identicalFinalParticles: false,
    defaultMass: PHYSICAL_CONSTANTS.electronMass,
    massMeaning: "electron mass (GeV)",
    defaultFinalMass: null,
    finalMassMeaning: null,
    finalStateLabel: "e⁺e⁻",
    divergesForward: true,
    divergesBackward: false,
    acceptsScalarFormFactor: false,
    needsSqrtS: false,
  },
  reactionMasses: (mass) => ({ axis: mass, partner: mass, reference: mass, recoil: mass }),
  fillCm(kin, e2, cosTheta, out) {
    const m = kin.masses.axis;
    const pref = kin.pOut / (64 * Math.PI * Math.PI * kin.s * kin.pIn);
    const pp2 = 2 * kin.pIn * kin.pOut;
    const t1 = kin.tForward;
    const u1 = kin.uBackward;
    const s = kin.s;
    for (let i = 0; i < cosTheta.length; i++) {
      const c = cosTheta[i];
      out[i] = pref * bhabhaAmplitudeSquared(s, t1 - pp2 * (1 - c), u1 - pp2 * (1 + c), m, e2);
    }
  },
};

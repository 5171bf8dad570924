import { PHYSICAL_CONSTANTS } from "../physical-constants";
import type { ProcessDefinition } from "../process-definition";

/**
 * e⁻(p₁) e⁺(p₂) → μ⁻(k₁) μ⁺(k₂) through one photon, QED, tree level, averaged over the initial
 * and summed over the final spins, electron mass m and muon mass M kept:
 * $\overline{|\mathcal M|^2} = \frac{2e^4}{s^2}\left[(m^2+M^2-t)^2 + (m^2+M^2-u)^2 + 2s(m^2+M^2)\right]$,
 * $t = (p_1-k_1)^2$, $u = (p_1-k_2)^2$. Dimensionless. Domain: s > max(4m², 4M²).
 * At s ≫ M² the total is 4πα²/(3s) (Review of Particle Physics, "Cross-section formulae for
 * specific processes"). Source: derived here from the two lepton traces (docs/decisions/0003);
 * verified against the numerical amplitude.
 */
export function muonPairAmplitudeSquared(s: number, t: number, u: number, m: number, M: number, e2: number): number {
  const sum = m * m + M * M;
  const a = sum - t;
  const b = sum - u;
  return ((2 * e2 * e2) / (s * s)) * (a * a + b * b + 2 * s * sum);
}

export const muonPair: ProcessDefinition = {
  info: {
    id: "muon-pair",
    reaction: "e⁺e⁻ → μ⁺μ⁻",
    theory: "QED",
    frames: ["cm"],
    referenceParticle: "the outgoing μ⁻",
    axisParticle: "the incoming e⁻",
    beamParticle: "e⁺",
    targetParticle: "e⁻",
    identicalFinalParticles: false,
    defaultMass: PHYSICAL_CONSTANTS.electronMass,
    massMeaning: "electron mass (GeV)",
    defaultFinalMass: PHYSICAL_CONSTANTS.muonMass,
    finalMassMeaning: "muon mass (GeV)",
    finalStateLabel: "μ⁺μ⁻",
    divergesForward: false,
    divergesBackward: false,
    acceptsScalarFormFactor: false,
    needsSqrtS: false,
  },
  reactionMasses: (mass, finalMass) => ({ axis: mass, partner: mass, reference: finalMass, recoil: finalMass }),
  fillCm(kin, e2, cosTheta, out) {
    const m = kin.masses.axis;
    const M = kin.masses.reference;
    const pref = kin.pOut / (64 * Math.PI * Math.PI * kin.s * kin.pIn);
    const pp2 = 2 * kin.pIn * kin.pOut;
    const t1 = kin.tForward;
    const u1 = kin.uBackward;
    const s = kin.s;
    for (let i = 0; i < cosTheta.length; i++) {
      const c = cosTheta[i];
      out[i] = pref * muonPairAmplitudeSquared(s, t1 - pp2 * (1 - c), u1 - pp2 * (1 + c), m, M, e2);
    }
  },
};

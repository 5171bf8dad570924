import { PHYSICAL_CONSTANTS } from "../physical-constants";
import type { ProcessDefinition } from "../process-definition";

/**
 * e⁺(p₂) e⁻(p₁) → γ(k₁) γ(k₂), QED, tree level, averaged over the lepton spins, summed over the
 * photon polarisations, electron mass m kept. With $P = p_1\cdot k_1 = (m^2-t)/2$ and
 * $Q = p_1\cdot k_2 = (m^2-u)/2$:
 * $\overline{|\mathcal M|^2} = 2e^4\left[\frac{Q}{P} + \frac{P}{Q} + 2m^2\left(\frac1P+\frac1Q\right) - m^4\left(\frac1P+\frac1Q\right)^2\right]$.
 * The expression is symmetric in the two photons and in e⁺ ↔ e⁻, so t may be taken against
 * either incoming lepton. Dimensionless. Domain: s > 4m².
 * Source: standard textbook result (e.g. M. E. Peskin and D. V. Schroeder, An Introduction to
 * Quantum Field Theory, section 5.5, by crossing Compton scattering); *memory*, verified in the
 * tests against the numerical amplitude.
 */
export function pairAnnihilationAmplitudeSquared(s: number, t: number, u: number, m: number, e2: number): number {
  const m2 = m * m;
  const p = (m2 - t) / 2;
  const q = (m2 - u) / 2;
  const inv = 1 / p + 1 / q;
  return 2 * e2 * e2 * (q / p + p / q + 2 * m2 * inv - m2 * m2 * inv * inv);
}

export const pairAnnihilation: ProcessDefinition = {
  info: {
    id: "pair-annihilation",
    reaction: "e⁺e⁻ → γγ",
    theory: "QED",
    frames: ["lab", "cm"],
    referenceParticle: "either photon",
    axisParticle: "the incoming e⁺ (the beam in the lab frame; e⁻ is the target at rest)",
    beamParticle: "e⁺",
    targetParticle: "e⁻",
    identicalFinalParticles: true,
    defaultMass: PHYSICAL_CONSTANTS.electronMass,
    massMeaning: "electron mass (GeV)",
    defaultFinalMass: null,
    finalMassMeaning: null,
    finalStateLabel: "e⁺e⁻",
    divergesForward: false,
    divergesBackward: false,
    acceptsScalarFormFactor: false,
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
      out[i] = pref * pairAnnihilationAmplitudeSquared(s, t1 - pp2 * (1 - c), u1 - pp2 * (1 + c), m, e2);
    }
  },
};

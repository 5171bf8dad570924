import { PHYSICAL_CONSTANTS } from "../physical-constants";
import type { ProcessDefinition } from "../process-definition";
import { pairAnnihilationAmplitudeSquared } from "./pair-annihilation";

/**
 * γ(k₁) γ(k₂) → e⁻(p₋) e⁺(p₊), QED, tree level, averaged over the photon polarisations, summed
 * over the lepton spins. The crossing of e⁺e⁻ → γγ (two fermion lines crossed: no sign; the
 * average is ¼ on both sides), so with $P = p_-\cdot k_1 = (m^2-t)/2$, $Q = p_-\cdot k_2 = (m^2-u)/2$
 * the expression of `pairAnnihilationAmplitudeSquared` holds unchanged; $t = (k_1-p_-)^2$.
 * Dimensionless. Domain: s > 4m².
 * Source: derived here by crossing (docs/decisions/0003); the total is the Breit–Wheeler cross
 * section (G. Breit and J. A. Wheeler, Phys. Rev. 46 (1934) 1087).
 */
export function breitWheelerAmplitudeSquared(s: number, t: number, u: number, m: number, e2: number): number {
  return pairAnnihilationAmplitudeSquared(s, t, u, m, e2);
}

export const breitWheeler: ProcessDefinition = {
  info: {
    id: "breit-wheeler",
    reaction: "γγ → e⁺e⁻",
    theory: "QED",
    frames: ["cm"],
    referenceParticle: "the outgoing e⁻",
    axisParticle: "one incoming photon",
    beamParticle: "γ",
    targetParticle: "γ",
    identicalFinalParticles: false,
    defaultMass: PHYSICAL_CONSTANTS.electronMass,
    massMeaning: "mass of the produced electron (GeV)",
    defaultFinalMass: null,
    finalMassMeaning: null,
    finalStateLabel: "e⁺e⁻",
    divergesForward: false,
    divergesBackward: false,
    acceptsScalarFormFactor: false,
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
      out[i] = pref * pairAnnihilationAmplitudeSquared(s, t1 - pp2 * (1 - c), u1 - pp2 * (1 + c), m, e2);
    }
  },
};

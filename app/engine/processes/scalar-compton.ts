import { PHYSICAL_CONSTANTS } from "../physical-constants";
import type { ProcessDefinition } from "../process-definition";

/**
 * γ(k) φ(p) → γ(k′) φ(p′), scalar QED, tree level, averaged over the incoming and summed over
 * the outgoing photon polarisation:
 * $\overline{|\mathcal M|^2} = 2e^4\left[1 + \left(1 - \frac{2m^2 t}{(s-m^2)(u-m^2)}\right)^2\right]$,
 * $t = (k-k')^2$, $u = (k-p')^2$. Dimensionless. Domain: s > m².
 * Low-energy limit in the lab frame: $d\sigma/d\Omega = \frac{\alpha^2}{2m^2}(1+\cos^2\theta)$ (Thomson).
 * Source: derived here by crossing `scalarAnnihilationAmplitudeSquared` (s → t, t → u, u → s;
 * docs/decisions/0003).
 */
export function scalarComptonAmplitudeSquared(s: number, t: number, u: number, m: number, e2: number): number {
  const m2 = m * m;
  const c = 1 - (2 * m2 * t) / ((s - m2) * (u - m2));
  return 2 * e2 * e2 * (1 + c * c);
}

export const scalarCompton: ProcessDefinition = {
  info: {
    id: "scalar-compton",
    reaction: "γφ → γφ",
    theory: "scalar QED",
    frames: ["lab", "cm"],
    referenceParticle: "the scattered photon",
    axisParticle: "the incoming photon (φ is the target at rest in the lab frame)",
    beamParticle: "γ",
    targetParticle: "φ",
    identicalFinalParticles: false,
    defaultMass: PHYSICAL_CONSTANTS.chargedPionMass,
    massMeaning: "mass of the charged scalar target φ (GeV)",
    defaultFinalMass: null,
    finalMassMeaning: null,
    finalStateLabel: "γφ",
    divergesForward: false,
    divergesBackward: false,
    acceptsScalarFormFactor: true,
    needsSqrtS: false,
  },
  reactionMasses: (mass) => ({ axis: 0, partner: mass, reference: 0, recoil: mass }),
  fillCm(kin, e2, cosTheta, out) {
    const m = kin.masses.partner;
    const pref = kin.pOut / (64 * Math.PI * Math.PI * kin.s * kin.pIn);
    const pp2 = 2 * kin.pIn * kin.pOut;
    const t1 = kin.tForward;
    const u1 = kin.uBackward;
    const s = kin.s;
    for (let i = 0; i < cosTheta.length; i++) {
      const c = cosTheta[i];
      out[i] = pref * scalarComptonAmplitudeSquared(s, t1 - pp2 * (1 - c), u1 - pp2 * (1 + c), m, e2);
    }
  },
};

import { PHYSICAL_CONSTANTS } from "../physical-constants";
import type { ProcessDefinition } from "../process-definition";

/**
 * γ(k) e⁻(p) → γ(k′) e⁻(p′), QED, tree level, averaged over the initial and summed over the
 * final spins and polarisations. With $P = p\cdot k = (s-m^2)/2$ and $Q = p\cdot k' = (m^2-u)/2$:
 * $\overline{|\mathcal M|^2} = 2e^4\left[\frac{Q}{P} + \frac{P}{Q} + 2m^2\left(\frac1P-\frac1Q\right) + m^4\left(\frac1P-\frac1Q\right)^2\right]$,
 * $t = (k-k')^2$, $u = (k-p')^2$. Dimensionless. Domain: s > m².
 * Evaluated in the equivalent form (derived here with $Q - P = t/2$, docs/decisions/0003)
 * $2e^4\left[\frac{t^2}{(s-m^2)(m^2-u)} + 1 + \left(1 - \frac{2m^2t}{(s-m^2)(u-m^2)}\right)^2\right]$:
 * the textbook form cancels terms of size m/ω against each other and loses about (m/ω)²·10⁻¹⁶
 * of relative precision near the Thomson limit; this one does not.
 * In the lab frame this is the Klein–Nishina formula (O. Klein and Y. Nishina, Z. Phys. 52
 * (1929) 853). Source: standard textbook result (e.g. M. E. Peskin and D. V. Schroeder,
 * An Introduction to Quantum Field Theory, section 5.5); *memory*, verified in the tests against
 * the numerical amplitude and the Klein–Nishina formula.
 */
export function comptonAmplitudeSquared(s: number, t: number, u: number, m: number, e2: number): number {
  const m2 = m * m;
  const a = s - m2;
  const b = m2 - u;
  const c = 1 + (2 * m2 * t) / (a * b);
  return 2 * e2 * e2 * ((t * t) / (a * b) + 1 + c * c);
}

export const compton: ProcessDefinition = {
  info: {
    id: "compton",
    reaction: "γe⁻ → γe⁻",
    theory: "QED",
    frames: ["lab", "cm"],
    referenceParticle: "the scattered photon",
    axisParticle: "the incoming photon (e⁻ is the target at rest in the lab frame)",
    beamParticle: "γ",
    targetParticle: "e⁻",
    identicalFinalParticles: false,
    defaultMass: PHYSICAL_CONSTANTS.electronMass,
    massMeaning: "electron (target) mass (GeV)",
    defaultFinalMass: null,
    finalMassMeaning: null,
    finalStateLabel: "γe⁻",
    divergesForward: false,
    divergesBackward: false,
    acceptsScalarFormFactor: false,
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
      out[i] = pref * comptonAmplitudeSquared(s, t1 - pp2 * (1 - c), u1 - pp2 * (1 + c), m, e2);
    }
  },
};

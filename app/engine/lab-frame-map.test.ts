import { describe, expect, it } from "vitest";
import { cosPolarAngle, fourVector, invariantMassSquared, subtractFourVectors } from "./four-vector";
import { cmCosFromLab, cmPerLabSolidAngle, labCosFromCm, labFrameMap, maximumLabAngleDeg } from "./lab-frame-map";
import { lorentzBoost } from "./lorentz-boost";
import { seededRandom } from "./testing/seeded-random";
import { cosThetaFromT, mandelstamT, mandelstamU, reactionThreshold, twoBodyKinematics, type ReactionMasses } from "./two-body-kinematics";

// Reference: explicit four-vectors boosted with the textbook Lorentz transformation, and
// numerical derivatives — independent of the closed-form angle map being tested.
function cmReference(kin: ReturnType<typeof twoBodyKinematics>, cosCm: number) {
  const sin = Math.sqrt(1 - cosCm * cosCm);
  return fourVector(kin.energyReference, kin.pOut * sin, 0, kin.pOut * cosCm);
}

function labCosByBoost(kin: ReturnType<typeof twoBodyKinematics>, cosCm: number): number {
  // the CM frame moves with +β along z in the lab, so the lab is the frame moving with −β
  const beta = kin.pIn / kin.energyPartner;
  return cosPolarAngle(lorentzBoost(cmReference(kin, cosCm), 0, 0, -beta));
}

const cases: [string, ReactionMasses, number][] = [
  ["massless reference (γ from e⁺e⁻ → γγ)", { axis: 0.000511, partner: 0.000511, reference: 0, recoil: 0 }, 0.01],
  ["light reference, g < 1 (γ p → π⁺ n-like masses)", { axis: 0, partner: 0.938, reference: 0.1396, recoil: 0.9396 }, 1.9],
  ["heavy reference on a light target, g > 1 (two branches)", { axis: 1, partner: 0.1, reference: 1, recoil: 0.1 }, 1.3],
];

describe("lab ↔ CM angle map", () => {
  for (const [label, masses, sqrtS] of cases) {
    it(`${label}: forward map, inverse, Jacobian`, () => {
      const kin = twoBodyKinematics(sqrtS * sqrtS, masses);
      const map = labFrameMap(kin);
      const rand = seededRandom(label.length);
      for (let i = 0; i < 200; i++) {
        const c = 2 * rand() - 1;
        const lab = labCosFromCm(map, c);
        expect(Math.abs(lab - labCosByBoost(kin, c)), `lab cos at cos* = ${c}`).toBeLessThan(1e-12);
        const branch = map.g > 1 && c < -1 / map.g ? "backward" : "forward";
        expect(Math.abs(cmCosFromLab(map, lab, branch) - c), `inverse at cos* = ${c} (${branch})`).toBeLessThan(1e-8);
        // central differences with one Richardson step: truncation O(h⁴)
        const h = 1e-4 * Math.min(1, 1 - Math.abs(c));
        const d = (k: number) => (labCosFromCm(map, c + k) - labCosFromCm(map, c - k)) / (2 * k);
        const dLab = (4 * d(h / 2) - d(h)) / 3;
        const jac = cmPerLabSolidAngle(map, c);
        expect(Math.abs(jac * Math.abs(dLab) - 1), `dΩ*/dΩ_lab at cos* = ${c}`).toBeLessThan(1e-6);
      }
    });
  }

  it("has the maximum lab angle tan θ_max = 1/(γ√(g²−1)) when g > 1, and none when g ≤ 1", () => {
    const [, masses, sqrtS] = cases[2];
    const map = labFrameMap(twoBodyKinematics(sqrtS * sqrtS, masses));
    expect(map.g).toBeGreaterThan(1);
    let maxDeg = 0;
    for (let i = 0; i <= 200000; i++) maxDeg = Math.max(maxDeg, (Math.acos(labCosFromCm(map, -1 + i / 100000)) * 180) / Math.PI);
    expect(Math.abs(maxDeg - maximumLabAngleDeg(map))).toBeLessThan(1e-4);
    expect(Number.isNaN(cmCosFromLab(map, Math.cos(((maximumLabAngleDeg(map) + 1) * Math.PI) / 180)))).toBe(true);
    expect(maximumLabAngleDeg(labFrameMap(twoBodyKinematics(cases[0][2] ** 2, cases[0][1])))).toBe(180);
  });

  it("is single-valued for photons: lab 0° ↔ CM 0° and lab 180° ↔ CM 180°", () => {
    const map = labFrameMap(twoBodyKinematics(0.01 ** 2, cases[0][1]));
    expect(cmCosFromLab(map, 1)).toBe(1);
    expect(cmCosFromLab(map, -1)).toBe(-1);
  });
});

describe("two-body kinematics", () => {
  it("gives t and u equal to the explicit four-vector invariants, and s + t + u = Σm²", () => {
    const rand = seededRandom(5);
    for (const [, masses, sqrtS] of cases) {
      const kin = twoBodyKinematics(sqrtS * sqrtS, masses);
      for (let i = 0; i < 50; i++) {
        const c = 2 * rand() - 1;
        const pa = fourVector(kin.energyAxis, 0, 0, kin.pIn);
        const pc = cmReference(kin, c);
        const pd = fourVector(kin.energyRecoil, -pc.x, 0, -pc.z);
        const t = invariantMassSquared(subtractFourVectors(pa, pc));
        const u = invariantMassSquared(subtractFourVectors(pa, pd));
        const scale = kin.s;
        expect(Math.abs(mandelstamT(kin, c) - t) / scale).toBeLessThan(1e-13);
        expect(Math.abs(mandelstamU(kin, c) - u) / scale).toBeLessThan(1e-13);
        const sum = masses.axis ** 2 + masses.partner ** 2 + masses.reference ** 2 + masses.recoil ** 2;
        expect(Math.abs(kin.s + mandelstamT(kin, c) + mandelstamU(kin, c) - sum) / scale).toBeLessThan(1e-13);
        expect(cosThetaFromT(kin, mandelstamT(kin, c))).toBeCloseTo(c, 12);
      }
    }
  });

  it("keeps t accurate at θ = 0 at high energy (massless-limit cancellation avoided)", () => {
    // e⁻ e⁺ → μ⁻ μ⁺ at √s = 1000 GeV: t(0) ≈ −(m_μ² − m_e²)²/s is 10⁻⁸ of the masses squared
    const me = 0.00051099895;
    const mmu = 0.1056583755;
    const kin = twoBodyKinematics(1e6, { axis: me, partner: me, reference: mmu, recoil: mmu });
    // all four energies are E = √s/2, so t(0) = −(p − p′)² with p − p′ = (m_μ² − m_e²)/(p + p′) exactly
    const E = 500;
    const p = Math.sqrt(E * E - me * me);
    const pp = Math.sqrt(E * E - mmu * mmu);
    const exact = -(((mmu * mmu - me * me) / (p + pp)) ** 2);
    expect(Math.abs(kin.tForward - exact) / Math.abs(exact)).toBeLessThan(1e-9);
  });

  it("thresholds are max((m_a+m_b)², (m_c+m_d)²)", () => {
    expect(reactionThreshold({ axis: 0, partner: 0, reference: 1, recoil: 2 })).toBe(9);
    expect(reactionThreshold({ axis: 1, partner: 1, reference: 0, recoil: 0 })).toBe(4);
  });
});

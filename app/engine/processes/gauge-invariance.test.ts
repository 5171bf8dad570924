import { describe, expect, it } from "vitest";
import { PHYSICAL_CONSTANTS } from "../physical-constants";
import type { ProcessId } from "../process-definition";
import { PROCESS_DEFINITIONS } from "../process-registry";
import { cmMomenta, labMomentaMasslessReference } from "../testing/oracle-kinematics";
import { oracleMasses } from "../testing/oracle-fixtures";
import { seededRandom } from "../testing/seeded-random";
import {
  ORACLE_PROCESSES,
  largestAmplitude,
  scalarLineDiagrams,
  summedSquaredAmplitude,
  type OracleMomenta,
  type OracleProcess,
} from "../testing/tree-amplitudes";
import type { Vec4 } from "../testing/dirac-algebra";

// Ward identity (every QED textbook; *practice*): replacing an external photon's polarisation
// by its momentum makes the full tree amplitude vanish. k is scaled to k/k⁰ so that it has the
// size of a polarisation vector; "vanishes" means below 1e-11 of the largest physical amplitude.
const ROUNDOFF = 1e-11;
const e = Math.sqrt(4 * Math.PI * PHYSICAL_CONSTANTS.alpha);
const legMomentum = (p: OracleMomenta, i: number): Vec4 => [p.a, p.b, p.c, p.d][i];

function wardRatio(proc: OracleProcess, p: OracleMomenta, leg: number, params: { e: number; mass: number; finalMass: number }) {
  const k = legMomentum(p, leg);
  const kScaled: Vec4 = [1, k[1] / k[0], k[2] / k[0], k[3] / k[0]];
  const gaugeSum = summedSquaredAmplitude(proc, p, params, { [leg]: [kScaled] });
  return Math.sqrt(gaugeSum) / largestAmplitude(proc, p, params);
}

describe("gauge invariance of the oracle amplitudes (Ward identity)", () => {
  const withPhotons = PROCESS_DEFINITIONS.filter((d) => ORACLE_PROCESSES[d.info.id].legs.includes("photon"));
  it("covers every process with external photons", () => {
    expect(withPhotons.map((d) => d.info.id).sort()).toEqual(
      ["breit-wheeler", "compton", "pair-annihilation", "photon-fusion-scalar", "scalar-annihilation", "scalar-compton"].sort(),
    );
  });
  for (const def of withPhotons) {
    const id = def.info.id as ProcessId;
    const proc = ORACLE_PROCESSES[id];
    it(`${id}: ε → k makes the amplitude vanish for each photon, CM and lab kinematics`, () => {
      const rand = seededRandom(4242 + PROCESS_DEFINITIONS.indexOf(def));
      const mass = def.info.defaultMass;
      const finalMass = def.info.defaultFinalMass ?? mass;
      const m = oracleMasses(id, mass, finalMass);
      const params = { e, mass, finalMass };
      for (let i = 0; i < 40; i++) {
        const cos = 2 * rand() - 1;
        const phi = 2 * Math.PI * rand();
        const threshold = Math.max(m.a + m.b, m.c + m.d);
        const p =
          i % 2 === 0 || !def.info.frames.includes("lab")
            ? cmMomenta(threshold * (1 + 5 * rand() + 1e-3), m, cos, phi)
            : labMomentaMasslessReference(m.a + m.b * (5 * rand() + 1e-3), m, cos, phi);
        proc.legs.forEach((kind, leg) => {
          if (kind !== "photon") return;
          const ratio = wardRatio(proc, p, leg, params);
          expect(ratio, `${id} leg ${leg} point ${i}: |M(ε→k)|/|M|max = ${ratio}, limit ${ROUNDOFF}`).toBeLessThan(ROUNDOFF);
        });
      }
    });
  }

  it("fails without the scalar-QED contact vertex (the check can fail)", () => {
    // scalar annihilation with only the two exchange diagrams is not gauge invariant
    // lab kinematics: in the CM frame the photons are back to back and the contact term of
    // k̂₁ with a transverse ε₂ is zero, which would make this check empty
    const m = { a: 0.14, b: 0.14, c: 0, d: 0 };
    const p = labMomentaMasslessReference(0.6, m, 0.3, 0.7);
    const k = p.c;
    const kScaled: Vec4 = [1, k[1] / k[0], k[2] / k[0], k[3] / k[0]];
    const neg = (x: Vec4): Vec4 => [-x[0], -x[1], -x[2], -x[3]];
    const eps2 = [0, 1, 0, 0] as Vec4;
    const dTransverse = (() => {
      const n = Math.hypot(p.d[1], p.d[2], p.d[3]);
      const dir = [p.d[1] / n, p.d[2] / n, p.d[3] / n];
      const proj = eps2[1] * dir[0];
      const v = [eps2[1] - proj * dir[0], -proj * dir[1], -proj * dir[2]];
      const l = Math.hypot(v[0], v[1], v[2]);
      return [0, v[0] / l, v[1] / l, v[2] / l] as Vec4;
    })();
    const d = scalarLineDiagrams(p.a, neg(p.c), kScaled, neg(p.d), dTransverse, 0.14, e);
    const withoutContact = d.exchangeAB.add(d.exchangeBA).abs();
    const full = d.exchangeAB.add(d.exchangeBA).add(d.contact).abs();
    const scale = Math.max(d.exchangeAB.abs(), d.exchangeBA.abs(), d.contact.abs());
    expect(full / scale).toBeLessThan(ROUNDOFF);
    expect(withoutContact / scale).toBeGreaterThan(0.1);
  });
});

describe("scalar annihilation in the rest frame of one initial scalar (standard textbook argument)", () => {
  // With polarisation vectors without time component, ε·p = 0 for the scalar at rest, so both
  // scalar-exchange diagrams vanish and only the contact vertex 2ie²g^{μν} contributes:
  // Σ|M|² = 4e⁴(1 + cos²θ₁₂), θ₁₂ the angle between the photons in that frame.
  const mass = PHYSICAL_CONSTANTS.chargedPionMass;
  const proc = ORACLE_PROCESSES["scalar-annihilation"];
  const params = { e, mass, finalMass: mass };
  const neg = (x: Vec4): Vec4 => [-x[0], -x[1], -x[2], -x[3]];
  const frames: [string, (p: OracleMomenta) => OracleMomenta][] = [
    ["φ⁻ at rest", (p) => p],
    ["φ⁺ at rest", (p) => ({ a: p.b, b: p.a, c: p.c, d: p.d })],
  ];
  for (const [label, arrange] of frames) {
    it(`${label}: each exchange diagram vanishes and Σ|M|² = 4e⁴(1 + cos²θ₁₂) at 200 points (relative 1e-12)`, () => {
      const rand = seededRandom(label.length * 31);
      for (let i = 0; i < 200; i++) {
        const kinetic = mass * 10 ** (4 * rand() - 3);
        const lab = labMomentaMasslessReference(kinetic + mass, { a: mass, b: mass, c: 0, d: 0 }, 2 * rand() - 1, 2 * Math.PI * rand());
        const p = arrange(lab);
        const [c1, c2] = [p.c, p.d].map((k) => {
          const n = Math.hypot(k[1], k[2], k[3]);
          return [k[1] / n, k[2] / n, k[3] / n];
        });
        const cos12 = c1[0] * c2[0] + c1[1] * c2[1] + c1[2] * c2[2];
        const expected = 4 * e ** 4 * (1 + cos12 * cos12);
        const got = summedSquaredAmplitude(proc, p, params);
        expect(Math.abs(got - expected) / expected, `point ${i}: got ${got} expected ${expected}`).toBeLessThan(1e-12);
        const [e1s, e2s] = [p.c, p.d].map((k) => {
          const n = Math.hypot(k[1], k[2], k[3]);
          const dir = [k[1] / n, k[2] / n, k[3] / n];
          const ax = Math.abs(dir[0]) < 0.5 ? [1, 0, 0] : [0, 1, 0];
          const v1 = [ax[1] * dir[2] - ax[2] * dir[1], ax[2] * dir[0] - ax[0] * dir[2], ax[0] * dir[1] - ax[1] * dir[0]];
          const l = Math.hypot(v1[0], v1[1], v1[2]);
          const u1 = v1.map((x) => x / l);
          const u2 = [dir[1] * u1[2] - dir[2] * u1[1], dir[2] * u1[0] - dir[0] * u1[2], dir[0] * u1[1] - dir[1] * u1[0]];
          return [[0, ...u1] as unknown as Vec4, [0, ...u2] as unknown as Vec4];
        });
        for (const eps1 of e1s)
          for (const eps2 of e2s) {
            const d = scalarLineDiagrams(p.a, neg(p.c), eps1, neg(p.d), eps2, mass, e);
            const scale = 2 * e * e;
            expect(d.exchangeAB.abs() / scale, `point ${i} exchange (k₁ first)`).toBeLessThan(1e-12);
            expect(d.exchangeBA.abs() / scale, `point ${i} exchange (k₂ first)`).toBeLessThan(1e-12);
          }
      }
    });
  }

  it("in the CM frame the exchange diagrams do not vanish (the statement is specific to the rest frame)", () => {
    const m = { a: mass, b: mass, c: 0, d: 0 };
    const p = cmMomenta(1.0, m, 0.4, 0.2);
    const n = Math.hypot(p.c[1], p.c[2], p.c[3]);
    // a polarisation in the scattering plane of photon c, without time component
    const eps1: Vec4 = [0, (p.c[3] / n) * Math.cos(0.2), (p.c[3] / n) * Math.sin(0.2), -Math.hypot(p.c[1], p.c[2]) / n];
    const d = scalarLineDiagrams(p.a, neg(p.c), eps1, neg(p.d), eps1, mass, e);
    expect(d.exchangeAB.abs() / (2 * e * e)).toBeGreaterThan(0.01);
  });
});

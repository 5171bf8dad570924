import { describe, expect, it } from "vitest";
import { Complex } from "./complex";
import {
  GAMMA,
  METRIC,
  adjoint,
  dot,
  identityMatrix,
  matAdd,
  matMul,
  matScale,
  matVec,
  photonPolarisations,
  sandwich,
  slash,
  spinorU,
  spinorV,
  type Matrix4,
  type Vec4,
} from "./dirac-algebra";
import { seededRandom } from "./seeded-random";

// The oracle's own foundations, checked against the defining relations of the Dirac algebra
// (standard textbook facts): if these hold, the oracle's amplitudes are built from correct parts.
const maxAbs = (m: Matrix4) => Math.max(...m.flat().map((x) => x.abs()));

function randomMomentum(rand: () => number, m: number): Vec4 {
  const p: [number, number, number] = [rand() * 4 - 2, rand() * 4 - 2, rand() * 4 - 2];
  return [Math.sqrt(m * m + p[0] ** 2 + p[1] ** 2 + p[2] ** 2), ...p];
}

describe("oracle Dirac algebra", () => {
  it("satisfies the Clifford algebra {γ^μ, γ^ν} = 2g^{μν}", () => {
    for (let mu = 0; mu < 4; mu++)
      for (let nu = 0; nu < 4; nu++) {
        const anti = matAdd(matMul(GAMMA[mu], GAMMA[nu]), matMul(GAMMA[nu], GAMMA[mu]));
        const expected = matScale(identityMatrix(), new Complex(mu === nu ? 2 * METRIC[mu] : 0));
        const diff = matAdd(anti, matScale(expected, new Complex(-1)));
        expect(maxAbs(diff), `μ=${mu} ν=${nu}`).toBeLessThan(1e-15);
      }
  });

  it("has spinors that solve the Dirac equation, with ūu = 2m, v̄v = −2m and completeness Σuū = p̸+m, Σvv̄ = p̸−m", () => {
    const rand = seededRandom(7);
    for (let i = 0; i < 20; i++) {
      const m = i === 0 ? 0 : rand() * 2;
      const p = randomMomentum(rand, m);
      const mI = matScale(identityMatrix(), new Complex(m));
      const pslash = slash(p);
      let sumU = matScale(identityMatrix(), Complex.ZERO);
      let sumV = matScale(identityMatrix(), Complex.ZERO);
      for (const s of [0, 1] as const) {
        const u = spinorU(p, m, s);
        const v = spinorV(p, m, s);
        const du = matVec(matAdd(pslash, matScale(mI, new Complex(-1))), u);
        const dv = matVec(matAdd(pslash, mI), v);
        expect(Math.max(...du.map((x) => x.abs())), `(p̸−m)u, p=${p}`).toBeLessThan(1e-12);
        expect(Math.max(...dv.map((x) => x.abs())), `(p̸+m)v, p=${p}`).toBeLessThan(1e-12);
        expect(sandwich(adjoint(u), identityMatrix(), u).re).toBeCloseTo(2 * m, 12);
        expect(sandwich(adjoint(v), identityMatrix(), v).re).toBeCloseTo(-2 * m, 12);
        const outerU = u.map((x) => adjoint(u).map((y) => x.mul(y)));
        const outerV = v.map((x) => adjoint(v).map((y) => x.mul(y)));
        sumU = matAdd(sumU, outerU);
        sumV = matAdd(sumV, outerV);
      }
      expect(maxAbs(matAdd(sumU, matScale(matAdd(pslash, mI), new Complex(-1))))).toBeLessThan(1e-12);
      expect(maxAbs(matAdd(sumV, matScale(matAdd(pslash, matScale(mI, new Complex(-1))), new Complex(-1))))).toBeLessThan(1e-12);
    }
  });

  it("has photon polarisations that are transverse, unit, orthogonal and without time component", () => {
    const rand = seededRandom(8);
    for (let i = 0; i < 50; i++) {
      const k = randomMomentum(rand, 0);
      const [e1, e2] = photonPolarisations(k);
      expect(e1[0]).toBe(0);
      expect(e2[0]).toBe(0);
      expect(Math.abs(dot(e1, k))).toBeLessThan(1e-14);
      expect(Math.abs(dot(e2, k))).toBeLessThan(1e-14);
      expect(dot(e1, e1)).toBeCloseTo(-1, 14);
      expect(dot(e2, e2)).toBeCloseTo(-1, 14);
      expect(Math.abs(dot(e1, e2))).toBeLessThan(1e-14);
    }
  });
});

import { Complex } from "./complex";

/**
 * Explicit Dirac algebra for the test oracle, Dirac (standard) representation:
 * γ⁰ = diag(1, 1, −1, −1), γⁱ = [[0, σⁱ], [−σⁱ, 0]]; metric (+, −, −, −).
 * Nothing here uses trace identities: amplitudes are built as complex numbers from explicit
 * matrices and spinors, so the closed forms of the engine are checked independently.
 */
export type Matrix4 = Complex[][];
export type Spinor = Complex[];
/** Real four-vector [E, px, py, pz] (contravariant components). */
export type Vec4 = readonly [number, number, number, number];

const c = (re: number, im = 0) => new Complex(re, im);
const O = c(0);
const one = c(1);
const mone = c(-1);
const I = c(0, 1);
const mI = c(0, -1);

export const METRIC = [1, -1, -1, -1] as const;

/** γ^μ, μ = 0…3 (upper index). */
export const GAMMA: readonly Matrix4[] = [
  [
    [one, O, O, O],
    [O, one, O, O],
    [O, O, mone, O],
    [O, O, O, mone],
  ],
  [
    [O, O, O, one],
    [O, O, one, O],
    [O, mone, O, O],
    [mone, O, O, O],
  ],
  [
    [O, O, O, mI],
    [O, O, I, O],
    [O, I, O, O],
    [mI, O, O, O],
  ],
  [
    [O, O, one, O],
    [O, O, O, mone],
    [mone, O, O, O],
    [O, one, O, O],
  ],
];

export function zeroMatrix(): Matrix4 {
  return Array.from({ length: 4 }, () => Array.from({ length: 4 }, () => O));
}

export function identityMatrix(): Matrix4 {
  return Array.from({ length: 4 }, (_, i) => Array.from({ length: 4 }, (_, j) => (i === j ? one : O)));
}

export function matMul(a: Matrix4, b: Matrix4): Matrix4 {
  const r = zeroMatrix();
  for (let i = 0; i < 4; i++)
    for (let j = 0; j < 4; j++) {
      let acc = O;
      for (let k = 0; k < 4; k++) acc = acc.add(a[i][k].mul(b[k][j]));
      r[i][j] = acc;
    }
  return r;
}

export function matAdd(a: Matrix4, b: Matrix4): Matrix4 {
  return a.map((row, i) => row.map((x, j) => x.add(b[i][j])));
}

export function matScale(a: Matrix4, k: Complex): Matrix4 {
  return a.map((row) => row.map((x) => x.mul(k)));
}

/** $\not a = \gamma^\mu a_\mu = \gamma^0 a^0 - \vec\gamma\cdot\vec a$ for a real or complex four-vector. */
export function slash(a: readonly (number | Complex)[]): Matrix4 {
  let r = zeroMatrix();
  for (let mu = 0; mu < 4; mu++) {
    const comp = a[mu];
    const k = typeof comp === "number" ? c(comp * METRIC[mu]) : comp.scale(METRIC[mu]);
    r = matAdd(r, matScale(GAMMA[mu], k));
  }
  return r;
}

export function matVec(a: Matrix4, v: Spinor): Spinor {
  return a.map((row) => row.reduce((acc, x, k) => acc.add(x.mul(v[k])), O));
}

/** Dirac adjoint $\bar\psi = \psi^\dagger\gamma^0$ as a row. */
export function adjoint(psi: Spinor): Spinor {
  return psi.map((x, i) => (i < 2 ? x.conj() : x.conj().scale(-1)));
}

/** $\bar a\,M\,b$ for a row `bar` (already adjoint) and a column `b`. */
export function sandwich(bar: Spinor, m: Matrix4, b: Spinor): Complex {
  const mb = matVec(m, b);
  return bar.reduce((acc, x, i) => acc.add(x.mul(mb[i])), O);
}

/** The current $J^\mu = \bar a\gamma^\mu b$ (upper index). */
export function current(bar: Spinor, b: Spinor): Complex[] {
  return GAMMA.map((g) => sandwich(bar, g, b));
}

/** Minkowski contraction of two complex four-vectors with upper indices. */
export function contract(a: readonly Complex[], b: readonly Complex[]): Complex {
  let acc = O;
  for (let mu = 0; mu < 4; mu++) acc = acc.add(a[mu].mul(b[mu]).scale(METRIC[mu]));
  return acc;
}

export function dot(a: Vec4, b: Vec4): number {
  return a[0] * b[0] - a[1] * b[1] - a[2] * b[2] - a[3] * b[3];
}

/** Two-component basis spinors χ₁ = (1, 0), χ₂ = (0, 1). */
const CHI: readonly [Complex, Complex][] = [
  [one, O],
  [O, one],
];

function sigmaDotP(p: Vec4, chi: [Complex, Complex]): [Complex, Complex] {
  // σ·p = [[p_z, p_x − i p_y], [p_x + i p_y, −p_z]]
  const [a, b] = chi;
  const pxmi = c(p[1], -p[2]);
  const pxpi = c(p[1], p[2]);
  return [a.scale(p[3]).add(pxmi.mul(b)), pxpi.mul(a).add(b.scale(-p[3]))];
}

/** Particle spinor $u(p,s) = \sqrt{E+m}\,(\chi_s,\ \vec\sigma\cdot\vec p\,\chi_s/(E+m))$, normalised $\bar uu = 2m$. */
export function spinorU(p: Vec4, m: number, s: 0 | 1): Spinor {
  const n = Math.sqrt(p[0] + m);
  const chi = CHI[s];
  const lower = sigmaDotP(p, chi);
  return [chi[0].scale(n), chi[1].scale(n), lower[0].scale(1 / n), lower[1].scale(1 / n)];
}

/** Antiparticle spinor $v(p,s) = \sqrt{E+m}\,(\vec\sigma\cdot\vec p\,\eta_s/(E+m),\ \eta_s)$, $\bar vv = -2m$. */
export function spinorV(p: Vec4, m: number, s: 0 | 1): Spinor {
  const n = Math.sqrt(p[0] + m);
  const eta = CHI[s];
  const upper = sigmaDotP(p, eta);
  return [upper[0].scale(1 / n), upper[1].scale(1 / n), eta[0].scale(n), eta[1].scale(n)];
}

/**
 * Two real transverse polarisation vectors of a photon of momentum k, with no time component
 * (radiation gauge): ε = (0, ê) with ê ⟂ k̂, ê₁ ⟂ ê₂.
 */
export function photonPolarisations(k: Vec4): [Vec4, Vec4] {
  const n = Math.hypot(k[1], k[2], k[3]);
  const kx = k[1] / n;
  const ky = k[2] / n;
  const kz = k[3] / n;
  // pick the coordinate axis least aligned with k̂ to build ê₁ = normalise(axis × k̂)
  const ax = Math.abs(kx) < 0.5 ? [1, 0, 0] : Math.abs(ky) < 0.5 ? [0, 1, 0] : [0, 0, 1];
  let e1 = [ax[1] * kz - ax[2] * ky, ax[2] * kx - ax[0] * kz, ax[0] * ky - ax[1] * kx];
  const l = Math.hypot(e1[0], e1[1], e1[2]);
  e1 = e1.map((x) => x / l);
  const e2 = [ky * e1[2] - kz * e1[1], kz * e1[0] - kx * e1[2], kx * e1[1] - ky * e1[0]];
  return [
    [0, e1[0], e1[1], e1[2]],
    [0, e2[0], e2[1], e2[2]],
  ];
}

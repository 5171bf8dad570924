import { Complex } from "./complex";
import {
  adjoint,
  contract,
  current,
  dot,
  identityMatrix,
  matAdd,
  matMul,
  matScale,
  photonPolarisations,
  sandwich,
  slash,
  spinorU,
  spinorV,
  type Matrix4,
  type Vec4,
} from "./dirac-algebra";

/**
 * The numerical tree-level amplitude oracle. Each process is written from its Feynman rules
 * (QED vertex −ieγ^μ, fermion propagator i(q̸+m)/(q²−m²), photon propagator −ig_{μν}/q²;
 * scalar QED vertex −ie(q+q′)^μ, contact vertex 2ie²g^{μν}, scalar propagator i/(q²−m²)),
 * evaluated with explicit spinors and polarisation vectors as a complex number and squared.
 * Overall phases are dropped; relative signs between diagrams are kept.
 * Legs are ordered a b → c d as in the engine (a: axis particle, c: reference particle).
 */
export type LegKind = "fermion-in" | "antifermion-in" | "fermion-out" | "antifermion-out" | "photon" | "scalar";

/** A leg state: a spin index for fermions, a polarisation vector for photons, null for scalars. */
export type LegState = 0 | 1 | Vec4 | null;

export interface OracleMomenta {
  readonly a: Vec4;
  readonly b: Vec4;
  readonly c: Vec4;
  readonly d: Vec4;
}

export interface OracleParams {
  readonly e: number;
  /** Mass of the fermion or scalar on the charged line attached to the photons / the initial pair. */
  readonly mass: number;
  /** Final-pair mass where it differs (muon-pair, scalar-pair-production). */
  readonly finalMass: number;
}

export interface OracleProcess {
  readonly id: string;
  readonly legs: readonly [LegKind, LegKind, LegKind, LegKind];
  /** Number of initial spin/polarisation states averaged over. */
  readonly initialStates: number;
  amplitude(p: OracleMomenta, states: readonly LegState[], params: OracleParams): Complex;
}

const legMomentum = (p: OracleMomenta, i: number): Vec4 => [p.a, p.b, p.c, p.d][i];

function fermionPropagator(q: Vec4, m: number): Matrix4 {
  const num = matAdd(slash(q), matScale(identityMatrix(), new Complex(m)));
  return matScale(num, new Complex(1 / (dot(q, q) - m * m)));
}

const sub = (x: Vec4, y: Vec4): Vec4 => [x[0] - y[0], x[1] - y[1], x[2] - y[2], x[3] - y[3]];
const add = (x: Vec4, y: Vec4): Vec4 => [x[0] + y[0], x[1] + y[1], x[2] + y[2], x[3] + y[3]];
const neg = (x: Vec4): Vec4 => [-x[0], -x[1], -x[2], -x[3]];
const asComplex = (v: Vec4): Complex[] => v.map((x) => new Complex(x));

/**
 * One fermion line with two photons attached, between the row `bar` and the column `col`:
 * $\bar\psi\,[\not\epsilon_B\,S(q_A)\,\not\epsilon_A + \not\epsilon_A\,S(q_B)\,\not\epsilon_B]\,\psi$, where
 * $q_A$ is the line momentum after attaching A first and $S(q) = (\not q + m)/(q^2-m^2)$.
 */
function twoPhotonFermionLine(
  bar: Complex[],
  col: Complex[],
  qStart: Vec4,
  injectA: Vec4,
  epsA: Vec4,
  injectB: Vec4,
  epsB: Vec4,
  m: number,
): Complex {
  const sA = slash(epsA);
  const sB = slash(epsB);
  const first = matMul(sB, matMul(fermionPropagator(add(qStart, injectA), m), sA));
  const second = matMul(sA, matMul(fermionPropagator(add(qStart, injectB), m), sB));
  return sandwich(bar, matAdd(first, second), col);
}

/**
 * The three scalar-QED diagrams of a charged scalar line (arrow entering with qStart) with two
 * photons attached; photon X injects momentum `injectX` into the line (+k incoming, −k outgoing).
 * Returned separately so that the tests can look at each diagram.
 */
export function scalarLineDiagrams(
  qStart: Vec4,
  injectA: Vec4,
  epsA: Vec4,
  injectB: Vec4,
  epsB: Vec4,
  m: number,
  e: number,
): { exchangeAB: Complex; exchangeBA: Complex; contact: Complex } {
  const e2 = e * e;
  const exchange = (inj1: Vec4, eps1: Vec4, inj2: Vec4, eps2: Vec4): Complex => {
    const q1 = add(qStart, inj1);
    const q2 = add(q1, inj2);
    // iM = (−ie)(q0+q1)·ε1 · i/(q1²−m²) · (−ie)(q1+q2)·ε2  ⇒  M = −e² (…)(…)/(q1²−m²)
    return new Complex((-e2 * dot(add(qStart, q1), eps1) * dot(add(q1, q2), eps2)) / (dot(q1, q1) - m * m));
  };
  return {
    exchangeAB: exchange(injectA, epsA, injectB, epsB),
    exchangeBA: exchange(injectB, epsB, injectA, epsA),
    // iM = 2ie² ε_A·ε_B
    contact: new Complex(2 * e2 * dot(epsA, epsB)),
  };
}

function sumDiagrams(d: { exchangeAB: Complex; exchangeBA: Complex; contact: Complex }): Complex {
  return d.exchangeAB.add(d.exchangeBA).add(d.contact);
}

const u = (p: Vec4, m: number, s: LegState) => spinorU(p, m, s as 0 | 1);
const v = (p: Vec4, m: number, s: LegState) => spinorV(p, m, s as 0 | 1);
const ubar = (p: Vec4, m: number, s: LegState) => adjoint(spinorU(p, m, s as 0 | 1));
const vbar = (p: Vec4, m: number, s: LegState) => adjoint(spinorV(p, m, s as 0 | 1));
const eps = (s: LegState) => s as Vec4;

export const ORACLE_PROCESSES: Record<string, OracleProcess> = {
  // φ⁺(a) φ⁻(b) → γ(c) γ(d): charge line enters with p_a, leaves with −p_b
  "scalar-annihilation": {
    id: "scalar-annihilation",
    legs: ["scalar", "scalar", "photon", "photon"],
    initialStates: 1,
    amplitude: (p, st, { e, mass }) =>
      sumDiagrams(scalarLineDiagrams(p.a, neg(p.c), eps(st[2]), neg(p.d), eps(st[3]), mass, e)),
  },
  // γ(a) φ(b) → γ(c) φ(d): line enters with p_b, leaves with p_d
  "scalar-compton": {
    id: "scalar-compton",
    legs: ["photon", "scalar", "photon", "scalar"],
    initialStates: 2,
    amplitude: (p, st, { e, mass }) =>
      sumDiagrams(scalarLineDiagrams(p.b, p.a, eps(st[0]), neg(p.c), eps(st[2]), mass, e)),
  },
  // γ(a) γ(b) → φ⁻(c) φ⁺(d): line enters with −p_c (outgoing antiparticle), leaves with p_d
  "photon-fusion-scalar": {
    id: "photon-fusion-scalar",
    legs: ["photon", "photon", "scalar", "scalar"],
    initialStates: 4,
    amplitude: (p, st, { e, mass }) =>
      sumDiagrams(scalarLineDiagrams(neg(p.c), p.a, eps(st[0]), p.b, eps(st[1]), mass, e)),
  },
  // e⁻(a) e⁺(b) → φ⁻(c) φ⁺(d): M = (e²/s) [v̄_b γ^μ u_a] (p_d − p_c)_μ
  "scalar-pair-production": {
    id: "scalar-pair-production",
    legs: ["fermion-in", "antifermion-in", "scalar", "scalar"],
    initialStates: 4,
    amplitude: (p, st, { e, mass }) => {
      const q = add(p.a, p.b);
      const j = current(vbar(p.b, mass, st[1]), u(p.a, mass, st[0]));
      return contract(j, asComplex(sub(p.d, p.c))).scale((e * e) / dot(q, q));
    },
  },
  // e⁺(a) e⁻(b) → γ(c) γ(d): v̄(p_a) [ … ] u(p_b), the electron line starts at p_b
  "pair-annihilation": {
    id: "pair-annihilation",
    legs: ["antifermion-in", "fermion-in", "photon", "photon"],
    initialStates: 4,
    amplitude: (p, st, { e, mass }) =>
      twoPhotonFermionLine(vbar(p.a, mass, st[0]), u(p.b, mass, st[1]), p.b, neg(p.c), eps(st[2]), neg(p.d), eps(st[3]), mass).scale(
        e * e,
      ),
  },
  // γ(a) e⁻(b) → γ(c) e⁻(d)
  compton: {
    id: "compton",
    legs: ["photon", "fermion-in", "photon", "fermion-out"],
    initialStates: 4,
    amplitude: (p, st, { e, mass }) =>
      twoPhotonFermionLine(ubar(p.d, mass, st[3]), u(p.b, mass, st[1]), p.b, p.a, eps(st[0]), neg(p.c), eps(st[2]), mass).scale(e * e),
  },
  // γ(a) γ(b) → e⁻(c) e⁺(d): ū(p_c) [ … ] v(p_d), the line starts (arrow enters) with −p_d
  "breit-wheeler": {
    id: "breit-wheeler",
    legs: ["photon", "photon", "fermion-out", "antifermion-out"],
    initialStates: 4,
    amplitude: (p, st, { e, mass }) =>
      twoPhotonFermionLine(ubar(p.c, mass, st[2]), v(p.d, mass, st[3]), neg(p.d), p.a, eps(st[0]), p.b, eps(st[1]), mass).scale(e * e),
  },
  // e⁻(a) e⁺(b) → μ⁻(c) μ⁺(d)
  "muon-pair": {
    id: "muon-pair",
    legs: ["fermion-in", "antifermion-in", "fermion-out", "antifermion-out"],
    initialStates: 4,
    amplitude: (p, st, { e, mass, finalMass }) => {
      const q = add(p.a, p.b);
      const jIn = current(vbar(p.b, mass, st[1]), u(p.a, mass, st[0]));
      const jOut = current(ubar(p.c, finalMass, st[2]), v(p.d, finalMass, st[3]));
      return contract(jIn, jOut).scale((e * e) / dot(q, q));
    },
  },
  // e⁻(a) e⁺(b) → e⁻(c) e⁺(d): t-channel minus s-channel (Fermi statistics)
  bhabha: {
    id: "bhabha",
    legs: ["fermion-in", "antifermion-in", "fermion-out", "antifermion-out"],
    initialStates: 4,
    amplitude: (p, st, { e, mass }) => {
      const tq = sub(p.a, p.c);
      const sq = add(p.a, p.b);
      const tChannel = contract(current(ubar(p.c, mass, st[2]), u(p.a, mass, st[0])), current(vbar(p.b, mass, st[1]), v(p.d, mass, st[3])));
      const sChannel = contract(current(vbar(p.b, mass, st[1]), u(p.a, mass, st[0])), current(ubar(p.c, mass, st[2]), v(p.d, mass, st[3])));
      return tChannel.scale((e * e) / dot(tq, tq)).sub(sChannel.scale((e * e) / dot(sq, sq)));
    },
  },
  // e⁻(a) e⁻(b) → e⁻(c) e⁻(d): t-channel minus u-channel (Fermi statistics)
  moller: {
    id: "moller",
    legs: ["fermion-in", "fermion-in", "fermion-out", "fermion-out"],
    initialStates: 4,
    amplitude: (p, st, { e, mass }) => {
      const tq = sub(p.a, p.c);
      const uq = sub(p.a, p.d);
      const tChannel = contract(current(ubar(p.c, mass, st[2]), u(p.a, mass, st[0])), current(ubar(p.d, mass, st[3]), u(p.b, mass, st[1])));
      const uChannel = contract(current(ubar(p.d, mass, st[3]), u(p.a, mass, st[0])), current(ubar(p.c, mass, st[2]), u(p.b, mass, st[1])));
      return tChannel.scale((e * e) / dot(tq, tq)).sub(uChannel.scale((e * e) / dot(uq, uq)));
    },
  },
};

/** The states summed over on each leg: two spins, two transverse polarisations, or the scalar. */
export function legStates(kind: LegKind, k: Vec4): LegState[] {
  if (kind === "photon") return photonPolarisations(k);
  if (kind === "scalar") return [null];
  return [0, 1];
}

/**
 * Brute-force $\sum|\mathcal M|^2$ over all spins and polarisations (no average). `override`
 * replaces the states of some legs (for the Ward-identity test: a photon's ε replaced by k).
 */
export function summedSquaredAmplitude(
  proc: OracleProcess,
  p: OracleMomenta,
  params: OracleParams,
  override: Partial<Record<number, LegState[]>> = {},
): number {
  const lists = proc.legs.map((kind, i) => override[i] ?? legStates(kind, legMomentum(p, i)));
  let total = 0;
  const state: LegState[] = [null, null, null, null];
  const walk = (leg: number) => {
    if (leg === 4) {
      total += proc.amplitude(p, state, params).abs2();
      return;
    }
    for (const s of lists[leg]) {
      state[leg] = s;
      walk(leg + 1);
    }
  };
  walk(0);
  return total;
}

/** The largest |M| over all spin and polarisation states: the scale for "vanishes to roundoff". */
export function largestAmplitude(proc: OracleProcess, p: OracleMomenta, params: OracleParams): number {
  let largest = 0;
  const lists = proc.legs.map((kind, i) => legStates(kind, legMomentum(p, i)));
  const state: LegState[] = [null, null, null, null];
  const walk = (leg: number) => {
    if (leg === 4) {
      largest = Math.max(largest, proc.amplitude(p, state, params).abs());
      return;
    }
    for (const s of lists[leg]) {
      state[leg] = s;
      walk(leg + 1);
    }
  };
  walk(0);
  return largest;
}

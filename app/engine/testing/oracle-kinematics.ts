import type { Vec4 } from "./dirac-algebra";
import type { OracleMomenta } from "./tree-amplitudes";

/**
 * Explicit four-momenta for the oracle, built directly in the frame asked for (not by boosting
 * the engine's CM kinematics), so that the engine's lab ↔ CM map is checked independently.
 * a along +z; c at polar angle θ and azimuth φ; d from momentum conservation.
 */
export interface OracleMasses {
  readonly a: number;
  readonly b: number;
  readonly c: number;
  readonly d: number;
}

function direction(cosTheta: number, phi: number): [number, number, number] {
  const sinTheta = Math.sqrt(Math.max(0, 1 - cosTheta * cosTheta));
  return [sinTheta * Math.cos(phi), sinTheta * Math.sin(phi), cosTheta];
}

const onShell = (m: number, px: number, py: number, pz: number): Vec4 => [Math.sqrt(m * m + px * px + py * py + pz * pz), px, py, pz];

/** CM frame at √s: |p| from E² − m² with E = (s + m₁² − m₂²)/(2√s). */
export function cmMomenta(sqrtS: number, m: OracleMasses, cosTheta: number, phi: number): OracleMomenta {
  const s = sqrtS * sqrtS;
  const ea = (s + m.a * m.a - m.b * m.b) / (2 * sqrtS);
  const pin = Math.sqrt(Math.max(0, ea * ea - m.a * m.a));
  const ec = (s + m.c * m.c - m.d * m.d) / (2 * sqrtS);
  const pout = Math.sqrt(Math.max(0, ec * ec - m.c * m.c));
  const [nx, ny, nz] = direction(cosTheta, phi);
  return {
    a: onShell(m.a, 0, 0, pin),
    b: onShell(m.b, 0, 0, -pin),
    c: onShell(m.c, pout * nx, pout * ny, pout * nz),
    d: onShell(m.d, -pout * nx, -pout * ny, -pout * nz),
  };
}

/**
 * Lab frame: b at rest, a the beam with total energy `beamEnergy` along +z, c massless at lab
 * angle θ. Energy conservation $E - \omega = \sqrt{m_d^2 + P^2 - 2P\omega\cos\theta + \omega^2}$ gives
 * $\omega = (s - m_d^2)/(2(E - P\cos\theta))$ with E = E_beam + m_b and P the beam momentum.
 */
export function labMomentaMasslessReference(beamEnergy: number, m: OracleMasses, cosTheta: number, phi: number): OracleMomenta {
  if (m.c !== 0) throw new Error("labMomentaMasslessReference needs a massless reference particle");
  const pBeam = Math.sqrt(beamEnergy * beamEnergy - m.a * m.a);
  const eTot = beamEnergy + m.b;
  const s = m.a * m.a + m.b * m.b + 2 * beamEnergy * m.b;
  const omega = (s - m.d * m.d) / (2 * (eTot - pBeam * cosTheta));
  const [nx, ny, nz] = direction(cosTheta, phi);
  const c: Vec4 = [omega, omega * nx, omega * ny, omega * nz];
  const a: Vec4 = [beamEnergy, 0, 0, pBeam];
  const b: Vec4 = [m.b, 0, 0, 0];
  const d: Vec4 = [eTot - omega, -c[1], -c[2], pBeam - c[3]];
  return { a, b, c, d };
}

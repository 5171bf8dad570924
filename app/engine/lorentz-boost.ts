import type { FourVector } from "./four-vector";

/**
 * Pure Lorentz boost of `p` into a frame moving with velocity $\vec\beta$ (|β| < 1) relative to
 * the frame in which `p` is given:
 * $E' = \gamma(E - \vec\beta\cdot\vec p)$,
 * $\vec p' = \vec p + \left[\frac{\gamma-1}{\beta^2}\,\vec\beta\cdot\vec p - \gamma E\right]\vec\beta$.
 * Units: whatever `p` carries (GeV). Source: standard special relativity (e.g. J. D. Jackson,
 * Classical Electrodynamics, section on Lorentz transformations).
 * To go from the CM frame to the lab frame of a target at rest, boost with −β_cm.
 */
export function lorentzBoost(p: FourVector, bx: number, by: number, bz: number): FourVector {
  const b2 = bx * bx + by * by + bz * bz;
  if (!(b2 < 1)) throw new RangeError(`boost velocity |β| = ${Math.sqrt(b2)} is not below 1`);
  if (b2 === 0) return p;
  const gamma = 1 / Math.sqrt(1 - b2);
  const bp = bx * p.x + by * p.y + bz * p.z;
  const k = ((gamma - 1) / b2) * bp - gamma * p.e;
  return { e: gamma * (p.e - bp), x: p.x + k * bx, y: p.y + k * by, z: p.z + k * bz };
}

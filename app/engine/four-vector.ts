/**
 * A four-vector (E, px, py, pz) in GeV with the metric (+, −, −, −).
 * Plain data so that it serialises and compares trivially.
 */
export interface FourVector {
  readonly e: number;
  readonly x: number;
  readonly y: number;
  readonly z: number;
}

export function fourVector(e: number, x: number, y: number, z: number): FourVector {
  return { e, x, y, z };
}

/** Minkowski product $a\cdot b = a^0 b^0 - \vec a\cdot\vec b$, GeV². */
export function minkowskiDot(a: FourVector, b: FourVector): number {
  return a.e * b.e - a.x * b.x - a.y * b.y - a.z * b.z;
}

export function addFourVectors(a: FourVector, b: FourVector): FourVector {
  return { e: a.e + b.e, x: a.x + b.x, y: a.y + b.y, z: a.z + b.z };
}

export function subtractFourVectors(a: FourVector, b: FourVector): FourVector {
  return { e: a.e - b.e, x: a.x - b.x, y: a.y - b.y, z: a.z - b.z };
}

/** Invariant mass squared $p^2$, GeV². */
export function invariantMassSquared(p: FourVector): number {
  return minkowskiDot(p, p);
}

/** Magnitude of the three-momentum, GeV. */
export function threeMomentum(p: FourVector): number {
  return Math.hypot(p.x, p.y, p.z);
}

/** Cosine of the polar angle against +z; 1 for a vector at rest (no direction). */
export function cosPolarAngle(p: FourVector): number {
  const magnitude = threeMomentum(p);
  return magnitude === 0 ? 1 : p.z / magnitude;
}

import type { TwoBodyKinematics } from "./two-body-kinematics";

/**
 * The lab frame of a fixed-target reaction: the partner b at rest, the axis particle a the beam
 * along +z. The CM frame moves along +z with $\beta = p_{in}/E_b^{*}$, $\gamma = E_b^{*}/m_b$, and the
 * reference particle c has $g = \beta E_c^{*}/p_{out}$ (the ratio of the CM speed to c's CM speed).
 * For g < 1 (always for a massless c) each lab angle comes from one CM angle; for g > 1 the lab
 * angle has a maximum $\tan\theta_{max} = 1/(\gamma\sqrt{g^2-1})$ (at $\cos\theta^* = -1/g$) and two CM angles (branches)
 * map onto each smaller lab angle.
 */
export interface LabFrameMap {
  readonly beta: number;
  readonly gamma: number;
  readonly g: number;
  /** True when c is massless: then exact aberration formulas are used. */
  readonly massless: boolean;
}

export type LabBranch = "forward" | "backward";

/** Domain: a partner with positive mass (a target that can be at rest). */
export function labFrameMap(kin: TwoBodyKinematics): LabFrameMap {
  const mb = kin.masses.partner;
  if (!(mb > 0)) throw new RangeError("the lab frame needs a massive target at rest");
  const beta = kin.pIn / kin.energyPartner;
  const gamma = kin.energyPartner / mb;
  const massless = kin.masses.reference === 0;
  const g = massless ? beta : (beta * kin.energyReference) / kin.pOut;
  return { beta, gamma, g, massless };
}

/**
 * Lab angle of the reference particle from its CM angle:
 * $\cos\theta_{lab} = \gamma(\cos\theta^{*} + g)/\sqrt{\gamma^2(\cos\theta^{*}+g)^2 + \sin^2\theta^{*}}$;
 * for massless c the aberration formula $(\cos\theta^{*}+\beta)/(1+\beta\cos\theta^{*})$.
 * Source: standard relativistic kinematics (e.g. R. Hagedorn, Relativistic Kinematics).
 */
export function labCosFromCm(map: LabFrameMap, cosCm: number): number {
  if (map.massless) return (cosCm + map.beta) / (1 + map.beta * cosCm);
  const a = map.gamma * (cosCm + map.g);
  const sin2 = (1 - cosCm) * (1 + cosCm);
  return a / Math.sqrt(a * a + sin2);
}

/**
 * CM angle of the reference particle from its lab angle. With $A = \gamma^2\sin^2\theta + \cos^2\theta$
 * and $R = \sqrt{\gamma^2\sin^2\theta\,(1-g^2) + \cos^2\theta}$ the two roots are
 * $\cos\theta^{*} = -g + \cos\theta\,(g\cos\theta \pm R)/A$ (derived here, docs/decisions/0003);
 * for g ≤ 1 only "+" is physical, for g > 1 "+" is the forward and "−" the backward branch.
 * Returns NaN when the lab angle is beyond the maximum lab angle (g > 1).
 * Massless c: $\cos\theta^{*} = (\cos\theta - \beta)/(1 - \beta\cos\theta)$.
 */
export function cmCosFromLab(map: LabFrameMap, cosLab: number, branch: LabBranch = "forward"): number {
  if (map.massless) return (cosLab - map.beta) / (1 - map.beta * cosLab);
  const { gamma, g } = map;
  const sin2 = (1 - cosLab) * (1 + cosLab);
  const gs2 = gamma * gamma * sin2;
  const a = gs2 + cosLab * cosLab;
  const disc = gs2 * (1 - g * g) + cosLab * cosLab;
  if (disc < 0) return Number.NaN;
  if (g > 1 && cosLab < 0) return Number.NaN;
  const r = Math.sqrt(disc);
  const sign = g > 1 && branch === "backward" ? -1 : 1;
  const c = -g + (cosLab * (g * cosLab + sign * r)) / a;
  return Math.min(1, Math.max(-1, c));
}

/**
 * Jacobian $d\Omega^{*}/d\Omega_{lab} = D^{3/2}/(\gamma\,|1 + g\cos\theta^{*}|)$ with
 * $D = \gamma^2(\cos\theta^{*} + g)^2 + \sin^2\theta^{*}$ (derived here, docs/decisions/0003);
 * for massless c it is $\gamma^2(1+\beta\cos\theta^{*})^2$. Dimensionless. Infinite at the maximum
 * lab angle when g > 1 (the lab cross section has an integrable singularity there).
 */
export function cmPerLabSolidAngle(map: LabFrameMap, cosCm: number): number {
  if (map.massless) {
    const f = map.gamma * (1 + map.beta * cosCm);
    return f * f;
  }
  const a = map.gamma * (cosCm + map.g);
  const d = a * a + (1 - cosCm) * (1 + cosCm);
  return (d * Math.sqrt(d)) / (map.gamma * Math.abs(1 + map.g * cosCm));
}

/** Maximum lab angle of the reference particle in degrees: 180 when g ≤ 1. */
export function maximumLabAngleDeg(map: LabFrameMap): number {
  if (map.g <= 1) return 180;
  return (Math.atan(1 / (map.gamma * Math.sqrt(map.g * map.g - 1))) * 180) / Math.PI;
}

/**
 * Masses of a 2 → 2 reaction a b → c d, GeV. `axis` (a) is the particle whose direction defines
 * θ, `reference` (c) the particle whose angle θ is, `recoil` (d) the other final particle.
 */
export interface ReactionMasses {
  readonly axis: number;
  readonly partner: number;
  readonly reference: number;
  readonly recoil: number;
}

/**
 * CM-frame kinematics of a b → c d at fixed s, with a along +z and c at polar angle θ:
 * $p_{in} = \lambda^{1/2}(s, m_a^2, m_b^2)/(2\sqrt s)$, $E_a = (s + m_a^2 - m_b^2)/(2\sqrt s)$, …,
 * $t(\cos\theta) = (p_a - p_c)^2 = t_1 - 2 p_{in} p_{out}(1 - \cos\theta)$,
 * $u(\cos\theta) = (p_a - p_d)^2 = u_1 - 2 p_{in} p_{out}(1 + \cos\theta)$,
 * with $t_1 = (E_a - E_c)^2 - (p_{in} - p_{out})^2$ (t at θ = 0), $E_a - E_c = (m_a^2 - m_b^2 - m_c^2 + m_d^2)/(2\sqrt s)$,
 * $p_{in} - p_{out} = (\lambda_{in} - \lambda_{out})/(4s(p_{in}+p_{out}))$, and $u_1$ likewise with d
 * (u at θ = 180°). Written that way, no two large numbers are subtracted at high energy.
 * Units GeV, GeV².
 * Source: standard relativistic kinematics (Review of Particle Physics, "Kinematics");
 * the rewriting is derived here (docs/decisions/0003-engine-conventions.md).
 */
export interface TwoBodyKinematics {
  readonly s: number;
  readonly sqrtS: number;
  readonly masses: ReactionMasses;
  readonly pIn: number;
  readonly pOut: number;
  readonly energyAxis: number;
  readonly energyPartner: number;
  readonly energyReference: number;
  readonly energyRecoil: number;
  /** t at θ = 0 (its maximum), GeV². */
  readonly tForward: number;
  /** u at θ = 180° (its maximum), GeV². */
  readonly uBackward: number;
}

/** Källén function in its factorised form, well conditioned near threshold. */
function kallenSqrt(s: number, m1: number, m2: number): number {
  const lambda = (s - (m1 + m2) ** 2) * (s - (m1 - m2) ** 2);
  return Math.sqrt(Math.max(lambda, 0));
}

/**
 * Builds the CM kinematics at Mandelstam s (GeV²). Domain: s ≥ max((m_a+m_b)², (m_c+m_d)²);
 * the caller checks thresholds (see `reactionThreshold`).
 */
export function twoBodyKinematics(s: number, masses: ReactionMasses): TwoBodyKinematics {
  const { axis: ma, partner: mb, reference: mc, recoil: md } = masses;
  const sqrtS = Math.sqrt(s);
  const pIn = kallenSqrt(s, ma, mb) / (2 * sqrtS);
  const pOut = kallenSqrt(s, mc, md) / (2 * sqrtS);
  const energyAxis = (s + ma * ma - mb * mb) / (2 * sqrtS);
  const energyPartner = (s + mb * mb - ma * ma) / (2 * sqrtS);
  const energyReference = (s + mc * mc - md * md) / (2 * sqrtS);
  const energyRecoil = (s + md * md - mc * mc) / (2 * sqrtS);
  // t(θ=0) = (E_a − E_c)² − (p_in − p_out)², both differences written without subtracting
  // large numbers: E_a − E_c from the masses, p_in − p_out = (λ_in − λ_out)/(4s(p_in + p_out)).
  const [xa, xb, xc, xd] = [ma * ma, mb * mb, mc * mc, md * md];
  const lambdaDiff = -2 * s * (xa + xb - xc - xd) + (xa - xb) ** 2 - (xc - xd) ** 2;
  const dp = pIn + pOut > 0 ? lambdaDiff / (4 * s * (pIn + pOut)) : 0;
  const dEc = (xa - xb - xc + xd) / (2 * sqrtS);
  const dEd = (xa - xb - xd + xc) / (2 * sqrtS);
  const tForward = (dEc - dp) * (dEc + dp);
  const uBackward = (dEd - dp) * (dEd + dp);
  return { s, sqrtS, masses, pIn, pOut, energyAxis, energyPartner, energyReference, energyRecoil, tForward, uBackward };
}

/** $t(\cos\theta)$ in the CM frame, GeV². */
export function mandelstamT(kin: TwoBodyKinematics, cosTheta: number): number {
  return kin.tForward - 2 * kin.pIn * kin.pOut * (1 - cosTheta);
}

/** $u(\cos\theta)$ in the CM frame, GeV². */
export function mandelstamU(kin: TwoBodyKinematics, cosTheta: number): number {
  return kin.uBackward - 2 * kin.pIn * kin.pOut * (1 + cosTheta);
}

/** Inverse of `mandelstamT`: $\cos\theta = 1 - (t_1 - t)/(2p_{in}p_{out})$. */
export function cosThetaFromT(kin: TwoBodyKinematics, t: number): number {
  return 1 - (kin.tForward - t) / (2 * kin.pIn * kin.pOut);
}

/**
 * The threshold of the reaction in s: $s_{thr} = \max\{(m_a+m_b)^2, (m_c+m_d)^2\}$, GeV².
 */
export function reactionThreshold(masses: ReactionMasses): number {
  return Math.max((masses.axis + masses.partner) ** 2, (masses.reference + masses.recoil) ** 2);
}

import type { Vec4 } from "./dirac-algebra";
import { ORACLE_PROCESSES, summedSquaredAmplitude, type OracleMomenta, type OracleParams } from "./tree-amplitudes";

/**
 * dσ/dΩ from the oracle's |M|², with the two-body phase space written out from the standard
 * textbook formulas (Review of Particle Physics, "Kinematics"), in GeV⁻²/sr:
 * CM: $\frac{d\sigma}{d\Omega} = \frac{\overline{|\mathcal M|^2}}{64\pi^2 s}\frac{|\vec p_c|}{|\vec p_a|}$;
 * lab (b at rest, mass m_b; beam momentum P):
 * $\frac{d\sigma}{d\Omega} = \frac{\overline{|\mathcal M|^2}\,|\vec p_c|^2}{64\pi^2\,m_b P\,(|\vec p_c|(E_a+m_b) - E_c P\cos\theta_c)}$.
 */
export function oracleAveragedSquaredAmplitude(id: string, p: OracleMomenta, params: OracleParams): number {
  const proc = ORACLE_PROCESSES[id];
  return summedSquaredAmplitude(proc, p, params) / proc.initialStates;
}

const norm3 = (v: Vec4) => Math.hypot(v[1], v[2], v[3]);

export function oracleDsigmaDOmegaCm(id: string, p: OracleMomenta, params: OracleParams): number {
  const s = (p.a[0] + p.b[0]) ** 2 - (p.a[1] + p.b[1]) ** 2 - (p.a[2] + p.b[2]) ** 2 - (p.a[3] + p.b[3]) ** 2;
  return (oracleAveragedSquaredAmplitude(id, p, params) * norm3(p.c)) / (64 * Math.PI * Math.PI * s * norm3(p.a));
}

export function oracleDsigmaDOmegaLab(id: string, p: OracleMomenta, params: OracleParams): number {
  const mb = p.b[0];
  const bigP = norm3(p.a);
  const pc = norm3(p.c);
  const cos = p.c[3] / pc;
  const denom = 64 * Math.PI * Math.PI * mb * bigP * (pc * (p.a[0] + mb) - p.c[0] * bigP * cos);
  return (oracleAveragedSquaredAmplitude(id, p, params) * pc * pc) / denom;
}

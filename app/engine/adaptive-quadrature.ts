/**
 * Adaptive Gauss–Kronrod quadrature (7-point Gauss, 15-point Kronrod), globally adaptive: the
 * interval with the largest error estimate is bisected until the summed estimate is below
 * max(relativeTolerance·|I|, absoluteTolerance) or `maxIntervals` is reached.
 * Nodes and weights: R. Piessens et al., QUADPACK (Springer, 1983), routine QK15.
 * Error estimate: |K15 − G7| per interval (conservative; no QUADPACK rescaling).
 */
export interface QuadratureOptions {
  /** Default 1e-10. */
  relativeTolerance?: number;
  /** Default 0. */
  absoluteTolerance?: number;
  /** Default 200 intervals. */
  maxIntervals?: number;
}

export interface QuadratureResult {
  value: number;
  errorEstimate: number;
  intervals: number;
  converged: boolean;
}

export const DEFAULT_RELATIVE_TOLERANCE = 1e-10;

const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.58608723546769113029414483825873, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
];
const WGK = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
const WG = [0.129484966168869693270611432679082, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975, 0.417959183673469387755102040816327];

function kronrod15(f: (x: number) => number, a: number, b: number): [number, number] {
  const center = 0.5 * (a + b);
  const half = 0.5 * (b - a);
  const fc = f(center);
  let kronrod = fc * WGK[7];
  let gauss = fc * WG[3];
  for (let j = 0; j < 7; j++) {
    const dx = half * XGK[j];
    const sum = f(center - dx) + f(center + dx);
    kronrod += WGK[j] * sum;
    // the Gauss nodes are the odd-indexed Kronrod nodes
    if (j % 2 === 1) gauss += WG[(j - 1) / 2] * sum;
  }
  return [kronrod * half, Math.abs((kronrod - gauss) * half)];
}

/**
 * $\int_a^b f(x)\,dx$. Domain: finite a, b (b < a gives the negative); f finite on [a, b]
 * (integrable endpoint singularities converge slowly and report `converged: false`).
 */
export function integrateAdaptive(f: (x: number) => number, a: number, b: number, options: QuadratureOptions = {}): QuadratureResult {
  const rel = options.relativeTolerance ?? DEFAULT_RELATIVE_TOLERANCE;
  const abs = options.absoluteTolerance ?? 0;
  const maxIntervals = options.maxIntervals ?? 200;
  if (a === b) return { value: 0, errorEstimate: 0, intervals: 0, converged: true };
  const lo: number[] = [a];
  const hi: number[] = [b];
  const [v0, e0] = kronrod15(f, a, b);
  const val: number[] = [v0];
  const err: number[] = [e0];
  let total = v0;
  let totalError = e0;
  while (totalError > Math.max(rel * Math.abs(total), abs) && lo.length < maxIntervals) {
    let worst = 0;
    for (let i = 1; i < err.length; i++) if (err[i] > err[worst]) worst = i;
    const mid = 0.5 * (lo[worst] + hi[worst]);
    const [vl, el] = kronrod15(f, lo[worst], mid);
    const [vr, er] = kronrod15(f, mid, hi[worst]);
    total += vl + vr - val[worst];
    totalError += el + er - err[worst];
    lo.push(mid);
    hi.push(hi[worst]);
    val.push(vr);
    err.push(er);
    hi[worst] = mid;
    val[worst] = vl;
    err[worst] = el;
  }
  // re-sum from the parts so that the result does not carry the running sum's roundoff
  let value = 0;
  let errorEstimate = 0;
  for (let i = 0; i < val.length; i++) {
    value += val[i];
    errorEstimate += err[i];
  }
  return { value, errorEstimate, intervals: lo.length, converged: errorEstimate <= Math.max(rel * Math.abs(value), abs) };
}

import { integrateAdaptive, type QuadratureResult } from "./adaptive-quadrature";
import type { Frame } from "./process-definition";
import type { ProcessKernel } from "./process-kernel";
import { cosThetaFromT, mandelstamT } from "./two-body-kinematics";

export type DifferentialObservable = "dsigma/dOmega" | "dsigma/dcos" | "dsigma/dt";
export type Observable = DifferentialObservable | "sigma";
export type AngleVariable = "thetaDeg" | "cosTheta" | "t";

const DEG = Math.PI / 180;

/**
 * The mean of a differential observable dσ/dX over a bin, as a measurement defines it:
 * $\bar y = \sigma(\text{bin})/\Delta X(\text{bin})$, X being the variable of the derivative — the
 * solid angle in `frame` for dσ/dΩ ($\Delta\Omega = 2\pi|\cos\theta_{lo} - \cos\theta_{hi}|$), cos θ
 * in `frame` for dσ/dcosθ, t for dσ/dt — whatever variable the bin edges are given in (θ in
 * degrees or cos θ in `frame`, or t in GeV²). Since dσ = (dσ/dX) dX, that is the mean of
 * dσ/dX taken uniformly in X between the bin's edges converted to X (dΩ = 2π dcos θ, so for
 * dσ/dΩ and dσ/dcosθ uniformly in the frame's cos θ), not uniformly in θ
 * (docs/decisions/0006-bin-means.md). Natural units as the observable.
 * Adaptive Gauss–Kronrod at the given relative tolerance.
 */
export function binMean(
  kernel: ProcessKernel,
  frame: Frame,
  observable: DifferentialObservable,
  variable: AngleVariable,
  lo: number,
  hi: number,
  relativeTolerance: number,
): QuadratureResult {
  const kin = kernel.kinematics;
  let f: (x: number) => number;
  let toX: (edge: number) => number;
  if (observable === "dsigma/dt") {
    const twoPP = 2 * kin.pIn * kin.pOut;
    f = (t) => (2 * Math.PI * kernel.dsigmaDOmegaCm(cosThetaFromT(kin, t))) / twoPP;
    toX =
      variable === "t"
        ? (t) => t
        : variable === "cosTheta"
          ? (c) => mandelstamT(kin, kernel.cmCos(frame, c))
          : (deg) => mandelstamT(kin, kernel.cmCos(frame, Math.cos(deg * DEG)));
  } else {
    const factor = observable === "dsigma/dcos" ? 2 * Math.PI : 1;
    f = (c) => factor * kernel.dsigmaDOmega(frame, c);
    toX =
      variable === "cosTheta"
        ? (c) => c
        : variable === "thetaDeg"
          ? (deg) => Math.cos(deg * DEG)
          : (t) => kernel.frameCos(frame, cosThetaFromT(kin, t));
  }
  const xLo = toX(lo);
  const xHi = toX(hi);
  const a = Math.min(xLo, xHi);
  const b = Math.max(xLo, xHi);
  // a bin too narrow to separate its edges in X: the mean is the value there
  if (a === b) return { value: f(a), errorEstimate: 0, intervals: 0, converged: true };
  const r = integrateAdaptive(f, a, b, { relativeTolerance, maxIntervals: 400 });
  const width = b - a;
  return { ...r, value: r.value / width, errorEstimate: r.errorEstimate / width };
}

/**
 * σ with the reference particle's cos θ (in `frame`) inside [cosLo, cosHi], GeV⁻²:
 * $\sigma = f\,2\pi\int_{c^*_{lo}}^{c^*_{hi}} \frac{d\sigma}{d\Omega^*}\,d\cos\theta^*$, the range mapped to
 * the CM frame, with f = ½ for identical final particles (so that the full range gives the total
 * cross section; for a CM-symmetric acceptance it is the cross section of events in it).
 * Adaptive Gauss–Kronrod at the given relative tolerance.
 */
export function sigmaInAcceptance(
  kernel: ProcessKernel,
  frame: Frame,
  cosLo: number,
  cosHi: number,
  relativeTolerance: number,
): QuadratureResult {
  const a = kernel.cmCos(frame, cosLo);
  const b = kernel.cmCos(frame, cosHi);
  const f = kernel.definition.info.identicalFinalParticles ? 0.5 : 1;
  const r = integrateAdaptive((c) => kernel.dsigmaDOmegaCm(c), Math.min(a, b), Math.max(a, b), { relativeTolerance, maxIntervals: 400 });
  return { ...r, value: f * 2 * Math.PI * r.value, errorEstimate: f * 2 * Math.PI * r.errorEstimate };
}

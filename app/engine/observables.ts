import { integrateAdaptive, type QuadratureResult } from "./adaptive-quadrature";
import type { Frame } from "./process-definition";
import type { ProcessKernel } from "./process-kernel";
import { cosThetaFromT } from "./two-body-kinematics";

export type DifferentialObservable = "dsigma/dOmega" | "dsigma/dcos" | "dsigma/dt";
export type Observable = DifferentialObservable | "sigma";
export type AngleVariable = "thetaDeg" | "cosTheta" | "t";

const DEG = Math.PI / 180;

/**
 * A differential observable at fixed energy as a function of an angle variable x (θ in degrees
 * or cos θ of the reference particle in `frame`, or t = (p_axis − p_ref)² in GeV²), in natural
 * units: dσ/dΩ in GeV⁻²/sr, dσ/dcosθ in GeV⁻², dσ/dt in GeV⁻⁴.
 * $\frac{d\sigma}{d\cos\theta} = 2\pi\frac{d\sigma}{d\Omega}$ (azimuthal symmetry of unpolarised
 * scattering); $\frac{d\sigma}{dt} = \frac{1}{2p_{in}p_{out}}\frac{d\sigma}{d\cos\theta^*}$ (from
 * $t = t_1 - 2p_{in}p_{out}(1-\cos\theta^*)$), the same in every frame. Source: standard kinematics.
 */
export function angularObservable(
  kernel: ProcessKernel,
  frame: Frame,
  observable: DifferentialObservable,
  variable: AngleVariable,
): (x: number) => number {
  const kin = kernel.kinematics;
  const twoPP = 2 * kin.pIn * kin.pOut;
  if (observable === "dsigma/dt") {
    const cmCosOf =
      variable === "t"
        ? (x: number) => cosThetaFromT(kin, x)
        : variable === "cosTheta"
          ? (x: number) => kernel.cmCos(frame, x)
          : (x: number) => kernel.cmCos(frame, Math.cos(x * DEG));
    return (x) => (2 * Math.PI * kernel.dsigmaDOmegaCm(cmCosOf(x))) / twoPP;
  }
  const factor = observable === "dsigma/dcos" ? 2 * Math.PI : 1;
  if (variable === "t") return (x) => factor * kernel.dsigmaDOmega(frame, kernel.frameCos(frame, cosThetaFromT(kin, x)));
  if (variable === "cosTheta") return (x) => factor * kernel.dsigmaDOmega(frame, x);
  return (x) => factor * kernel.dsigmaDOmega(frame, Math.cos(x * DEG));
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

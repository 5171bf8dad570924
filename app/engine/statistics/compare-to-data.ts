import { EngineInputError } from "../engine-input-error";
import { chiSquarePValue } from "./chi-square-p-value";
import { uncertaintyTowards, type MeasuredPoint } from "./measured-point";

export interface Comparison {
  chi2: number;
  ndf: number;
  pValue: number;
  /** (measured − prediction)/σ per point. */
  pulls: number[];
  /** measured/prediction per point. */
  ratios: number[];
}

function checkInputs(points: readonly MeasuredPoint[], predictions: readonly number[]): void {
  if (points.length !== predictions.length) {
    throw new EngineInputError("length_mismatch", "predictions", `${points.length} measured points but ${predictions.length} predictions`);
  }
  if (points.length === 0) throw new EngineInputError("invalid_list", "points", "at least one measured point is needed");
  points.forEach((p, i) => {
    if (!Number.isFinite(p.value)) throw new EngineInputError("not_a_number", `points[${i}].value`, `points[${i}].value is not a finite number`);
    if (!Number.isFinite(predictions[i])) throw new EngineInputError("not_a_number", `predictions[${i}]`, `predictions[${i}] is not a finite number`);
    if (!(uncertaintyTowards(p, predictions[i]) > 0)) {
      throw new EngineInputError("invalid_uncertainty", `points[${i}]`, `points[${i}] needs a positive total uncertainty on the side of the prediction`);
    }
  });
}

/**
 * $\chi^2 = \sum_i (y_i - p_i)^2/\sigma_i^2$ with σ_i from `uncertaintyTowards` (stat ⊕ syst, the
 * side of the prediction), ndf = n − fittedParameters, p-value from jstat; pulls
 * $(y_i - p_i)/\sigma_i$ and ratios $y_i/p_i$. Standard least-squares statistics (e.g. Review of
 * Particle Physics, "Statistics").
 */
export function compareToData(points: readonly MeasuredPoint[], predictions: readonly number[], fittedParameters = 0): Comparison {
  checkInputs(points, predictions);
  const pulls = points.map((p, i) => (p.value - predictions[i]) / uncertaintyTowards(p, predictions[i]));
  const chi2 = pulls.reduce((acc, x) => acc + x * x, 0);
  const ndf = points.length - fittedParameters;
  if (ndf < 1) throw new EngineInputError("invalid_ndf", "points", `${points.length} points with ${fittedParameters} fitted parameters leave no degree of freedom`);
  return { chi2, ndf, pValue: chiSquarePValue(chi2, ndf), pulls, ratios: points.map((p, i) => p.value / predictions[i]) };
}

export interface NormalisedComparison extends Comparison {
  /** Fitted normalisation k of the prediction, and its uncertainty. */
  normalisation: number;
  normalisationUncertainty: number;
}

/**
 * χ² with a fully correlated normalisation uncertainty σ_N (relative, e.g. 0.03 for 3 %) as a
 * nuisance parameter k, profiled analytically:
 * $\chi^2(k) = \sum_i (y_i - k p_i)^2/\sigma_i^2 + (k-1)^2/\sigma_N^2$, minimised at
 * $\hat k = \frac{\sum_i y_ip_i/\sigma_i^2 + 1/\sigma_N^2}{\sum_i p_i^2/\sigma_i^2 + 1/\sigma_N^2}$ with
 * $\sigma_{\hat k} = \left(\sum_i p_i^2/\sigma_i^2 + 1/\sigma_N^2\right)^{-1/2}$ (derived here; the
 * quadratic χ² has these as its minimum and curvature). The constraint term counts as one
 * measurement, so ndf = n. σ_i are taken towards the unscaled prediction (documented
 * approximation for asymmetric errors). Pulls and ratios use k̂·p_i.
 */
export function compareWithNormalisation(points: readonly MeasuredPoint[], predictions: readonly number[], normalisationUncertainty: number): NormalisedComparison {
  checkInputs(points, predictions);
  if (!(normalisationUncertainty > 0 && Number.isFinite(normalisationUncertainty))) {
    throw new EngineInputError("invalid_uncertainty", "normalisationUncertainty", "the normalisation uncertainty must be a positive fraction, e.g. 0.03");
  }
  const sigmas = points.map((p, i) => uncertaintyTowards(p, predictions[i]));
  const w = 1 / (normalisationUncertainty * normalisationUncertainty);
  let num = w;
  let den = w;
  points.forEach((p, i) => {
    const s2 = sigmas[i] * sigmas[i];
    num += (p.value * predictions[i]) / s2;
    den += (predictions[i] * predictions[i]) / s2;
  });
  const k = num / den;
  const pulls = points.map((p, i) => (p.value - k * predictions[i]) / sigmas[i]);
  const chi2 = pulls.reduce((acc, x) => acc + x * x, 0) + (k - 1) * (k - 1) * w;
  const ndf = points.length;
  return {
    chi2,
    ndf,
    pValue: chiSquarePValue(chi2, ndf),
    pulls,
    ratios: points.map((p, i) => p.value / (k * predictions[i])),
    normalisation: k,
    normalisationUncertainty: 1 / Math.sqrt(den),
  };
}

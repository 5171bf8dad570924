import jStat from "jstat";

/**
 * Upper-tail probability $p = P(\chi^2_{ndf} \ge \chi^2) = 1 - F_{\chi^2}(\chi^2; ndf)$ from jstat's
 * chi-square CDF. Domain: χ² ≥ 0, ndf ≥ 1. Underflows to 0 for very large χ².
 */
export function chiSquarePValue(chi2: number, ndf: number): number {
  if (!(ndf >= 1)) throw new RangeError(`the p-value needs ndf ≥ 1, got ${ndf}`);
  const p = 1 - jStat.chisquare.cdf(chi2, ndf);
  return Math.min(1, Math.max(0, p));
}

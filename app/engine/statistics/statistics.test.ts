import { describe, expect, it } from "vitest";
import { EngineInputError } from "../engine-input-error";
import { seededRandom } from "../testing/seeded-random";
import { chiSquarePValue } from "./chi-square-p-value";
import { compareToData, compareWithNormalisation } from "./compare-to-data";
import { envelopeBand } from "./envelope-band";
import { uncertaintyTowards } from "./measured-point";

describe("chiSquarePValue (jstat)", () => {
  // quantiles of the χ² distribution from standard statistical tables (e.g. Review of Particle
  // Physics, "Statistics", table of χ² critical values)
  it.each([
    [3.841, 1, 0.05],
    [6.635, 1, 0.01],
    [5.991, 2, 0.05],
    [18.307, 10, 0.05],
    [10, 10, 0.4405],
  ])("P(χ² ≥ %s; ndf %s) ≈ %s", (chi2, ndf, p) => {
    expect(chiSquarePValue(chi2, ndf)).toBeCloseTo(p, 3);
  });
  it("for ndf = 2 equals exp(−χ²/2) exactly (closed form of the χ² distribution with two degrees of freedom)", () => {
    for (const x of [0.1, 1, 4, 9]) expect(chiSquarePValue(x, 2) / Math.exp(-x / 2) - 1).toBeCloseTo(0, 10);
  });
});

describe("compareToData", () => {
  it("computes χ², pulls and ratios with stat ⊕ syst", () => {
    const r = compareToData(
      [
        { value: 10, stat: 3, syst: 4 },
        { value: 20, stat: 1 },
      ],
      [5, 22],
    );
    expect(r.pulls).toEqual([1, -2]);
    expect(r.chi2).toBe(5);
    expect(r.ndf).toBe(2);
    expect(r.pValue).toBeCloseTo(Math.exp(-2.5), 10);
    expect(r.ratios).toEqual([2, 20 / 22]);
  });
  it("uses the asymmetric error on the side of the prediction", () => {
    const p = { value: 10, stat: { minus: 1, plus: 3 } };
    expect(uncertaintyTowards(p, 12)).toBe(3);
    expect(uncertaintyTowards(p, 8)).toBe(1);
    expect(compareToData([p], [13]).pulls).toEqual([-1]);
    expect(compareToData([p], [9]).pulls).toEqual([1]);
  });
  it("rejects mismatched lengths and zero uncertainties with a typed error", () => {
    expect(() => compareToData([{ value: 1, stat: 1 }], [1, 2])).toThrow(EngineInputError);
    expect(() => compareToData([{ value: 1, stat: 0 }], [1])).toThrow(EngineInputError);
  });
  it("gives χ²/ndf ≈ 1 and a uniform-looking p-value for data generated from the prediction (seeded Gaussian noise)", () => {
    const rand = seededRandom(99);
    const gauss = () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
    const n = 20000;
    const prediction = Array.from({ length: n }, (_, i) => 1 + i / n);
    const points = prediction.map((p) => ({ value: p + 0.1 * gauss(), stat: 0.1 }));
    const r = compareToData(points, prediction);
    // χ² has mean n and standard deviation √(2n) = 200
    expect(Math.abs(r.chi2 - n)).toBeLessThan(5 * Math.sqrt(2 * n));
  });
});

describe("compareWithNormalisation (analytically profiled normalisation)", () => {
  it("matches a brute-force minimisation of χ²(k) over a fine grid", () => {
    const points = [
      { value: 11, stat: 1 },
      { value: 21.5, stat: 2, syst: 1 },
      { value: 33, stat: 2 },
    ];
    const pred = [10, 20, 30];
    const sN = 0.05;
    const r = compareWithNormalisation(points, pred, sN);
    const chi2At = (k: number) =>
      points.reduce((acc, p, i) => acc + (p.value - k * pred[i]) ** 2 / uncertaintyTowards(p, pred[i]) ** 2, 0) + ((k - 1) / sN) ** 2;
    let best = 0;
    let bestChi = Infinity;
    for (let k = 0.9; k <= 1.2; k += 1e-6) {
      const c = chi2At(k);
      if (c < bestChi) [best, bestChi] = [k, c];
    }
    expect(Math.abs(r.normalisation - best)).toBeLessThan(2e-6);
    expect(r.chi2).toBeCloseTo(bestChi, 6);
    // σ_k from Δχ² = 1 on the profile (definition of a one-standard-deviation interval)
    const k1 = r.normalisation + r.normalisationUncertainty;
    expect(chi2At(k1) - r.chi2).toBeCloseTo(1, 9);
    expect(r.ndf).toBe(3);
  });
  it("pulls the normalisation to 1 when the constraint is tight, and to the data when it is loose", () => {
    const points = [{ value: 12, stat: 0.1 }];
    expect(compareWithNormalisation(points, [10], 1e-6).normalisation).toBeCloseTo(1, 6);
    expect(compareWithNormalisation(points, [10], 1e3).normalisation).toBeCloseTo(1.2, 6);
  });
});

describe("envelopeBand", () => {
  it("is the pointwise min and max over the central and the varied curves", () => {
    expect(envelopeBand([1, 2, 3], [[0.5, 2.5, 3], [1.5, 1, 2]])).toEqual({ lower: [0.5, 1, 2], upper: [1.5, 2.5, 3] });
  });
  it("rejects curves of a different length", () => {
    expect(() => envelopeBand([1, 2], [[1]])).toThrow(EngineInputError);
  });
});

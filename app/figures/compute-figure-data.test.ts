import { describe, expect, it } from "vitest";
import { runPrediction } from "~/engine";
import { computeFigureData } from "./compute-figure-data";
import { datasetInputKey, type DatasetInput } from "./figure-inputs";
import { figureModelSchema, type FigureModelInput } from "./figure-model";

const MB_PER_GEV2 = 0.3893793721; // (ħc)², CODATA 2018
const UB = 1e-3 / MB_PER_GEV2; // 1 µb in GeV⁻²
const ID = "0b5a3c1e-7d2f-4e6a-8c9b-1a2b3c4d5e6f";

function close(got: number, expected: number, rel: number, what: string) {
  const d = Math.abs(got - expected) / Math.max(Math.abs(expected), 1e-300);
  if (!(d <= rel)) throw new Error(`${what}: got ${got}, expected ${expected}, relative difference ${d} > ${rel}`);
}

function dataset(quantity: DatasetInput["quantity"], rows: DatasetInput["rows"]): DatasetInput {
  return { datasetId: ID, datasetName: "test", revisionNumber: 1, revisionId: "r1", contentHash: "0".repeat(64), latestRevisionNumber: 1, quantity, rows };
}

function model(x: Partial<FigureModelInput["x"]>, y: Partial<FigureModelInput["y"]>, prediction: Record<string, unknown>, extra: Record<string, unknown> = {}) {
  return figureModelSchema.parse({
    version: 1,
    preset: "single-column",
    panelHeightMm: 50,
    fontSizePt: 8,
    lineWidthPt: 0.6,
    x: { variable: "thetaDeg", frame: "cm", label: "\\theta", ...x },
    y: { observable: "dsigma/dOmega", unit: "ub/sr", label: "y", ...y },
    legend: {},
    panels: [
      {
        id: "main",
        strip: "ratio",
        layers: [
          { kind: "prediction", id: "born", label: "Born", colour: "#000000", samples: 50, ...prediction },
          { kind: "dataset", id: "data", label: "data", datasetId: ID, revisionNumber: 1, colour: "#000000", marker: "disc", ...extra },
        ],
      },
    ],
  });
}

const row = (x: number, y: number, e: Partial<DatasetInput["rows"][number]> = {}) => ({ x, xLow: null, xHigh: null, y, statMinus: null, statPlus: null, systMinus: null, systPlus: null, ...e });

describe("computeFigureData: measured points in the figure's axes", () => {
  const compton = { process: "compton", energy: { kind: "beam", value: 1, unit: "MeV" } };

  it("keeps asymmetric errors the right way round and converts the y unit (1 µb = 1000 nb)", () => {
    const m = model({}, { unit: "nb/sr" }, compton);
    const input = dataset({ x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } }, [row(40, 10 * UB, { statMinus: 1 * UB, statPlus: 3 * UB, systMinus: 2 * UB, systPlus: 4 * UB })]);
    const d = computeFigureData(m, { [datasetInputKey(ID, 1)]: input }).panels[0].datasets[0];
    const p = d.points[0];
    close(p.y, 10_000, 1e-12, "y in nb/sr");
    close(p.stat[0], 1000, 1e-12, "downward stat");
    close(p.stat[1], 3000, 1e-12, "upward stat");
    close(p.total[0], Math.hypot(1000, 2000), 1e-12, "downward total = stat ⊕ syst");
    close(p.total[1], Math.hypot(3000, 4000), 1e-12, "upward total");
  });

  it("draws a cos θ dataset on a θ axis of the same frame at θ = arccos(cos θ), y unchanged", () => {
    const m = model({}, {}, compton);
    const input = dataset({ x: { kind: "cos_theta" }, y: { kind: "dsigma_domega", unit: "ub/sr" } }, [row(0.5, 7 * UB)]);
    const p = computeFigureData(m, { [datasetInputKey(ID, 1)]: input }).panels[0].datasets[0].points[0];
    close(p.x, 60, 1e-12, "θ of cos θ = 0.5");
    close(p.y, 7, 1e-12, "y");
  });

  it("gives ratio y/p and pull (y − p)/σ with σ on the prediction's side, p the engine's value at the point", () => {
    const m = model({}, {}, compton);
    const p = runPrediction({ process: "compton", frame: "cm", energy: { beam: 1, unit: "MeV" }, thetaDeg: [30, 90], unit: "GeV^-2/sr" }).values;
    const rows = [row(30, 1.1 * p[0], { statMinus: 0.05 * p[0], statPlus: 0.2 * p[0] }), row(90, 0.9 * p[1], { statMinus: 0.3 * p[1], statPlus: 0.05 * p[1], systMinus: 0.05 * p[1] })];
    const d = computeFigureData(m, { [datasetInputKey(ID, 1)]: dataset({ x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } }, rows) }).panels[0].datasets[0];
    close(d.ratio[0].value, 1.1, 1e-12, "ratio 1");
    close(d.ratio[1].value, 0.9, 1e-12, "ratio 2");
    // data above the prediction: its downward error counts; below: its upward error
    close(d.pull[0].value, 0.1 / 0.05, 1e-12, "pull 1");
    close(d.pull[1].value, -0.1 / Math.hypot(0.05, 0.05), 1e-12, "pull 2");
    close(d.statistics!.chi2, 2 ** 2 + 0.1 ** 2 / (0.05 ** 2 + 0.05 ** 2), 1e-12, "χ²");
    expect(d.statistics!.ndf).toBe(2);
  });

  it("moves θ-lab bins to the CM frame exactly: the same events over the CM solid angle (σ(bin) from the engine's σ in an acceptance)", () => {
    // e⁺e⁻ → γγ on electrons at rest, T = 0.5 GeV; data = the engine's lab bin means, no noise.
    const energy = { kind: "kinetic", value: 0.5, unit: "GeV" };
    const bins: [number, number][] = [[2, 6], [10, 20], [40, 80]];
    const lab = runPrediction({ process: "pair-annihilation", frame: "lab", energy: { kinetic: 0.5 }, thetaDegBins: bins, unit: "GeV^-2/sr" }).values;
    const input = dataset({ x: { kind: "theta_lab_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } }, bins.map(([lo, hi], i) => ({ ...row((lo + hi) / 2, lab[i]), xLow: lo, xHigh: hi })));
    const m = model({ frame: "cm" }, {}, { process: "pair-annihilation", energy });
    const points = computeFigureData(m, { [datasetInputKey(ID, 1)]: input }).panels[0].datasets[0].points;
    bins.forEach(([lo, hi], i) => {
      // σ in the lab acceptance counts each photon pair once (½ for identical photons), so one
      // photon in the bin is 2σ; its CM solid angle from the converted bin edges.
      const sigma = 2 * runPrediction({ process: "pair-annihilation", frame: "lab", energy: { kinetic: 0.5 }, observable: "sigma", acceptance: { thetaDeg: [lo, hi] }, unit: "ub" }).values[0];
      const [a, b] = points[i].bin!;
      const dOmegaCm = 2 * Math.PI * (Math.cos((a * Math.PI) / 180) - Math.cos((b * Math.PI) / 180));
      close(points[i].y, sigma / dOmegaCm, 1e-6, `CM bin mean of lab bin [${lo}°, ${hi}°]`);
    });
  });

  it("compares a bin as a whole: where its point is drawn (the centre of a file without x, or any x in the bin) does not change the ratio (docs/decisions/0013-bins-without-a-centre.md)", () => {
    // Data = the CM bin mean from the engine's σ in an acceptance (2σ: one of two identical
    // photons in the bin) over the bin's solid angle, not from the bin-mean code.
    const energy = { kind: "kinetic", value: 0.5, unit: "GeV" };
    const bins: [number, number][] = [[20, 40], [60, 90]];
    const measured = bins.map(([lo, hi]) => {
      const sigma = 2 * runPrediction({ process: "pair-annihilation", frame: "cm", energy: { kinetic: 0.5 }, observable: "sigma", acceptance: { thetaDeg: [lo, hi] }, unit: "GeV^-2" }).values[0];
      return sigma / (2 * Math.PI * (Math.cos((lo * Math.PI) / 180) - Math.cos((hi * Math.PI) / 180)));
    });
    const m = model({ frame: "cm" }, {}, { process: "pair-annihilation", energy });
    const quantity = { x: { kind: "theta_cm_deg" as const }, y: { kind: "dsigma_domega" as const, unit: "ub/sr" } };
    for (const at of [(lo: number, hi: number) => (lo + hi) / 2, (lo: number) => lo]) {
      const rows = bins.map(([lo, hi], i) => ({ ...row(at(lo, hi), measured[i]), xLow: lo, xHigh: hi }));
      const d = computeFigureData(m, { [datasetInputKey(ID, 1)]: dataset(quantity, rows) }).panels[0].datasets[0];
      bins.forEach(([lo, hi], i) => {
        expect(d.points[i].x).toBe(at(lo, hi));
        expect(d.points[i].bin).toEqual([lo, hi]);
        close(d.ratio[i].value, 1, 1e-6, `ratio in the bin [${lo}°, ${hi}°] drawn at ${at(lo, hi)}°`);
      });
    }
  });

  it("says why a dataset cannot be drawn: an energy dataset on an angle axis, a missing revision", () => {
    const m = model({}, {}, compton);
    const energyData = dataset({ x: { kind: "sqrt_s", unit: "GeV" }, y: { kind: "sigma", unit: "nb" } }, [row(1, 1)]);
    const withEnergy = computeFigureData(m, { [datasetInputKey(ID, 1)]: energyData });
    expect(withEnergy.problems.map((p) => p.message).join("\n")).toMatch(/cannot be drawn on an axis of θ \(CM\)/);
    const missing = computeFigureData(m, {});
    expect(missing.problems[0]).toEqual({ layerId: "data", message: expect.stringMatching(/revision r1 of this dataset cannot be read/) });
  });
});

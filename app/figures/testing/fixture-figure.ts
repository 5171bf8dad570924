// A small figure whose rendered SVG is kept as a fixture (app/figures/fixtures/), reviewed by eye
// when it was made and whenever `npm run fixtures:figures` rewrites it: synthetic Compton data
// (the engine's bin means with seeded noise; invented numbers), a Klein–Nishina curve, a pull
// strip, an annotation, a log y axis, asymmetric errors.
import { runPrediction } from "~/engine";
import { seededRandom } from "~/engine/testing/seeded-random";
import { datasetInputKey, type DatasetInputs } from "../figure-inputs";
import { figureModelSchema, type FigureModel } from "../figure-model";

export const FIXTURE_DATASET_ID = "1c9d7e52-8a41-4f0b-9d3e-6b2a7c5e4f10";

export function fixtureInputs(): DatasetInputs {
  const bins: [number, number][] = Array.from({ length: 12 }, (_, i) => [10 + 12 * i, 22 + 12 * i]);
  const means = runPrediction({ process: "compton", frame: "lab", energy: { beam: 1, unit: "MeV" }, thetaDegBins: bins, unit: "GeV^-2/sr" }).values;
  const rng = seededRandom(7);
  const rows = bins.map(([lo, hi], i) => {
    const stat = 0.05 * means[i];
    return { x: (lo + hi) / 2, xLow: lo, xHigh: hi, y: means[i] * (1 + 0.05 * (rng() * 2 - 1)), statMinus: stat, statPlus: 1.5 * stat, systMinus: 0.5 * stat, systPlus: 0.5 * stat };
  });
  return {
    [datasetInputKey(FIXTURE_DATASET_ID, 2)]: {
      datasetId: FIXTURE_DATASET_ID, datasetName: "synthetic Compton", revisionNumber: 2, revisionId: "fixture-r2", contentHash: "f".repeat(64), latestRevisionNumber: 2,
      quantity: { x: { kind: "theta_lab_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } }, rows,
    },
  };
}

export function fixtureModel(): FigureModel {
  return figureModelSchema.parse({
    version: 1, preset: "single-column", panelHeightMm: 45, fontSizePt: 8, lineWidthPt: 0.6,
    x: { variable: "thetaDeg", frame: "lab", label: "\\theta_{\\mathrm{lab}}\\ [\\mathrm{deg}]" },
    y: { observable: "dsigma/dOmega", unit: "ub/sr", scale: "log", label: "(\\mathrm{d}\\sigma/\\mathrm{d}\\Omega)_{\\mathrm{lab}}\\ [\\mu\\mathrm{b/sr}]" },
    legend: { position: "upper-right", statistics: "legend" },
    panels: [{
      id: "main", strip: "pull",
      layers: [
        { kind: "prediction", id: "kn", label: "\\text{QED (Klein–Nishina)}", process: "compton", energy: { kind: "beam", value: 1, unit: "MeV" }, colour: "#1f4e8c", samples: 200 },
        { kind: "dataset", id: "data", label: "\\text{synthetic data}", datasetId: FIXTURE_DATASET_ID, revisionNumber: 2, colour: "#1b1a17", marker: "open-circle", compareWith: "kn" },
        { kind: "annotation", id: "note", tex: "E_\\gamma = 1\\ \\mathrm{MeV}", at: [0.06, 0.1] },
      ],
    }],
  });
}

export const FIXTURE_METADATA = { title: "fixture figure", description: "", notes: ["fixture"] };

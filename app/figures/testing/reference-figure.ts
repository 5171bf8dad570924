// The reference figure of the composer's goals and benchmarks: two synthetic datasets of 500
// points each, three predictions of 1000 points, a ratio strip. The datasets are the engine's
// own bin means with seeded Gaussian noise: invented numbers, never a measurement.
import { runPrediction } from "~/engine";
import { seededRandom } from "~/engine/testing/seeded-random";
import { datasetInputKey, type DatasetInput, type DatasetInputs } from "../figure-inputs";
import { colourFor } from "../palette";
import { figureModelSchema, type FigureModel, type FigureModelInput } from "../figure-model";


/** A synthetic dataset of θ-lab bins from the engine's bin means with `noise` relative scatter. */
export function syntheticAngularDataset(options: {
  datasetId: string;
  name: string;
  process: string;
  kineticGeV: number;
  bins: number;
  fromDeg: number;
  toDeg: number;
  noise: number;
  seed: number;
}): DatasetInput {
  const width = (options.toDeg - options.fromDeg) / options.bins;
  const bins: [number, number][] = Array.from({ length: options.bins }, (_, i) => [options.fromDeg + i * width, options.fromDeg + (i + 1) * width]);
  const means = runPrediction({ process: options.process, frame: "lab", energy: { kinetic: options.kineticGeV }, thetaDegBins: bins, unit: "GeV^-2/sr" }).values;
  const rng = seededRandom(options.seed);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - rng())) * Math.cos(2 * Math.PI * rng());
  return {
    datasetId: options.datasetId,
    datasetName: options.name,
    revisionNumber: 1,
    revisionId: `${options.datasetId.slice(0, 8)}-rev1`,
    contentHash: "0".repeat(64),
    latestRevisionNumber: 1,
    quantity: { x: { kind: "theta_lab_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } },
    rows: bins.map(([lo, hi], i) => {
      const stat = options.noise * means[i];
      return { x: (lo + hi) / 2, xLow: lo, xHigh: hi, y: means[i] * (1 + options.noise * gauss()), statMinus: stat, statPlus: stat, systMinus: 0.5 * stat, systPlus: 0.5 * stat };
    }),
  };
}

export const REFERENCE_DATASET_IDS = ["6f1c2a9e-0d4b-4c3a-9b7e-2a1f3c4d5e60", "6f1c2a9e-0d4b-4c3a-9b7e-2a1f3c4d5e61"] as const;

export function referenceInputs(): DatasetInputs {
  const a = syntheticAngularDataset({ datasetId: REFERENCE_DATASET_IDS[0], name: "synthetic A", process: "pair-annihilation", kineticGeV: 0.5, bins: 500, fromDeg: 5, toDeg: 150, noise: 0.04, seed: 11 });
  const b = syntheticAngularDataset({ datasetId: REFERENCE_DATASET_IDS[1], name: "synthetic B", process: "pair-annihilation", kineticGeV: 0.5, bins: 500, fromDeg: 6, toDeg: 151, noise: 0.06, seed: 12 });
  return { [datasetInputKey(a.datasetId, 1)]: a, [datasetInputKey(b.datasetId, 1)]: b };
}

export function referenceModelInput(): FigureModelInput {
  return {
    version: 1,
    preset: "single-column",
    panelHeightMm: 55,
    fontSizePt: 8,
    lineWidthPt: 0.6,
    x: { variable: "thetaDeg", frame: "lab", scale: "linear", label: "\\theta_{\\mathrm{lab}}\\ [\\mathrm{deg}]" },
    y: { observable: "dsigma/dOmega", unit: "ub/sr", scale: "log", label: "d\\sigma/d\\Omega\\ [\\mu\\mathrm{b/sr}]" },
    legend: { position: "upper-right", statistics: "legend" },
    panels: [
      {
        id: "main",
        strip: "ratio",
        layers: [
          { kind: "prediction", id: "qed", label: "\\mathrm{QED\\ Born}", process: "pair-annihilation", energy: { kind: "kinetic", value: 0.5, unit: "GeV" }, colour: colourFor(0), samples: 1000 },
          { kind: "prediction", id: "qed-alpha", label: "\\alpha = 1/130", process: "pair-annihilation", energy: { kind: "kinetic", value: 0.5, unit: "GeV" }, alpha: 1 / 130, colour: colourFor(1), dash: "dashed", samples: 1000 },
          { kind: "prediction", id: "qed-450", label: "T = 0.45\\ \\mathrm{GeV}", process: "pair-annihilation", energy: { kind: "kinetic", value: 0.45, unit: "GeV" }, colour: colourFor(3), dash: "dotted", samples: 1000 },
          { kind: "dataset", id: "data-a", label: "\\mathrm{synthetic\\ A}", datasetId: REFERENCE_DATASET_IDS[0], revisionNumber: 1, colour: "#1b1a17", marker: "disc", compareWith: "qed" },
          { kind: "dataset", id: "data-b", label: "\\mathrm{synthetic\\ B}", datasetId: REFERENCE_DATASET_IDS[1], revisionNumber: 1, colour: colourFor(2), marker: "open-square", compareWith: "qed" },
        ],
      },
    ],
  };
}

export function referenceModel(): FigureModel {
  return figureModelSchema.parse(referenceModelInput());
}


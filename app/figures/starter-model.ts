import { PROCESSES } from "~/engine";
import type { QuantityDescription, XKind, YKind } from "~/datasets";
import { figureModelSchema, type FigureModel, type FigureObservable, type PredictionLayer, type XVariable } from "./figure-model";
import { plainTextTex, reactionTex, xLabelTex, yLabelTex } from "./figure-labels";
import { DEFAULT_PRESET_ID } from "./journal-presets";
import { colourFor, markerFor } from "./palette";

/** What a new figure starts from when an author picks a dataset revision. */
export interface StarterDataset {
  id: string;
  name: string;
  quantity: QuantityDescription;
  /** The engine process the dataset's metadata names, if any. */
  process: string | null;
  /** Total beam energy in the lab (the dataset metadata's convention), GeV. */
  beamEnergyGeV: number | null;
  revisionNumber: number;
}

const X_OF: Record<XKind, { variable: XVariable; frame: "lab" | "cm" }> = {
  theta_lab_deg: { variable: "thetaDeg", frame: "lab" },
  theta_cm_deg: { variable: "thetaDeg", frame: "cm" },
  cos_theta: { variable: "cosTheta", frame: "cm" },
  t: { variable: "t", frame: "cm" },
  sqrt_s: { variable: "sqrtS", frame: "lab" },
  beam_energy: { variable: "beam", frame: "lab" },
  beam_kinetic: { variable: "kinetic", frame: "lab" },
};

const Y_OF: Record<YKind, FigureObservable> = {
  dsigma_domega: "dsigma/dOmega",
  dsigma_dcos: "dsigma/dcos",
  dsigma_dt: "dsigma/dt",
  sigma: "sigma",
};

const BASE = {
  version: 1 as const,
  preset: DEFAULT_PRESET_ID,
  panelHeightMm: 55,
  columns: 1,
  fontSizePt: 8,
  lineWidthPt: 0.6,
  legend: { position: "upper-right" as const, statistics: "legend" as const },
};

/** An empty figure: dσ/dΩ in µb/sr against θ in the lab, no layers yet. */
export function emptyFigureModel(): FigureModel {
  return figureModelSchema.parse({
    ...BASE,
    x: { variable: "thetaDeg", frame: "lab", scale: "linear", label: xLabelTex("thetaDeg", "lab", "GeV") },
    y: { observable: "dsigma/dOmega", unit: "ub/sr", scale: "log", label: yLabelTex("dsigma/dOmega", "ub/sr", "lab") },
    panels: [{ id: "main", layers: [] }],
  });
}

/** A prediction layer for a process at an energy, with the theory and reaction as its legend entry. */
export function predictionLayerFor(process: string, energy: PredictionLayer["energy"], index: number, id = `prediction-${index + 1}`): PredictionLayer {
  const info = PROCESSES.find((p) => p.id === process);
  const label = info === undefined ? plainTextTex(process) : `\\text{${info.theory}}\\ ${reactionTex(info.reaction)}`;
  return {
    kind: "prediction", id, label, process, energy,
    fixedThetaDeg: null, acceptanceThetaDeg: null, mass: null, finalMass: null, alpha: null, formFactor: null, band: null,
    colour: colourFor(index), dash: "solid", samples: 400,
  };
}

/**
 * A figure that already shows a dataset revision on its own x variable and units, with the
 * prediction that its metadata names (process and beam energy) compared with it in a ratio
 * strip. Without a process in the metadata the figure holds the data alone.
 */
export function figureModelFromDataset(d: StarterDataset): FigureModel {
  const x = X_OF[d.quantity.x.kind];
  const energyUnit = "unit" in d.quantity.x && d.quantity.x.kind !== "t" ? d.quantity.x.unit : "GeV";
  const observable = Y_OF[d.quantity.y.kind];
  const process = d.process !== null && PROCESSES.some((p) => p.id === d.process && p.frames.includes(x.frame)) ? d.process : null;
  const prediction = process !== null && (d.beamEnergyGeV !== null || x.variable === "sqrtS" || x.variable === "beam" || x.variable === "kinetic")
    ? predictionLayerFor(process, { kind: "beam", value: d.beamEnergyGeV ?? 1, unit: "GeV" }, 0, "theory")
    : null;
  const data = {
    kind: "dataset" as const, id: "data", label: plainTextTex(d.name), datasetId: d.id, revisionNumber: d.revisionNumber,
    colour: "#1b1a17", marker: markerFor(0).id, normalisationUncertainty: null, compareWith: prediction?.id ?? null,
  };
  return figureModelSchema.parse({
    ...BASE,
    x: { variable: x.variable, frame: x.frame, energyUnit, scale: "linear", label: xLabelTex(x.variable, x.frame, energyUnit) },
    y: { observable, unit: d.quantity.y.unit, scale: "log", label: yLabelTex(observable, d.quantity.y.unit, x.frame) },
    panels: [{ id: "main", strip: prediction === null ? "none" : "ratio", layers: prediction === null ? [data] : [prediction, data] }],
  });
}

/** The quick look of a dataset revision: its points with their error bars, no prediction, no legend. */
export function quickLookModel(d: Omit<StarterDataset, "process" | "beamEnergyGeV">, yScale: "linear" | "log"): FigureModel {
  const m = figureModelFromDataset({ ...d, process: null, beamEnergyGeV: null });
  return figureModelSchema.parse({ ...m, preset: "double-column", panelHeightMm: 60, y: { ...m.y, scale: yScale }, legend: { position: "none", statistics: "none" } });
}

/** Two revisions of one dataset on one panel, each with its own marker, for the compare page. */
export function compareRevisionsModel(d: Omit<StarterDataset, "process" | "beamEnergyGeV" | "revisionNumber">, from: number, to: number): FigureModel {
  const m = figureModelFromDataset({ ...d, revisionNumber: to, process: null, beamEnergyGeV: null });
  const layer = (n: number, i: number) => ({
    kind: "dataset" as const, id: `r${n}`, label: plainTextTex(`r${n}`), datasetId: d.id, revisionNumber: n,
    colour: colourFor(i), marker: markerFor(i).id, normalisationUncertainty: null, compareWith: null,
  });
  return figureModelSchema.parse({
    ...m, preset: "double-column", panelHeightMm: 60, legend: { position: "upper-right", statistics: "none" },
    panels: [{ id: "main", strip: "none", layers: from === to ? [layer(to, 0)] : [layer(from, 0), layer(to, 1)] }],
  });
}

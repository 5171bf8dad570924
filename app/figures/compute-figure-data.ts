import {
  angleConverter,
  compareToData,
  compareWithNormalisation,
  EngineInputError,
  parseUnit,
  runPrediction,
  type AngleConverter,
  type AngleVariable,
  type DifferentialObservable,
  type EnergyKind,
  type Frame,
  type MeasuredPoint,
} from "~/engine";
import { NATURAL_Y_UNIT, type XKind, type YKind } from "~/datasets";
import { paddedDomain } from "./axis-ticks";
import { datasetInputKey, type DatasetInput, type DatasetInputs, type FigureProblem } from "./figure-inputs";
import type { DatasetLayer, FigureModel, FigureObservable, FigurePanel, PredictionLayer } from "./figure-model";
import { predictionRequest, type RequestAbscissa } from "./prediction-requests";

/** A measured point in the figure's axes and y unit. Errors are [down, up], both ≥ 0. */
export interface PlottedPoint {
  x: number;
  /** The bin in figure x, ordered low < high; null for a point measurement. */
  bin: [number, number] | null;
  y: number;
  stat: [number, number];
  total: [number, number];
}

export interface StripPoint {
  x: number;
  bin: [number, number] | null;
  value: number;
  /** Error bar of the strip value [down, up] (ratio: data errors over the prediction; pull: 1). */
  error: [number, number];
}

export interface DatasetStatistics {
  chi2: number;
  ndf: number;
  pValue: number;
  /** Fitted normalisation and its uncertainty when the layer has a normalisation uncertainty. */
  normalisation: { value: number; uncertainty: number } | null;
  comparedWith: string;
}

export interface DatasetSeries {
  layer: DatasetLayer;
  input: DatasetInput | null;
  points: PlottedPoint[];
  /** Ratio (data/prediction) and pull ((data − prediction)/σ) per point, against `comparedWith`. */
  ratio: StripPoint[];
  pull: StripPoint[];
  /** The bin means (or point values) of the compared prediction, in the figure's y unit. */
  predictionAtData: { x: number; bin: [number, number] | null; y: number }[];
  statistics: DatasetStatistics | null;
}

export interface PredictionSeries {
  layer: PredictionLayer;
  curve: { x: number; y: number }[];
  band: { x: number; low: number; high: number }[] | null;
  engineVersion: string | null;
  parametersHash: string | null;
  /** The engine request of the drawn curve, for the prediction table of an export. */
  request: Record<string, unknown> | null;
}

export interface PanelData {
  panel: FigurePanel;
  datasets: DatasetSeries[];
  predictions: PredictionSeries[];
}

export interface FigureData {
  xDomain: [number, number];
  yDomain: [number, number];
  panels: PanelData[];
  problems: FigureProblem[];
}

type XCoordinate = { kind: "angle"; variable: AngleVariable; frame: Frame } | { kind: "energy"; variable: EnergyKind };

const DATA_OBSERVABLE: Record<YKind, FigureObservable> = {
  dsigma_domega: "dsigma/dOmega",
  dsigma_dcos: "dsigma/dcos",
  dsigma_dt: "dsigma/dt",
  sigma: "sigma",
};
const ENERGY_FACTOR = { GeV: 1, MeV: 1e-3, keV: 1e-6 } as const;
const DEG = Math.PI / 180;

/** What a dataset's x is; cos θ and t are taken in the figure's frame (docs/decisions/0008). */
function dataXCoordinate(kind: XKind, figureFrame: Frame): XCoordinate {
  switch (kind) {
    case "theta_lab_deg":
      return { kind: "angle", variable: "thetaDeg", frame: "lab" };
    case "theta_cm_deg":
      return { kind: "angle", variable: "thetaDeg", frame: "cm" };
    case "cos_theta":
      return { kind: "angle", variable: "cosTheta", frame: figureFrame };
    case "t":
      return { kind: "angle", variable: "t", frame: figureFrame };
    case "sqrt_s":
      return { kind: "energy", variable: "sqrtS" };
    case "beam_energy":
      return { kind: "energy", variable: "beam" };
    case "beam_kinetic":
      return { kind: "energy", variable: "kinetic" };
  }
}

function figureXCoordinate(model: FigureModel): XCoordinate {
  const v = model.x.variable;
  return v === "thetaDeg" || v === "cosTheta" || v === "t" ? { kind: "angle", variable: v, frame: model.x.frame } : { kind: "energy", variable: v };
}

const describe = (c: XCoordinate) =>
  c.kind === "energy"
    ? { sqrtS: "√s", beam: "the beam energy", kinetic: "the beam kinetic energy" }[c.variable]
    : `${{ thetaDeg: "θ", cosTheta: "cos θ", t: "t" }[c.variable]}${c.variable === "t" ? "" : ` (${c.frame === "lab" ? "lab" : "CM"})`}`;

const message = (error: unknown) => (error instanceof EngineInputError || error instanceof Error ? error.message : String(error));

/**
 * Everything a figure shows, computed from the model and the pinned dataset revisions with the
 * engine: the measured points moved into the figure's axes (by the engine's kinematics where the
 * variable or the frame differs), each prediction on a fine grid (and its band), the prediction
 * averaged over each data bin as a measurement defines the mean (σ(bin)/ΔX, docs/decisions/0006)
 * for the ratio and pull strips and χ². Pure and deterministic. Problems do not throw: they are
 * collected per layer, and what can be drawn is drawn.
 */
export function computeFigureData(model: FigureModel, inputs: DatasetInputs): FigureData {
  const problems: FigureProblem[] = [];
  const figureX = figureXCoordinate(model);
  const yFactor = parseUnit(model.y.unit).toNatural;
  const xFactor = figureX.kind === "energy" ? ENERGY_FACTOR[model.x.energyUnit] : 1;

  const panels = model.panels.map((panel) => {
    const predictionLayers = panel.layers.filter((l): l is PredictionLayer => l.kind === "prediction");
    const datasets = panel.layers
      .filter((l): l is DatasetLayer => l.kind === "dataset")
      .map((layer) => {
        const input = inputs[datasetInputKey(layer.datasetId, layer.revisionNumber)] ?? null;
        const compared = predictionLayers.find((p) => p.id === layer.compareWith) ?? (layer.compareWith === null ? predictionLayers[0] : undefined) ?? null;
        return prepareDataset(model, figureX, xFactor, yFactor, layer, input, compared, problems);
      });
    return { panel, datasets, predictionLayers };
  });

  const xDomain = model.x.domain ?? autoXDomain(model, figureX, xFactor, panels.flatMap((p) => p.datasets), panels.flatMap((p) => p.predictionLayers));
  const result: PanelData[] = panels.map(({ panel, datasets, predictionLayers }) => ({
    panel,
    datasets,
    predictions: predictionLayers.map((layer) => predictionSeries(model, figureX, xFactor, xDomain, layer, problems)),
  }));
  const yDomain = model.y.domain ?? autoYDomain(model, result);
  return { xDomain, yDomain, panels: result, problems };
}

function converterFor(layer: PredictionLayer | null): AngleConverter | null {
  if (layer === null) return null;
  try {
    return angleConverter({
      process: layer.process,
      energy: { kind: layer.energy.kind, valueGeV: layer.energy.value * ENERGY_FACTOR[layer.energy.unit] },
      mass: layer.mass,
      finalMass: layer.finalMass,
    });
  } catch {
    return null;
  }
}

function prepareDataset(
  model: FigureModel,
  figureX: XCoordinate,
  xFactor: number,
  yFactor: number,
  layer: DatasetLayer,
  input: DatasetInput | null,
  compared: PredictionLayer | null,
  problems: FigureProblem[],
): DatasetSeries {
  const empty: DatasetSeries = { layer, input, points: [], ratio: [], pull: [], predictionAtData: [], statistics: null };
  const fail = (text: string) => {
    problems.push({ layerId: layer.id, message: text });
    return empty;
  };
  if (input === null) return fail(`revision r${layer.revisionNumber} of this dataset cannot be read (it may have been removed or not be visible to you)`);
  const dataX = dataXCoordinate(input.quantity.x.kind, model.x.frame);
  const dataObservable = DATA_OBSERVABLE[input.quantity.y.kind];
  const figureObservable = model.y.observable;
  if (dataX.kind !== figureX.kind) {
    return fail(`this dataset's x is ${describe(dataX)}, which cannot be drawn on an axis of ${describe(figureX)}: put it in a figure whose x axis is an ${dataX.kind === "angle" ? "angle" : "energy"}`);
  }
  if ((dataObservable === "sigma") !== (figureObservable === "sigma")) {
    return fail(`this dataset is ${dataObservable === "sigma" ? "σ" : "a differential cross section"} and the figure's y axis is ${figureObservable === "sigma" ? "σ" : "a differential cross section"}: they cannot share an axis`);
  }
  if (dataX.kind === "energy" && figureX.kind === "energy" && dataX.variable !== figureX.variable) {
    return fail(`this dataset's x is ${describe(dataX)} and the figure's x axis is ${describe(figureX)}: set the figure's x axis to ${describe(dataX)}`);
  }
  if (dataX.kind === "energy" && dataObservable !== figureObservable) {
    return fail(`this dataset is ${dataObservable} and the figure's y axis is ${figureObservable}: on an energy axis only the same observable can be drawn`);
  }

  // Angles: moving between variables or frames needs the reaction's kinematics (the compared
  // prediction's process and energy); θ ↔ cos θ in one frame does not.
  const needsKinematics =
    dataX.kind === "angle" &&
    figureX.kind === "angle" &&
    (dataX.frame !== figureX.frame || ((dataX.variable === "t") !== (figureX.variable === "t")) || dataObservable !== figureObservable);
  const converter = needsKinematics ? converterFor(compared) : null;
  if (needsKinematics && converter === null) {
    return fail(`moving this dataset from ${describe(dataX)} and ${dataObservable} to ${describe(figureX)} and ${figureObservable} needs a reaction's kinematics: add a prediction to the panel (its process and energy are used)`);
  }

  const rows = input.rows;
  const xs = (x: number) => {
    if (dataX.kind === "energy") return x / xFactor;
    if (converter !== null && figureX.kind === "angle") return converter.convert(dataX, figureX, x);
    if (figureX.kind === "angle" && dataX.variable !== figureX.variable) {
      return figureX.variable === "cosTheta" ? Math.cos(x * DEG) : Math.acos(Math.max(-1, Math.min(1, x))) / DEG;
    }
    return x;
  };
  const dataY = { observable: dataObservable as DifferentialObservable, frame: dataX.kind === "angle" ? dataX.frame : "cm" as Frame };
  const figY = { observable: figureObservable as DifferentialObservable, frame: model.x.frame };
  // Factor from the dataset's y (natural units) to the figure's y: unit, then measure ratio.
  const factorAt = (row: (typeof rows)[number]): number => {
    if (converter === null || dataX.kind !== "angle") {
      // dσ/dcosθ = 2π dσ/dΩ in one frame (azimuthal symmetry), the only change without kinematics.
      const twoPi = dataObservable === figureObservable ? 1 : dataObservable === "dsigma/dcos" ? 1 / (2 * Math.PI) : 2 * Math.PI;
      return twoPi / yFactor;
    }
    if (row.xLow !== null && row.xHigh !== null) {
      const a = converter.cmCos(dataX, row.xLow);
      const b = converter.cmCos(dataX, row.xHigh);
      const dData = Math.abs(converter.measure(dataY, b) - converter.measure(dataY, a));
      const dFig = Math.abs(converter.measure(figY, b) - converter.measure(figY, a));
      return dData / dFig / yFactor;
    }
    const c = converter.cmCos(dataX, row.x);
    return converter.measureDerivative(dataY, c) / converter.measureDerivative(figY, c) / yFactor;
  };

  const points: PlottedPoint[] = [];
  const measured: MeasuredPoint[] = [];
  for (const row of rows) {
    const f = factorAt(row);
    const x = xs(row.x);
    const bin: [number, number] | null = row.xLow !== null && row.xHigh !== null ? ordered(xs(row.xLow), xs(row.xHigh)) : null;
    const statDown = (row.statMinus ?? 0) * f;
    const statUp = (row.statPlus ?? row.statMinus ?? 0) * f;
    const systDown = (row.systMinus ?? 0) * f;
    const systUp = (row.systPlus ?? row.systMinus ?? 0) * f;
    points.push({
      x,
      bin,
      y: row.y * f,
      stat: [statDown, statUp],
      total: [Math.hypot(statDown, systDown), Math.hypot(statUp, systUp)],
    });
    measured.push({
      value: row.y,
      stat: { minus: row.statMinus ?? 0, plus: row.statPlus ?? row.statMinus ?? 0 },
      syst: { minus: row.systMinus ?? 0, plus: row.systPlus ?? row.systMinus ?? 0 },
    });
  }
  if (compared === null) return { ...empty, points };

  // The compared prediction in the dataset's own variable, frame and observable (natural units):
  // the measurement is compared as it was made, never after a conversion.
  const binned = rows.every((r) => r.xLow !== null && r.xHigh !== null);
  const abscissa: RequestAbscissa =
    dataX.kind === "angle"
      ? { kind: "angle", variable: dataX.variable, frame: dataX.frame, ...(binned ? { bins: rows.map((r) => ordered(r.xLow!, r.xHigh!)) } : { points: rows.map((r) => r.x) }) }
      : { kind: "energy", variable: dataX.variable, ...(binned ? { bins: rows.map((r) => ordered(r.xLow!, r.xHigh!)) } : { points: rows.map((r) => r.x) }) };
  let predicted: number[];
  try {
    predicted = runPrediction(predictionRequest(compared, abscissa, { observable: dataObservable, unit: NATURAL_Y_UNIT[input.quantity.y.kind] })).values;
  } catch (error) {
    problems.push({ layerId: layer.id, message: `the prediction "${compared.id}" cannot be compared with this dataset: ${message(error)}` });
    return { ...empty, points };
  }
  const predictionAtData = points.map((p, i) => ({ x: p.x, bin: p.bin, y: predicted[i] * factorAt(rows[i]) }));
  let statistics: DatasetStatistics | null = null;
  let ratios = measured.map((m, i) => m.value / predicted[i]);
  let pulls: number[] | null = null;
  try {
    if (layer.normalisationUncertainty !== null) {
      const c = compareWithNormalisation(measured, predicted, layer.normalisationUncertainty);
      statistics = { chi2: c.chi2, ndf: c.ndf, pValue: c.pValue, normalisation: { value: c.normalisation, uncertainty: c.normalisationUncertainty }, comparedWith: compared.id };
      ratios = c.ratios;
      pulls = c.pulls;
    } else {
      const c = compareToData(measured, predicted);
      statistics = { chi2: c.chi2, ndf: c.ndf, pValue: c.pValue, normalisation: null, comparedWith: compared.id };
      pulls = c.pulls;
    }
  } catch (error) {
    problems.push({ layerId: layer.id, message: `no χ² against "${compared.id}": ${message(error)}` });
  }
  const k = statistics?.normalisation?.value ?? 1;
  const ratio = points.map((p, i) => {
    const scale = 1 / (k * predicted[i]);
    const m = measured[i];
    const down = Math.hypot(stat(m.stat, "minus"), stat(m.syst, "minus")) * scale;
    const up = Math.hypot(stat(m.stat, "plus"), stat(m.syst, "plus")) * scale;
    return { x: p.x, bin: p.bin, value: ratios[i], error: [down, up] as [number, number] };
  });
  const pull = pulls === null ? [] : points.map((p, i) => ({ x: p.x, bin: p.bin, value: pulls![i], error: [1, 1] as [number, number] }));
  return { layer, input, points, ratio, pull, predictionAtData, statistics };
}

function stat(u: MeasuredPoint["stat"] | undefined, side: "minus" | "plus"): number {
  if (u === undefined) return 0;
  return typeof u === "number" ? u : u[side];
}

function ordered(a: number, b: number): [number, number] {
  return a <= b ? [a, b] : [b, a];
}

/** The drawn curve: `samples` points across the x range, log-spaced on a log axis. */
function gridOver(domain: [number, number], samples: number, log: boolean, divergesAt: number[]): number[] {
  const [lo, hi] = domain;
  const out: number[] = [];
  for (let i = 0; i < samples; i++) {
    const f = i / (samples - 1);
    let x = log ? lo * (hi / lo) ** f : lo + (hi - lo) * f;
    // A tree-level pole at an end of the range: step just inside, as a drawing would.
    if (divergesAt.includes(x)) x += (i === 0 ? 1 : -1) * (hi - lo) * 1e-3;
    out.push(x);
  }
  return out;
}

function predictionSeries(model: FigureModel, figureX: XCoordinate, xFactor: number, xDomain: [number, number], layer: PredictionLayer, problems: FigureProblem[]): PredictionSeries {
  const none: PredictionSeries = { layer, curve: [], band: null, engineVersion: null, parametersHash: null, request: null };
  const poles = figureX.kind === "angle" ? polesOf(layer.process, figureX.variable) : [];
  const [lo, hi] = figureX.kind === "angle" ? clampAngleDomain(xDomain, figureX.variable, layer) : xDomain;
  if (!(lo < hi)) {
    problems.push({ layerId: layer.id, message: "the x range holds no physical angle of this reaction" });
    return none;
  }
  const grid = gridOver([lo, hi], layer.samples, model.x.scale === "log", poles);
  const abscissa: RequestAbscissa =
    figureX.kind === "angle" ? { kind: "angle", variable: figureX.variable, frame: figureX.frame, points: grid } : { kind: "energy", variable: figureX.variable, points: grid.map((x) => x * xFactor) };
  const observable = model.y.observable;
  try {
    const request = predictionRequest(layer, abscissa, { observable, unit: model.y.unit });
    const response = runPrediction(request);
    const curve = grid.map((x, i) => ({ x, y: response.values[i] }));
    let band: PredictionSeries["band"] = null;
    if (layer.band !== null) {
      const low = runPrediction(predictionRequest(layer, abscissa, { observable, unit: model.y.unit, vary: { parameter: layer.band.parameter, value: layer.band.low } })).values;
      const high = runPrediction(predictionRequest(layer, abscissa, { observable, unit: model.y.unit, vary: { parameter: layer.band.parameter, value: layer.band.high } })).values;
      band = grid.map((x, i) => ({ x, low: Math.min(low[i], high[i], response.values[i]), high: Math.max(low[i], high[i], response.values[i]) }));
    }
    return { layer, curve, band, engineVersion: response.engineVersion, parametersHash: response.parametersHash, request };
  } catch (error) {
    problems.push({ layerId: layer.id, message: message(error) });
    return none;
  }
}

function polesOf(process: string, variable: AngleVariable): number[] {
  const forward = process === "bhabha" || process === "moller";
  const backward = process === "moller";
  if (variable === "thetaDeg") return [...(forward ? [0] : []), ...(backward ? [180] : [])];
  if (variable === "cosTheta") return [...(forward ? [1] : []), ...(backward ? [-1] : [])];
  return [];
}

/** Angles outside their physical range are not drawn: θ in [0°, 180°], cos θ in [−1, 1], t in the reaction's range. */
function clampAngleDomain(domain: [number, number], variable: AngleVariable, layer: PredictionLayer): [number, number] {
  if (variable === "thetaDeg") return [Math.max(0, domain[0]), Math.min(180, domain[1])];
  if (variable === "cosTheta") return [Math.max(-1, domain[0]), Math.min(1, domain[1])];
  const conv = converterFor(layer);
  if (conv === null) return domain;
  const tMin = conv.fromCmCos({ variable: "t", frame: "cm" }, -1);
  const tMax = conv.kinematics.tForward;
  const poles = polesOf(layer.process, "cosTheta");
  const inset = (tMax - tMin) * 1e-3;
  return [Math.max(tMin + (poles.includes(-1) ? inset : 0), domain[0]), Math.min(tMax - (poles.includes(1) ? inset : 0), domain[1])];
}

function autoXDomain(model: FigureModel, figureX: XCoordinate, xFactor: number, datasets: DatasetSeries[], predictions: PredictionLayer[]): [number, number] {
  const xs = datasets.flatMap((d) => d.points.flatMap((p) => (p.bin ? p.bin : [p.x])));
  const log = model.x.scale === "log";
  const usable = log ? xs.filter((x) => x > 0) : xs;
  if (usable.length > 0) {
    const lo = Math.min(...usable);
    const hi = Math.max(...usable);
    const padded = paddedDomain(lo, hi, model.x.scale);
    if (figureX.kind === "angle" && figureX.variable === "thetaDeg") return [Math.max(0, padded[0]), Math.min(180, padded[1])];
    if (figureX.kind === "angle" && figureX.variable === "cosTheta") return [Math.max(-1, padded[0]), Math.min(1, padded[1])];
    return padded;
  }
  if (figureX.kind === "angle") {
    if (figureX.variable === "thetaDeg") return log ? [1, 180] : [0, 180];
    if (figureX.variable === "cosTheta") return [-1, 1];
    const conv = converterFor(predictions[0] ?? null);
    if (conv !== null) return [conv.fromCmCos({ variable: "t", frame: "cm" }, -1), conv.kinematics.tForward];
    return [-1, 0];
  }
  // An energy axis with no data: from the first prediction's energy to four times it.
  const first = predictions[0];
  const e = first ? (first.energy.value * ENERGY_FACTOR[first.energy.unit]) / xFactor : 1;
  return [e, 4 * e];
}

function autoYDomain(model: FigureModel, panels: PanelData[]): [number, number] {
  const log = model.y.scale === "log";
  const values: number[] = [];
  // With data, the range fits the data and the curves where the data are: a curve's divergence
  // outside the measured range (θ → 0 of a t-channel process) must not squash the data.
  const xs = panels.flatMap((panel) => panel.datasets.flatMap((d) => d.points.flatMap((p) => (p.bin ? p.bin : [p.x]))));
  const [xLo, xHi] = xs.length > 0 ? [Math.min(...xs), Math.max(...xs)] : [-Infinity, Infinity];
  const inRange = (x: number) => x >= xLo && x <= xHi;
  for (const panel of panels) {
    for (const d of panel.datasets) for (const p of d.points) values.push(p.y - p.total[0], p.y + p.total[1], p.y);
    for (const pr of panel.predictions) {
      for (const c of pr.curve) if (inRange(c.x)) values.push(c.y);
      for (const b of pr.band ?? []) if (inRange(b.x)) values.push(b.low, b.high);
    }
  }
  const usable = values.filter((v) => Number.isFinite(v) && (!log || v > 0));
  if (usable.length === 0) return log ? [1e-3, 1] : [0, 1];
  return paddedDomain(Math.min(...usable), Math.max(...usable), model.y.scale, 0.06);
}

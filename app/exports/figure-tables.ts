// The bundle's CSV files of one rendered figure: its plotted dataset revisions and its drawn
// predictions, from the model and the computed figure data. Pure: runs in the browser too.
import { runPrediction } from "~/engine";
import type { FigureData } from "~/figures/compute-figure-data";
import type { FigureModel } from "~/figures/figure-model";
import { plottedDataCsv, predictionTableCsv, type AxisQuantity, type PlottedDataTable, type PredictionTable } from "./data-tables";

const X_NAMES: Record<FigureModel["x"]["variable"], string> = {
  thetaDeg: "theta",
  cosTheta: "cos theta",
  t: "Mandelstam t",
  sqrtS: "sqrt(s)",
  beam: "beam energy",
  kinetic: "beam kinetic energy",
};

/** The figure's x axis as the tables write it (angles and frame-dependent observables name their frame). */
export function xQuantity(model: FigureModel): AxisQuantity {
  const v = model.x.variable;
  const frame = ` (${model.x.frame === "lab" ? "lab" : "CM"})`;
  switch (v) {
    case "thetaDeg":
      return { name: X_NAMES[v] + frame, unit: "deg" };
    case "cosTheta":
      return { name: X_NAMES[v] + frame, unit: "1" };
    case "t":
      return { name: X_NAMES[v], unit: "GeV^2" };
    default:
      return { name: X_NAMES[v], unit: model.x.energyUnit };
  }
}

export function yQuantity(model: FigureModel): AxisQuantity {
  const o = model.y.observable;
  const framed = o === "dsigma/dOmega" || o === "dsigma/dcos";
  return { name: framed ? `${o} (${model.x.frame === "lab" ? "lab" : "CM"})` : o, unit: model.y.unit };
}

/** A file name part from an id or a name: lower-case letters, digits and dashes. */
export function fileSlug(text: string): string {
  const slug = text.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-+|-+$/g, "");
  return slug === "" ? "unnamed" : slug.slice(0, 60);
}

export interface FigureCsvFile {
  name: string;
  text: string;
  description: string;
}

/**
 * One CSV per dataset revision as plotted (`data-<dataset>-r<revision>.csv`) and one per drawn
 * prediction (`prediction-<layer id>.csv`). A prediction's parameters are the engine's
 * after defaults, taken again from the engine for the stored request, so that the hash in the
 * file is the hash of the parameters in the file.
 */
export function figureCsvFiles(model: FigureModel, data: FigureData): FigureCsvFile[] {
  const x = xQuantity(model);
  const y = yQuantity(model);
  const files: FigureCsvFile[] = [];
  for (const panel of data.panels) {
    for (const series of panel.datasets) {
      if (series.input === null) continue;
      const input = series.input;
      const table: PlottedDataTable = {
        datasetName: input.datasetName,
        datasetId: input.datasetId,
        revisionNumber: input.revisionNumber,
        revisionId: input.revisionId,
        contentHash: input.contentHash,
        x,
        y,
        rows: series.points,
      };
      const name = `data-${fileSlug(input.datasetName)}-r${input.revisionNumber}.csv`;
      const text = plottedDataCsv(table);
      // The same revision in two panels plots the same points: one file.
      if (files.some((f) => f.name === name && f.text === text)) continue;
      files.push({
        name,
        text,
        description: `dataset "${input.datasetName}", revision ${input.revisionNumber}, as plotted (figure axes and unit)`,
      });
    }
    for (const series of panel.predictions) {
      if (series.request === null || series.engineVersion === null || series.parametersHash === null) continue;
      const response = runPrediction(series.request);
      if (response.parametersHash !== series.parametersHash) throw new Error(`prediction ${series.layer.id}: the engine gives parameters hash ${response.parametersHash}, the figure data ${series.parametersHash}`);
      const table: PredictionTable = {
        layerId: series.layer.id,
        label: series.layer.label,
        engineVersion: series.engineVersion,
        parameters: response.parameters,
        parametersHash: series.parametersHash,
        x,
        y,
        curve: series.curve,
        band: series.band?.map(({ low, high }) => ({ low, high })) ?? null,
      };
      files.push({
        name: `prediction-${fileSlug(series.layer.id)}.csv`,
        text: predictionTableCsv(table),
        description: `prediction "${series.layer.id}" as drawn, engine ${series.engineVersion}, parameters in the header`,
      });
    }
  }
  return withUniqueNames(files);
}

/** Layer ids are unique, their slugs may not be ("a_b" and "a-b"): a repeated name gets -2, -3, … */
function withUniqueNames(files: FigureCsvFile[]): FigureCsvFile[] {
  const seen = new Set<string>();
  return files.map((f) => {
    let name = f.name;
    for (let n = 2; seen.has(name); n++) name = f.name.replace(/\.csv$/, `-${n}.csv`);
    seen.add(name);
    return { ...f, name };
  });
}

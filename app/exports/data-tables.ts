// The numbers behind a figure as CSV for the submission bundle: one table per dataset revision as
// plotted, one per prediction as drawn. Pure: runs in the browser too.
import { commentLine, csvDocument, csvRow } from "./csv";

/** What an axis column holds: a name for the header comment and a unit for the column headers. */
export interface AxisQuantity {
  /** e.g. "theta (lab)", "dsigma/dOmega (lab)". */
  name: string;
  /** e.g. "deg", "ub/sr"; "1" for a pure number. */
  unit: string;
}

/** A measured point as plotted: errors [down, up], both ≥ 0, in the y unit. */
export interface PlottedRow {
  x: number;
  bin: [number, number] | null;
  y: number;
  stat: [number, number];
  total: [number, number];
}

export interface PlottedDataTable {
  datasetName: string;
  datasetId: string;
  revisionNumber: number;
  revisionId: string;
  /** SHA-256 of the revision's content, as stored with the revision. */
  contentHash: string;
  x: AxisQuantity;
  y: AxisQuantity;
  rows: PlottedRow[];
}

export interface PredictionTable {
  /** The layer's id in the figure model and its label (TeX). */
  layerId: string;
  label: string;
  engineVersion: string;
  /** The engine's parameters after defaults, exactly what `parametersHash` is the hash of. */
  parameters: unknown;
  parametersHash: string;
  x: AxisQuantity;
  y: AxisQuantity;
  curve: { x: number; y: number }[];
  /** The band's edges at the curve's x values, when the layer has a band. */
  band: { low: number; high: number }[] | null;
}

const withUnit = (column: string, unit: string) => `${column} [${unit}]`;

/**
 * One dataset revision as plotted: columns x, x_low, x_high (empty for a point measurement), y,
 * the statistical and the total error (down, up), each header with its unit. Header comments name
 * the revision and its content hash, so the table can be traced to the stored revision.
 */
export function plottedDataCsv(table: PlottedDataTable): string {
  const { x, y } = table;
  return csvDocument([
    commentLine("dataset", table.datasetName),
    commentLine("dataset id", table.datasetId),
    commentLine("revision", table.revisionNumber),
    commentLine("revision id", table.revisionId),
    commentLine("content sha256", table.contentHash),
    commentLine("x", x.name),
    commentLine("y", y.name),
    commentLine("errors", "as plotted; down and up both >= 0; total = stat and syst added in quadrature"),
    csvRow([
      withUnit("x", x.unit), withUnit("x_low", x.unit), withUnit("x_high", x.unit), withUnit("y", y.unit),
      withUnit("stat_down", y.unit), withUnit("stat_up", y.unit), withUnit("total_down", y.unit), withUnit("total_up", y.unit),
    ]),
    ...table.rows.map((r) => csvRow([r.x, r.bin?.[0] ?? null, r.bin?.[1] ?? null, r.y, r.stat[0], r.stat[1], r.total[0], r.total[1]])),
  ]);
}

/**
 * One prediction as drawn: x and y (and the band's low and high edge when there is one). Header
 * comments carry the engine version, the parameters as JSON and their hash, so that anyone can
 * recompute the curve with the same engine and check the hash.
 */
export function predictionTableCsv(table: PredictionTable): string {
  const { x, y, band } = table;
  if (band !== null && band.length !== table.curve.length) throw new Error(`prediction ${table.layerId}: ${band.length} band points for ${table.curve.length} curve points`);
  const header = [withUnit("x", x.unit), withUnit("y", y.unit), ...(band ? [withUnit("y_low", y.unit), withUnit("y_high", y.unit)] : [])];
  return csvDocument([
    commentLine("prediction", table.layerId),
    commentLine("label", table.label),
    commentLine("engine version", table.engineVersion),
    commentLine("parameters sha256", table.parametersHash),
    commentLine("parameters", table.parameters),
    commentLine("x", x.name),
    commentLine("y", y.name),
    csvRow(header),
    ...table.curve.map((p, i) => csvRow(band ? [p.x, p.y, band[i].low, band[i].high] : [p.x, p.y])),
  ]);
}

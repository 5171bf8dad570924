import type { QuantityDescription } from "~/datasets";

/** One row of a dataset revision in canonical units (x: degrees, 1, GeV² or GeV; y natural). */
export interface RevisionRowInput {
  x: number;
  xLow: number | null;
  xHigh: number | null;
  y: number;
  statMinus: number | null;
  statPlus: number | null;
  systMinus: number | null;
  systPlus: number | null;
}

/** A dataset layer's revision as the figure needs it, loaded by the server from its pinned revision. */
export interface DatasetInput {
  datasetId: string;
  datasetName: string;
  revisionNumber: number;
  revisionId: string;
  contentHash: string;
  /** The newest revision of the dataset, so the page can offer to move the layer to it. */
  latestRevisionNumber: number;
  quantity: QuantityDescription;
  rows: RevisionRowInput[];
}

/** Keyed by `${datasetId}/r${revisionNumber}`. */
export type DatasetInputs = Readonly<Record<string, DatasetInput>>;

export function datasetInputKey(datasetId: string, revisionNumber: number): string {
  return `${datasetId}/r${revisionNumber}`;
}

/** A problem of one layer (or of the figure when layerId is null), shown beside it. */
export interface FigureProblem {
  layerId: string | null;
  message: string;
}

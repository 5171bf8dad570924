import { canonicalJson } from "~/engine";
import type { SnapshotDataset, SnapshotPrediction, VersionSnapshot } from "./version-snapshot";

/** One changed value: `before` undefined when it was added, `after` undefined when removed. */
export interface ValueChange {
  path: string;
  before?: unknown;
  after?: unknown;
}

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);
const same = (a: unknown, b: unknown) => canonicalJson(a) === canonicalJson(b);
const hasIds = (v: unknown[]) => v.length > 0 && v.every((x) => isObject(x) && typeof x.id === "string");

/**
 * The changes between two JSON values, as dotted paths. Lists of objects with an `id` (panels,
 * layers) are matched by id and named by it (`panels[main].layers[prediction-1].energy.value`),
 * so that reordering or inserting a layer does not read as every layer changing; lists of plain
 * values (a range, a position) are compared whole.
 */
export function diffJson(before: unknown, after: unknown, path = ""): ValueChange[] {
  if (same(before, after)) return [];
  if (isObject(before) && isObject(after)) {
    const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])].sort();
    return keys.flatMap((k) => {
      const p = path === "" ? k : `${path}.${k}`;
      if (!(k in before)) return [{ path: p, after: after[k] }];
      if (!(k in after)) return [{ path: p, before: before[k] }];
      return diffJson(before[k], after[k], p);
    });
  }
  if (Array.isArray(before) && Array.isArray(after) && (hasIds(before) || hasIds(after)) && [...before, ...after].every((x) => isObject(x) && typeof x.id === "string")) {
    const byId = (list: unknown[]) => new Map(list.map((x) => [(x as { id: string }).id, x]));
    const a = byId(before);
    const b = byId(after);
    const out: ValueChange[] = [];
    for (const [id, x] of a) {
      const p = `${path}[${id}]`;
      if (!b.has(id)) out.push({ path: p, before: x });
      else out.push(...diffJson(x, b.get(id), p));
    }
    for (const [id, x] of b) if (!a.has(id)) out.push({ path: `${path}[${id}]`, after: x });
    const orderA = [...a.keys()].filter((id) => b.has(id));
    const orderB = [...b.keys()].filter((id) => a.has(id));
    if (!same(orderA, orderB)) out.push({ path: `${path} (order)`, before: orderA, after: orderB });
    return out;
  }
  return [{ path, before, after }];
}

// The sampled abscissa of a drawn curve is not a parameter: it is listed as the table's x.
const ABSCISSA_KEYS = new Set(["thetaDeg", "cosTheta", "t", "thetaDegBins", "cosThetaBins", "tBins"]);

/** A prediction's request without the sampled grid: what a physicist calls its parameters. */
export function requestParameters(request: Record<string, unknown> | null): Record<string, unknown> | null {
  if (request === null) return null;
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(request)) {
    if (k === "scan" && isObject(v)) out.scan = Object.fromEntries(Object.entries(v).filter(([, x]) => !Array.isArray(x)));
    else if (!("scan" in request) && ABSCISSA_KEYS.has(k)) continue;
    else out[k] = v;
  }
  return out;
}

export interface PredictionChange {
  key: string;
  panelId: string;
  layerId: string;
  label: string;
  status: "added" | "removed" | "changed" | "unchanged";
  engineVersion: { before: string | null; after: string | null } | null;
  parametersHash: { before: string | null; after: string | null } | null;
  parameters: ValueChange[];
  /** Largest |Δy|/|y| over the curve where both tables share the same x; null if the grids differ. */
  largestRelativeChange: number | null;
  gridChanged: boolean;
}

export interface DatasetChange {
  datasetId: string;
  datasetName: string;
  before: SnapshotDataset[];
  after: SnapshotDataset[];
  status: "added" | "removed" | "changed" | "unchanged";
}

export interface VersionComparison {
  model: ValueChange[];
  engineVersion: { before: string; after: string };
  predictions: PredictionChange[];
  datasets: DatasetChange[];
  svgChanged: boolean;
}

function largestRelativeChange(a: SnapshotPrediction, b: SnapshotPrediction): number | null {
  if (!same(a.table.x, b.table.x)) return null;
  let worst = 0;
  a.table.y.forEach((ya, i) => {
    const yb = b.table.y[i];
    if (ya === null || yb === null) {
      if (ya !== yb) worst = Number.POSITIVE_INFINITY;
      return;
    }
    const scale = Math.max(Math.abs(ya), Math.abs(yb));
    if (scale > 0) worst = Math.max(worst, Math.abs(ya - yb) / scale);
  });
  return worst;
}

function comparePrediction(key: string, a: SnapshotPrediction | undefined, b: SnapshotPrediction | undefined): PredictionChange {
  const any = (b ?? a)!;
  const base = { key, panelId: any.panelId, layerId: any.layerId, label: any.label };
  if (!a || !b) {
    return { ...base, status: a ? "removed" : "added", engineVersion: null, parametersHash: null, parameters: [], largestRelativeChange: null, gridChanged: false };
  }
  const parameters = diffJson(requestParameters(a.request), requestParameters(b.request));
  const engineVersion = a.engineVersion === b.engineVersion ? null : { before: a.engineVersion, after: b.engineVersion };
  const parametersHash = a.parametersHash === b.parametersHash ? null : { before: a.parametersHash, after: b.parametersHash };
  const tablesSame = same(a.table, b.table) && same(a.band, b.band);
  return {
    ...base,
    status: parameters.length === 0 && engineVersion === null && parametersHash === null && tablesSame ? "unchanged" : "changed",
    engineVersion,
    parametersHash,
    parameters,
    largestRelativeChange: largestRelativeChange(a, b),
    gridChanged: !same(a.table.x, b.table.x),
  };
}

/** What changed from one sealed version to another: model, predictions, engine, datasets, picture. */
export function compareVersions(before: { snapshot: VersionSnapshot; svgSha256: string }, after: { snapshot: VersionSnapshot; svgSha256: string }): VersionComparison {
  const a = before.snapshot;
  const b = after.snapshot;
  const keyOf = (p: SnapshotPrediction) => `${p.panelId}/${p.layerId}`;
  const pa = new Map(a.predictions.map((p) => [keyOf(p), p]));
  const pb = new Map(b.predictions.map((p) => [keyOf(p), p]));
  const keys = [...new Set([...pa.keys(), ...pb.keys()])];
  const datasetIds = [...new Set([...a.datasets, ...b.datasets].map((d) => d.datasetId))];
  const datasets = datasetIds.map((id): DatasetChange => {
    const da = a.datasets.filter((d) => d.datasetId === id);
    const db = b.datasets.filter((d) => d.datasetId === id);
    const status = da.length === 0 ? "added" : db.length === 0 ? "removed" : same(da.map((d) => d.contentHash), db.map((d) => d.contentHash)) ? "unchanged" : "changed";
    return { datasetId: id, datasetName: (db[0] ?? da[0]).datasetName, before: da, after: db, status };
  });
  return {
    model: diffJson(a.model, b.model),
    engineVersion: { before: a.engineVersion, after: b.engineVersion },
    predictions: keys.map((k) => comparePrediction(k, pa.get(k), pb.get(k))),
    datasets,
    svgChanged: before.svgSha256 !== after.svgSha256,
  };
}

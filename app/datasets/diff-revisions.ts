/** One normalised row of a revision, as stored; null where the revision has no such column. */
export interface RevisionRow {
  x: number;
  xLow: number | null;
  xHigh: number | null;
  y: number;
  statMinus: number | null;
  statPlus: number | null;
  systMinus: number | null;
  systPlus: number | null;
}

export const REVISION_ROW_FIELDS = ["x", "xLow", "xHigh", "y", "statMinus", "statPlus", "systMinus", "systPlus"] as const;
export type RevisionRowField = (typeof REVISION_ROW_FIELDS)[number];

export interface ChangedRow {
  old: RevisionRow;
  new: RevisionRow;
  changes: { field: RevisionRowField; old: number | null; new: number | null }[];
}

export interface RevisionDiff {
  /** What rows were matched by: the bin when both revisions have bins, x otherwise. */
  keyedBy: "bin" | "x";
  added: RevisionRow[];
  removed: RevisionRow[];
  changed: ChangedRow[];
  addedCount: number;
  removedCount: number;
  changedCount: number;
  unchangedCount: number;
  /** "r1 → r2: 3 added, 1 removed, 5 changed, 40 unchanged" */
  summary: string;
}

export interface DiffSide {
  /** How the revision is named in the summary, e.g. "r1". */
  label: string;
  rows: readonly RevisionRow[];
}

/**
 * Compares two revisions row by row. Rows are matched by their bin when both revisions have
 * bins (so moving x inside its bin reads as a change, not as a removal plus an addition),
 * by x otherwise. Values are compared exactly: both sides are in the normal form already.
 * `maxListed` bounds the listed rows of each kind for very large revisions; counts are exact.
 */
export function diffRevisions(from: DiffSide, to: DiffSide, options: { maxListed?: number } = {}): RevisionDiff {
  const maxListed = options.maxListed ?? Number.POSITIVE_INFINITY;
  const hasBins = (rows: readonly RevisionRow[]) => rows.length > 0 && rows.every((r) => r.xLow !== null && r.xHigh !== null);
  const keyedBy = hasBins(from.rows) && hasBins(to.rows) ? "bin" : "x";
  const keyOf = keyedBy === "bin" ? (r: RevisionRow) => `${r.xLow}|${r.xHigh}` : (r: RevisionRow) => String(r.x);

  // A queue per key keeps the comparison total even if a key repeats (possible when the
  // two revisions were keyed differently at upload, e.g. one had bins and one did not).
  const pending = new Map<string, RevisionRow[]>();
  for (const row of from.rows) {
    const key = keyOf(row);
    const queue = pending.get(key);
    if (queue === undefined) pending.set(key, [row]);
    else queue.push(row);
  }

  const result: RevisionDiff = {
    keyedBy,
    added: [],
    removed: [],
    changed: [],
    addedCount: 0,
    removedCount: 0,
    changedCount: 0,
    unchangedCount: 0,
    summary: "",
  };
  for (const row of to.rows) {
    const queue = pending.get(keyOf(row));
    const old = queue?.shift();
    if (queue !== undefined && queue.length === 0) pending.delete(keyOf(row));
    if (old === undefined) {
      result.addedCount++;
      if (result.added.length < maxListed) result.added.push(row);
      continue;
    }
    const changes: ChangedRow["changes"] = [];
    for (const field of REVISION_ROW_FIELDS) {
      if (!Object.is(old[field], row[field])) changes.push({ field, old: old[field], new: row[field] });
    }
    if (changes.length === 0) {
      result.unchangedCount++;
    } else {
      result.changedCount++;
      if (result.changed.length < maxListed) result.changed.push({ old, new: row, changes });
    }
  }
  for (const row of from.rows) {
    const queue = pending.get(keyOf(row));
    if (queue === undefined || queue[0] !== row) continue;
    queue.shift();
    result.removedCount++;
    if (result.removed.length < maxListed) result.removed.push(row);
  }
  result.summary = `${from.label} → ${to.label}: ${result.addedCount} added, ${result.removedCount} removed, ${result.changedCount} changed, ${result.unchangedCount} unchanged`;
  return result;
}

export interface RowDelta {
  /** Δ = y(to) − y(from), in the normal form's units. */
  delta: number;
  /** Δ / |y(from)|; null when y(from) is 0. */
  relative: number | null;
  /** σ = √(σ_from² + σ_to²), each σ the stat and syst errors added in quadrature; 0 when no errors are given. */
  sigma: number;
  /** Δ / σ; null when σ is 0. */
  pull: number | null;
}

/**
 * How far a row moved between two revisions, in units of their combined uncertainty:
 * Δ/σ = (y₂ − y₁) / √(σ₁² + σ₂²) with σᵢ² = statᵢ² + systᵢ² — the standard difference of two
 * independent measurements (e.g. PDG, Review of Particle Physics, "Statistics", combination of
 * independent errors; common practice). With asymmetric errors each side contributes the error
 * that points toward the other value (from's + error and to's − error when y rises). Two
 * revisions of one measurement usually share part of their errors, so this σ is an upper bound
 * and Δ/σ a lower bound on the significance of the change; the compare page says so.
 */
export function rowDelta(from: RevisionRow, to: RevisionRow): RowDelta {
  const delta = to.y - from.y;
  const up = delta >= 0;
  const side = (r: RevisionRow, plus: boolean) => {
    const stat = (plus ? r.statPlus : r.statMinus) ?? 0;
    const syst = (plus ? r.systPlus : r.systMinus) ?? 0;
    return stat * stat + syst * syst;
  };
  const sigma = Math.sqrt(side(from, up) + side(to, !up));
  return { delta, relative: from.y === 0 ? null : delta / Math.abs(from.y), sigma, pull: sigma === 0 ? null : delta / sigma };
}

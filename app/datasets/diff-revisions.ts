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

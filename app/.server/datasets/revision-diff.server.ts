import { sql } from "kysely";
import { REVISION_ROW_FIELDS, type ChangedRow, type RevisionDiff, type RevisionRow } from "~/datasets/diff-revisions";
import type { Db } from "../platform/db.server";

const COLUMNS = { x: "x", xLow: "x_low", xHigh: "x_high", y: "y", statMinus: "stat_minus", statPlus: "stat_plus", systMinus: "syst_minus", systPlus: "syst_plus" } as const;

type Joined = Record<string, number | null>;

function side(r: Joined, p: "a" | "b"): RevisionRow {
  return Object.fromEntries(REVISION_ROW_FIELDS.map((f) => [f, r[`${p}_${COLUMNS[f]}`] as number | null])) as unknown as RevisionRow;
}

/**
 * The row-by-row comparison of two revisions, computed in PostgreSQL so that revisions of
 * millions of rows are never held in the server's memory; only `maxListed` rows of each kind
 * come back. Same rules as the pure `diffRevisions` (rows matched by their bin when both
 * revisions have bins, by x otherwise; exact comparison of normal-form values), which the
 * tests use as its reference. A revision never repeats a key (the upload refuses duplicates).
 */
export async function diffRevisionsInDatabase(
  db: Db,
  from: { id: string; label: string },
  to: { id: string; label: string },
  maxListed = 500,
): Promise<RevisionDiff> {
  const binned = await sql<{ both: boolean }>`
    SELECT count(*) = 2 AND bool_and(has) AS both FROM (
      SELECT bool_and(x_low IS NOT NULL AND x_high IS NOT NULL) AND count(*) > 0 AS has
      FROM dataset_row WHERE revision_id IN (${from.id}, ${to.id}) GROUP BY revision_id
    ) s`.execute(db);
  const keyedBy: RevisionDiff["keyedBy"] = binned.rows[0]?.both ? "bin" : "x";
  const on = keyedBy === "bin" ? sql`a.x_low = b.x_low AND a.x_high = b.x_high` : sql`a.x = b.x`;
  const differs = sql.join(Object.values(COLUMNS).map((c) => sql`a.${sql.ref(c)} IS DISTINCT FROM b.${sql.ref(c)}`), sql` OR `);
  const pick = sql.join(
    (["a", "b"] as const).flatMap((p) => [sql`${sql.ref(`${p}.idx`)} AS ${sql.ref(`${p}_idx`)}`, ...Object.values(COLUMNS).map((c) => sql`${sql.ref(`${p}.${c}`)} AS ${sql.ref(`${p}_${c}`)}`)]),
    sql`, `,
  );
  const joined = sql`
    (SELECT * FROM dataset_row WHERE revision_id = ${from.id}) a
    FULL JOIN (SELECT * FROM dataset_row WHERE revision_id = ${to.id}) b ON ${on}`;

  const counts = await sql<{ added: number; removed: number; changed: number; unchanged: number }>`
    SELECT count(*) FILTER (WHERE a.idx IS NULL)::int AS added,
           count(*) FILTER (WHERE b.idx IS NULL)::int AS removed,
           count(*) FILTER (WHERE a.idx IS NOT NULL AND b.idx IS NOT NULL AND (${differs}))::int AS changed,
           count(*) FILTER (WHERE a.idx IS NOT NULL AND b.idx IS NOT NULL AND NOT (${differs}))::int AS unchanged
    FROM ${joined}`.execute(db);
  const list = (where: ReturnType<typeof sql>, order: "a" | "b") =>
    sql<Joined>`SELECT ${pick} FROM ${joined} WHERE ${where} ORDER BY ${sql.ref(`${order}.idx`)} LIMIT ${maxListed}`.execute(db);
  const [added, removed, changed] = await Promise.all([
    list(sql`a.idx IS NULL`, "b"),
    list(sql`b.idx IS NULL`, "a"),
    list(sql`a.idx IS NOT NULL AND b.idx IS NOT NULL AND (${differs})`, "b"),
  ]);
  const c = counts.rows[0];
  return {
    keyedBy,
    added: added.rows.map((r) => side(r, "b")),
    removed: removed.rows.map((r) => side(r, "a")),
    changed: changed.rows.map((r): ChangedRow => {
      const old = side(r, "a");
      const now = side(r, "b");
      return { old, new: now, changes: REVISION_ROW_FIELDS.filter((f) => !Object.is(old[f], now[f])).map((f) => ({ field: f, old: old[f], new: now[f] })) };
    }),
    addedCount: c.added,
    removedCount: c.removed,
    changedCount: c.changed,
    unchangedCount: c.unchanged,
    summary: `${from.label} → ${to.label}: ${c.added} added, ${c.removed} removed, ${c.changed} changed, ${c.unchanged} unchanged`,
  };
}

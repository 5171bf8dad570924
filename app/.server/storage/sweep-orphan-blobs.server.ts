import { readdir, rm, stat } from "node:fs/promises";
import path from "node:path";
import { sql } from "kysely";
import type { Db } from "../platform/db.server";

const BLOB_NAME = /^[0-9a-f]{64}$/;

/**
 * Every blob key the database names: the values of every text column called `*_key` in the
 * public schema (dataset_revision.raw_key, figure_export.bundle_key; a table that stores blobs later names its
 * column the same way, docs/decisions/0012-hardening.md), and the files of finished exports.
 */
async function referencedKeys(db: Db): Promise<Set<string>> {
  const columns = await sql<{ table_name: string; column_name: string }>`
    SELECT c.table_name, c.column_name FROM information_schema.columns c
    JOIN information_schema.tables t ON t.table_schema = c.table_schema AND t.table_name = c.table_name
    WHERE c.table_schema = 'public' AND t.table_type = 'BASE TABLE' AND c.column_name LIKE '%\\_key' AND c.data_type = 'text'`.execute(db);
  const keys = new Set<string>();
  for (const { table_name, column_name } of columns.rows) {
    const rows = await sql<{ key: string | null }>`SELECT DISTINCT ${sql.ref(column_name)} AS key FROM ${sql.table(table_name)}`.execute(db);
    for (const r of rows.rows) if (r.key) keys.add(r.key);
  }
  // A finished export names its four files in figure_export.files ({"figure.pdf": {key, …}, …});
  // the bundle's key is also in figure_export.bundle_key above.
  const exportFiles = await sql<{ key: string }>`
    SELECT DISTINCT f.value->>'key' AS key FROM figure_export e, jsonb_each(e.files) f
    WHERE e.files IS NOT NULL AND f.value ? 'key'`.execute(db);
  for (const r of exportFiles.rows) if (r.key) keys.add(r.key);
  return keys;
}

/**
 * Removes stored files of the local store that no row names: a crash between storing an
 * upload's file and committing its revision leaves one behind. Run at start-up only, before
 * the server takes requests (an upload in flight would otherwise lose its file). Returns how
 * many were removed.
 */
export async function sweepOrphanBlobs(db: Db, root: string): Promise<number> {
  const keys = await referencedKeys(db);
  // An export being drawn by a worker elsewhere (`npm run worker`) stores its files before its row
  // names them: files written since the oldest such job started are left for it.
  const rendering = await db
    .selectFrom("figure_export")
    .select((eb) => eb.fn.min("started_at").as("since"))
    .where("state", "=", "rendering")
    .executeTakeFirst();
  const keepNewerThan = rendering?.since ? new Date(rendering.since).getTime() : Number.POSITIVE_INFINITY;
  const blobs = path.join(root, "blobs");
  let removed = 0;
  let entries: string[];
  try {
    entries = await readdir(blobs, { recursive: true });
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === "ENOENT") return 0;
    throw e;
  }
  for (const rel of entries) {
    if (!BLOB_NAME.test(path.basename(rel))) continue;
    const key = `blobs/${rel.split(path.sep).join("/")}`;
    if (keys.has(key)) continue;
    if (Number.isFinite(keepNewerThan) && (await stat(path.join(blobs, rel))).mtimeMs >= keepNewerThan) continue;
    await rm(path.join(blobs, rel), { force: true });
    removed++;
  }
  return removed;
}

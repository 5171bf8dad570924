import { pipeline } from "node:stream/promises";
import { Readable } from "node:stream";
import { from as copyFrom } from "pg-copy-streams";
import type { ColumnMapping } from "~/datasets/column-mapping";
import type { QuantityDescription } from "~/datasets/quantity";
import type { IngestColumns } from "./csv/ingest-csv.server";
import { type Db, pool } from "../platform/db.server";
import type { RowSort } from "~/revision-row-sorts";

export interface DatasetMetadata {
  process: string | null;
  beamEnergyGeV: number | null;
  target: string | null;
  description: string;
}

export async function createDataset(
  db: Db,
  args: { manuscriptId: string; userId: string; name: string; quantity: QuantityDescription; mapping: ColumnMapping | null; metadata: DatasetMetadata; isDemo?: boolean },
) {
  return db
    .insertInto("dataset")
    .values({
      manuscript_id: args.manuscriptId,
      name: args.name,
      quantity: JSON.stringify(args.quantity),
      mapping: args.mapping ? JSON.stringify(args.mapping) : null,
      process: args.metadata.process,
      beam_energy_gev: args.metadata.beamEnergyGeV,
      target: args.metadata.target,
      description: args.metadata.description,
      is_demo: args.isDemo ?? false,
      created_by: args.userId,
    })
    .returning(["id", "name", "created_at"])
    .executeTakeFirstOrThrow();
}

export async function listDatasets(db: Db, manuscriptId: string) {
  return db
    .selectFrom("dataset")
    .select((eb) => [
      "dataset.id", "dataset.name", "dataset.quantity", "dataset.process", "dataset.beam_energy_gev", "dataset.target", "dataset.description", "dataset.is_demo", "dataset.created_at",
      eb.selectFrom("dataset_revision").select((e2) => e2.fn.max("dataset_revision.number").as("n")).whereRef("dataset_revision.dataset_id", "=", "dataset.id").as("latestRevision"),
    ])
    .where("manuscript_id", "=", manuscriptId)
    // A retired dataset leaves the lists; its page and revisions stay readable by address.
    .where("retired_at", "is", null)
    .orderBy("created_at", "asc")
    .execute();
}

export async function findDataset(db: Db, manuscriptId: string, datasetId: string) {
  if (!/^[0-9a-f-]{36}$/i.test(datasetId)) return undefined;
  return db.selectFrom("dataset").selectAll().where("id", "=", datasetId).where("manuscript_id", "=", manuscriptId).executeTakeFirst();
}

export async function listRevisions(db: Db, datasetId: string) {
  return db
    .selectFrom("dataset_revision")
    .innerJoin("app_user", "app_user.id", "dataset_revision.created_by")
    .select(["dataset_revision.id", "number", "content_hash", "raw_sha256", "raw_filename", "raw_bytes", "row_count", "dataset_revision.created_at", "app_user.name as uploaderName"])
    .where("dataset_id", "=", datasetId)
    .orderBy("number", "desc")
    .execute();
}

export async function findRevision(db: Db, datasetId: string, number: number) {
  return db.selectFrom("dataset_revision").selectAll().where("dataset_id", "=", datasetId).where("number", "=", number).executeTakeFirst();
}


export async function revisionRowsPage(db: Db, revisionId: string, page: { offset: number; limit: number; sort: RowSort; dir: "asc" | "desc" }) {
  return db
    .selectFrom("dataset_row")
    .select(["idx", "x", "x_low", "x_high", "y", "stat_minus", "stat_plus", "syst_minus", "syst_plus"])
    .where("revision_id", "=", revisionId)
    .orderBy(page.sort, page.dir)
    .orderBy("idx", "asc")
    .offset(page.offset)
    .limit(page.limit)
    .execute();
}


export type SaveRevisionResult =
  | { created: true; revision: { id: string; number: number; contentHash: string; rowCount: number } }
  | { created: false; identicalTo: { id: string; number: number; contentHash: string; rowCount: number } };

/**
 * Stores a validated revision: the next number, its metadata, and its rows by COPY, in one
 * transaction. Content identical to an existing revision creates nothing and names it. The
 * dataset row is locked so that two concurrent uploads cannot take the same number.
 */
export async function saveRevision(args: {
  datasetId: string;
  userId: string;
  contentHash: string;
  raw: { sha256: string; key: string; fileName: string; bytes: number };
  quantity: QuantityDescription;
  mapping: ColumnMapping;
  rowCount: number;
  columns: IngestColumns;
}): Promise<SaveRevisionResult> {
  const client = await pool.connect();
  try {
    await client.query("BEGIN");
    await client.query("SELECT 1 FROM dataset WHERE id = $1 FOR UPDATE", [args.datasetId]);
    const same = await client.query<{ id: string; number: number; row_count: number }>(
      "SELECT id, number, row_count FROM dataset_revision WHERE dataset_id = $1 AND content_hash = $2",
      [args.datasetId, args.contentHash],
    );
    if (same.rows[0]) {
      await client.query("ROLLBACK");
      const r = same.rows[0];
      return { created: false, identicalTo: { id: r.id, number: r.number, contentHash: args.contentHash, rowCount: r.row_count } };
    }
    const inserted = await client.query<{ id: string; number: number }>(
      `INSERT INTO dataset_revision (dataset_id, number, content_hash, raw_sha256, raw_key, raw_filename, raw_bytes, row_count, quantity, mapping, created_by)
       SELECT $1, COALESCE(MAX(number), 0) + 1, $2, $3, $4, $5, $6, $7, $8, $9, $10 FROM dataset_revision WHERE dataset_id = $1
       RETURNING id, number`,
      [args.datasetId, args.contentHash, args.raw.sha256, args.raw.key, args.raw.fileName, args.raw.bytes, args.rowCount, JSON.stringify(args.quantity), JSON.stringify(args.mapping), args.userId],
    );
    const rev = inserted.rows[0];
    const copy = client.query(copyFrom("COPY dataset_row (revision_id, idx, x, x_low, x_high, y, stat_minus, stat_plus, syst_minus, syst_plus) FROM STDIN WITH (FORMAT binary)"));
    await pipeline(Readable.from(copyBinary(rev.id, args.rowCount, args.columns)), copy);
    await client.query("UPDATE dataset SET mapping = $2 WHERE id = $1", [args.datasetId, JSON.stringify(args.mapping)]);
    await client.query("COMMIT");
    return { created: true, revision: { id: rev.id, number: rev.number, contentHash: args.contentHash, rowCount: args.rowCount } };
  } catch (e) {
    await client.query("ROLLBACK").catch(() => undefined);
    throw e;
  } finally {
    client.release();
  }
}

/**
 * COPY's binary format (PostgreSQL manual, "COPY", binary file format): the server reads the
 * doubles as they are, with no text formatting here or float parsing there — the costliest
 * part of a text COPY of a large revision. Absent columns are NULL (length −1).
 */
function* copyBinary(revisionId: string, n: number, c: IngestColumns): Generator<Buffer> {
  const cols = [c.x, c.xLow, c.xHigh, c.y, c.statMinus, c.statPlus, c.systMinus, c.systPlus];
  const uuid = Buffer.from(revisionId.replace(/-/g, ""), "hex");
  const header = Buffer.alloc(19);
  Buffer.from("PGCOPY\n\xff\r\n\0", "latin1").copy(header, 0);
  yield header; // flags and header-extension length stay 0
  const ROWS = 4096;
  const rowBytes = 2 + (4 + 16) + (4 + 4) + cols.reduce((sum, col) => sum + (col ? 12 : 4), 0);
  for (let start = 0; start < n; start += ROWS) {
    const end = Math.min(n, start + ROWS);
    const buf = Buffer.allocUnsafe((end - start) * rowBytes);
    let o = 0;
    for (let i = start; i < end; i++) {
      o = buf.writeInt16BE(10, o);
      o = buf.writeInt32BE(16, o);
      o += uuid.copy(buf, o);
      o = buf.writeInt32BE(4, o);
      o = buf.writeInt32BE(i, o);
      for (const col of cols) {
        if (col) {
          o = buf.writeInt32BE(8, o);
          o = buf.writeDoubleBE(col[i], o);
        } else {
          o = buf.writeInt32BE(-1, o);
        }
      }
    }
    yield buf;
  }
  const trailer = Buffer.alloc(2);
  trailer.writeInt16BE(-1, 0);
  yield trailer;
}


import { randomUUID } from "node:crypto";
import { sql } from "kysely";
import type { PoolClient, QueryResultRow } from "pg";
import { type CopyStreamQuery, from as copyFrom } from "pg-copy-streams";
import type { ColumnMapping } from "~/datasets/column-mapping";
import type { RevisionRow } from "~/datasets/diff-revisions";
import type { QuantityDescription } from "~/datasets/quantity";
import { type Db, pool } from "./db.server";
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

export async function revisionRows(db: Db, revisionId: string): Promise<RevisionRow[]> {
  const rows = await db.selectFrom("dataset_row").selectAll().where("revision_id", "=", revisionId).orderBy("idx").execute();
  return rows.map((r) => ({ x: r.x, xLow: r.x_low, xHigh: r.x_high, y: r.y, statMinus: r.stat_minus, statPlus: r.stat_plus, systMinus: r.syst_minus, systPlus: r.syst_plus }));
}

export type SaveRevisionResult =
  | { created: true; revision: { id: string; number: number; contentHash: string; rowCount: number } }
  | { created: false; identicalTo: { id: string; number: number; contentHash: string; rowCount: number } };

type RevisionSummary = { id: string; number: number; contentHash: string; rowCount: number };

const COPY_ROWS =
  "COPY dataset_row (revision_id, idx, x, x_low, x_high, y, stat_minus, stat_plus, syst_minus, syst_plus) FROM STDIN WITH (FORMAT binary)";
const BATCH_ROWS = 4096;

/**
 * A revision's rows on their way into PostgreSQL while the file is still being read: a
 * transaction with a binary COPY into dataset_row under a revision id chosen here, the revision
 * row itself only at the end, once the content hash is known (the row → revision reference is
 * DEFERRABLE INITIALLY DEFERRED, migration 2026_12_01_1700). Nothing is visible to anyone
 * before `commit`; `abort` (a refused file, an error) rolls everything back. Memory is one
 * batch of rows plus what the COPY stream buffers: `row` answers with a promise whenever the
 * stream asks the reader to wait. See docs/decisions/0005-streamed-copy.md.
 *
 * The connection is taken at the first full batch, so a small file refused for its problems
 * never touches the database; it is released before `complete`/`commit`/`abort` return, so an
 * upload never holds two pool connections at once.
 */
export class RevisionRowCopy {
  readonly revisionId = randomUUID();
  private readonly uuid: Buffer;
  private readonly present: boolean[];
  private readonly rowBytes: number;
  private client: PoolClient | null = null;
  private copy: CopyStreamQuery | null = null;
  private failure: Error | null = null;
  private batch: Buffer;
  private offset = 0;
  private count = 0;
  private closed = false;
  private readonly onClientError = (e: Error) => {
    this.failure ??= e;
  };

  constructor(mapping: ColumnMapping) {
    this.uuid = Buffer.from(this.revisionId.replace(/-/g, ""), "hex");
    const bins = mapping.xLow !== undefined;
    // In SLOT order, which is also the order of the COPY's value columns.
    this.present = [true, bins, bins, true, mapping.stat !== undefined, mapping.stat !== undefined, mapping.syst !== undefined, mapping.syst !== undefined];
    this.rowBytes = 2 + (4 + 16) + (4 + 4) + this.present.reduce((sum, p) => sum + (p ? 12 : 4), 0);
    this.batch = Buffer.allocUnsafe(BATCH_ROWS * this.rowBytes);
  }

  /** One row in COPY's binary format (PostgreSQL manual, "COPY", binary file format). */
  row(values: Float64Array): void | Promise<void> {
    const buf = this.batch;
    let o = this.offset;
    o = buf.writeInt16BE(10, o);
    o = buf.writeInt32BE(16, o);
    o += this.uuid.copy(buf, o);
    o = buf.writeInt32BE(4, o);
    o = buf.writeInt32BE(this.count++, o);
    const present = this.present;
    for (let s = 0; s < 8; s++) {
      if (present[s]) {
        o = buf.writeInt32BE(8, o);
        o = buf.writeDoubleBE(values[s], o);
      } else {
        o = buf.writeInt32BE(-1, o);
      }
    }
    this.offset = o;
    if (o + this.rowBytes > buf.length) return this.flush();
  }

  /**
   * Ends the COPY and looks for a revision of the dataset with the same content; if there is
   * one, rolls back and names it. Otherwise the transaction stays open for `commit`.
   */
  async complete(datasetId: string, contentHash: string, rowCount: number): Promise<RevisionSummary | null> {
    try {
      await this.flush();
      const trailer = Buffer.alloc(2);
      trailer.writeInt16BE(-1, 0);
      await this.write(trailer);
      const copy = this.copy as CopyStreamQuery;
      await new Promise<void>((resolve, reject) => {
        copy.once("error", reject);
        copy.end(() => resolve());
      });
      if (this.failure) throw this.failure;
      if (copy.rowCount !== rowCount || this.count !== rowCount) {
        throw new Error(`COPY stored ${copy.rowCount} rows of ${this.count} sent; the file had ${rowCount}`);
      }
      const same = await this.query<{ id: string; number: number; row_count: number }>(
        "SELECT id, number, row_count FROM dataset_revision WHERE dataset_id = $1 AND content_hash = $2",
        [datasetId, contentHash],
      );
      if (!same.rows[0]) return null;
      await this.abort();
      const r = same.rows[0];
      return { id: r.id, number: r.number, contentHash, rowCount: r.row_count };
    } catch (e) {
      await this.abort();
      throw e;
    }
  }

  /**
   * After `complete` found nothing identical: locks the dataset row (so that concurrent uploads
   * take sequential numbers), checks once more for identical content committed meanwhile,
   * inserts the revision under the id the rows carry, saves the mapping and commits; the
   * deferred reference check of every row runs at this COMMIT.
   */
  async commit(args: {
    datasetId: string;
    userId: string;
    contentHash: string;
    raw: { sha256: string; key: string; fileName: string; bytes: number };
    quantity: QuantityDescription;
    mapping: ColumnMapping;
    rowCount: number;
  }): Promise<SaveRevisionResult> {
    try {
      await this.query("SELECT 1 FROM dataset WHERE id = $1 FOR UPDATE", [args.datasetId]);
      const same = await this.query<{ id: string; number: number; row_count: number }>(
        "SELECT id, number, row_count FROM dataset_revision WHERE dataset_id = $1 AND content_hash = $2",
        [args.datasetId, args.contentHash],
      );
      if (same.rows[0]) {
        await this.abort();
        const r = same.rows[0];
        return { created: false, identicalTo: { id: r.id, number: r.number, contentHash: args.contentHash, rowCount: r.row_count } };
      }
      const inserted = await this.query<{ number: number }>(
        `INSERT INTO dataset_revision (id, dataset_id, number, content_hash, raw_sha256, raw_key, raw_filename, raw_bytes, row_count, quantity, mapping, created_by)
         SELECT $1, $2, COALESCE(MAX(number), 0) + 1, $3, $4, $5, $6, $7, $8, $9, $10, $11 FROM dataset_revision WHERE dataset_id = $2
         RETURNING number`,
        [this.revisionId, args.datasetId, args.contentHash, args.raw.sha256, args.raw.key, args.raw.fileName, args.raw.bytes, args.rowCount, JSON.stringify(args.quantity), JSON.stringify(args.mapping), args.userId],
      );
      await this.query("UPDATE dataset SET mapping = $2 WHERE id = $1", [args.datasetId, JSON.stringify(args.mapping)]);
      await this.query("COMMIT");
      this.release(null);
      return { created: true, revision: { id: this.revisionId, number: inserted.rows[0].number, contentHash: args.contentHash, rowCount: args.rowCount } };
    } catch (e) {
      await this.abort();
      throw e;
    }
  }

  /** Rolls back whatever was sent (CopyFail if the COPY is still open) and frees the connection. */
  async abort(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    const client = this.client;
    if (client === null) return;
    const copy = this.copy;
    if (this.failure) {
      this.release(this.failure);
      return;
    }
    try {
      if (copy !== null && !copy.writableFinished && !copy.destroyed) {
        copy.on("error", () => undefined);
        await new Promise<void>((resolve) => {
          copy.once("close", () => resolve());
          copy.destroy(new Error("the upload was refused; its rows are rolled back"));
        });
      }
      await client.query("ROLLBACK");
      this.release(null);
    } catch (e) {
      // A connection in an unknown state is closed rather than reused; the server then rolls back.
      this.release(e as Error);
    }
  }

  private async flush(): Promise<void> {
    if (this.copy === null) await this.start();
    if (this.offset === 0) return;
    const full = this.batch.subarray(0, this.offset);
    // The stream keeps a reference to what it was given until it is sent.
    this.batch = Buffer.allocUnsafe(BATCH_ROWS * this.rowBytes);
    this.offset = 0;
    await this.write(full);
  }

  private async start(): Promise<void> {
    if (this.closed) throw new Error("the revision's rows were already rolled back");
    const client = await pool.connect();
    this.client = client;
    client.on("error", this.onClientError);
    await client.query("BEGIN");
    const copy = client.query(copyFrom(COPY_ROWS));
    copy.on("error", (e: Error) => {
      this.failure ??= e;
    });
    this.copy = copy;
    const header = Buffer.alloc(19);
    Buffer.from("PGCOPY\n\xff\r\n\0", "latin1").copy(header, 0);
    await this.write(header); // flags and header-extension length stay 0
  }

  private async write(chunk: Buffer): Promise<void> {
    const copy = this.copy as CopyStreamQuery;
    if (this.failure) throw this.failure;
    if (copy.destroyed) throw new Error("the COPY of the revision's rows ended early");
    if (copy.write(chunk)) return;
    await new Promise<void>((resolve, reject) => {
      const done = (error?: Error) => {
        copy.off("drain", done);
        copy.off("error", done);
        copy.off("close", done);
        const failure = error ?? this.failure ?? (copy.destroyed ? new Error("the COPY of the revision's rows ended early") : null);
        if (failure) reject(failure);
        else resolve();
      };
      copy.on("drain", done);
      copy.on("error", done);
      copy.on("close", done);
    });
  }

  private query<R extends QueryResultRow = QueryResultRow>(text: string, values?: unknown[]) {
    if (this.client === null || this.closed) throw new Error("the revision's transaction is not open");
    return this.client.query<R>(text, values);
  }

  private release(error: Error | null): void {
    const client = this.client;
    if (client === null) return;
    this.client = null;
    this.closed = true;
    client.off("error", this.onClientError);
    client.release(error ?? undefined);
  }
}

export async function revisionCount(db: Db, datasetId: string): Promise<number> {
  const r = await db.selectFrom("dataset_revision").select(sql<number>`count(*)::int`.as("n")).where("dataset_id", "=", datasetId).executeTakeFirstOrThrow();
  return r.n;
}

// Rows are copied into PostgreSQL while the file is still being read (decision 0005). A file
// large enough for several COPY batches, refused only at its very end, must still store
// nothing; identical content must leave no rows behind; concurrent uploads must still get
// sequential numbers; the deferred row → revision reference must still be enforced.
import { readdirSync } from "node:fs";
import path from "node:path";
import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { TEST_PASSWORD, createAccount, createManuscriptWith } from "../support/accounts";
import { createDatasetViaApi } from "../support/datasets";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { Client } from "../support/http";

const db = connect(testEnv.appDatabaseUrl);
let c: Client;
let manuscriptId: string;

// Well above one COPY batch (4096 rows), within the test server's row limit.
const ROWS = 15_000;

/** Synthetic angular rows (invented numbers), θ strictly increasing; `shift` changes every y. */
function bigCsv(n: number, shift = 0): string {
  let s = "theta,dsigma,stat\n";
  for (let i = 0; i < n; i++) s += `${((180 * (i + 0.5)) / n).toFixed(6)},${(1 + shift + (i % 89) / 100).toFixed(3)},0.05\n`;
  return s;
}

function blobCount(): number {
  const root = path.join(testEnv.storageDir, "blobs");
  let n = 0;
  const walk = (d: string) => {
    for (const e of readdirSync(d, { withFileTypes: true })) e.isDirectory() ? walk(path.join(d, e.name)) : n++;
  };
  try { walk(root); } catch { return 0; }
  return n;
}

async function counts() {
  const rows = await sql<{ n: number }>`SELECT count(*)::int AS n FROM dataset_row`.execute(db);
  const revs = await sql<{ n: number }>`SELECT count(*)::int AS n FROM dataset_revision`.execute(db);
  return { rows: rows.rows[0].n, revisions: revs.rows[0].n, blobs: blobCount() };
}

beforeAll(async () => {
  const me = await createAccount(db, "streamed");
  manuscriptId = await createManuscriptWith(db, [{ id: me.id, role: "contributor" }]);
  c = new Client();
  await c.signIn(me.email, TEST_PASSWORD);
});
afterAll(() => db.destroy());

const revisionsOf = (datasetId: string) => `/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions`;

describe("rows copied while the file is read", () => {
  it("stores nothing for a file whose only problem is a duplicate found after the last row", async () => {
    const datasetId = await createDatasetViaApi(c, manuscriptId, "late duplicate");
    const before = await counts();
    const csv = bigCsv(ROWS) + `${((180 * 0.5) / ROWS).toFixed(6)},1.5,0.05\n`;
    const res = await c.upload(revisionsOf(datasetId), csv, {}, "late-duplicate.csv");
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { problemCount: number; problems: Array<{ row: number; message: string }> } };
    expect(body.error.problemCount).toBe(1);
    expect(body.error.problems[0].row).toBe(ROWS + 2);
    expect(body.error.problems[0].message).toMatch(/already appears on line 2/);
    expect(await counts()).toEqual(before);
  });

  it("stores nothing for a file with a byte that is not UTF-8 on its last line", async () => {
    const datasetId = await createDatasetViaApi(c, manuscriptId, "late latin-1");
    const before = await counts();
    const text = Buffer.from(bigCsv(ROWS), "utf8");
    const bytes = Buffer.concat([text, Buffer.from([0x31, 0x37, 0x39, 0x2c, 0x31, 0x2c, 0x30, 0x2e, 0x31, 0xe9, 0x0a])]);
    const res = await c.upload(revisionsOf(datasetId), new Uint8Array(bytes), {}, "late-latin1.csv");
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { problems: Array<{ row: number; message: string }> } };
    expect(body.error.problems[0].row).toBe(ROWS + 2);
    expect(body.error.problems[0].message).toMatch(/not UTF-8/);
    expect(await counts()).toEqual(before);
  });

  it("stores nothing for a file one row over the row limit", async () => {
    const datasetId = await createDatasetViaApi(c, manuscriptId, "over the limit");
    const before = await counts();
    const res = await c.upload(revisionsOf(datasetId), bigCsv(testEnv.maxRows + 1), {}, "too-many.csv");
    expect(res.status).toBe(413);
    expect(await counts()).toEqual(before);
  });

  it("stores every row of a large file in file order, and leaves no rows behind for identical content", async () => {
    const datasetId = await createDatasetViaApi(c, manuscriptId, "large");
    const csv = bigCsv(ROWS);
    const first = await c.upload(revisionsOf(datasetId), csv);
    expect(first.status).toBe(201);
    const r1 = ((await first.json()) as { revision: { id: string; number: number; rowCount: number } }).revision;
    expect(r1.number).toBe(1);
    expect(r1.rowCount).toBe(ROWS);
    const stored = await sql<{ n: number; min: number; max: number; ordered: boolean }>`
      SELECT count(*)::int AS n, min(idx) AS min, max(idx) AS max,
             bool_and(x > coalesce(prev, -1)) AS ordered
      FROM (SELECT idx, x, lag(x) OVER (ORDER BY idx) AS prev FROM dataset_row WHERE revision_id = ${r1.id}) t`.execute(db);
    expect(stored.rows[0]).toEqual({ n: ROWS, min: 0, max: ROWS - 1, ordered: true });
    const last = await sql<{ x: number; stat_minus: number; stat_plus: number; x_low: number | null }>`
      SELECT x, stat_minus, stat_plus, x_low FROM dataset_row WHERE revision_id = ${r1.id} AND idx = ${ROWS - 1}`.execute(db);
    expect(last.rows[0].x).toBe(Number(((180 * (ROWS - 0.5)) / ROWS).toFixed(6)));
    expect(last.rows[0].stat_plus).toBe(last.rows[0].stat_minus);
    expect(last.rows[0].x_low).toBeNull();

    const before = await counts();
    const again = await c.upload(revisionsOf(datasetId), csv.replace(/,/g, ";"), {}, "same.csv");
    expect(again.status).toBe(200);
    expect(((await again.json()) as { message: string }).message).toBe("identical to r1");
    expect(await counts()).toEqual(before);
  });

  it("numbers concurrent uploads to one dataset 1, 2, 3, 4", async () => {
    const datasetId = await createDatasetViaApi(c, manuscriptId, "concurrent");
    const answers = await Promise.all([0, 1, 2, 3].map((k) => c.upload(revisionsOf(datasetId), bigCsv(ROWS, k))));
    expect(answers.map((a) => a.status)).toEqual([201, 201, 201, 201]);
    const numbers = await Promise.all(answers.map(async (a) => ((await a.json()) as { revision: { number: number } }).revision.number));
    expect([...numbers].sort()).toEqual([1, 2, 3, 4]);
    const perRevision = await sql<{ n: number }>`
      SELECT count(*)::int AS n FROM dataset_row JOIN dataset_revision r ON r.id = dataset_row.revision_id
      WHERE r.dataset_id = ${datasetId} GROUP BY r.id`.execute(db);
    expect(perRevision.rows.map((r) => r.n)).toEqual([ROWS, ROWS, ROWS, ROWS]);
  });

  it("still refuses, at COMMIT, a row whose revision does not exist", async () => {
    await expect(
      db.transaction().execute(async (tx) => {
        await sql`INSERT INTO dataset_row (revision_id, idx, x, y) VALUES (gen_random_uuid(), 0, 1, 1)`.execute(tx);
      }),
    ).rejects.toThrow(/foreign key/);
  });
});

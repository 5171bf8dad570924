// The database diff of two revisions against the pure diffRevisions as its reference, on
// seeded random revisions with and without bins.
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { diffRevisionsInDatabase } from "../../app/.server/datasets/revision-diff.server";
import { diffRevisions, type RevisionRow } from "../../app/datasets/diff-revisions";
import { createTestDatabase } from "../support/db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let userId: string;
let datasetId: string;
let n = 0;

beforeAll(async () => {
  t = await createTestDatabase();
  userId = (await t.db.insertInto("app_user").values({ email: "diff@example.org", name: "D" }).returning("id").executeTakeFirstOrThrow()).id;
  const m = (await t.db.insertInto("manuscript").values({ title: "T", created_by: userId }).returning("id").executeTakeFirstOrThrow()).id;
  datasetId = (await t.db.insertInto("dataset").values({ manuscript_id: m, name: "d", quantity: "{}", created_by: userId }).returning("id").executeTakeFirstOrThrow()).id;
});
afterAll(() => t?.drop());

async function store(rows: RevisionRow[]): Promise<string> {
  n++;
  const id = (await t.db.insertInto("dataset_revision").values({ dataset_id: datasetId, number: n, content_hash: n.toString(16).padStart(64, "0"), raw_sha256: "b".repeat(64), raw_key: "k", raw_filename: "f.csv", raw_bytes: 1, row_count: Math.max(1, rows.length), quantity: "{}", mapping: "{}", created_by: userId }).returning("id").executeTakeFirstOrThrow()).id;
  if (rows.length) {
    await t.db.insertInto("dataset_row").values(rows.map((r, idx) => ({ revision_id: id, idx, x: r.x, x_low: r.xLow, x_high: r.xHigh, y: r.y, stat_minus: r.statMinus, stat_plus: r.statPlus, syst_minus: r.systMinus, syst_plus: r.systPlus }))).execute();
  }
  return id;
}

const rowAt = (k: number, binned: boolean, y: number, err: number | null): RevisionRow => ({
  x: binned ? k + 0.5 : k, xLow: binned ? k : null, xHigh: binned ? k + 1 : null, y, statMinus: err, statPlus: err, systMinus: null, systPlus: null,
});

describe("revision diff in the database", () => {
  it("agrees with the pure diffRevisions on random pairs of revisions", async () => {
    const revision = fc.uniqueArray(fc.integer({ min: 0, max: 60 }), { maxLength: 40 });
    await fc.assert(
      fc.asyncProperty(revision, revision, fc.boolean(), fc.boolean(), fc.integer({ min: 0, max: 2 ** 31 }), async (keysA, keysB, binnedA, binnedB, seed) => {
        const value = (k: number, flip: number) => 1 + ((k * 7919 + seed + flip) % 5) / 10;
        const a = keysA.map((k) => rowAt(k, binnedA, value(k, 0), k % 3 === 0 ? null : 0.1));
        const b = keysB.map((k) => rowAt(k, binnedB, value(k, k % 4 === 0 ? 1 : 0), k % 3 === 0 ? null : k % 5 === 0 ? 0.2 : 0.1));
        const [ida, idb] = [await store(a), await store(b)];
        const want = diffRevisions({ label: "rA", rows: a }, { label: "rB", rows: b }, { maxListed: 7 });
        const got = await diffRevisionsInDatabase(t.db, { id: ida, label: "rA" }, { id: idb, label: "rB" }, 7);
        expect(got).toEqual(want);
      }),
      { numRuns: 40, seed: 4242 },
    );
  }, 60_000);
});

// Datasets through the JSON API and the database: revisions, identity by content, precise
// refusals, limits, immutability, rows, raw files, the audit log.
import { readdirSync } from "node:fs";
import path from "node:path";
import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { TEST_PASSWORD, createAccount, createManuscriptWith } from "../support/accounts";
import { ANGULAR_MAPPING, angularCsv, createDatasetViaApi } from "../support/datasets";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { Client } from "../support/http";

const db = connect(testEnv.appDatabaseUrl);
let c: Client;
let manuscriptId: string;
let datasetId: string;
const base = () => `/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}`;

function blobCount(): number {
  const root = path.join(testEnv.storageDir, "blobs");
  let n = 0;
  const walk = (d: string) => {
    for (const e of readdirSync(d, { withFileTypes: true })) e.isDirectory() ? walk(path.join(d, e.name)) : n++;
  };
  try { walk(root); } catch { return 0; }
  return n;
}

beforeAll(async () => {
  const me = await createAccount(db, "datasets");
  manuscriptId = await createManuscriptWith(db, [{ id: me.id, role: "contributor" }, { id: (await createAccount(db, "ds-ca")).id, role: "corresponding" }]);
  c = new Client();
  await c.signIn(me.email, TEST_PASSWORD);
  datasetId = await createDatasetViaApi(c, manuscriptId, "angular");
});
afterAll(() => db.destroy());

describe("datasets API", () => {
  it("creates a dataset and refuses a unit that does not fit the quantity, naming the field", async () => {
    const bad = await c.postJson(`/api/v1/manuscripts/${manuscriptId}/datasets`, { name: "bad", quantity: { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "nb" } } });
    expect(bad.status).toBe(422);
    const body = (await bad.json()) as { error: { field: string; message: string } };
    expect(body.error.field).toBe("quantity.y.unit");
    expect(body.error.message).toMatch(/per steradian/);
    const twice = await c.postJson(`/api/v1/manuscripts/${manuscriptId}/datasets`, { name: "angular", quantity: { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "nb/sr" } } });
    expect(twice.status).toBe(422);
    expect(((await twice.json()) as { error: { code: string; field: string } }).error).toMatchObject({ code: "name-taken", field: "name" });
    const list = (await (await c.get(`/api/v1/manuscripts/${manuscriptId}/datasets`)).json()) as { datasets: Array<{ name: string }> };
    expect(list.datasets.map((d) => d.name)).toEqual(["angular"]);
  });

  it("stores r1 (201), says 'identical to r1' for the same content written differently (200), and r2 for a change", async () => {
    const first = await c.upload(`${base()}/revisions`, angularCsv());
    expect(first.status).toBe(201);
    const r1 = ((await first.json()) as { revision: { number: number; hash: string; rowCount: number } }).revision;
    expect(r1.number).toBe(1);
    expect(r1.rowCount).toBe(5);
    expect(r1.hash).toMatch(/^[0-9a-f]{64}$/);

    const blobsBefore = blobCount();
    const again = await c.upload(`${base()}/revisions`, angularCsv(undefined, { delimiter: ";", bom: true, crlf: true }), {}, "same-values.csv");
    expect(again.status).toBe(200);
    const same = (await again.json()) as { message: string; revision: { number: number; hash: string } };
    expect(same.message).toBe("identical to r1");
    expect(same.revision.hash).toBe(r1.hash);
    expect(blobCount()).toBe(blobsBefore);

    const changed = await c.upload(`${base()}/revisions`, angularCsv([1.5, 1.2, 0.96, 0.81, 0.74]));
    expect(changed.status).toBe(201);
    const r2 = ((await changed.json()) as { revision: { number: number; hash: string } }).revision;
    expect(r2.number).toBe(2);
    expect(r2.hash).not.toBe(r1.hash);
  });

  it("refuses a broken file with precise problems and stores nothing", async () => {
    const revsBefore = await db.selectFrom("dataset_revision").select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
    const blobsBefore = blobCount();
    const csv = "theta,dsigma,stat\n30,1.5,0.05\n45,\"1,2\",0.05\n200,0.9,0.05\n75,0.8,-0.01\n90,0.7\n";
    const res = await c.upload(`${base()}/revisions`, csv, {}, "broken.csv");
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { code: string; problemCount: number; problems: Array<{ row: number; column: number | null; message: string }> } };
    expect(body.error.code).toBe("invalid-file");
    expect(body.error.problemCount).toBe(4);
    const at = body.error.problems.map((p) => [p.row, p.column]);
    expect(at).toEqual([[3, 2], [4, 1], [5, 3], [6, null]]);
    expect(body.error.problems[0].message).toMatch(/decimal point/);
    const revsAfter = await db.selectFrom("dataset_revision").select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
    expect(Number(revsAfter.n)).toBe(Number(revsBefore.n));
    expect(blobCount()).toBe(blobsBefore);
    const rejected = await db.selectFrom("audit_event").select("detail").where("manuscript_id", "=", manuscriptId).where("action", "=", "revision-rejected").execute();
    expect(rejected.some((r) => (r.detail as { problemCount?: number }).problemCount === 4)).toBe(true);
  });

  it("a mapping sent with the upload overrides the saved one, and becomes the saved one", async () => {
    const csv = "angle;xs;err\n30;2.5;0.1\n60;2.0;0.1\n";
    const noMap = await c.upload(`${base()}/revisions`, csv);
    expect(noMap.status).toBe(422);
    const res = await c.upload(`${base()}/revisions`, csv, { mapping: JSON.stringify({ x: "angle", y: "xs", stat: { kind: "symmetric", column: "err" } }) });
    expect(res.status).toBe(201);
    const reused = await c.upload(`${base()}/revisions`, "angle;xs;err\n30;2.6;0.1\n60;2.0;0.1\n");
    expect(reused.status).toBe(201);
    const bad = await c.upload(`${base()}/revisions`, csv, { mapping: "{not json" });
    expect(bad.status).toBe(422);
    expect(((await bad.json()) as { error: { field: string } }).error.field).toBe("mapping");
  });

  it("answers 413 naming the limit for too many bytes or too many rows, and stores nothing", async () => {
    const rows = Array.from({ length: testEnv.maxRows + 1 }, (_, i) => `${(i * 180) / (testEnv.maxRows + 2)},1,0.1`).join("\n");
    // The previous test left another saved mapping: name this file's columns.
    const tooMany = await c.upload(`${base()}/revisions`, `theta,dsigma,stat\n${rows}\n`, { mapping: JSON.stringify(ANGULAR_MAPPING) });
    expect(tooMany.status).toBe(413);
    expect(((await tooMany.json()) as { error: { message: string; limit: { kind: string; max: number } } }).error.limit).toEqual({ kind: "rows", max: testEnv.maxRows });
    const big = new Uint8Array(testEnv.maxBytes + 10).fill(0x31);
    const tooBig = await c.upload(`${base()}/revisions`, big, { mapping: JSON.stringify(ANGULAR_MAPPING) });
    expect(tooBig.status).toBe(413);
    const body = (await tooBig.json()) as { error: { message: string; limit: { kind: string; max: number } } };
    expect(body.error.limit).toEqual({ kind: "bytes", max: testEnv.maxBytes });
    expect(body.error.message).toContain("UPLOAD_MAX_BYTES");
  });

  it("pages the rows, and hands back the original file byte for byte", async () => {
    const rows = (await (await c.get(`${base()}/revisions/1/rows?page=2&pageSize=2`)).json()) as { units: unknown; totalRows: number; totalPages: number; rows: Array<{ row: number; x: number; y: number }> };
    expect(rows.units).toEqual({ x: "deg", y: "GeV^-2/sr" });
    // 0.81 µb/sr in GeV⁻²/sr: 0.81e-3 mb / 0.3893793721 mb GeV² (CODATA 2018 (ħc)²).
    expect(rows.rows[1].y).toBeCloseTo(0.81e-3 / 0.3893793721, 12);
    expect(rows.totalRows).toBe(5);
    expect(rows.totalPages).toBe(3);
    expect(rows.rows.map((r) => [r.row, r.x])).toEqual([[3, 60], [4, 75]]);
    expect((await c.get(`${base()}/revisions/1/rows?pageSize=5000`)).status).toBe(422);
    const raw = await c.get(`${base()}/revisions/1/raw`);
    expect(raw.status).toBe(200);
    expect(await raw.text()).toBe(angularCsv());
    const downloads = await db.selectFrom("audit_event").select("action").where("manuscript_id", "=", manuscriptId).where("action", "=", "raw-file-downloaded").execute();
    expect(downloads.length).toBeGreaterThanOrEqual(1);
    const uploads = await db.selectFrom("audit_event").select("action").where("manuscript_id", "=", manuscriptId).where("action", "=", "revision-uploaded").execute();
    expect(uploads.length).toBe(4);
  });

  it("the compare page summarises the change from r1 to r2", async () => {
    const page = await c.get(`/manuscripts/${manuscriptId}/datasets/${datasetId}/compare?from=1&to=2`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain("r1 → r2: 0 added, 0 removed, 1 changed, 4 unchanged");
  });

  it("revisions and their rows are immutable in the database itself", async () => {
    const rev = await db.selectFrom("dataset_revision").select("id").where("dataset_id", "=", datasetId).where("number", "=", 1).executeTakeFirstOrThrow();
    await expect(sql`UPDATE dataset_revision SET row_count = 99 WHERE id = ${rev.id}`.execute(db)).rejects.toThrow(/immutable/);
    await expect(sql`DELETE FROM dataset_revision WHERE id = ${rev.id}`.execute(db)).rejects.toThrow(/immutable/);
    await expect(sql`UPDATE dataset_row SET y = 0 WHERE revision_id = ${rev.id}`.execute(db)).rejects.toThrow(/immutable/);
    await expect(sql`DELETE FROM dataset_row WHERE revision_id = ${rev.id}`.execute(db)).rejects.toThrow(/immutable/);
    await expect(sql`TRUNCATE dataset_row`.execute(db)).rejects.toThrow(/immutable/);
    const n = await db.selectFrom("dataset_row").select((eb) => eb.fn.countAll<number>().as("n")).where("revision_id", "=", rev.id).executeTakeFirstOrThrow();
    expect(Number(n.n)).toBe(5);
  });

  it("an observer can read but not upload; a personal access token uploads like the session", async () => {
    const obs = await createAccount(db, "ds-observer");
    await db.insertInto("membership").values({ manuscript_id: manuscriptId, user_id: obs.id, role: "observer" }).execute();
    const o = new Client();
    await o.signIn(obs.email, TEST_PASSWORD);
    expect((await o.get(`${base()}/revisions`)).status).toBe(200);
    const denied = await o.upload(`${base()}/revisions`, angularCsv([9, 9, 9, 9, 9]));
    expect(denied.status).toBe(403);

    const created = await c.post("/account", { intent: "create-token", name: "uploader" });
    const secret = /data-testid="new-token">(sdn_[A-Za-z0-9_-]+)</.exec(await created.text())![1];
    const script = new Client();
    const res = await script.upload(`${base()}/revisions`, angularCsv([3, 3, 3, 3, 3]), { mapping: JSON.stringify(ANGULAR_MAPPING) }, "from-script.csv", { Authorization: `Bearer ${secret}` });
    expect(res.status).toBe(201);
  });

  it("stores a file that gives only bin edges, with x the bins' centres, and asks for x in words when neither is mapped", async () => {
    const id = await createDatasetViaApi(c, manuscriptId, "edges only", { mapping: { xLow: "theta_lo", xHigh: "theta_hi", y: "dsdo" } });
    const at = `/api/v1/manuscripts/${manuscriptId}/datasets/${id}`;
    const res = await c.upload(`${at}/revisions`, "theta_lo,theta_hi,dsdo\n20,30,1.5\n30,45,0.75\n", {}, "edges.csv");
    expect(res.status).toBe(201);
    const rows = (await (await c.get(`${at}/revisions/1/rows`)).json()) as { rows: Array<{ x: number; xLow: number; xHigh: number }> };
    // (20 + 30)/2 and (30 + 45)/2, by hand.
    expect(rows.rows.map((r) => [r.x, r.xLow, r.xHigh])).toEqual([[25, 20, 30], [37.5, 30, 45]]);

    const neither = await c.upload(`${at}/revisions`, "theta_lo,theta_hi,dsdo\n20,30,1.5\n", { mapping: JSON.stringify({ y: "dsdo" }) }, "edges.csv");
    expect(neither.status).toBe(422);
    const body = (await neither.json()) as { error: { field: string; message: string } };
    expect(body.error.field).toBe("mapping.x");
    expect(body.error.message).toBe("The mapping of x (“x”): choose the column that holds x, or map both edges of the bin (each point is then plotted at its bin's centre).");
  });
});

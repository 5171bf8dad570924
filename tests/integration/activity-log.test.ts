// The manuscript's activity log through HTTP: sentences with links, filters by person and kind in
// the URL, paging with counts, and the CSV download of the filtered log.
import { parse } from "csv-parse/sync";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { TEST_PASSWORD, createAccount, createManuscriptWith } from "../support/accounts";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { Client } from "../support/http";
import { angularCsv, createDatasetViaApi } from "../support/datasets";

const db = connect(testEnv.appDatabaseUrl);
let manuscriptId = "";
let datasetId = "";
let owner: { id: string; email: string };
let busy: { id: string; email: string };
let client: Client;
const BUSY_NAME = "=HYPERLINK(\"http://x.invalid\",\"Busy\")";
const SAVES = 120;

/** The page's text without tags, as a reader sees it. */
const textOf = async (res: Response) => (await res.text()).replace(/<[^>]+>/g, "").replace(/&quot;/g, '"').replace(/&#x27;/g, "'").replace(/&amp;/g, "&");

beforeAll(async () => {
  owner = await createAccount(db, "activity-owner");
  busy = await createAccount(db, "activity-busy");
  await db.updateTable("app_user").set({ name: BUSY_NAME }).where("id", "=", busy.id).execute();
  manuscriptId = await createManuscriptWith(db, [{ id: owner.id, role: "corresponding" }, { id: busy.id, role: "contributor" }]);
  client = new Client();
  await client.signIn(owner.email, TEST_PASSWORD);
  datasetId = await createDatasetViaApi(client, manuscriptId, "activity data");
  expect((await client.upload(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions`, angularCsv())).status).toBe(201);
  // Many draft saves by one person, written as the app writes them (the table takes inserts only).
  await db.insertInto("audit_event").values(Array.from({ length: SAVES }, (_, i) => ({
    action: "figure-draft-saved", actor_id: busy.id, manuscript_id: manuscriptId, detail: JSON.stringify({ figureId: "77777777-7777-4777-8777-777777777777", draftRevision: i + 1 }),
  }))).execute();
});
afterAll(() => db.destroy());

describe("the activity log page", () => {
  it("tells what happened in sentences, linking the dataset and revision, with the hash short", async () => {
    const res = await client.get(`/manuscripts/${manuscriptId}/audit?kind=datasets`);
    expect(res.status).toBe(200);
    const html = await res.clone().text();
    const text = await textOf(res);
    const rev = await db.selectFrom("dataset_revision").select("content_hash").where("dataset_id", "=", datasetId).executeTakeFirstOrThrow();
    expect(text).toContain("Test activity-owner created the dataset “activity data”.");
    expect(text).toMatch(/Test activity-owner uploaded r1 of “activity data” \(\d+ rows\), content fingerprint /);
    expect(text).toContain(`${rev.content_hash.slice(0, 4)} ${rev.content_hash.slice(4, 8)} ${rev.content_hash.slice(8, 12)} …`);
    expect(html).toContain(`href="/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions/1"`);
    expect(html).toContain(`href="/manuscripts/${manuscriptId}/datasets/${datasetId}"`);
    expect(text).toContain("Entries 1–2 of 2.");
    expect(text).not.toContain("draft revision");
    expect(text).toMatch(/\d{4}-\d\d-\d\d \d\d:\d\d:\d\d UTC/);
  });

  it("filters by person and pages by 50, with counts", async () => {
    const base = `/manuscripts/${manuscriptId}/audit?person=${busy.id}`;
    const first = await textOf(await client.get(base));
    expect(first).toContain(`Entries 1–50 of ${SAVES}, page 1 of 3.`);
    expect(first).toContain(`saved draft revision ${SAVES} of a figure no longer in this manuscript.`);
    expect(first).not.toContain("Test activity-owner created");
    const third = await client.get(`${base}&page=3`);
    const thirdText = await textOf(third);
    expect(thirdText).toContain(`Entries 101–${SAVES} of ${SAVES}, page 3 of 3.`);
    expect(thirdText).toContain("saved draft revision 1 of a figure no longer in this manuscript.");
    expect(thirdText).not.toContain("saved draft revision 21 of");
    // Everyone, every kind: the saves and the owner's own entries.
    expect(await textOf(await client.get(`/manuscripts/${manuscriptId}/audit`))).toContain(`of ${SAVES + 2}, page 1 of 3.`);
  });

  it("ignores search params it cannot read instead of failing", async () => {
    const res = await client.get(`/manuscripts/${manuscriptId}/audit?person=nobody&kind=everything&page=abc`);
    expect(res.status).toBe(200);
    expect(await textOf(res)).toContain(`Entries 1–50 of ${SAVES + 2}`);
  });
});

describe("the CSV download", () => {
  it("holds every entry of the filter, not one page, with cells a spreadsheet cannot run", async () => {
    const res = await client.get(`/manuscripts/${manuscriptId}/audit.csv?person=${busy.id}&page=2`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="activity-[0-9a-f]{8}\.csv"$/);
    const rows = parse(await res.text(), { columns: true }) as Record<string, string>[];
    expect(rows.length).toBe(SAVES);
    expect(Object.keys(rows[0])).toEqual(["when_utc", "person", "kind", "action", "sentence", "detail_json"]);
    // OWASP "CSV Injection": a name starting with = is written with a leading apostrophe.
    expect(rows[0].person).toBe(`'${BUSY_NAME}`);
    expect(rows[0].sentence).toBe(`'${BUSY_NAME} saved draft revision ${SAVES} of a figure no longer in this manuscript.`);
    expect(rows[0].action).toBe("figure-draft-saved");
    expect(rows[0].kind).toBe("Figures and drafts");
    expect(rows[0].when_utc).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
    expect(JSON.parse(rows[0].detail_json)).toEqual({ figureId: "77777777-7777-4777-8777-777777777777", draftRevision: SAVES });
  });

  it("writes hashes whole", async () => {
    const rows = parse(await (await client.get(`/manuscripts/${manuscriptId}/audit.csv?kind=datasets`)).text(), { columns: true }) as Record<string, string>[];
    const rev = await db.selectFrom("dataset_revision").select("content_hash").where("dataset_id", "=", datasetId).executeTakeFirstOrThrow();
    expect(rows.map((r) => r.action)).toEqual(["revision-uploaded", "dataset-created"]);
    expect(rows[0].sentence).toContain(`content ${rev.content_hash}.`);
  });
});

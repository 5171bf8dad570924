// Renaming and retiring a dataset (issue 12): who may, the audit entries, and what a retired
// dataset keeps — its page, its revisions and the sealed figure versions that cite it.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { TEST_PASSWORD, createAccount, createManuscriptWith } from "../support/accounts";
import { angularCsv, createDatasetViaApi } from "../support/datasets";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { Client } from "../support/http";

const db = connect(testEnv.appDatabaseUrl);
const who = {} as Record<"corresponding" | "creator" | "otherContributor" | "coauthor", Client>;
const ids = {} as Record<keyof typeof who, string>;
let manuscriptId = "";
const api = (datasetId: string) => `/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}`;
const patch = (c: Client, datasetId: string, body: unknown) =>
  c.request(api(datasetId), { method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
const auditOf = (datasetId: string) =>
  db.selectFrom("audit_event").select(["action", "actor_id", "detail"]).where("manuscript_id", "=", manuscriptId).where("action", "in", ["dataset-renamed", "dataset-retired"]).orderBy("id", "asc").execute()
    .then((rows) => rows.filter((r) => (r.detail as { datasetId?: string }).datasetId === datasetId));

beforeAll(async () => {
  const roles = { corresponding: "corresponding", creator: "contributor", otherContributor: "contributor", coauthor: "coauthor" } as const;
  const accounts = {} as Record<keyof typeof who, { id: string; email: string }>;
  for (const k of Object.keys(roles) as (keyof typeof who)[]) {
    accounts[k] = await createAccount(db, `tidy-${k}`);
    ids[k] = accounts[k].id;
  }
  manuscriptId = await createManuscriptWith(db, (Object.keys(roles) as (keyof typeof who)[]).map((k) => ({ id: accounts[k].id, role: roles[k] })));
  for (const k of Object.keys(roles) as (keyof typeof who)[]) {
    who[k] = new Client();
    await who[k].signIn(accounts[k].email, TEST_PASSWORD);
  }
});
afterAll(() => db.destroy());

describe("renaming a dataset", () => {
  it("is open to the creator and the corresponding author, refused to other contributors and co-authors, and audited", async () => {
    const d = await createDatasetViaApi(who.creator, manuscriptId, "tidy rename");
    expect((await patch(who.otherContributor, d, { name: "not yours" })).status).toBe(403);
    expect((await patch(who.coauthor, d, { name: "not yours" })).status).toBe(403);
    const byCreator = await patch(who.creator, d, { name: "tidy renamed once" });
    expect(byCreator.status).toBe(200);
    expect(((await byCreator.json()) as { dataset: { name: string } }).dataset.name).toBe("tidy renamed once");
    expect((await patch(who.corresponding, d, { name: "tidy renamed twice" })).status).toBe(200);
    const row = await db.selectFrom("dataset").select("name").where("id", "=", d).executeTakeFirstOrThrow();
    expect(row.name).toBe("tidy renamed twice");
    expect(await auditOf(d)).toEqual([
      { action: "dataset-renamed", actor_id: ids.creator, detail: { datasetId: d, from: "tidy rename", to: "tidy renamed once" } },
      { action: "dataset-renamed", actor_id: ids.corresponding, detail: { datasetId: d, from: "tidy renamed once", to: "tidy renamed twice" } },
    ]);
  });

  it("refuses an empty name and a name the manuscript already uses, naming the field", async () => {
    const d = await createDatasetViaApi(who.creator, manuscriptId, "tidy clash a");
    await createDatasetViaApi(who.creator, manuscriptId, "tidy clash b");
    const empty = await patch(who.creator, d, { name: "   " });
    expect(empty.status).toBe(422);
    expect(((await empty.json()) as { error: { field: string } }).error.field).toBe("name");
    const taken = await patch(who.creator, d, { name: "tidy clash b" });
    expect(taken.status).toBe(422);
    expect(((await taken.json()) as { error: { code: string } }).error.code).toBe("name-taken");
    expect(await auditOf(d)).toEqual([]);
  });

  it("renames through the dataset page's form too", async () => {
    const d = await createDatasetViaApi(who.corresponding, manuscriptId, "tidy page rename");
    const page = `/manuscripts/${manuscriptId}/datasets/${d}`;
    expect((await who.coauthor.post(page, { intent: "rename", name: "nope" })).status).toBe(403);
    const res = await who.corresponding.post(page, { intent: "rename", name: "tidy page renamed" });
    expect(res.status).toBe(302);
    expect((await db.selectFrom("dataset").select("name").where("id", "=", d).executeTakeFirstOrThrow()).name).toBe("tidy page renamed");
  });
});

describe("retiring a dataset", () => {
  it("takes it out of the page and API lists, keeps its page, revisions and rows readable, refuses new revisions, and is audited once", async () => {
    const d = await createDatasetViaApi(who.creator, manuscriptId, "tidy retire");
    expect((await who.creator.upload(`${api(d)}/revisions`, angularCsv())).status).toBe(201);
    expect((await patch(who.otherContributor, d, { retired: true })).status).toBe(403);
    expect((await patch(who.coauthor, d, { retired: true })).status).toBe(403);
    const retired = await patch(who.creator, d, { retired: true });
    expect(retired.status).toBe(200);
    expect(((await retired.json()) as { dataset: { retiredAt: string | null } }).dataset.retiredAt).not.toBeNull();
    // Retiring again changes nothing and records nothing new.
    expect((await patch(who.corresponding, d, { retired: true })).status).toBe(200);
    expect(await auditOf(d)).toEqual([{ action: "dataset-retired", actor_id: ids.creator, detail: { datasetId: d, name: "tidy retire" } }]);
    // `retired: false` is refused: a retired dataset stays retired.
    expect((await patch(who.creator, d, { retired: false })).status).toBe(422);

    const list = (await (await who.coauthor.get(`/api/v1/manuscripts/${manuscriptId}/datasets`)).json()) as { datasets: { id: string }[] };
    expect(list.datasets.map((x) => x.id)).not.toContain(d);
    const listPage = await (await who.coauthor.get(`/manuscripts/${manuscriptId}/datasets`)).text();
    expect(listPage).not.toContain(d);

    const one = await who.coauthor.get(api(d));
    expect(one.status).toBe(200);
    expect(((await one.json()) as { dataset: { retiredAt: string | null } }).dataset.retiredAt).not.toBeNull();
    expect((await who.coauthor.get(`${api(d)}/revisions/1/rows`)).status).toBe(200);
    const page = await who.coauthor.get(`/manuscripts/${manuscriptId}/datasets/${d}`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain("This dataset was retired");
    const revisionPage = await who.coauthor.get(`/manuscripts/${manuscriptId}/datasets/${d}/revisions/1`);
    expect(revisionPage.status).toBe(200);
    expect(await revisionPage.text()).toContain("retired");

    const upload = await who.creator.upload(`${api(d)}/revisions`, angularCsv([2, 2, 2, 2, 2]));
    expect(upload.status).toBe(409);
    expect(((await upload.json()) as { error: { code: string } }).error.code).toBe("dataset-retired");
  });

  it("leaves a sealed figure version that cites the dataset rendering as before", async () => {
    const d = await createDatasetViaApi(who.creator, manuscriptId, "tidy cited");
    expect((await who.creator.upload(`${api(d)}/revisions`, angularCsv())).status).toBe(201);
    const f = await who.creator.postJson(`/api/v1/manuscripts/${manuscriptId}/figures`, { title: "tidy figure", from: { datasetId: d } });
    expect(f.status).toBe(201);
    const figure = ((await f.json()) as { figure: { id: string; draftRevision: number } }).figure;
    const sealed = await who.creator.postJson(`/api/v1/figures/${figure.id}/versions`, { draftRevision: figure.draftRevision });
    expect(sealed.status).toBe(201);
    const n = ((await sealed.json()) as { version: { number: number } }).version.number;
    const before = await (await who.coauthor.get(`/api/v1/figures/${figure.id}/versions/${n}/figure.svg`)).text();
    expect(before).toContain("<svg");
    expect((await patch(who.corresponding, d, { retired: true })).status).toBe(200);
    const after = await who.coauthor.get(`/api/v1/figures/${figure.id}/versions/${n}/figure.svg`);
    expect(after.status).toBe(200);
    expect(await after.text()).toBe(before);
    expect((await who.coauthor.get(`/manuscripts/${manuscriptId}/figures/${figure.id}/versions/${n}`)).status).toBe(200);
  });
});

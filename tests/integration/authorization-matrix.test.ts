// Every route and API endpoint of the foundation, as each role and as an anonymous user: the
// exact set of callers that get through, and what the others get instead.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client } from "../support/http";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { TEST_PASSWORD, createAccount, createManuscriptWith } from "../support/accounts";
import { angularCsv, createDatasetViaApi } from "../support/datasets";

type Who = "anonymous" | "outsider" | "admin" | "observer" | "contributor" | "coauthor" | "corresponding";
const EVERYONE: Who[] = ["anonymous", "outsider", "admin", "observer", "contributor", "coauthor", "corresponding"];
const MEMBERS: Who[] = ["observer", "contributor", "coauthor", "corresponding"];
const SIGNED_IN: Who[] = ["outsider", "admin", ...MEMBERS];

const db = connect(testEnv.appDatabaseUrl);
const clients = {} as Record<Who, Client>;
let manuscriptId = "";
let datasetId = "";
let otherManuscriptId = "";
let otherDatasetId = "";
let targetMemberId = "";
let figureId = "";
let versionFigureId = "";
let unique = 0;
const fresh = () => ++unique;
const AUTHORS: Who[] = ["contributor", "corresponding"];
const READERS_OF_RAW: Who[] = ["contributor", "coauthor", "corresponding"];

beforeAll(async () => {
  const ids = {} as Record<Exclude<Who, "anonymous">, { id: string; email: string }>;
  for (const w of SIGNED_IN) ids[w as Exclude<Who, "anonymous">] = await createAccount(db, `matrix-${w}`, { siteRole: w === "admin" ? "admin" : "member" });
  manuscriptId = await createManuscriptWith(db, [
    { id: ids.corresponding.id, role: "corresponding" },
    { id: ids.coauthor.id, role: "coauthor" },
    { id: ids.contributor.id, role: "contributor" },
    { id: ids.observer.id, role: "observer" },
  ]);
  clients.anonymous = new Client();
  for (const w of SIGNED_IN) {
    clients[w] = new Client();
    await clients[w].signIn(ids[w as Exclude<Who, "anonymous">].email, TEST_PASSWORD);
  }
  datasetId = await createDatasetViaApi(clients.corresponding, manuscriptId, "matrix data");
  // A member to change and remove, re-added before every call.
  targetMemberId = (await createAccount(db, "matrix-target")).id;
  // Another manuscript that everyone in the matrix belongs to: its dataset must not be
  // reachable under the first manuscript's address.
  otherManuscriptId = await createManuscriptWith(db, [
    { id: ids.corresponding.id, role: "corresponding" },
    ...(["coauthor", "contributor", "observer", "outsider", "admin"] as const).map((w) => ({ id: ids[w].id, role: "observer" as const })),
  ]);
  otherDatasetId = await createDatasetViaApi(clients.corresponding, otherManuscriptId, "other data");
  const r1 = await clients.corresponding.upload(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions`, angularCsv());
  expect(r1.status).toBe(201);
  const f = await clients.corresponding.postJson(`/api/v1/manuscripts/${manuscriptId}/figures`, { title: "matrix figure", from: { datasetId } });
  expect(f.status).toBe(201);
  figureId = ((await f.json()) as { figure: { id: string } }).figure.id;
  const vf = await clients.corresponding.postJson(`/api/v1/manuscripts/${manuscriptId}/figures`, { title: "matrix versions" });
  expect(vf.status).toBe(201);
  versionFigureId = ((await vf.json()) as { figure: { id: string } }).figure.id;
  await freshVersion([]);
});

/** A draft revision nobody has sealed yet: the draft of the versions figure, moved on by one. */
async function freshDraftRevision(): Promise<number> {
  const row = await db.updateTable("figure").set((eb) => ({ draft_revision: eb("draft_revision", "+", 1) })).where("id", "=", versionFigureId).returning("draft_revision").executeTakeFirstOrThrow();
  return row.draft_revision;
}

/** A new version of the versions figure, sealed by the contributor, with sign-off asked of `reviewers`. */
async function freshVersion(reviewers: ("coauthor" | "corresponding")[]): Promise<number> {
  const sealed = await clients.contributor.postJson(`/api/v1/figures/${versionFigureId}/versions`, { draftRevision: await freshDraftRevision() });
  expect(sealed.status).toBe(201);
  const n = ((await sealed.json()) as { version: { number: number } }).version.number;
  if (reviewers.length > 0) {
    const ids = await db.selectFrom("membership").select("user_id").where("manuscript_id", "=", manuscriptId).where("role", "in", reviewers).execute();
    const asked = await clients.contributor.postJson(`/api/v1/figures/${versionFigureId}/versions/${n}/review-requests`, { reviewerIds: ids.map((r) => r.user_id) });
    expect(asked.status).toBe(201);
  }
  return n;
}
/** A signed-off version of the versions figure, made once: sealed by the contributor, signed off by the co-author. */
let signedOff: Promise<number> | undefined;
function signedOffVersion(): Promise<number> {
  signedOff ??= (async () => {
    const n = await freshVersion(["coauthor"]);
    expect((await clients.coauthor.postJson(`/api/v1/figures/${versionFigureId}/versions/${n}/sign-off`, {})).status).toBe(200);
    return n;
  })();
  return signedOff;
}

/** An export of that version, finished by the app's worker, made once. */
let exported: Promise<string> | undefined;
function doneExport(): Promise<string> {
  exported ??= (async () => {
    const res = await clients.corresponding.postJson(`/api/v1/figures/${versionFigureId}/versions/${await signedOffVersion()}/exports`, {});
    const id = ((await res.json()) as { export: { id: string } }).export.id;
    for (;;) {
      const body = (await (await clients.corresponding.get(`/api/v1/exports/${id}`)).json()) as { export: { state: string; reason: string | null } };
      if (body.export.state === "done") return id;
      if (body.export.state === "failed") throw new Error(`the matrix export failed: ${body.export.reason}`);
      await new Promise((r) => setTimeout(r, 300));
    }
  })();
  return exported;
}
const coauthorId = async () => (await db.selectFrom("membership").select("user_id").where("manuscript_id", "=", manuscriptId).where("role", "=", "coauthor").executeTakeFirstOrThrow()).user_id;

/** The stored draft and its revision, so that an allowed save is never stale. */
async function currentDraft() {
  const row = await db.selectFrom("figure").select(["draft", "draft_revision"]).where("id", "=", figureId).executeTakeFirstOrThrow();
  return { baseRevision: row.draft_revision, model: row.draft };
}
afterAll(() => db.destroy());

interface Case {
  name: string;
  allowed: Who[];
  call: (c: Client) => Promise<Response>;
  /** What a signed-in caller outside `allowed` gets; anonymous callers get `anonymous`. */
  denied: (w: Who) => number;
  anonymous: number;
  okStatus?: number;
}

const pageDenied = (w: Who) => (MEMBERS.includes(w) ? 403 : 404);

async function ensureTarget() {
  await db.insertInto("membership").values({ manuscript_id: manuscriptId, user_id: targetMemberId, role: "observer" }).onConflict((oc) => oc.columns(["manuscript_id", "user_id"]).doUpdateSet({ role: "observer" })).execute();
}
const apiDenied = pageDenied;

const cases: Case[] = [
  { name: "GET /manuscripts", allowed: SIGNED_IN, call: (c) => c.get("/manuscripts"), denied: () => 0, anonymous: 302 },
  { name: "GET /manuscripts/:id", allowed: MEMBERS, call: (c) => c.get(`/manuscripts/${manuscriptId}`), denied: pageDenied, anonymous: 302 },
  { name: "GET /manuscripts/:id/members", allowed: MEMBERS, call: (c) => c.get(`/manuscripts/${manuscriptId}/members`), denied: pageDenied, anonymous: 302 },
  {
    name: "POST /manuscripts/:id/members (invite)", allowed: ["corresponding"],
    call: (c) => c.post(`/manuscripts/${manuscriptId}/members`, { intent: "invite", email: `invitee-${Math.random().toString(16).slice(2)}@example.org`, role: "observer" }),
    denied: pageDenied, anonymous: 302,
  },
  { name: "GET /manuscripts/:id/audit", allowed: ["corresponding"], call: (c) => c.get(`/manuscripts/${manuscriptId}/audit`), denied: pageDenied, anonymous: 302 },
  { name: "GET /manuscripts/:id/audit.csv", allowed: ["corresponding"], call: (c) => c.get(`/manuscripts/${manuscriptId}/audit.csv`), denied: pageDenied, anonymous: 302 },
  { name: "GET /account", allowed: SIGNED_IN, call: (c) => c.get("/account"), denied: () => 0, anonymous: 302 },
  { name: "GET /admin/accounts", allowed: ["admin"], call: (c) => c.get("/admin/accounts"), denied: () => 403, anonymous: 302 },
  { name: "GET /admin/mail", allowed: ["admin"], call: (c) => c.get("/admin/mail"), denied: () => 403, anonymous: 302 },
  { name: "GET /predictions", allowed: SIGNED_IN, call: (c) => c.get("/predictions"), denied: () => 0, anonymous: 302 },
  { name: "GET /api/v1/manuscripts", allowed: SIGNED_IN, call: (c) => c.get("/api/v1/manuscripts"), denied: () => 0, anonymous: 401 },
  { name: "GET /api/v1/manuscripts/:id", allowed: MEMBERS, call: (c) => c.get(`/api/v1/manuscripts/${manuscriptId}`), denied: apiDenied, anonymous: 401 },
  {
    name: "POST /api/v1/predictions", allowed: SIGNED_IN,
    call: (c) => c.postJson("/api/v1/predictions", { process: "compton", frame: "lab", energy: { beam: 0.001 }, thetaDeg: [90], unit: "mb/sr" }),
    denied: () => 0, anonymous: 401,
  },
  {
    name: "POST /manuscripts (create)", allowed: SIGNED_IN, okStatus: 302,
    call: (c) => c.post("/manuscripts?index", { title: `matrix manuscript ${fresh()}` }), denied: () => 0, anonymous: 302,
  },
  { name: "POST /account (create a token)", allowed: SIGNED_IN, call: (c) => c.post("/account", { intent: "create-token", name: `t${fresh()}` }), denied: () => 0, anonymous: 302 },
  {
    name: "POST /admin/accounts (disable, re-enable)", allowed: ["admin"],
    call: async (c) => {
      const res = await c.post("/admin/accounts", { intent: "disable", userId: targetMemberId });
      await db.updateTable("app_user").set({ status: "active" }).where("id", "=", targetMemberId).execute();
      return res;
    },
    denied: () => 403, anonymous: 302,
  },
  {
    name: "POST /manuscripts/:id/members (change role)", allowed: ["corresponding"],
    call: async (c) => {
      await ensureTarget();
      return c.post(`/manuscripts/${manuscriptId}/members`, { intent: "change-role", userId: targetMemberId, role: "coauthor" });
    },
    denied: pageDenied, anonymous: 302,
  },
  {
    name: "POST /manuscripts/:id/members (remove)", allowed: ["corresponding"],
    call: async (c) => {
      await ensureTarget();
      return c.post(`/manuscripts/${manuscriptId}/members`, { intent: "remove", userId: targetMemberId });
    },
    denied: pageDenied, anonymous: 302,
  },
  // Datasets (issue 4).
  { name: "GET /manuscripts/:id/datasets", allowed: MEMBERS, call: (c) => c.get(`/manuscripts/${manuscriptId}/datasets`), denied: pageDenied, anonymous: 302 },
  {
    name: "POST /manuscripts/:id/datasets (create)", allowed: AUTHORS, okStatus: 302,
    call: (c) => c.post(`/manuscripts/${manuscriptId}/datasets`, { name: `page dataset ${fresh()}`, xKind: "theta_cm_deg", xUnit: "", yKind: "dsigma_domega", yUnit: "nb/sr" }),
    denied: pageDenied, anonymous: 302,
  },
  { name: "GET /manuscripts/:id/datasets/:d", allowed: MEMBERS, call: (c) => c.get(`/manuscripts/${manuscriptId}/datasets/${datasetId}`), denied: pageDenied, anonymous: 302 },
  {
    name: "POST /manuscripts/:id/datasets/:d (upload)", allowed: AUTHORS, okStatus: 302,
    call: (c) => c.upload(`/manuscripts/${manuscriptId}/datasets/${datasetId}`, angularCsv([fresh(), 1, 1, 1, 1])),
    denied: pageDenied, anonymous: 302,
  },
  // Rename and retire: the corresponding author and the dataset's creator (here the same person;
  // a creating contributor is covered in dataset-tidy.test.ts).
  {
    name: "POST /manuscripts/:id/datasets/:d (rename)", allowed: ["corresponding"], okStatus: 302,
    call: (c) => c.post(`/manuscripts/${manuscriptId}/datasets/${datasetId}`, { intent: "rename", name: `matrix data ${fresh()}` }),
    denied: pageDenied, anonymous: 302,
  },
  {
    name: "PATCH /api/v1/…/datasets/:d (rename)", allowed: ["corresponding"],
    call: (c) => c.request(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}`, { method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify({ name: `matrix data ${fresh()}` }) }),
    denied: apiDenied, anonymous: 401,
  },
  {
    name: "PATCH /api/v1/…/datasets/:d (retire)", allowed: ["corresponding"],
    call: async (c) => c.request(`/api/v1/manuscripts/${manuscriptId}/datasets/${await createDatasetViaApi(clients.corresponding, manuscriptId, `matrix retire ${fresh()}`)}`, { method: "PATCH", headers: { "content-type": "application/json" }, body: JSON.stringify({ retired: true }) }),
    denied: apiDenied, anonymous: 401,
  },
  { name: "GET /manuscripts/:id/datasets/:d/compare", allowed: MEMBERS, call: (c) => c.get(`/manuscripts/${manuscriptId}/datasets/${datasetId}/compare?from=1&to=1`), denied: pageDenied, anonymous: 302 },
  { name: "GET /manuscripts/:id/datasets/:d/revisions/1", allowed: MEMBERS, call: (c) => c.get(`/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions/1`), denied: pageDenied, anonymous: 302 },
  { name: "GET /manuscripts/:id/datasets/:d/revisions/1/raw", allowed: READERS_OF_RAW, call: (c) => c.get(`/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions/1/raw`), denied: pageDenied, anonymous: 302 },
  { name: "GET /api/v1/manuscripts/:id/datasets", allowed: MEMBERS, call: (c) => c.get(`/api/v1/manuscripts/${manuscriptId}/datasets`), denied: apiDenied, anonymous: 401 },
  {
    name: "POST /api/v1/manuscripts/:id/datasets", allowed: AUTHORS, okStatus: 201,
    call: (c) => c.postJson(`/api/v1/manuscripts/${manuscriptId}/datasets`, { name: `api dataset ${fresh()}`, quantity: { x: { kind: "cos_theta" }, y: { kind: "dsigma_dcos", unit: "nb" } } }),
    denied: apiDenied, anonymous: 401,
  },
  { name: "GET /api/v1/manuscripts/:id/datasets/:d", allowed: MEMBERS, call: (c) => c.get(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}`), denied: apiDenied, anonymous: 401 },
  { name: "GET /api/v1/…/datasets/:d/revisions", allowed: MEMBERS, call: (c) => c.get(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions`), denied: apiDenied, anonymous: 401 },
  {
    name: "POST /api/v1/…/datasets/:d/revisions", allowed: AUTHORS, okStatus: 201,
    call: (c) => c.upload(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions`, angularCsv([fresh(), 2, 2, 2, 2])),
    denied: apiDenied, anonymous: 401,
  },
  { name: "GET /api/v1/…/revisions/1", allowed: MEMBERS, call: (c) => c.get(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions/1`), denied: apiDenied, anonymous: 401 },
  { name: "GET /api/v1/…/revisions/1/rows", allowed: MEMBERS, call: (c) => c.get(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions/1/rows`), denied: apiDenied, anonymous: 401 },
  {
    name: "POST /manuscripts/:id/datasets/:d (mapping step)", allowed: AUTHORS, okStatus: 422,
    // A made-up waiting file: the allowed roles reach the check and are told to upload again.
    call: (c) => c.post(`/manuscripts/${manuscriptId}/datasets/${datasetId}`, { pending: "00000000-0000-4000-8000-000000000000.upload.forged", fileName: "x.csv", x: "theta", y: "dsigma" }),
    denied: pageDenied, anonymous: 302,
  },
  {
    name: "GET another manuscript's dataset under this manuscript's address", allowed: [],
    call: (c) => c.get(`/api/v1/manuscripts/${manuscriptId}/datasets/${otherDatasetId}`), denied: () => 404, anonymous: 401,
  },
  {
    name: "DELETE /api/v1/manuscripts/:id (a method it does not take)", allowed: [],
    call: (c) => c.request(`/api/v1/manuscripts/${manuscriptId}`, { method: "DELETE" }), denied: () => 405, anonymous: 401,
  },
  // Figures (issue 8): every member reads, only authors (corresponding, contributor) edit.
  { name: "GET /manuscripts/:id/figures", allowed: MEMBERS, call: (c) => c.get(`/manuscripts/${manuscriptId}/figures`), denied: pageDenied, anonymous: 302 },
  {
    name: "POST /manuscripts/:id/figures (create)", allowed: AUTHORS, okStatus: 302,
    call: (c) => c.post(`/manuscripts/${manuscriptId}/figures`, { title: `page figure ${fresh()}`, start: datasetId }), denied: pageDenied, anonymous: 302,
  },
  {
    name: "POST /predictions (add to a figure)", allowed: AUTHORS,
    call: (c) => c.post("/predictions", { figureId, layer: JSON.stringify({ label: "QED, Born", process: "compton", energy: { kind: "kinetic", value: 0.5, unit: "GeV" } }) }),
    denied: pageDenied, anonymous: 302,
  },
  { name: "GET /manuscripts/:id/figures/:f", allowed: MEMBERS, call: (c) => c.get(`/manuscripts/${manuscriptId}/figures/${figureId}`), denied: pageDenied, anonymous: 302 },
  {
    name: "POST /manuscripts/:id/figures/:f (save the draft)", allowed: AUTHORS,
    call: async (c) => c.postJson(`/manuscripts/${manuscriptId}/figures/${figureId}`, await currentDraft()), denied: pageDenied, anonymous: 302,
  },
  { name: "GET /api/v1/manuscripts/:id/figures", allowed: MEMBERS, call: (c) => c.get(`/api/v1/manuscripts/${manuscriptId}/figures`), denied: apiDenied, anonymous: 401 },
  {
    name: "POST /api/v1/manuscripts/:id/figures", allowed: AUTHORS, okStatus: 201,
    call: (c) => c.postJson(`/api/v1/manuscripts/${manuscriptId}/figures`, { title: `api figure ${fresh()}` }), denied: apiDenied, anonymous: 401,
  },
  { name: "GET /api/v1/figures/:f/draft", allowed: MEMBERS, call: (c) => c.get(`/api/v1/figures/${figureId}/draft`), denied: apiDenied, anonymous: 401 },
  {
    name: "PUT /api/v1/figures/:f/draft", allowed: AUTHORS,
    call: async (c) => c.request(`/api/v1/figures/${figureId}/draft`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(await currentDraft()) }),
    denied: apiDenied, anonymous: 401,
  },
  { name: "GET /api/v1/figures/:f/draft.svg", allowed: MEMBERS, call: (c) => c.get(`/api/v1/figures/${figureId}/draft.svg`), denied: apiDenied, anonymous: 401 },
  { name: "GET /api/v1/…/revisions/1/raw", allowed: READERS_OF_RAW, call: (c) => c.get(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions/1/raw`), denied: apiDenied, anonymous: 401 },
  // Sealed versions and sign-off (issue 9): every member reads; authors seal and ask; co-authors
  // and corresponding authors who were asked sign off or return (a contributor never does, so
  // nobody signs off their own contributor's seal by role); observers only read.
  { name: "GET /inbox", allowed: SIGNED_IN, call: (c) => c.get("/inbox"), denied: () => 0, anonymous: 302 },
  { name: "GET /manuscripts/:id/figures/:f/versions/1", allowed: MEMBERS, call: (c) => c.get(`/manuscripts/${manuscriptId}/figures/${versionFigureId}/versions/1`), denied: pageDenied, anonymous: 302 },
  { name: "GET /manuscripts/:id/figures/:f/compare", allowed: MEMBERS, call: (c) => c.get(`/manuscripts/${manuscriptId}/figures/${versionFigureId}/compare?from=1&to=1`), denied: pageDenied, anonymous: 302 },
  {
    name: "POST /manuscripts/:id/figures/:f/versions (seal)", allowed: AUTHORS, okStatus: 302,
    call: async (c) => c.post(`/manuscripts/${manuscriptId}/figures/${versionFigureId}/versions`, { draftRevision: String(await freshDraftRevision()) }), denied: pageDenied, anonymous: 302,
  },
  {
    name: "POST /manuscripts/:id/figures/:f/versions/:n (request sign-off)", allowed: AUTHORS,
    call: async (c) => c.post(`/manuscripts/${manuscriptId}/figures/${versionFigureId}/versions/${await freshVersion([])}`, { intent: "request", reviewer: await coauthorId() }), denied: pageDenied, anonymous: 302,
  },
  {
    name: "POST /manuscripts/:id/figures/:f/versions/:n (sign off, when asked)", allowed: ["coauthor", "corresponding"],
    call: async (c) => c.post(`/manuscripts/${manuscriptId}/figures/${versionFigureId}/versions/${await freshVersion(["coauthor", "corresponding"])}`, { intent: "sign-off", comment: "" }), denied: pageDenied, anonymous: 302,
  },
  {
    name: "POST /manuscripts/:id/figures/:f/versions/:n (comment)", allowed: READERS_OF_RAW,
    call: (c) => c.post(`/manuscripts/${manuscriptId}/figures/${versionFigureId}/versions/1`, { intent: "comment", comment: `note ${fresh()}` }), denied: pageDenied, anonymous: 302,
  },
  { name: "GET /api/v1/figures/:f/versions", allowed: MEMBERS, call: (c) => c.get(`/api/v1/figures/${versionFigureId}/versions`), denied: apiDenied, anonymous: 401 },
  {
    name: "POST /api/v1/figures/:f/versions (seal)", allowed: AUTHORS, okStatus: 201,
    call: async (c) => c.postJson(`/api/v1/figures/${versionFigureId}/versions`, { draftRevision: await freshDraftRevision() }), denied: apiDenied, anonymous: 401,
  },
  { name: "GET /api/v1/figures/:f/versions/1", allowed: MEMBERS, call: (c) => c.get(`/api/v1/figures/${versionFigureId}/versions/1`), denied: apiDenied, anonymous: 401 },
  { name: "GET /api/v1/figures/:f/versions/1/figure.svg", allowed: MEMBERS, call: (c) => c.get(`/api/v1/figures/${versionFigureId}/versions/1/figure.svg`), denied: apiDenied, anonymous: 401 },
  {
    name: "POST /api/v1/figures/:f/versions/:n/review-requests", allowed: AUTHORS, okStatus: 201,
    call: async (c) => c.postJson(`/api/v1/figures/${versionFigureId}/versions/${await freshVersion([])}/review-requests`, { reviewerIds: [await coauthorId()] }), denied: apiDenied, anonymous: 401,
  },
  {
    name: "POST /api/v1/figures/:f/versions/:n/sign-off (when asked)", allowed: ["coauthor", "corresponding"],
    call: async (c) => c.postJson(`/api/v1/figures/${versionFigureId}/versions/${await freshVersion(["coauthor", "corresponding"])}/sign-off`, {}), denied: apiDenied, anonymous: 401,
  },
  {
    name: "POST /api/v1/figures/:f/versions/:n/return (when asked)", allowed: ["coauthor", "corresponding"],
    call: async (c) => c.postJson(`/api/v1/figures/${versionFigureId}/versions/${await freshVersion(["coauthor", "corresponding"])}/return`, { comment: "Not yet." }), denied: apiDenied, anonymous: 401,
  },
  {
    name: "POST /api/v1/figures/:f/versions/:n/comments", allowed: READERS_OF_RAW, okStatus: 201,
    call: (c) => c.postJson(`/api/v1/figures/${versionFigureId}/versions/1/comments`, { comment: `note ${fresh()}` }), denied: apiDenied, anonymous: 401,
  },
  // Exports (issue 10): only a corresponding author, only a signed-off version; checking a bundle needs no account.
  {
    name: "POST /api/v1/figures/:f/versions/:n/exports", allowed: ["corresponding"], okStatus: 202,
    call: async (c) => c.postJson(`/api/v1/figures/${versionFigureId}/versions/${await signedOffVersion()}/exports`, {}), denied: apiDenied, anonymous: 401,
  },
  { name: "GET /api/v1/figures/:f/versions/:n/exports", allowed: ["corresponding"], call: async (c) => c.get(`/api/v1/figures/${versionFigureId}/versions/${await signedOffVersion()}/exports`), denied: apiDenied, anonymous: 401 },
  {
    name: "POST /manuscripts/:id/figures/:f/versions/:n (export)", allowed: ["corresponding"],
    call: async (c) => c.post(`/manuscripts/${manuscriptId}/figures/${versionFigureId}/versions/${await signedOffVersion()}`, { intent: "export" }), denied: pageDenied, anonymous: 302,
  },
  { name: "GET /api/v1/exports/:e", allowed: ["corresponding"], call: async (c) => c.get(`/api/v1/exports/${await doneExport()}`), denied: apiDenied, anonymous: 401 },
  { name: "GET /api/v1/exports/:e/files/bundle.zip", allowed: ["corresponding"], call: async (c) => c.get(`/api/v1/exports/${await doneExport()}/files/bundle.zip`), denied: apiDenied, anonymous: 401 },
  { name: "GET /api/v1/exports/:e/files/figure.pdf", allowed: ["corresponding"], call: async (c) => c.get(`/api/v1/exports/${await doneExport()}/files/figure.pdf`), denied: apiDenied, anonymous: 401 },
  { name: "GET /verify (check a bundle)", allowed: EVERYONE, call: (c) => c.get("/verify"), denied: () => 0, anonymous: 200 },
  {
    name: "POST /verify (check a bundle)", allowed: EVERYONE,
    call: (c) => {
      const form = new FormData();
      form.set("bundle", new Blob([new Uint8Array([80, 75, 5, 6])], { type: "application/zip" }), "empty.zip");
      return c.request("/verify", { method: "POST", body: form });
    },
    denied: () => 0, anonymous: 200,
  },
  {
    name: "GET a version the figure does not have (the matrix figure is never sealed)", allowed: [],
    call: (c) => c.get(`/api/v1/figures/${figureId}/versions/1`), denied: () => 404, anonymous: 401,
  },
];

describe("authorisation matrix (foundation, dataset, figure and version routes)", () => {
  for (const k of cases) {
    it(`${k.name}: allowed exactly for ${k.allowed.join(", ")}`, async () => {
      const got: Record<string, number> = {};
      const want: Record<string, number> = {};
      for (const w of EVERYONE) {
        got[w] = (await k.call(clients[w])).status;
        want[w] = k.allowed.includes(w) ? (k.okStatus ?? 200) : w === "anonymous" ? k.anonymous : k.denied(w);
      }
      expect(got).toEqual(want);
    });
  }

  it("a personal access token gets exactly what its owner's session gets", async () => {
    const created = await clients.contributor.post("/account", { intent: "create-token", name: "matrix token" });
    const secret = /data-testid="new-token">(sdn_[A-Za-z0-9_-]+)</.exec(await created.text())![1];
    const bearer = { Authorization: `Bearer ${secret}` };
    const anon = new Client();
    expect((await anon.get(`/api/v1/manuscripts/${manuscriptId}/datasets`, bearer)).status).toBe(200);
    expect((await anon.get(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions/1/raw`, bearer)).status).toBe(200);
    expect((await anon.get(`/api/v1/manuscripts/${otherManuscriptId}/datasets`, bearer)).status).toBe(200);
    expect((await anon.postJson(`/api/v1/manuscripts/${otherManuscriptId}/datasets`, { name: "x", quantity: { x: { kind: "cos_theta" }, y: { kind: "sigma", unit: "nb" } } }, bearer)).status).toBe(403);
    // A token is for the API: pages still need the session.
    expect((await anon.get(`/manuscripts/${manuscriptId}`, bearer)).status).toBe(302);
  });

  it("ids that are not uuids are 404s, never 500s", async () => {
    for (const path of [`/api/v1/manuscripts/${"-".repeat(36)}`, `/api/v1/manuscripts/${"a".repeat(36)}`, `/api/v1/manuscripts/${manuscriptId}/datasets/${"-".repeat(36)}`, `/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions/r99999999999`]) {
      const res = await clients.corresponding.get(path);
      expect(res.status, path).toBe(404);
      expect(res.headers.get("content-type"), path).toMatch(/application\/json/);
    }
    expect((await clients.corresponding.get("/api/v2/anything")).headers.get("content-type")).toMatch(/application\/json/);
  });

  it("API denials are JSON with an error code and message, never HTML", async () => {
    for (const [who, path] of [["anonymous", "/api/v1/manuscripts"], ["outsider", `/api/v1/manuscripts/${manuscriptId}`], ["outsider", "/api/v1/no-such-thing"]] as const) {
      const res = await clients[who].get(path);
      expect(res.headers.get("content-type"), `${who} ${path}`).toMatch(/application\/json/);
      const body = (await res.json()) as { error: { code: string; message: string } };
      expect(typeof body.error.code).toBe("string");
      expect(body.error.message.length).toBeGreaterThan(10);
    }
  });

  it("nobody signs off their own seal: a corresponding author who sealed cannot be asked, and is not a reviewer of it", async () => {
    const sealed = await clients.corresponding.postJson(`/api/v1/figures/${versionFigureId}/versions`, { draftRevision: await freshDraftRevision() });
    expect(sealed.status).toBe(201);
    const n = ((await sealed.json()) as { version: { number: number } }).version.number;
    const correspondingId = (await db.selectFrom("membership").select("user_id").where("manuscript_id", "=", manuscriptId).where("role", "=", "corresponding").executeTakeFirstOrThrow()).user_id;
    const asked = await clients.contributor.postJson(`/api/v1/figures/${versionFigureId}/versions/${n}/review-requests`, { reviewerIds: [correspondingId] });
    expect(asked.status).toBe(422);
    expect(((await asked.json()) as { error: { code: string } }).error.code).toBe("sealer-review");
    const own = await clients.corresponding.postJson(`/api/v1/figures/${versionFigureId}/versions/${n}/sign-off`, {});
    expect(own.status).toBe(403);
    expect(((await own.json()) as { error: { code: string } }).error.code).toBe("not-requested");
    // A contributor's own version: the contributor's role has no sign-off at all.
    const mine = await freshVersion(["coauthor"]);
    const contributorSignOff = await clients.contributor.postJson(`/api/v1/figures/${versionFigureId}/versions/${mine}/sign-off`, {});
    expect(contributorSignOff.status).toBe(403);
    expect(((await contributorSignOff.json()) as { error: { message: string } }).error.message).toBe("This needs the role of co-author or corresponding author; your role here is contributor.");
  });

  it("a 403 page names the role that is needed", async () => {
    const res = await clients.observer.get(`/manuscripts/${manuscriptId}/audit`);
    expect(res.status).toBe(403);
    expect(await res.text()).toContain("This needs the role of corresponding author; your role here is observer.");
  });
});

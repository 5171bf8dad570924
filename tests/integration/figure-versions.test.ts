// Sealed versions and their review through the API (issue 9, docs/decisions/0010-sealed-versions.md):
// the snapshot and its fingerprint, immutability in the database itself (raw SQL as the
// application's database user), the review flow and its derived states, notifications by e-mail
// (the local mail catcher) and in the inbox, the audit log, and concurrent requests.
import { createHash } from "node:crypto";
import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { canonicalJson } from "../../app/engine/canonical-json";
import { rerenderVersion } from "../../app/.server/versions/rerender-version.server";
import { Client } from "../support/http";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { waitForMail } from "../support/mail";
import { TEST_PASSWORD, createAccount, createManuscriptWith } from "../support/accounts";
import { angularCsv, createDatasetViaApi } from "../support/datasets";

const db = connect(testEnv.appDatabaseUrl, 8);
type Who = "contributor" | "coauthor" | "coauthor2" | "corresponding" | "observer";
const people = {} as Record<Who, { id: string; email: string; client: Client }>;
let manuscriptId = "";
let datasetId = "";

const sha256 = (s: string) => createHash("sha256").update(s, "utf8").digest("hex");

beforeAll(async () => {
  const roles: Record<Who, "contributor" | "coauthor" | "corresponding" | "observer"> = { contributor: "contributor", coauthor: "coauthor", coauthor2: "coauthor", corresponding: "corresponding", observer: "observer" };
  for (const w of Object.keys(roles) as Who[]) {
    const a = await createAccount(db, `versions-${w}`);
    people[w] = { ...a, client: new Client() };
    await people[w].client.signIn(a.email, TEST_PASSWORD);
  }
  manuscriptId = await createManuscriptWith(db, (Object.keys(roles) as Who[]).map((w) => ({ id: people[w].id, role: roles[w] })), "Versions test manuscript");
  datasetId = await createDatasetViaApi(people.contributor.client, manuscriptId, "versions data", { metadata: { process: "bhabha", beamEnergyGeV: 1 } });
  expect((await people.contributor.client.upload(`/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions`, angularCsv())).status).toBe(201);
});
afterAll(() => db.destroy());

async function newFigure(title: string) {
  const res = await people.contributor.client.postJson(`/api/v1/manuscripts/${manuscriptId}/figures`, { title, from: { datasetId } });
  expect(res.status).toBe(201);
  return ((await res.json()) as { figure: { id: string } }).figure.id;
}

async function draftOf(figureId: string) {
  return (await (await people.contributor.client.get(`/api/v1/figures/${figureId}/draft`)).json()) as { draftRevision: number; model: Record<string, any> };
}

/** Saves an edit of the draft (as the contributor) and returns the new revision. */
async function edit(figureId: string, change: (m: Record<string, any>) => void): Promise<number> {
  const { draftRevision, model } = await draftOf(figureId);
  change(model);
  const res = await people.contributor.client.request(`/api/v1/figures/${figureId}/draft`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify({ baseRevision: draftRevision, model }) });
  expect(res.status).toBe(200);
  return ((await res.json()) as { draftRevision: number }).draftRevision;
}

const seal = (who: Who, figureId: string, draftRevision: number) => people[who].client.postJson(`/api/v1/figures/${figureId}/versions`, { draftRevision });
async function sealOk(who: Who, figureId: string) {
  const res = await seal(who, figureId, (await draftOf(figureId)).draftRevision);
  expect(res.status, await res.clone().text()).toBe(201);
  return ((await res.json()) as { version: { id: string; number: number; fingerprint: string } }).version;
}
const ask = (who: Who, figureId: string, n: number, reviewers: Who[]) =>
  people[who].client.postJson(`/api/v1/figures/${figureId}/versions/${n}/review-requests`, { reviewerIds: reviewers.map((r) => people[r].id) });
const signOff = (who: Who, figureId: string, n: number, comment?: string) => people[who].client.postJson(`/api/v1/figures/${figureId}/versions/${n}/sign-off`, comment ? { comment } : {});
const giveBack = (who: Who, figureId: string, n: number, comment: string) => people[who].client.postJson(`/api/v1/figures/${figureId}/versions/${n}/return`, { comment });
async function stateOf(figureId: string, n: number): Promise<string> {
  const res = await people.observer.client.get(`/api/v1/figures/${figureId}/versions/${n}`);
  expect(res.status).toBe(200);
  return ((await res.json()) as { version: { state: string } }).version.state;
}
async function errorOf(res: Response) {
  return ((await res.json()) as { error: { code: string; message: string; field?: string } }).error;
}

describe("sealing", () => {
  it("freezes the draft into v1: model, revision ids and hashes, engine, requests and tables, the SVG and a recomputable fingerprint", async () => {
    const figureId = await newFigure("sealed snapshot");
    const { draftRevision, model } = await draftOf(figureId);
    const v = await sealOk("contributor", figureId);
    expect(v.number).toBe(1);
    const body = (await (await people.observer.client.get(`/api/v1/figures/${figureId}/versions/1`)).json()) as {
      version: { state: string; fingerprint: string; svgSha256: string; draftRevision: number; next: { who: string } };
      snapshot: { model: unknown; engineVersion: string; figure: { draftRevision: number }; datasets: { datasetId: string; revisionNumber: number; revisionId: string; contentHash: string; rowCount: number }[]; predictions: { request: Record<string, unknown>; parametersHash: string; engineVersion: string; table: { x: number[]; y: number[] } }[] };
    };
    expect(body.version).toMatchObject({ state: "sealed", draftRevision, next: { who: "authors" } });
    expect(body.snapshot.model).toEqual(model);
    const rev = await db.selectFrom("dataset_revision").select(["id", "content_hash", "row_count"]).where("dataset_id", "=", datasetId).where("number", "=", 1).executeTakeFirstOrThrow();
    expect(body.snapshot.datasets).toEqual([expect.objectContaining({ datasetId, revisionNumber: 1, revisionId: rev.id, contentHash: rev.content_hash, rowCount: rev.row_count })]);
    const inputs = await db.selectFrom("figure_version_input").selectAll().where("version_id", "=", v.id).execute();
    expect(inputs).toEqual([{ version_id: v.id, revision_id: rev.id, dataset_id: datasetId, revision_number: 1, content_hash: rev.content_hash }]);

    // Each stored prediction, sent again to the public prediction API, gives the stored hash and table.
    expect(body.snapshot.predictions.length).toBe(1);
    for (const p of body.snapshot.predictions) {
      expect(p.table.x.length).toBe(400);
      const again = (await (await people.observer.client.postJson("/api/v1/predictions", p.request)).json()) as { parametersHash: string; engineVersion: string; values: number[] };
      expect(again.parametersHash).toBe(p.parametersHash);
      expect(again.engineVersion).toBe(body.snapshot.engineVersion);
      expect(again.values).toEqual(p.table.y);
    }

    // The stored SVG is what its hash says, and the fingerprint follows from the stored row
    // (SHA-256 by node:crypto over the canonical JSON of what it covers).
    const row = await db.selectFrom("figure_version").selectAll().where("id", "=", v.id).executeTakeFirstOrThrow();
    expect(sha256(row.svg)).toBe(row.svg_sha256);
    const recomputed = sha256(canonicalJson({ fingerprintFormat: 1, figureId, number: 1, snapshot: row.snapshot, svgSha256: row.svg_sha256, sealedBy: people.contributor.id, sealedAt: row.sealed_at.toISOString() }));
    expect(row.fingerprint).toBe(recomputed);
    expect(body.version.fingerprint).toBe(recomputed);

    // The same renderer as the draft SVG: the two differ only in what their metadata says.
    const draftSvg = await (await people.observer.client.get(`/api/v1/figures/${figureId}/draft.svg`)).text();
    const sealedSvg = await (await people.observer.client.get(`/api/v1/figures/${figureId}/versions/1/figure.svg`)).text();
    expect(sealedSvg).toBe(row.svg);
    expect(sealedSvg).toContain(`Sealed version v1 of figure ${figureId}, from draft revision ${draftRevision}.`);
    expect(sealedSvg).not.toContain("Unsealed draft");
    const withoutMetadata = (s: string) => s.replace(/<metadata>.*?<\/metadata>/s, "");
    expect(withoutMetadata(sealedSvg)).toBe(withoutMetadata(draftSvg));
    expect(sealedSvg.length).toBeGreaterThan(10_000);

    // Drawn again from the snapshot alone (as an export does), the picture is the same bytes; a
    // snapshot that differs in one number is not.
    const again = await rerenderVersion(db, row);
    expect(again).toMatchObject({ inputsMatch: true, matches: true, svgSha256: row.svg_sha256 });
    expect(again.svg).toBe(row.svg);
    const altered = structuredClone(row.snapshot) as { model: { fontSizePt: number } };
    altered.model.fontSizePt += 0.5;
    expect((await rerenderVersion(db, { ...row, snapshot: altered })).matches).toBe(false);

    const audit = await db.selectFrom("audit_event").select(["action", "detail", "actor_id"]).where("manuscript_id", "=", manuscriptId).where("action", "=", "version-sealed").where("detail", "@>", JSON.stringify({ figureId }) as never).execute();
    expect(audit).toEqual([{ action: "version-sealed", actor_id: people.contributor.id, detail: expect.objectContaining({ number: 1, fingerprint: row.fingerprint, draftRevision }) }]);
  });

  it("numbers versions v1, v2, … as the draft goes on; the same draft revision is not sealed twice; a stale revision is a 409", async () => {
    const figureId = await newFigure("numbering");
    const r1 = (await draftOf(figureId)).draftRevision;
    expect((await seal("contributor", figureId, r1)).status).toBe(201);
    const again = await seal("corresponding", figureId, r1);
    expect(again.status).toBe(409);
    expect(await errorOf(again)).toMatchObject({ code: "already-sealed" });
    const r2 = await edit(figureId, (m) => { m.fontSizePt = 9; });
    const stale = await seal("contributor", figureId, r1);
    expect(stale.status).toBe(409);
    expect(await errorOf(stale)).toMatchObject({ code: "stale-draft", field: "draftRevision" });
    const v2 = await seal("corresponding", figureId, r2);
    expect(v2.status).toBe(201);
    expect(((await v2.json()) as { version: { number: number } }).version.number).toBe(2);
    const list = (await (await people.observer.client.get(`/api/v1/figures/${figureId}/versions`)).json()) as { versions: { number: number; state: string; draftRevision: number }[] };
    expect(list.versions.map((v) => [v.number, v.draftRevision, v.state])).toEqual([[2, r2, "sealed"], [1, r1, "superseded"]]);
  });

  it("refuses a draft that names a missing revision, with the layer named; refuses sealing to observers and co-authors", async () => {
    const figureId = await newFigure("missing revision");
    const rev = await edit(figureId, (m) => { m.panels[0].layers.find((l: { kind: string }) => l.kind === "dataset").revisionNumber = 99; });
    const res = await seal("contributor", figureId, rev);
    expect(res.status).toBe(422);
    const error = await errorOf(res);
    expect(error.code).toBe("missing-revision");
    expect(error.message).toMatch(/revision r99 of dataset/);
    expect(error.message).toMatch(/cannot be sealed/);
    expect((await seal("observer", figureId, rev)).status).toBe(403);
    expect((await seal("coauthor", figureId, rev)).status).toBe(403);
    expect(await db.selectFrom("figure_version").select("id").where("figure_id", "=", figureId).execute()).toEqual([]);
  });

  it("refuses a draft whose TeX does not render, naming the field", async () => {
    const figureId = await newFigure("bad tex");
    const rev = await edit(figureId, (m) => { m.y.label = "\\frac{"; });
    const res = await seal("contributor", figureId, rev);
    expect(res.status).toBe(422);
    expect(await errorOf(res)).toMatchObject({ code: "tex-error", field: "model.y.label" });
    expect(await db.selectFrom("figure_version").select("id").where("figure_id", "=", figureId).execute()).toEqual([]);
  });
});

describe("immutability in the database", () => {
  it("refuses UPDATE, DELETE and TRUNCATE of versions, their inputs, requests and events, as the application's database user", async () => {
    const figureId = await newFigure("immutable");
    const v = await sealOk("contributor", figureId);
    expect((await ask("contributor", figureId, 1, ["coauthor"])).status).toBe(201);
    expect((await signOff("coauthor", figureId, 1, "fine")).status).toBe(200);
    const who = await sql<{ current_user: string; rolsuper: boolean }>`SELECT current_user, rolsuper FROM pg_roles WHERE rolname = current_user`.execute(db);
    expect(who.rows[0]).toEqual({ current_user: new URL(testEnv.appDatabaseUrl).username, rolsuper: false });
    for (const statement of [
      sql`UPDATE figure_version SET svg = '<svg/>', svg_sha256 = encode(sha256('<svg/>'), 'hex') WHERE id = ${v.id}`,
      sql`UPDATE figure_version SET snapshot = '{}' WHERE id = ${v.id}`,
      sql`DELETE FROM figure_version WHERE id = ${v.id}`,
      sql`TRUNCATE figure_version CASCADE`,
      sql`UPDATE figure_version_input SET content_hash = content_hash WHERE version_id = ${v.id}`,
      sql`DELETE FROM figure_version_input WHERE version_id = ${v.id}`,
      sql`DELETE FROM review_request WHERE version_id = ${v.id}`,
      sql`UPDATE review_request SET requested_at = now() WHERE version_id = ${v.id}`,
      sql`UPDATE version_event SET kind = 'returned', comment = 'x' WHERE version_id = ${v.id}`,
      sql`DELETE FROM version_event WHERE version_id = ${v.id}`,
      sql`TRUNCATE version_event`,
    ]) {
      await expect(statement.execute(db)).rejects.toThrow(/immutable/);
    }
    expect(await stateOf(figureId, 1)).toBe("signed off");
  });

  it("refuses an SVG that is not the one its hash names, a gap in the numbering, and impossible review steps", async () => {
    const figureId = await newFigure("guards");
    const v = await sealOk("contributor", figureId);
    const base = { figure_id: figureId, manuscript_id: manuscriptId, snapshot: "{}", sealed_by: people.contributor.id, sealed_at: new Date(), fingerprint: "a".repeat(64) };
    await expect(db.insertInto("figure_version").values({ ...base, number: 2, draft_revision: 50, svg: "<svg/>", svg_sha256: "b".repeat(64) }).execute()).rejects.toThrow(/figure_version_svg_hash_check/);
    await expect(db.insertInto("figure_version").values({ ...base, number: 3, draft_revision: 51, svg: "<svg/>", svg_sha256: sha256("<svg/>") }).execute()).rejects.toThrow(/the next one is v2, not v3/);
    // A decision by someone never asked; a request of an observer, of a contributor, of the sealer.
    await expect(db.insertInto("version_event").values({ version_id: v.id, kind: "signed-off", actor_id: people.coauthor.id, reviewer_id: people.coauthor.id }).execute()).rejects.toThrow(/version_event_request_fkey/);
    await expect(db.insertInto("review_request").values({ version_id: v.id, reviewer_id: people.observer.id, requested_by: people.corresponding.id }).execute()).rejects.toThrow(/only a co-author or corresponding author .* \(this member is observer\)/);
    await expect(db.insertInto("review_request").values({ version_id: v.id, reviewer_id: people.contributor.id, requested_by: people.corresponding.id }).execute()).rejects.toThrow(/the sealer of a version cannot review it/);
    await expect(db.insertInto("review_request").values({ version_id: v.id, reviewer_id: people.coauthor.id, requested_by: people.coauthor.id }).execute()).rejects.toThrow(/review_request_not_self_check/);
    // A return without a comment; any step after a return.
    expect((await ask("contributor", figureId, 1, ["coauthor", "coauthor2"])).status).toBe(201);
    await expect(db.insertInto("version_event").values({ version_id: v.id, kind: "returned", actor_id: people.coauthor.id, reviewer_id: people.coauthor.id }).execute()).rejects.toThrow(/version_event_comment_check/);
    expect((await giveBack("coauthor", figureId, 1, "axis label is wrong")).status).toBe(200);
    await expect(db.insertInto("version_event").values({ version_id: v.id, kind: "signed-off", actor_id: people.coauthor2.id, reviewer_id: people.coauthor2.id }).execute()).rejects.toThrow(/is returned already/);
    expect(await stateOf(figureId, 1)).toBe("returned");
  });
});

describe("review", () => {
  it("requested → in review → returned with a comment; a new version signed off by all; e-mail, inbox and audit for each step", async () => {
    const figureId = await newFigure("review flow");
    const v1 = await sealOk("contributor", figureId);
    expect((await ask("contributor", figureId, 1, ["coauthor", "corresponding"])).status).toBe(201);
    expect(await stateOf(figureId, 1)).toBe("in review");

    // The request reaches both reviewers by e-mail and in their inbox, naming manuscript, figure, version and fingerprint, with a link.
    for (const w of ["coauthor", "corresponding"] as const) {
      const mail = await waitForMail(people[w].email, (m) => m.subject.includes("review flow") && m.subject.startsWith("Sign-off requested"));
      expect(mail.text).toContain("Versions test manuscript");
      expect(mail.text).toContain("“review flow”");
      expect(mail.text).toContain("version v1");
      expect(mail.text).toContain(v1.fingerprint);
      expect(mail.text).toContain(`${testEnv.appUrl}/manuscripts/${manuscriptId}/figures/${figureId}/versions/1`);
      const inbox = await db.selectFrom("notification").select(["kind", "link", "body", "read_at"]).where("user_id", "=", people[w].id).where("figure_id", "=", figureId).execute();
      expect(inbox).toEqual([{ kind: "requested", link: `/manuscripts/${manuscriptId}/figures/${figureId}/versions/1`, body: expect.stringContaining(v1.fingerprint), read_at: null }]);
    }

    expect((await signOff("coauthor", figureId, 1, "looks right")).status).toBe(200);
    expect(await stateOf(figureId, 1)).toBe("in review");
    const noComment = await giveBack("corresponding", figureId, 1, "  ");
    expect(noComment.status).toBe(422);
    expect(await errorOf(noComment)).toMatchObject({ code: "comment-required", field: "comment" });
    const back = await giveBack("corresponding", figureId, 1, "Please use the CM frame.");
    expect(back.status).toBe(200);
    expect(await back.json()).toEqual({ decision: "returned", state: "returned" });
    const returned = await waitForMail(people.contributor.email, (m) => m.subject.startsWith("Returned") && m.subject.includes("review flow"));
    expect(returned.text).toContain("Please use the CM frame.");
    // Nothing more happens to a returned version.
    expect((await ask("contributor", figureId, 1, ["coauthor2"])).status).toBe(409);
    expect((await signOff("coauthor", figureId, 1)).status).toBe(409);

    await edit(figureId, (m) => { m.x.frame = "cm"; });
    const v2 = await sealOk("contributor", figureId);
    expect(v2.number).toBe(2);
    expect(await stateOf(figureId, 1)).toBe("returned");
    expect((await ask("contributor", figureId, 2, ["coauthor", "coauthor2"])).status).toBe(201);
    expect((await signOff("coauthor", figureId, 2)).status).toBe(200);
    const done = await signOff("coauthor2", figureId, 2, "good");
    expect(await done.json()).toEqual({ decision: "signed-off", state: "signed off" });
    // The sealer and the corresponding author hear of it; the one who signed last does not.
    await waitForMail(people.contributor.email, (m) => m.subject.startsWith("Signed off") && m.subject.includes("review flow"));
    await waitForMail(people.corresponding.email, (m) => m.subject.startsWith("Signed off") && m.subject.includes("review flow"));
    const list = (await (await people.observer.client.get(`/api/v1/figures/${figureId}/versions`)).json()) as { versions: { number: number; state: string; next: { who: string } }[] };
    expect(list.versions.map((v) => [v.number, v.state, v.next.who])).toEqual([[2, "signed off", "corresponding"], [1, "returned", "authors"]]);

    // A v3 signed off makes v2 superseded.
    await edit(figureId, (m) => { m.fontSizePt = 9; });
    await sealOk("contributor", figureId);
    expect(await stateOf(figureId, 2)).toBe("signed off");
    expect((await ask("contributor", figureId, 3, ["coauthor"])).status).toBe(201);
    expect((await signOff("coauthor", figureId, 3)).status).toBe(200);
    expect(await stateOf(figureId, 2)).toBe("superseded");
    expect(await stateOf(figureId, 3)).toBe("signed off");

    const actions = await db.selectFrom("audit_event").select("action").where("manuscript_id", "=", manuscriptId).where("detail", "@>", JSON.stringify({ figureId }) as never).where("action", "like", "version-%").orderBy("id").execute();
    expect(actions.map((a) => a.action)).toEqual(["version-sealed", "version-signed-off", "version-returned", "version-sealed", "version-signed-off", "version-signed-off", "version-sealed", "version-signed-off", "version-superseded"]);
    const requests = await db.selectFrom("audit_event").select("detail").where("action", "=", "signoff-requested").where("detail", "@>", JSON.stringify({ figureId }) as never).execute();
    expect(requests.length).toBe(3);
  });

  it("sealing a newer version while one is in review supersedes it and tells its reviewers", async () => {
    const figureId = await newFigure("superseded in review");
    await sealOk("contributor", figureId);
    expect((await ask("contributor", figureId, 1, ["coauthor"])).status).toBe(201);
    await edit(figureId, (m) => { m.fontSizePt = 9; });
    await sealOk("corresponding", figureId);
    expect(await stateOf(figureId, 1)).toBe("superseded");
    const mail = await waitForMail(people.coauthor.email, (m) => m.subject.startsWith("Superseded") && m.subject.includes("superseded in review"));
    expect(mail.text).toMatch(/sealed v2 .* while v1 was waiting for review/);
    const res = await signOff("coauthor", figureId, 1);
    expect(res.status).toBe(409);
    expect((await errorOf(res)).message).toMatch(/superseded by v2/);
    const versions = (await (await people.coauthor.client.get(`/api/v1/figures/${figureId}/versions`)).json()) as { versions: { number: number; state: string; next: { who: string } }[] };
    expect(versions.versions.map((v) => [v.number, v.state])).toEqual([[2, "sealed"], [1, "superseded"]]);
  });

  it("asks only co-authors and corresponding authors, never oneself or the sealer; only a requested reviewer decides", async () => {
    const figureId = await newFigure("who reviews");
    await sealOk("corresponding", figureId);
    const cases: [Who, Who[], number, string][] = [
      ["contributor", ["observer"], 422, "not-a-reviewer"],
      ["contributor", ["contributor"], 422, "self-review"],
      ["contributor", ["corresponding"], 422, "sealer-review"],
      ["contributor", [], 422, "invalid-request"],
    ];
    for (const [who, reviewers, status, code] of cases) {
      const res = await ask(who, figureId, 1, reviewers);
      expect(res.status, `${who} asks ${reviewers.join(", ")}`).toBe(status);
      expect((await errorOf(res)).code).toBe(code);
    }
    expect((await ask("observer", figureId, 1, ["coauthor"])).status).toBe(403);
    expect((await ask("coauthor", figureId, 1, ["coauthor2"])).status).toBe(403);
    expect((await ask("contributor", figureId, 1, ["coauthor"])).status).toBe(201);
    expect((await ask("corresponding", figureId, 1, ["coauthor"])).status).toBe(409);
    const notAsked = await signOff("coauthor2", figureId, 1);
    expect(notAsked.status).toBe(403);
    expect((await errorOf(notAsked)).code).toBe("not-requested");
    expect((await signOff("observer", figureId, 1)).status).toBe(403);
    expect((await signOff("contributor", figureId, 1)).status).toBe(403);
    expect((await people.coauthor.client.get(`/api/v1/figures/${figureId}/versions/7`)).status).toBe(404);
    expect(await stateOf(figureId, 1)).toBe("in review");
  });

  it("keeps a thread of comments per version, in the audit log too", async () => {
    const figureId = await newFigure("thread");
    await sealOk("contributor", figureId);
    for (const [w, text] of [["coauthor", "Is the normalisation right?"], ["contributor", "Yes: 3 % as in the note."]] as const) {
      expect((await people[w].client.postJson(`/api/v1/figures/${figureId}/versions/1/comments`, { comment: text })).status).toBe(201);
    }
    expect((await people.observer.client.postJson(`/api/v1/figures/${figureId}/versions/1/comments`, { comment: "x" })).status).toBe(403);
    expect((await people.coauthor.client.postJson(`/api/v1/figures/${figureId}/versions/1/comments`, { comment: " " })).status).toBe(422);
    const body = (await (await people.observer.client.get(`/api/v1/figures/${figureId}/versions/1`)).json()) as { events: { kind: string; comment?: string; actor: { id: string } }[] };
    expect(body.events.map((e) => [e.kind, e.actor.id, e.comment])).toEqual([["comment", people.coauthor.id, "Is the normalisation right?"], ["comment", people.contributor.id, "Yes: 3 % as in the note."]]);
    const audit = await db.selectFrom("audit_event").select("detail").where("action", "=", "version-commented").where("detail", "@>", JSON.stringify({ figureId }) as never).execute();
    expect(audit.length).toBe(2);
  });
});

describe("concurrency", () => {
  it("a sign-off sent five times at once counts once", async () => {
    const figureId = await newFigure("double sign-off");
    await sealOk("contributor", figureId);
    expect((await ask("contributor", figureId, 1, ["coauthor"])).status).toBe(201);
    const results = await Promise.all(Array.from({ length: 5 }, () => signOff("coauthor", figureId, 1)));
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409, 409, 409]);
    const v = await db.selectFrom("figure_version").select("id").where("figure_id", "=", figureId).executeTakeFirstOrThrow();
    const events = await db.selectFrom("version_event").select("kind").where("version_id", "=", v.id).execute();
    expect(events.map((e) => e.kind).sort()).toEqual(["requested", "signed-off"]);
    expect(await stateOf(figureId, 1)).toBe("signed off");
    const told = await db.selectFrom("notification").select("kind").where("version_id", "=", v.id).where("user_id", "=", people.contributor.id).execute();
    expect(told).toEqual([{ kind: "signed-off" }]);
  });

  it("two reviewers at the same moment: both sign-offs count and the version is signed off once; a return against a sign-off ends returned", async () => {
    const both = await newFigure("two reviewers");
    await sealOk("contributor", both);
    expect((await ask("contributor", both, 1, ["coauthor", "coauthor2"])).status).toBe(201);
    const results = await Promise.all([signOff("coauthor", both, 1), signOff("coauthor2", both, 1)]);
    expect(results.map((r) => r.status)).toEqual([200, 200]);
    const states = (await Promise.all(results.map((r) => r.json()))) as { state: string }[];
    // Exactly one of the two saw the last sign-off.
    expect(states.map((s) => s.state).sort()).toEqual(["in review", "signed off"]);
    const v = await db.selectFrom("figure_version").select("id").where("figure_id", "=", both).executeTakeFirstOrThrow();
    expect(await db.selectFrom("notification").select("kind").where("version_id", "=", v.id).where("user_id", "=", people.contributor.id).execute()).toEqual([{ kind: "signed-off" }]);

    const mixed = await newFigure("sign-off against return");
    await sealOk("contributor", mixed);
    expect((await ask("contributor", mixed, 1, ["coauthor", "coauthor2"])).status).toBe(201);
    const [a, b] = await Promise.all([signOff("coauthor", mixed, 1), giveBack("coauthor2", mixed, 1, "The pull strip hides the low-angle points.")]);
    expect(b.status).toBe(200);
    // The sign-off either came first (200) or found the version returned already (409).
    expect([200, 409]).toContain(a.status);
    expect(await stateOf(mixed, 1)).toBe("returned");
  });

  it("a seal while another tab saves the draft: the seal holds exactly the revision it names, or is refused", async () => {
    const figureId = await newFigure("seal against save");
    const outcomes: string[] = [];
    for (let round = 0; round < 4; round++) {
      const { draftRevision, model } = await draftOf(figureId);
      const changed = { ...model, fontSizePt: 7 + round };
      const [sealed, saved] = await Promise.all([
        seal("contributor", figureId, draftRevision),
        people.corresponding.client.request(`/api/v1/figures/${figureId}/draft`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify({ baseRevision: draftRevision, model: changed }) }),
      ]);
      expect(saved.status).toBe(200);
      expect([201, 409]).toContain(sealed.status);
      outcomes.push(String(sealed.status));
      if (sealed.status === 201) {
        const n = ((await sealed.json()) as { version: { number: number } }).version.number;
        const row = await db.selectFrom("figure_version").select(["draft_revision", "snapshot"]).where("figure_id", "=", figureId).where("number", "=", n).executeTakeFirstOrThrow();
        expect(row.draft_revision).toBe(draftRevision);
        expect((row.snapshot as { model: unknown }).model).toEqual(model);
      } else {
        expect((await errorOf(sealed)).code).toBe("stale-draft");
      }
    }
    const numbers = await db.selectFrom("figure_version").select("number").where("figure_id", "=", figureId).orderBy("number").execute();
    expect(numbers.map((r) => r.number)).toEqual(numbers.map((_, i) => i + 1));
    expect(numbers.length).toBe(outcomes.filter((o) => o === "201").length);
  });

  it("two seals of the same revision at once make one version", async () => {
    const figureId = await newFigure("two seals");
    const { draftRevision } = await draftOf(figureId);
    const results = await Promise.all([seal("contributor", figureId, draftRevision), seal("corresponding", figureId, draftRevision), seal("contributor", figureId, draftRevision)]);
    expect(results.map((r) => r.status).sort()).toEqual([201, 409, 409]);
    expect((await db.selectFrom("figure_version").select("number").where("figure_id", "=", figureId).execute()).map((r) => r.number)).toEqual([1]);
  });
});

// Manuscripts, members and roles through HTTP; the audit log and the JSON API.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { TEST_PASSWORD, createAccount, uniqueEmail } from "../support/accounts";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { Client } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";

const db = connect(testEnv.appDatabaseUrl);
let owner: { id: string; email: string };
let ownerClient: Client;
let manuscriptId: string;

beforeAll(async () => {
  owner = await createAccount(db, "owner");
  ownerClient = new Client();
  await ownerClient.signIn(owner.email, TEST_PASSWORD);
  const res = await ownerClient.post("/manuscripts?index", { title: "Two-photon production of π⁺π⁻ (test)", journal: "" });
  expect(res.status).toBe(302);
  manuscriptId = res.headers.get("location")!.split("/").pop()!;
});
afterAll(() => db.destroy());

describe("manuscripts", () => {
  it("the creator becomes corresponding author, visible in the API with the caller's role", async () => {
    const res = await ownerClient.get(`/api/v1/manuscripts/${manuscriptId}`);
    expect(res.status).toBe(200);
    const body = (await res.json()) as { title: string; role: string; members: Array<{ email: string; role: string }>; permissions: Record<string, boolean> };
    expect(body.title).toBe("Two-photon production of π⁺π⁻ (test)");
    expect(body.role).toBe("corresponding");
    expect(body.members).toEqual([expect.objectContaining({ email: owner.email, role: "corresponding" })]);
    expect(body.permissions["manage:members"]).toBe(true);
    const list = (await (await ownerClient.get("/api/v1/manuscripts")).json()) as { manuscripts: Array<{ id: string; role: string }> };
    expect(list.manuscripts.find((m) => m.id === manuscriptId)?.role).toBe("corresponding");
  });

  it("an unknown manuscript is a 404 on the page and in the API", async () => {
    expect((await ownerClient.get("/manuscripts/00000000-0000-4000-8000-000000000000")).status).toBe(404);
    expect((await ownerClient.get("/manuscripts/not-a-uuid")).status).toBe(404);
    const api = await ownerClient.get("/api/v1/manuscripts/00000000-0000-4000-8000-000000000000");
    expect(api.status).toBe(404);
    expect(((await api.json()) as { error: { code: string } }).error.code).toBe("not-found");
  });

  it("a title that is too long is a 422 naming the field, and nothing is created", async () => {
    const before = await db.selectFrom("manuscript").select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
    const res = await ownerClient.post("/manuscripts?index", { title: "x".repeat(301) });
    expect(res.status).toBe(422);
    expect(await res.text()).toContain("At most 300 characters.");
    const after = await db.selectFrom("manuscript").select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
    expect(Number(after.n)).toBe(Number(before.n));
  });
});

describe("members", () => {
  it("invites by e-mail; an existing user accepts, changes of role and removal are logged", async () => {
    const member = await createAccount(db, "member");
    const inv = await ownerClient.post(`/manuscripts/${manuscriptId}/members`, { intent: "invite", email: member.email, role: "contributor" });
    expect(inv.status).toBe(200);
    const mail = await waitForMail(member.email, (m) => m.subject.includes("Invitation"));
    expect(mail.text).toContain("as contributor");
    const path = new URL(linkIn(mail, "/invitations/")).pathname;

    const memberClient = new Client();
    await memberClient.signIn(member.email, TEST_PASSWORD);
    const accept = await memberClient.post(path, {});
    expect(accept.status).toBe(302);
    expect(accept.headers.get("location")).toBe(`/manuscripts/${manuscriptId}`);
    expect((await memberClient.get(`/manuscripts/${manuscriptId}`)).status).toBe(200);
    // One use only.
    expect((await memberClient.get(path)).status).toBe(404);

    const change = await ownerClient.post(`/manuscripts/${manuscriptId}/members`, { intent: "change-role", userId: member.id, role: "observer" });
    expect(change.status).toBe(200);
    const role = await db.selectFrom("membership").select("role").where("manuscript_id", "=", manuscriptId).where("user_id", "=", member.id).executeTakeFirstOrThrow();
    expect(role.role).toBe("observer");

    const remove = await ownerClient.post(`/manuscripts/${manuscriptId}/members`, { intent: "remove", userId: member.id });
    expect(remove.status).toBe(200);
    expect((await memberClient.get(`/manuscripts/${manuscriptId}`)).status).toBe(404);

    const log = await db.selectFrom("audit_event").select("action").where("manuscript_id", "=", manuscriptId).orderBy("id").execute();
    expect(log.map((e) => e.action)).toEqual(["manuscript-created", "member-invited", "member-joined", "member-role-changed", "member-removed"]);
    const page = await ownerClient.get(`/manuscripts/${manuscriptId}/audit`);
    // The log reads as sentences naming the people (createAccount names them "Test <tag>").
    const text = (await page.text()).replace(/<[^>]+>/g, "");
    expect(text).toContain("Test owner made Test member observer.");
    expect(text).toContain("Test owner removed Test member from the manuscript.");
    expect(text).toContain("Test member joined as contributor.");
  });

  it("the last corresponding author can be neither removed nor demoted", async () => {
    const remove = await ownerClient.post(`/manuscripts/${manuscriptId}/members`, { intent: "remove", userId: owner.id });
    expect(remove.status).toBe(422);
    expect(await remove.text()).toContain("The last corresponding author cannot be removed");
    const demote = await ownerClient.post(`/manuscripts/${manuscriptId}/members`, { intent: "change-role", userId: owner.id, role: "coauthor" });
    expect(demote.status).toBe(422);
    expect(await demote.text()).toContain("at least one corresponding author");
    const row = await db.selectFrom("membership").select("role").where("user_id", "=", owner.id).where("manuscript_id", "=", manuscriptId).executeTakeFirstOrThrow();
    expect(row.role).toBe("corresponding");
  });

  it("rejects an unknown role or a malformed address with the field named", async () => {
    const bad = await ownerClient.post(`/manuscripts/${manuscriptId}/members`, { intent: "invite", email: "someone@example.org", role: "editor" });
    expect(bad.status).toBe(422);
    expect(await bad.text()).toContain("Choose one of: corresponding author, co-author, contributor, observer.");
    const badMail = await ownerClient.post(`/manuscripts/${manuscriptId}/members`, { intent: "invite", email: "someone", role: "observer" });
    expect(badMail.status).toBe(422);
    expect(await badMail.text()).toContain("Enter an e-mail address like name@example.org.");
  });

  it("a new person accepts an invitation by creating an account", async () => {
    const email = uniqueEmail("newcomer");
    await ownerClient.post(`/manuscripts/${manuscriptId}/members`, { intent: "invite", email, role: "coauthor" });
    const mail = await waitForMail(email, (m) => m.subject.includes("Invitation"));
    const path = new URL(linkIn(mail, "/invitations/")).pathname;
    const c = new Client();
    const created = await c.post(path, { name: "Newcomer", password: "a long enough password" });
    expect(created.status).toBe(302);
    const api = (await (await c.get(`/api/v1/manuscripts/${manuscriptId}`)).json()) as { role: string };
    expect(api.role).toBe("coauthor");
  });
});

describe("site admin", () => {
  it("disables and re-enables an account", async () => {
    const admin = await createAccount(db, "siteadmin", { siteRole: "admin" });
    const target = await createAccount(db, "target");
    const c = new Client();
    await c.signIn(admin.email, TEST_PASSWORD);
    expect((await c.post("/admin/accounts", { intent: "disable", userId: target.id })).status).toBe(200);
    expect((await new Client().post("/sign-in", { email: target.email, password: TEST_PASSWORD })).status).toBe(401);
    expect((await c.post("/admin/accounts", { intent: "enable", userId: target.id })).status).toBe(200);
    expect((await new Client().post("/sign-in", { email: target.email, password: TEST_PASSWORD })).status).toBe(302);
    expect((await c.post("/admin/accounts", { intent: "reset", userId: target.id })).status).toBe(200);
    await waitForMail(target.email, (m) => m.subject.includes("Reset"));
    const mailPage = await c.get("/admin/mail");
    expect(await mailPage.text()).toContain(target.email);
  });
});

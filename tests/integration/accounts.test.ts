// Sign-in, sign-up with confirmation, password reset, throttling and sessions, through HTTP
// against the running app, reading mail from the local catcher.
import { createCookieSessionStorage } from "react-router";
import { afterAll, describe, expect, it } from "vitest";
import { TEST_PASSWORD, createAccount, uniqueEmail } from "../support/accounts";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { Client, DEMO } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";

const db = connect(testEnv.appDatabaseUrl);
afterAll(() => db.destroy());

async function signInStatus(email: string, password: string) {
  const res = await new Client().post("/sign-in", { email, password });
  return { status: res.status, text: res.status === 302 ? "" : await res.text() };
}

describe("sign-in", () => {
  it("gives the same message for an unknown address and for a wrong password", async () => {
    const { email } = await createAccount(db, "samemsg");
    const wrong = await signInStatus(email, "not the password");
    const unknown = await signInStatus(uniqueEmail("nobody"), "not the password");
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    const msg = "That e-mail address and password do not match an active account.";
    expect(wrong.text).toContain(msg);
    expect(unknown.text).toContain(msg);
  });

  it("throttles an account after 5 failures, even for the right password, and records them in the audit log", async () => {
    const { email, id } = await createAccount(db, "throttle");
    for (let i = 0; i < 5; i++) expect((await signInStatus(email, `wrong-${i}`)).status).toBe(401);
    const blocked = await signInStatus(email, TEST_PASSWORD);
    expect(blocked.status).toBe(429);
    expect(blocked.text).toContain("Too many failed sign-ins");
    const failures = await db.selectFrom("audit_event").select("action").where("actor_id", "=", id).where("action", "=", "sign-in-failed").execute();
    expect(failures.length).toBe(5);
  });

  it("rotates the session cookie on sign-in", async () => {
    const c = new Client();
    await c.signIn(DEMO.contributor, DEMO.password);
    const first = c.cookies.get("__steradian");
    await c.signIn(DEMO.contributor, DEMO.password);
    const second = c.cookies.get("__steradian");
    expect(first).toBeTruthy();
    expect(second).toBeTruthy();
    expect(second).not.toBe(first);
  });

  it("sets an httpOnly, SameSite=Lax, signed cookie", async () => {
    const res = await new Client().post("/sign-in", { email: DEMO.contributor, password: DEMO.password });
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith("__steradian="))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).toMatch(/^__steradian=[^;]+\.[A-Za-z0-9+/=%]+;/);
  });

  it("a tampered cookie signs the user out", async () => {
    const c = new Client();
    await c.signIn(DEMO.contributor, DEMO.password);
    const [payload, sig] = decodeURIComponent(c.cookies.get("__steradian")!).split(".");
    const forged = JSON.parse(Buffer.from(payload, "base64").toString("utf8"));
    forged.userId = "00000000-0000-4000-8000-000000000000";
    c.cookies.set("__steradian", encodeURIComponent(`${Buffer.from(JSON.stringify(forged)).toString("base64")}.${sig}`));
    const res = await c.get("/manuscripts");
    expect(res.status).toBe(302);
    expect(res.headers.get("location")).toMatch(/^\/sign-in/);
    expect(res.headers.getSetCookie().join(";")).toMatch(/__steradian=;/);
  });

  it("an expired session (older than 7 days) signs the user out", async () => {
    const user = await db.selectFrom("app_user").select("id").where("email", "=", DEMO.contributor).executeTakeFirstOrThrow();
    // The same cookie settings and secret as the server: a genuine, correctly signed cookie.
    // Both name a live server-side session (docs/decisions/0012-hardening.md), so that the
    // cookie's own age is what refuses the old one.
    const storage = createCookieSessionStorage({ cookie: { name: "__steradian", secrets: [process.env.SESSION_SECRET!] } });
    const live = () => db.insertInto("user_session").values({ user_id: user.id, expires_at: new Date(Date.now() + 3600_000) }).returning("id").executeTakeFirstOrThrow();
    const session = await storage.getSession();
    session.set("userId", user.id);
    session.set("issuedAt", Date.now() - 8 * 24 * 3600_000);
    session.set("sessionId", (await live()).id);
    const header = await storage.commitSession(session);
    const fresh = await storage.getSession();
    fresh.set("userId", user.id);
    fresh.set("issuedAt", Date.now());
    fresh.set("sessionId", (await live()).id);
    const freshHeader = await storage.commitSession(fresh);

    const ok = await new Client().get("/manuscripts", { Cookie: freshHeader.split(";")[0] });
    expect(ok.status).toBe(200);
    const old = await new Client().get("/manuscripts", { Cookie: header.split(";")[0] });
    expect(old.status).toBe(302);
    expect(old.headers.get("location")).toMatch(/^\/sign-in/);
  });

  it("a disabled account is signed out at its next request", async () => {
    const { email, id } = await createAccount(db, "disabled");
    const c = new Client();
    await c.signIn(email, TEST_PASSWORD);
    expect((await c.get("/manuscripts")).status).toBe(200);
    await db.updateTable("app_user").set({ status: "disabled" }).where("id", "=", id).execute();
    expect((await c.get("/manuscripts")).status).toBe(302);
    expect((await signInStatus(email, TEST_PASSWORD)).status).toBe(401);
  });

  it("an over-long or malformed field is a 422 naming the field", async () => {
    const long = await new Client().post("/sign-in", { email: `${"a".repeat(300)}@example.org`, password: "x" });
    expect(long.status).toBe(422);
    expect(await long.text()).toContain("At most 254 characters.");
    const malformed = await new Client().post("/sign-up", { name: "X", email: "not-an-address", password: "long enough password" });
    expect(malformed.status).toBe(422);
    const body = await malformed.text();
    expect(body).toContain("Enter an e-mail address like name@example.org.");
  });
});

describe("sign-up with e-mail confirmation", () => {
  it("creates a pending account that becomes active only through the e-mailed link", async () => {
    const email = uniqueEmail("signup");
    const res = await new Client().post("/sign-up", { name: "New Person", email, password: "a long new password" });
    expect(res.status).toBe(200);
    expect((await signInStatus(email, "a long new password")).status).toBe(401);
    const mail = await waitForMail(email, (m) => m.subject.includes("Confirm"));
    expect(mail.html).toContain("<a href=");
    const link = new URL(linkIn(mail, "/confirm-email/"));
    // Opening the link (as a mail scanner would) changes nothing; the button does.
    expect(await (await new Client().get(link.pathname)).text()).toContain("Confirm my address");
    expect((await signInStatus(email, "a long new password")).status).toBe(401);
    const confirm = await new Client().post(link.pathname, {});
    expect(confirm.status).toBe(302);
    expect((await signInStatus(email, "a long new password")).status).toBe(302);
    // The link works once.
    expect(await (await new Client().get(link.pathname)).text()).toContain("This link no longer works");
    expect(await (await new Client().post(link.pathname, {})).text()).toContain("This link no longer works");
    const row = await db.selectFrom("app_user").select(["status", "password_hash"]).where("email", "=", email).executeTakeFirstOrThrow();
    expect(row.status).toBe("active");
    expect(row.password_hash).toMatch(/^\$2[aby]\$12\$/); // bcrypt, cost 12
  });

  it("does not reveal that an address already has an account", async () => {
    const res = await new Client().post("/sign-up", { name: "Someone", email: DEMO.coauthor, password: "a long new password" });
    expect(res.status).toBe(200);
    const mail = await waitForMail(DEMO.coauthor, (m) => m.subject.includes("tried to create"));
    expect(mail.text).toContain("already exists");
  });
});

describe("password reset", () => {
  it("resets through a one-time link, which then stops working", async () => {
    const { email } = await createAccount(db, "reset");
    expect((await new Client().post("/forgot-password", { email })).status).toBe(200);
    const mail = await waitForMail(email, (m) => m.subject.includes("Reset"));
    const path = new URL(linkIn(mail, "/reset-password/")).pathname;
    const done = await new Client().post(path, { password: "a brand new password" });
    expect(done.status).toBe(302);
    expect((await signInStatus(email, "a brand new password")).status).toBe(302);
    expect((await signInStatus(email, TEST_PASSWORD)).status).toBe(401);
    const again = await new Client().post(path, { password: "another new password" });
    expect(again.status).toBe(200);
    expect(await again.text()).toContain("This link no longer works");
    expect((await signInStatus(email, "another new password")).status).toBe(401);
  });

  it("refuses an expired link", async () => {
    const { email, id } = await createAccount(db, "expired");
    await new Client().post("/forgot-password", { email });
    const mail = await waitForMail(email, (m) => m.subject.includes("Reset"));
    await db.updateTable("one_time_token").set({ created_at: new Date(Date.now() - 3 * 3600_000), expires_at: new Date(Date.now() - 3600_000) }).where("user_id", "=", id).execute();
    const path = new URL(linkIn(mail, "/reset-password/")).pathname;
    expect(await (await new Client().get(path)).text()).toContain("This link no longer works");
    const res = await new Client().post(path, { password: "a brand new password" });
    expect(res.status).toBe(200);
    expect((await signInStatus(email, "a brand new password")).status).toBe(401);
  });
});

describe("personal access tokens", () => {
  it("are shown once, work as Bearer tokens, and stop working when revoked", async () => {
    const { email } = await createAccount(db, "token");
    const c = new Client();
    await c.signIn(email, TEST_PASSWORD);
    const created = await c.post("/account", { intent: "create-token", name: "laptop" });
    const html = await created.text();
    const secret = /data-testid="new-token">(sdn_[A-Za-z0-9_-]+)</.exec(html)?.[1];
    expect(secret).toBeTruthy();
    const stored = await db.selectFrom("api_token").select(["id", "token_hash"]).where("name", "=", "laptop").orderBy("created_at", "desc").executeTakeFirstOrThrow();
    expect(stored.token_hash).not.toContain(secret!);
    expect(stored.token_hash).toMatch(/^[0-9a-f]{64}$/);
    const api = new Client();
    const ok = await api.get("/api/v1/manuscripts", { Authorization: `Bearer ${secret}` });
    expect(ok.status).toBe(200);
    expect(await (await c.get("/account")).text()).not.toContain(secret!);
    await c.post("/account", { intent: "revoke-token", tokenId: stored.id });
    const revoked = await api.get("/api/v1/manuscripts", { Authorization: `Bearer ${secret}` });
    expect(revoked.status).toBe(401);
    expect(((await revoked.json()) as { error: { code: string } }).error.code).toBe("unauthenticated");
    expect((await api.get("/api/v1/manuscripts", { Authorization: "Bearer sdn_made_up" })).status).toBe(401);
  });
});

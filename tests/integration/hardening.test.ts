// Hardening (issue 11, docs/decisions/0012-hardening.md), through HTTP against the running app:
// body limits answered before the body is read, sessions that end, security headers,
// cross-site writes refused, and a password-reset answer that does not tell whether an account
// exists.
import net from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { TEST_PASSWORD, createAccount, createManuscriptWith } from "../support/accounts";
import { ANGULAR_MAPPING, angularCsv, createDatasetViaApi } from "../support/datasets";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { Client, DEMO } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";

const db = connect(testEnv.appDatabaseUrl);
afterAll(() => db.destroy());

/**
 * Sends a request head and only the first part of its body, then waits for the server's answer
 * without ever sending the rest: an answer proves the limit was applied before the body was read.
 */
function partialRequest(head: string, firstBytes: string): Promise<{ status: number; headers: string; body: string }> {
  const url = new URL(testEnv.appUrl);
  return new Promise((resolve, reject) => {
    let raw = "";
    const socket = net.connect(Number(url.port), url.hostname, () => socket.write(head + firstBytes));
    const timer = setTimeout(() => {
      socket.destroy();
      reject(new Error(`no answer before the body was complete; got so far: ${raw.slice(0, 200)}`));
    }, 20_000);
    socket.on("data", (chunk) => (raw += chunk.toString("utf8")));
    const finish = () => {
      clearTimeout(timer);
      const [headers, ...rest] = raw.split("\r\n\r\n");
      resolve({ status: Number(/^HTTP\/1\.1 (\d{3})/.exec(headers)?.[1] ?? 0), headers, body: rest.join("\r\n\r\n") });
    };
    socket.on("end", finish);
    socket.on("close", finish);
    socket.on("error", () => undefined);
  });
}

function head(method: string, path: string, headers: Record<string, string | number>): string {
  const host = new URL(testEnv.appUrl).host;
  return `${method} ${path} HTTP/1.1\r\nHost: ${host}\r\n${Object.entries(headers).map(([k, v]) => `${k}: ${v}\r\n`).join("")}\r\n`;
}

describe("request body limits", () => {
  let c: Client;
  let manuscriptId: string;
  let datasetId: string;
  beforeAll(async () => {
    const owner = await createAccount(db, "limits");
    manuscriptId = await createManuscriptWith(db, [{ id: owner.id, role: "corresponding" }], "Limits");
    c = new Client();
    await c.signIn(owner.email, TEST_PASSWORD);
    datasetId = await createDatasetViaApi(c, manuscriptId, "limits");
  });

  it("answers a 100 MB sign-in form with 413 and a page, after reading 1 kB of it", async () => {
    const res = await partialRequest(head("POST", "/sign-in", { "Content-Type": "application/x-www-form-urlencoded", "Content-Length": 100_000_000 }), "email=a%40b.c&password=" + "x".repeat(1000));
    expect(res.status).toBe(413);
    expect(res.headers).toMatch(/content-type: text\/html/i);
    expect(res.body).toContain("BODY_MAX_BYTES");
  });

  it("answers a 13 MB prediction request with 413 in JSON, before reading it", async () => {
    const res = await partialRequest(
      head("POST", "/api/v1/predictions", { "Content-Type": "application/json", "Content-Length": 13_000_000, Cookie: c.cookieHeader(), Origin: new URL(testEnv.appUrl).origin }),
      '{"process":"bhabha","frame":"cm","energy":{"sqrtS":1},"thetaDeg":[30,',
    );
    expect(res.status).toBe(413);
    const body = JSON.parse(res.body) as { error: { code: string; limit: { max: number } } };
    expect(body.error.code).toBe("too-large");
    expect(body.error.limit.max).toBe(1024 * 1024);
  });

  it("counts every part of a multipart upload: big text fields beside a small file are refused whole", async () => {
    const boundary = "----steradian-limits";
    const first = `--${boundary}\r\nContent-Disposition: form-data; name="note"\r\n\r\n${"y".repeat(4096)}`;
    const res = await partialRequest(
      head("POST", `/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}/revisions`, {
        "Content-Type": `multipart/form-data; boundary=${boundary}`,
        // Four text fields of a quarter of the upload limit each plus a small file: each part is
        // under the limit, the whole is over it.
        "Content-Length": 4 * Math.ceil(testEnv.maxBytes / 4) + 300 * 1024,
        Cookie: c.cookieHeader(),
        Origin: new URL(testEnv.appUrl).origin,
      }),
      first,
    );
    expect(res.status).toBe(413);
    const body = JSON.parse(res.body) as { error: { code: string; message: string; limit: unknown } };
    expect(body.error.limit).toEqual({ kind: "bytes", max: testEnv.maxBytes });
    expect(body.error.message).toContain("UPLOAD_MAX_BYTES");
    const revisions = await db.selectFrom("dataset_revision").select("id").where("dataset_id", "=", datasetId).execute();
    expect(revisions).toEqual([]);
  });

  it("refuses a body without a declared length (chunked) with 411", async () => {
    const res = await partialRequest(head("POST", "/api/v1/predictions", { "Content-Type": "application/json", "Transfer-Encoding": "chunked", Cookie: c.cookieHeader(), Origin: new URL(testEnv.appUrl).origin }), "5\r\n{\"a\":\r\n");
    expect(res.status).toBe(411);
  });

  it("takes at most 10,000 angles in one prediction request, and says so", async () => {
    const angles = (n: number) => Array.from({ length: n }, (_, i) => 1 + (178 * i) / (n - 1));
    const ok = await c.postJson("/api/v1/predictions", { process: "bhabha", frame: "cm", energy: { sqrtS: 1 }, thetaDeg: angles(10_000), unit: "nb/sr" });
    expect(ok.status).toBe(200);
    expect(((await ok.json()) as { values: number[] }).values).toHaveLength(10_000);
    const tooMany = await c.postJson("/api/v1/predictions", { process: "bhabha", frame: "cm", energy: { sqrtS: 1 }, thetaDegBins: Array.from({ length: 10_001 }, (_, i) => [1 + i * 0.0177, 1 + (i + 1) * 0.0177]) });
    expect(tooMany.status).toBe(413);
    const body = (await tooMany.json()) as { error: { code: string; field: string; max: number; message: string } };
    expect(body.error).toMatchObject({ code: "too_many_points", field: "thetaDegBins", max: 10_000 });
    expect(body.error.message).toContain("10,001");
  });

  it("quotes only a short prefix of a bad value in its message", async () => {
    const unit = "Q".repeat(200_000);
    const res = await c.postJson("/api/v1/predictions", { process: "bhabha", frame: "cm", energy: { sqrtS: 1 }, thetaDeg: [30], unit });
    expect(res.status).toBe(422);
    const text = await res.text();
    expect(text.length).toBeLessThan(1000);
    const body = JSON.parse(text) as { error: { field: string; message: string } };
    expect(body.error.field).toBe("unit");
    expect(body.error.message).toContain('"QQQQQQQQ');
    expect(body.error.message).toContain("200,000 characters");
  });
});

describe("sessions end on the server", () => {
  async function signedIn(email: string) {
    const c = new Client();
    await c.signIn(email, TEST_PASSWORD);
    expect((await c.get("/api/v1/manuscripts")).status).toBe(200);
    return c;
  }
  /** A second client holding the same cookie as `c` holds now, as an attacker who copied it. */
  function copyOf(c: Client) {
    const copy = new Client();
    for (const [k, v] of c.cookies) copy.cookies.set(k, v);
    return copy;
  }
  async function expectSignedOut(saved: Client) {
    expect((await saved.get("/api/v1/manuscripts")).status).toBe(401);
    const page = await saved.get("/manuscripts");
    expect(page.status).toBe(302);
    expect(page.headers.get("location")).toMatch(/^\/sign-in/);
  }

  it("sign-out ends that session: the old cookie is refused", async () => {
    const { email } = await createAccount(db, "signout");
    const c = await signedIn(email);
    const other = await signedIn(email);
    const saved = copyOf(c);
    expect((await c.post("/sign-out", {})).status).toBe(302);
    await expectSignedOut(saved);
    // Only that session: another browser of the same user stays signed in.
    expect((await other.get("/api/v1/manuscripts")).status).toBe(200);
  });

  it("a password reset ends every session of the account", async () => {
    const { email } = await createAccount(db, "resetends");
    const saved = copyOf(await signedIn(email));
    await new Client().post("/forgot-password", { email });
    const mail = await waitForMail(email, (m) => m.subject.includes("Reset"));
    expect((await new Client().post(new URL(linkIn(mail, "/reset-password/")).pathname, { password: "a brand new password" })).status).toBe(302);
    await expectSignedOut(saved);
  });

  it("disabling an account ends its sessions, and enabling it again does not bring them back", async () => {
    const { email, id } = await createAccount(db, "disabled");
    const saved = copyOf(await signedIn(email));
    const admin = new Client();
    await admin.signIn(DEMO.admin, DEMO.password);
    expect((await admin.post("/admin/accounts", { intent: "disable", userId: id })).status).toBe(200);
    expect((await admin.post("/admin/accounts", { intent: "enable", userId: id })).status).toBe(200);
    await expectSignedOut(saved);
  });

  it("'sign out everywhere' on the account page ends all of the user's sessions", async () => {
    const { email } = await createAccount(db, "everywhere");
    const a = await signedIn(email);
    const b = await signedIn(email);
    const savedA = copyOf(a);
    expect(await (await a.get("/account")).text()).toContain("Sign out everywhere");
    const res = await a.post("/account", { intent: "sign-out-everywhere" });
    expect(res.status).toBe(302);
    await expectSignedOut(savedA);
    await expectSignedOut(b);
  });
});

describe("security headers", () => {
  let c: Client;
  let base: string;
  beforeAll(async () => {
    const owner = await createAccount(db, "headers");
    const manuscriptId = await createManuscriptWith(db, [{ id: owner.id, role: "corresponding" }], "Headers");
    c = new Client();
    await c.signIn(owner.email, TEST_PASSWORD);
    const datasetId = await createDatasetViaApi(c, manuscriptId, "headers");
    base = `/api/v1/manuscripts/${manuscriptId}/datasets/${datasetId}`;
    expect((await c.upload(`${base}/revisions`, angularCsv(), { mapping: JSON.stringify(ANGULAR_MAPPING) })).status).toBe(201);
  });

  const common = (res: Response) => {
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("x-frame-options")).toBe("DENY");
    expect(res.headers.get("referrer-policy")).toBe("same-origin");
    // Plain http here: HSTS is sent only in production over https.
    expect(res.headers.get("strict-transport-security")).toBeNull();
    const csp = res.headers.get("content-security-policy") ?? "";
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("script-src-attr 'none'");
    expect(csp).not.toContain("unsafe-eval");
    return csp;
  };

  it("a signed-in page: a strict CSP whose nonce is on every script, no inline handlers, no-store", async () => {
    const res = await c.get("/manuscripts");
    expect(res.status).toBe(200);
    const csp = common(res);
    expect(res.headers.get("cache-control")).toBe("no-store");
    const nonce = /script-src 'self' 'nonce-([A-Za-z0-9+/=]+)'/.exec(csp)?.[1];
    expect(nonce).toBeTruthy();
    const html = await res.text();
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(scripts.length).toBeGreaterThan(0);
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);
    expect(html).not.toMatch(/\son[a-z]+=["']/i);
    // A fresh nonce for every answer.
    const again = (await c.get("/manuscripts")).headers.get("content-security-policy");
    expect(again).not.toContain(nonce!);
  });

  it("an API answer and a download are never stored", async () => {
    const api = await c.get(`${base}/revisions/1`);
    expect(api.status).toBe(200);
    common(api);
    expect(api.headers.get("cache-control")).toBe("no-store");
    const raw = await c.get(`${base}/revisions/1/raw`);
    expect(raw.status).toBe(200);
    common(raw);
    expect(raw.headers.get("cache-control")).toBe("no-store");
  });
});

describe("cross-site writes", () => {
  let c: Client;
  let manuscriptId: string;
  let token: string;
  beforeAll(async () => {
    const owner = await createAccount(db, "csrf");
    manuscriptId = await createManuscriptWith(db, [{ id: owner.id, role: "corresponding" }], "Cross-site");
    c = new Client();
    await c.signIn(owner.email, TEST_PASSWORD);
    const html = await (await c.post("/account", { intent: "create-token", name: "script" })).text();
    token = /data-testid="new-token">(sdn_[A-Za-z0-9_-]+)</.exec(html)![1];
  });
  const evil = { Origin: "http://evil.example" };
  const datasets = () => `/api/v1/manuscripts/${manuscriptId}/datasets`;
  const count = async () => (await db.selectFrom("dataset").select("id").where("manuscript_id", "=", manuscriptId).execute()).length;

  it("refuses cookie writes from a foreign Origin, and JSON sent as text/plain", async () => {
    const body = JSON.stringify({ name: "evil", quantity: { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } } });
    const foreign = await c.request(datasets(), { method: "POST", headers: { ...evil, "Content-Type": "text/plain" }, body });
    expect(foreign.status).toBe(403);
    expect(((await foreign.json()) as { error: { code: string } }).error.code).toBe("cross-site");
    const foreignJson = await c.request(datasets(), { method: "POST", headers: { ...evil, "Content-Type": "application/json" }, body });
    expect(foreignJson.status).toBe(403);
    const plain = await c.request(datasets(), { method: "POST", headers: { "Content-Type": "text/plain" }, body });
    expect(plain.status).toBe(415);
    const noOrigin = await c.request(datasets(), { method: "POST", headers: { Origin: "", "Content-Type": "application/json" }, body });
    expect(noOrigin.status).toBe(403);
    const sameSite = await c.request(datasets(), { method: "POST", headers: { Origin: "", "Sec-Fetch-Site": "same-origin", "Content-Type": "application/json" }, body: body.replace("evil", "fine") });
    expect(sameSite.status).toBe(201);
    expect(await count()).toBe(1);
  });

  it("refuses a cross-site revision upload with the cookie and takes it with a token", async () => {
    const datasetId = await createDatasetViaApi(c, manuscriptId, "uploads");
    const path = `${datasets()}/${datasetId}/revisions`;
    const refused = await c.upload(path, angularCsv(), { mapping: JSON.stringify(ANGULAR_MAPPING) }, "data.csv", evil);
    expect(refused.status).toBe(403);
    const withToken = await new Client().upload(path, angularCsv(), { mapping: JSON.stringify(ANGULAR_MAPPING) }, "data.csv", { ...evil, Authorization: `Bearer ${token}` });
    expect(withToken.status).toBe(201);
    const tokenJson = await new Client().request(datasets(), { method: "POST", headers: { ...evil, Authorization: `Bearer ${token}`, "Content-Type": "application/json" }, body: JSON.stringify({ name: "by token", quantity: { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } } }) });
    expect(tokenJson.status).toBe(201);
  });

  it("refuses a sign-out from a foreign Origin", async () => {
    const res = await c.post("/sign-out", {}, evil);
    expect(res.status).toBe(403);
    expect((await c.get("/api/v1/manuscripts")).status).toBe(200);
  });
});

describe("password-reset timing", () => {
  // Statistical, as the issue asks for a timing check: 60 tries of each kind in a seeded random
  // interleaving (so that background work after one try falls on either kind alike), compared
  // by their medians. The margin, 25 ms, is a fifth of the difference seen before the fix
  // (129–157 ms against 6–12 ms); both paths now do the same work before answering.
  it("answers in the same time for an existing and an unknown address (medians within 25 ms)", async () => {
    const { email } = await createAccount(db, "timing");
    let seed = 20261204;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    const order = [...Array(60).fill("known"), ...Array(60).fill("unknown")].sort(() => random() - 0.5) as ("known" | "unknown")[];
    const times: Record<"known" | "unknown", number[]> = { known: [], unknown: [] };
    const client = new Client();
    // Warm-up: the first answers pay for compiling and connecting.
    for (let i = 0; i < 5; i++) await client.post("/forgot-password", { email: `warm-${i}@example.org` });
    for (const [i, kind] of order.entries()) {
      const address = kind === "known" ? email : `nobody-${i}@example.org`;
      const t0 = performance.now();
      const res = await client.post("/forgot-password", { email: address });
      await res.text();
      times[kind].push(performance.now() - t0);
      expect(res.status).toBe(200);
    }
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    const known = median(times.known);
    const unknown = median(times.unknown);
    console.info(`[hardening] reset answer medians: existing ${known.toFixed(1)} ms, unknown ${unknown.toFixed(1)} ms`);
    expect(Math.abs(known - unknown)).toBeLessThan(25);
    // The work did happen, after the answers.
    await waitForMail(email, (m) => m.subject.includes("Reset"));
  }, 120_000);
});

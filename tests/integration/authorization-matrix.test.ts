// Every route and API endpoint of the foundation, as each role and as an anonymous user: the
// exact set of callers that get through, and what the others get instead.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client } from "../support/http";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { TEST_PASSWORD, createAccount, createManuscriptWith } from "../support/accounts";

type Who = "anonymous" | "outsider" | "admin" | "observer" | "contributor" | "coauthor" | "corresponding";
const EVERYONE: Who[] = ["anonymous", "outsider", "admin", "observer", "contributor", "coauthor", "corresponding"];
const MEMBERS: Who[] = ["observer", "contributor", "coauthor", "corresponding"];
const SIGNED_IN: Who[] = ["outsider", "admin", ...MEMBERS];

const db = connect(testEnv.appDatabaseUrl);
const clients = {} as Record<Who, Client>;
let manuscriptId = "";

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
});
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
];

describe("authorisation matrix (foundation routes)", () => {
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

  it("API denials are JSON with an error code and message, never HTML", async () => {
    for (const [who, path] of [["anonymous", "/api/v1/manuscripts"], ["outsider", `/api/v1/manuscripts/${manuscriptId}`], ["outsider", "/api/v1/no-such-thing"]] as const) {
      const res = await clients[who].get(path);
      expect(res.headers.get("content-type"), `${who} ${path}`).toMatch(/application\/json/);
      const body = (await res.json()) as { error: { code: string; message: string } };
      expect(typeof body.error.code).toBe("string");
      expect(body.error.message.length).toBeGreaterThan(10);
    }
  });

  it("a 403 page names the role that is needed", async () => {
    const res = await clients.observer.get(`/manuscripts/${manuscriptId}/audit`);
    expect(res.status).toBe(403);
    expect(await res.text()).toContain("This needs the role of corresponding author; your role here is observer.");
  });
});

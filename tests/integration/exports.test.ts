// Journal exports as jobs (issue 10, docs/decisions/0011-export-jobs.md), through the running app
// and its own worker: who may export, the audit log, the job's lifecycle, two exports byte-identical, every manifest hash verified,
// the figure drawn again from the bundle, a preflight override recorded, and `pdffonts` (poppler,
// an independent reader) on the exported PDF.
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { verifyBundleAndFigure } from "../../app/.server/exports/verify-bundle-figure.server";
import { selfContainedSvgProblems } from "../../app/exports/self-contained-svg";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { Client, DEMO } from "../support/http";

const db = connect(testEnv.appDatabaseUrl, 4);
const clients = { corresponding: new Client(), coauthor: new Client(), contributor: new Client() };
let figureId = "";
let token = "";
let dir: string;
const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

interface ExportBody { export: { id: string; state: string; reason: string | null; attempts: number; overrideReason: string | null; preflight: { id: string; pass: boolean; measured: string }[] | null; files: { name: string; sha256: string; url: string }[] | null } }

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "steradian-exports-"));
  await clients.corresponding.signIn(DEMO.corresponding, DEMO.password);
  await clients.coauthor.signIn(DEMO.coauthor, DEMO.password);
  await clients.contributor.signIn(DEMO.contributor, DEMO.password);
  const v = await db.selectFrom("figure_version").select("figure_id").where("manuscript_id", "=", DEMO.manuscriptId).where("number", "=", 2).executeTakeFirstOrThrow();
  figureId = v.figure_id;
  const created = await clients.corresponding.post("/account", { intent: "create-token", name: `exports ${Date.now()}` });
  token = /data-testid="new-token">(sdn_[A-Za-z0-9_-]+)</.exec(await created.text())?.[1] ?? "";
  expect(token).not.toBe("");
});
afterAll(async () => {
  rmSync(dir, { recursive: true, force: true });
  await db.destroy();
});

const bearer = () => ({ Authorization: `Bearer ${token}` });
const exportsOf = (n: number) => `/api/v1/figures/${figureId}/versions/${n}/exports`;

/** Polls the export until it is finished (the app's own worker runs it). */
async function finished(id: string): Promise<ExportBody["export"]> {
  for (;;) {
    const res = await clients.corresponding.get(`/api/v1/exports/${id}`, bearer());
    expect(res.status).toBe(200);
    const body = (await res.json()) as ExportBody;
    if (body.export.state === "done" || body.export.state === "failed") return body.export;
    await new Promise((r) => setTimeout(r, 300));
  }
}

async function download(e: ExportBody["export"]) {
  const out: Record<string, Uint8Array> = {};
  for (const f of e.files!) {
    const res = await clients.corresponding.get(f.url, bearer());
    expect(res.status, f.name).toBe(200);
    out[f.name] = new Uint8Array(await res.arrayBuffer());
    expect(sha256(out[f.name]), f.name).toBe(f.sha256);
    expect(res.headers.get("X-Content-SHA256")).toBe(f.sha256);
  }
  return out;
}

describe("who may export", () => {
  it("refuses a co-author and a contributor with a 403 that says why, page and API", async () => {
    for (const c of [clients.coauthor, clients.contributor]) {
      const api = await c.postJson(exportsOf(1), {});
      expect(api.status).toBe(403);
      expect(((await api.json()) as { error: { message: string } }).error.message).toMatch(/needs the role of corresponding author/);
      const page = await c.post(`/manuscripts/${DEMO.manuscriptId}/figures/${figureId}/versions/1`, { intent: "export" });
      expect(page.status).toBe(403);
      expect(await page.text()).toMatch(/needs the role of corresponding author/);
    }
  });

  it("refuses a version that is not signed off, even to the corresponding author", async () => {
    const res = await clients.corresponding.postJson(exportsOf(2), {}, bearer());
    expect(res.status).toBe(403);
    const body = (await res.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe("not-signed-off");
    expect(body.error.message).toMatch(/Only a signed-off version can be exported; v2 is in review/);
  });

  it("tells others on the version page why they cannot export", async () => {
    const html = await (await clients.coauthor.get(`/manuscripts/${DEMO.manuscriptId}/figures/${figureId}/versions/1`)).text();
    expect(html).toMatch(/Only a corresponding author exports a version for the journal; your role here is co-author/);
  });
});

describe("an export through the app's worker", () => {
  let first: ExportBody["export"];
  let files: Record<string, Uint8Array>;

  beforeAll(async () => {
    const res = await clients.corresponding.postJson(exportsOf(1), {}, bearer());
    expect(res.status, await res.clone().text()).toBe(202);
    const body = (await res.json()) as ExportBody;
    expect(body.export.state).toBe("queued");
    expect(res.headers.get("Location")).toBe(`/api/v1/exports/${body.export.id}`);
    first = await finished(body.export.id);
    expect(first.state, first.reason ?? "").toBe("done");
    files = await download(first);
  }, 180_000);

  it("delivers the four files, the preflight report with measured values, and audit rows", async () => {
    expect(first.files!.map((f) => f.name)).toEqual(["figure.pdf", "figure.svg", "figure.png", "bundle.zip"]);
    expect(first.preflight!.map((c) => c.id)).toContain("text-size");
    for (const c of first.preflight!) expect(c.measured).not.toBe("");
    const audit = await db.selectFrom("audit_event").select(["action", "detail"]).where("manuscript_id", "=", DEMO.manuscriptId).where(sql<boolean>`detail->>'exportId' = ${first.id}`).orderBy("id").execute();
    expect(audit.map((a) => a.action)).toEqual(["export-requested", "export-completed"]);
  });

  it("makes a bundle whose every manifest hash verifies and whose figure, drawn again, is the signed-off one", async () => {
    const result = await verifyBundleAndFigure(files["bundle.zip"]);
    expect(result.problems).toEqual([]);
    expect(result.files.filter((f) => f.status !== "ok")).toEqual([]);
    expect(result.files.map((f) => f.name)).toEqual(expect.arrayContaining(["figure.pdf", "figure.svg", "figure.png", "figure.json", "alt-text.txt", "README.txt"]));
    expect(result.figure.ok, result.figure.message).toBe(true);
    const version = await db.selectFrom("figure_version").select(["svg_sha256", "fingerprint"]).where("figure_id", "=", figureId).where("number", "=", 1).executeTakeFirstOrThrow();
    expect(result.figure.redrawnSha256).toBe(version.svg_sha256);
    expect(result.manifest!.fingerprint).toBe(version.fingerprint);
    // The CLI agrees, with exit status 0 (and 1 for a zip with one byte changed inside a file).
    const zipFile = path.join(dir, "bundle.zip");
    writeFileSync(zipFile, files["bundle.zip"]);
    expect(execFileSync("node_modules/.bin/tsx", ["scripts/verify-bundle.ts", zipFile], { encoding: "utf8" })).toMatch(/verified: all \d+ files match manifest\.json, and the figure drawn again is the signed-off one\n$/);
  }, 120_000);

  it("writes a PDF in which pdffonts finds no font at all (so none unembedded, none Type 3), and a self-contained SVG", () => {
    const pdf = path.join(dir, "figure.pdf");
    writeFileSync(pdf, files["figure.pdf"]);
    const rows = execFileSync("pdffonts", [pdf], { encoding: "utf8" }).trimEnd().split("\n").slice(2);
    // Text is drawn as outlines (docs/decisions/0009-export-rendering.md): pdffonts lists no font
    // at all, so none is unembedded and none is of Type 3.
    expect(rows).toEqual([]);
    expect(execFileSync("pdffonts", [pdf], { encoding: "utf8" })).toMatch(/^name\s+type\s+encoding\s+emb\s+sub\s+uni\s+object ID\n-+/);
    expect(execFileSync("pdfinfo", [pdf], { encoding: "utf8" })).toMatch(/Subject:\s+Steradian sealed version v1, fingerprint [0-9a-f]{64}/);
    expect(selfContainedSvgProblems(new TextDecoder().decode(files["figure.svg"]))).toEqual([]);
  });

  it("gives byte-identical files when the same version is exported again", async () => {
    const res = await clients.corresponding.postJson(exportsOf(1), {}, bearer());
    expect(res.status).toBe(202);
    const second = await finished(((await res.json()) as ExportBody).export.id);
    expect(second.state).toBe("done");
    expect(second.files!.map((f) => [f.name, f.sha256])).toEqual(first.files!.map((f) => [f.name, f.sha256]));
    const again = await download(second);
    for (const name of Object.keys(files)) expect(Buffer.compare(Buffer.from(again[name]), Buffer.from(files[name])), name).toBe(0);
  }, 180_000);

  it("records a preflight override with its reason, page form included", async () => {
    const page = await clients.corresponding.post(`/manuscripts/${DEMO.manuscriptId}/figures/${figureId}/versions/1`, { intent: "export", overrideReason: "The journal accepts 6.5 pt tick labels for this figure." });
    expect(page.status).toBe(200);
    const row = await db.selectFrom("figure_export").select(["id", "override_reason"]).where("override_reason", "=", "The journal accepts 6.5 pt tick labels for this figure.").executeTakeFirstOrThrow();
    const audit = await db.selectFrom("audit_event").select(["action", "detail"]).where(sql<boolean>`detail->>'exportId' = ${row.id}`).orderBy("id").execute();
    expect(audit.map((a) => a.action).slice(0, 2)).toEqual(["export-requested", "export-preflight-overridden"]);
    expect((audit[1].detail as { reason: string }).reason).toBe("The journal accepts 6.5 pt tick labels for this figure.");
    expect((await finished(row.id)).state).toBe("done");
  }, 180_000);

  it("answers 409 for a file of an export that is not done, and 404 for a file it does not have", async () => {
    const res = await clients.corresponding.get(`/api/v1/exports/${first.id}/files/figure.eps`, bearer());
    expect(res.status).toBe(404);
    const other = await clients.coauthor.get(`/api/v1/exports/${first.id}/files/bundle.zip`);
    expect(other.status).toBe(403);
  });
});

// Export jobs on a database of their own (issue 10, docs/decisions/0011-export-jobs.md): a job
// whose worker died mid-render is retried by pg-boss and the half-made export never delivered; a
// tampered snapshot is refused. The app's worker does not watch this database, so the test plays
// the dying worker itself. The app's modules read DATABASE_URL when first imported: they are
// imported only after it points at this file's database.
import { createHash } from "node:crypto";
import { mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import { sql } from "kysely";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase } from "../support/db";
import { DEMO } from "../support/http";

const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
let jobs: typeof import("../../app/.server/exports/export-jobs.server");
let verify: typeof import("../../app/.server/exports/verify-bundle-figure.server");
let blobs: typeof import("../../app/.server/storage/create-blob-store.server");

describe("the job lifecycle on a database of its own", () => {
  let own: Awaited<ReturnType<typeof createTestDatabase>>;
  let boss: PgBoss;
  let storeDir: string;
  let carla = "";

  beforeAll(async () => {
    own = await createTestDatabase();
    process.env.DATABASE_URL = own.url;
    delete globalThis.__steradianPool;
    delete globalThis.__steradianDb;
    const { seedDemo } = await import("../../db/seed");
    const { seedDemoDatasets } = await import("../../app/.server/datasets/demo-datasets.server");
    const { seedDemoVersions } = await import("../../app/.server/versions/demo-versions.server");
    jobs = await import("../../app/.server/exports/export-jobs.server");
    verify = await import("../../app/.server/exports/verify-bundle-figure.server");
    blobs = await import("../../app/.server/storage/create-blob-store.server");
    await seedDemo(own.db, { bcryptCost: 4 });
    boss = await jobs.startBoss(own.url, { maintenanceIntervalSeconds: 1 });
    storeDir = mkdtempSync(path.join(tmpdir(), "steradian-export-store-"));
    const idOf = async (email: string) => (await own.db.selectFrom("app_user").select("id").where("email", "=", email).executeTakeFirstOrThrow()).id;
    carla = await idOf(DEMO.corresponding);
    await seedDemoDatasets(own.db, DEMO.manuscriptId, carla);
    await seedDemoVersions(own.db, DEMO.manuscriptId, { contributor: await idOf(DEMO.contributor), coauthor: await idOf(DEMO.coauthor), corresponding: carla });
  }, 120_000);
  afterAll(async () => {
    await boss.stop({ graceful: false, wait: true });
    await globalThis.__steradianDb?.destroy();
    await own.drop();
    rmSync(storeDir, { recursive: true, force: true });
  });

  const signedOff = () => own.db.selectFrom("figure_version").selectAll().where("manuscript_id", "=", DEMO.manuscriptId).where("number", "=", 1).executeTakeFirstOrThrow();
  const rowOf = (id: string) => own.db.selectFrom("figure_export").selectAll().where("id", "=", id).executeTakeFirstOrThrow();

  it("retries a job whose worker died mid-render; the half-made export is never delivered", async () => {
    const store = blobs.createBlobStore({ driver: "local", root: storeDir });
    const requested = await jobs.requestExport(own.db, boss, { version: await signedOff(), userId: carla, overrideReason: null, ip: null }, { retryLimit: 2, retryDelaySeconds: 1, expireInSeconds: 2 });
    // A worker takes the job, starts rendering, writes part of a file, and dies.
    const [job] = await boss.fetch<{ exportId: string }>(jobs.EXPORT_QUEUE);
    expect(job.data.exportId).toBe(requested.id);
    await own.db.updateTable("figure_export").set((eb) => ({ state: "rendering", attempts: eb("attempts", "+", 1) })).where("id", "=", requested.id).execute();
    const partial = await store.receive(Readable.from([Buffer.from("%PDF-1.4 half a fil")]), { maxBytes: 100 });
    const dead = await rowOf(requested.id);
    expect(dead.state).toBe("rendering");
    expect([dead.files, dead.bundle_key]).toEqual([null, null]);

    // pg-boss's maintenance finds the job past its expiry and hands it to a live worker.
    const stop = await jobs.startExportWorker(own.db, store, boss);
    let row = await rowOf(requested.id);
    while (row.state !== "done" && row.state !== "failed") {
      await new Promise((r) => setTimeout(r, 250));
      row = await rowOf(requested.id);
    }
    await stop();
    expect(row.state, row.reason ?? "").toBe("done");
    expect(row.attempts).toBe(2);
    const retried = await boss.getJobById(jobs.EXPORT_QUEUE, job.id);
    expect(retried?.retryCount).toBe(1);
    // The dead worker's partial file stayed a temporary file; the delivered bundle is whole.
    const zip = await new Promise<Buffer>((resolve, reject) => {
      void store.read(row.bundle_key!).then((s) => {
        const chunks: Buffer[] = [];
        s.on("data", (c: Buffer) => chunks.push(c));
        s.on("end", () => resolve(Buffer.concat(chunks)));
        s.on("error", reject);
      });
    });
    expect(sha256(zip)).toBe(row.bundle_sha256);
    expect((await verify.verifyBundleAndFigure(zip)).ok).toBe(true);
    await store.discard(partial.tempPath);
    const audit = await own.db.selectFrom("audit_event").select("action").where(sql<boolean>`detail->>'exportId' = ${requested.id}`).orderBy("id").execute();
    expect(audit.map((a) => a.action)).toEqual(["export-requested", "export-completed"]);
  }, 180_000);

  it("refuses a tampered snapshot: drawn again, the picture is not the signed-off one", async () => {
    const version = await signedOff();
    // Only a table owner can do this, with the immutability trigger switched off: the attack the check is for.
    await sql`ALTER TABLE figure_version DISABLE TRIGGER figure_version_immutable`.execute(own.db);
    await sql`UPDATE figure_version SET snapshot = jsonb_set(snapshot, '{model,altText}', '"Changed after sign-off."') WHERE id = ${version.id}`.execute(own.db);
    await sql`ALTER TABLE figure_version ENABLE TRIGGER figure_version_immutable`.execute(own.db);
    const store = blobs.createBlobStore({ driver: "local", root: storeDir });
    const before = readdirSync(storeDir, { recursive: true }).length;
    const requested = await jobs.requestExport(own.db, boss, { version, userId: carla, overrideReason: null, ip: null });
    const state = await jobs.runExportJob(own.db, store, { data: { exportId: requested.id }, retryCount: 0, retryLimit: 2 });
    expect(state).toBe("failed");
    const row = await rowOf(requested.id);
    expect(row.state).toBe("failed");
    expect(row.reason).toMatch(/^Drawn again from its sealed snapshot, v1 gives a picture with SVG SHA-256 [0-9a-f]{12}…, not the signed-off [0-9a-f]{12}…; nothing was exported/);
    expect([row.files, row.bundle_key]).toEqual([null, null]);
    expect(readdirSync(storeDir, { recursive: true }).length).toBe(before);
    const audit = await own.db.selectFrom("audit_event").select(["action", "detail"]).where(sql<boolean>`detail->>'exportId' = ${requested.id}`).orderBy("id").execute();
    expect(audit.map((a) => a.action)).toEqual(["export-requested", "export-failed"]);
    // A finished export never changes again (a trigger).
    await expect(own.db.updateTable("figure_export").set({ state: "done" }).where("id", "=", requested.id).execute()).rejects.toThrow(/a finished export does not change/);
  }, 180_000);

  it("blocks an export whose preflight fails, unless the corresponding author overrides it with a reason", async () => {
    const { findFigure, saveDraft } = await import("../../app/.server/figures/figure-repository.server");
    const { sealVersion } = await import("../../app/.server/versions/seal-version.server");
    const { requestSignoff, decideVersion } = await import("../../app/.server/versions/review.server");
    const { figureModelSchema } = await import("../../app/figures/figure-model");
    const idOf = async (email: string) => (await own.db.selectFrom("app_user").select("id").where("email", "=", email).executeTakeFirstOrThrow()).id;
    const [ada, bruno] = [await idOf(DEMO.contributor), await idOf(DEMO.coauthor)];
    // The demo figure with its text at 5.5 pt, below the single-column preset's 7 pt, sealed and signed off as v3.
    const figure = (await findFigure(own.db, (await signedOff()).figure_id))!;
    const model = figureModelSchema.parse(figure.draft);
    model.fontSizePt = 5.5;
    const saved = await saveDraft(own.db, { figureId: figure.id, manuscriptId: figure.manuscript_id, baseRevision: figure.draft_revision, model, userId: ada, ip: null });
    if (saved.kind !== "saved") throw new Error("the draft did not save");
    await sealVersion(own.db, { figureId: figure.id, userId: ada, draftRevision: saved.draftRevision, ip: null, mail: "skip" });
    const v3 = await own.db.selectFrom("figure_version").selectAll().where("figure_id", "=", figure.id).where("number", "=", 3).executeTakeFirstOrThrow();
    await requestSignoff(own.db, { version: v3, requesterId: ada, reviewerIds: [bruno], ip: null, mail: "skip" });
    await decideVersion(own.db, { version: v3, reviewerId: bruno, decision: "signed-off", comment: null, ip: null, mail: "skip" });
    const store = blobs.createBlobStore({ driver: "local", root: storeDir });

    const blocked = await jobs.requestExport(own.db, boss, { version: v3, userId: carla, overrideReason: null, ip: null });
    expect(await jobs.runExportJob(own.db, store, { data: { exportId: blocked.id }, retryCount: 0, retryLimit: 2 })).toBe("failed");
    const refused = await rowOf(blocked.id);
    expect(refused.reason).toMatch(/^The preflight failed: smallest text 5\.5 pt \(needs at least 7 pt\)\. Export again with a reason to override it\.$/);
    expect((refused.preflight as { id: string; pass: boolean }[]).filter((c) => !c.pass).map((c) => c.id)).toEqual(["text-size"]);
    expect(refused.bundle_key).toBeNull();

    const reason = "The editor accepts 5.5 pt labels for this inset.";
    const overridden = await jobs.requestExport(own.db, boss, { version: v3, userId: carla, overrideReason: reason, ip: null });
    expect(await jobs.runExportJob(own.db, store, { data: { exportId: overridden.id }, retryCount: 0, retryLimit: 2 })).toBe("done");
    const made = await rowOf(overridden.id);
    expect([made.state, made.override_reason]).toEqual(["done", reason]);
    const audit = await own.db.selectFrom("audit_event").select(["action", "detail"]).where(sql<boolean>`detail->>'exportId' = ${overridden.id}`).orderBy("id").execute();
    expect(audit.map((a) => a.action)).toEqual(["export-requested", "export-preflight-overridden", "export-completed"]);
    expect(audit[1].detail).toEqual(expect.objectContaining({ reason }));
    expect(audit[2].detail).toEqual(expect.objectContaining({ overridden: true }));
  }, 180_000);
});

// Exports as jobs in a PostgreSQL-backed queue (pg-boss), recorded in figure_export
// (docs/decisions/0011-export-jobs.md). Requesting writes the row and the job in the request;
// a worker — in the app process or started with `npm run worker` — draws the files, stores each
// under its content hash and only then marks the row done, so a download never sees half a file.
import { Readable } from "node:stream";
import PgBoss from "pg-boss";
import { failedChecks, type ExportState, type StoredExportFile } from "~/exports/export-state";
import type { PreflightCheck } from "~/exports/preflight";
import { deriveVersionState } from "~/figures/version-state";
import { recordAudit } from "../platform/audit.server";
import type { Db } from "../platform/db.server";
import type { BlobStore } from "../storage/blob-store.server";
import { VersionError } from "../versions/version-error.server";
import { asStateInput, listEvents, type VersionRow } from "../versions/version-repository.server";
import { ExportRefused, renderVersionExport, sha256Hex } from "./version-export.server";

export const EXPORT_QUEUE = "figure-export";

/** How a job is retried: a worker that dies leaves its job active; after `expireInSeconds` pg-boss's maintenance hands it to another worker, up to `retryLimit` times. */
export interface ExportJobOptions {
  retryLimit: number;
  retryDelaySeconds: number;
  expireInSeconds: number;
}
export const DEFAULT_JOB_OPTIONS: ExportJobOptions = { retryLimit: 2, retryDelaySeconds: 2, expireInSeconds: 300 };

export interface ExportJobData {
  exportId: string;
}

/** A pg-boss instance on the database; its own schema `pgboss` is created on first start. */
export async function startBoss(connectionString: string, opts: { maintenanceIntervalSeconds?: number; supervise?: boolean } = {}): Promise<PgBoss> {
  const boss = new PgBoss({
    connectionString,
    max: 3,
    supervise: opts.supervise ?? true,
    schedule: false,
    maintenanceIntervalSeconds: opts.maintenanceIntervalSeconds ?? 30,
  });
  boss.on("error", (e) => console.error("[steradian] export queue:", e));
  await boss.start();
  if (!(await boss.getQueue(EXPORT_QUEUE))) {
    try {
      await boss.createQueue(EXPORT_QUEUE);
    } catch (e) {
      // Two processes starting at once: the other one created it.
      if (!(await boss.getQueue(EXPORT_QUEUE))) throw e;
    }
  }
  return boss;
}

/** A refused request, as 403/404/409/422 with a message for the author. */
export class ExportRequestError extends VersionError {}

export async function versionStateOf(db: Db, versionId: string) {
  return deriveVersionState((await listEvents(db, [versionId])).map(asStateInput)).state;
}

/**
 * Records an export request of a signed-off version and queues its job. The caller has checked
 * that the user is a corresponding author (permission export:version). An override reason, when
 * given, lets the export go ahead even if the preflight fails; it is recorded with the request.
 */
export async function requestExport(
  db: Db,
  boss: PgBoss,
  args: { version: Pick<VersionRow, "id" | "number" | "manuscript_id" | "figure_id">; userId: string; overrideReason: string | null; ip: string | null },
  jobOptions: ExportJobOptions = DEFAULT_JOB_OPTIONS,
) {
  const state = await versionStateOf(db, args.version.id);
  if (state !== "signed off") {
    throw new ExportRequestError(403, "not-signed-off", `Only a signed-off version can be exported; v${args.version.number} is ${state}.`, null, { state });
  }
  const overrideReason = args.overrideReason?.trim() ? args.overrideReason.trim() : null;
  const row = await db.transaction().execute(async (trx) => {
    const inserted = await trx
      .insertInto("figure_export")
      .values({ version_id: args.version.id, manuscript_id: args.version.manuscript_id, requested_by: args.userId, override_reason: overrideReason })
      .returningAll()
      .executeTakeFirstOrThrow();
    const detail = { exportId: inserted.id, figureId: args.version.figure_id, version: args.version.number };
    await recordAudit(trx, { action: "export-requested", actorId: args.userId, manuscriptId: args.version.manuscript_id, detail, ip: args.ip });
    if (overrideReason !== null) await recordAudit(trx, { action: "export-preflight-overridden", actorId: args.userId, manuscriptId: args.version.manuscript_id, detail: { ...detail, reason: overrideReason }, ip: args.ip });
    return inserted;
  });
  await boss.send(EXPORT_QUEUE, { exportId: row.id } satisfies ExportJobData, {
    retryLimit: jobOptions.retryLimit,
    retryDelay: jobOptions.retryDelaySeconds,
    expireInSeconds: jobOptions.expireInSeconds,
  });
  return row;
}

/** Puts bytes into the blob store: received into a temporary file, then renamed to their content key. */
async function storeBytes(store: BlobStore, bytes: Uint8Array | string): Promise<StoredExportFile> {
  const buffer = typeof bytes === "string" ? Buffer.from(bytes, "utf8") : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const received = await store.receive(Readable.from([buffer]), { maxBytes: buffer.length + 1 });
  if (received.sha256 !== sha256Hex(buffer)) {
    await store.discard(received.tempPath);
    throw new Error("the stored bytes differ from the rendered ones");
  }
  const { key } = await store.commit(received.tempPath, received.sha256);
  return { key, sha256: received.sha256, bytes: received.bytes };
}

async function finish(db: Db, exportId: string, state: "failed", reason: string, preflight: PreflightCheck[] | null) {
  const row = await db
    .updateTable("figure_export")
    .set({ state, reason, preflight: preflight === null ? null : JSON.stringify(preflight), finished_at: new Date() })
    .where("id", "=", exportId)
    .where("state", "in", ["queued", "rendering"])
    .returning(["manuscript_id", "requested_by", "version_id"])
    .executeTakeFirst();
  if (row) await recordAudit(db, { action: "export-failed", actorId: row.requested_by, manuscriptId: row.manuscript_id, detail: { exportId, reason } });
}

/**
 * One attempt at an export job. A refusal that a retry cannot change (the picture differs from
 * the signed-off one, a failing preflight without an override) marks the export failed; any other
 * error is thrown so that pg-boss retries the job, and on the last attempt marks it failed too.
 */
export async function runExportJob(db: Db, store: BlobStore, job: { data: ExportJobData; retryCount: number; retryLimit: number }): Promise<ExportState> {
  const { exportId } = job.data;
  const row = await db
    .updateTable("figure_export")
    .set((eb) => ({ state: "rendering", started_at: new Date(), attempts: eb("attempts", "+", 1) }))
    .where("id", "=", exportId)
    .where("state", "in", ["queued", "rendering"])
    .returningAll()
    .executeTakeFirst();
  if (!row) return "done"; // finished already (a duplicate delivery of the job): nothing to do
  try {
    const version = await db.selectFrom("figure_version").selectAll().where("id", "=", row.version_id).executeTakeFirstOrThrow();
    const made = await renderVersionExport(db, version);
    if (made.preflight.some((c) => !c.pass) && row.override_reason === null) {
      throw new ExportRefused(`The preflight failed: ${failedChecks(made.preflight)}. Export again with a reason to override it.`, made.preflight);
    }
    // Every file is stored completely under its content hash before the row names any of them.
    const files = {
      "figure.pdf": await storeBytes(store, made.pdf),
      "figure.svg": await storeBytes(store, made.svg),
      "figure.png": await storeBytes(store, made.png),
      "bundle.zip": await storeBytes(store, made.bundle),
    };
    const done = await db
      .updateTable("figure_export")
      .set({ state: "done", reason: null, preflight: JSON.stringify(made.preflight), files: JSON.stringify(files), bundle_key: files["bundle.zip"].key, bundle_sha256: files["bundle.zip"].sha256, finished_at: new Date() })
      .where("id", "=", exportId)
      .where("state", "=", "rendering")
      .returning("id")
      .executeTakeFirst();
    if (done) {
      await recordAudit(db, {
        action: "export-completed",
        actorId: row.requested_by,
        manuscriptId: row.manuscript_id,
        detail: { exportId, bundleSha256: files["bundle.zip"].sha256, overridden: row.override_reason !== null && made.preflight.some((c) => !c.pass), attempts: row.attempts },
      });
    }
    return "done";
  } catch (e) {
    if (e instanceof ExportRefused) {
      await finish(db, exportId, "failed", e.message, e.preflight);
      return "failed";
    }
    if (job.retryCount >= job.retryLimit) {
      await finish(db, exportId, "failed", `Rendering failed on every attempt (${job.retryCount + 1}): ${e instanceof Error ? e.message : String(e)}`, null);
      return "failed";
    }
    await db.updateTable("figure_export").set({ state: "queued" }).where("id", "=", exportId).where("state", "=", "rendering").execute();
    throw e;
  }
}

/**
 * Starts one export worker on the queue: one job at a time, polling every half second (pg-boss's
 * smallest interval). Returns a function that stops it, letting a running job finish.
 */
export async function startExportWorker(db: Db, store: BlobStore, boss: PgBoss): Promise<() => Promise<void>> {
  const id = await boss.work<ExportJobData>(EXPORT_QUEUE, { batchSize: 1, pollingIntervalSeconds: 0.5, includeMetadata: true }, async ([job]) => {
    await runExportJob(db, store, { data: job.data, retryCount: job.retryCount, retryLimit: job.retryLimit });
  });
  return () => boss.offWork({ id });
}

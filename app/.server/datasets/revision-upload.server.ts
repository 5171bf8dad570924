import { stat } from "node:fs/promises";
import path from "node:path";
import { FormDataParseError, parseFormData } from "@mjackson/form-data-parser";
import type { ColumnMapping } from "~/datasets/column-mapping";
import type { DatasetProblem } from "~/datasets/dataset-problem";
import type { QuantityDescription } from "~/datasets/quantity";
import { recordAudit } from "../platform/audit.server";
import { ingestCsvOffThread } from "./csv/ingest-csv-pool.server";
import type { RefusedLines } from "./csv/preview-csv.server";
import { db } from "../platform/db.server";
import { env } from "../platform/env.server";
import { type SaveRevisionResult, saveRevision } from "./dataset-repository.server";
import type { BlobStore } from "../storage/blob-store.server";
import { createBlobStoreFromEnv } from "../storage/from-env.server";
import { createUploadReceiver, type StoredUpload, uploadLimitOf } from "../storage/upload-handler.server";

let store: BlobStore | undefined;
export function blobStore(): BlobStore {
  return (store ??= createBlobStoreFromEnv());
}

const ABANDONED_AFTER_MS = 24 * 3600_000;
let lastSweep = 0;
/**
 * Files left waiting for a column mapping for a day are abandoned; swept at most once an hour,
 * on the next upload, so that a running server does not fill its disk between restarts.
 */
function sweepAbandoned(): void {
  if (Date.now() - lastSweep < 3600_000) return;
  lastSweep = Date.now();
  blobStore().cleanupTemp(ABANDONED_AFTER_MS).catch((e: unknown) => console.error("[steradian] sweeping abandoned uploads failed:", e));
}

export type UploadOutcome =
  | { kind: "created" | "identical"; revision: { id: string; number: number; contentHash: string; rowCount: number } }
  | { kind: "problems"; problems: DatasetProblem[]; problemCount: number; refused: RefusedLines | null }
  | { kind: "limit"; limit: { kind: "rows" | "bytes"; max: number } };

export type ReceivedForm =
  | { ok: true; fields: FormData; upload: StoredUpload | null; discard(): Promise<void> }
  | { ok: false; limit: { kind: "bytes"; max: number } }
  | { ok: false; limit: null; message: string };

/**
 * Receives a multipart form whose one file part is `file`, into the store's temporary area.
 * The form parser holds a file part in memory up to maxFileSize before our handler streams it
 * to disk, so the byte limit also bounds the memory of one upload.
 */
export async function receiveUploadForm(request: Request): Promise<ReceivedForm> {
  sweepAbandoned();
  const receiver = createUploadReceiver(blobStore(), { maxBytes: env.UPLOAD_MAX_BYTES, fieldNames: ["file"] });
  try {
    const fields = await parseFormData(request, { maxFileSize: env.UPLOAD_MAX_BYTES, maxFiles: 1 }, receiver.handler);
    return { ok: true, fields, upload: receiver.uploads[0] ?? null, discard: () => receiver.discardAll() };
  } catch (e) {
    await receiver.discardAll();
    const limit = uploadLimitOf(e, env.UPLOAD_MAX_BYTES);
    if (limit) return { ok: false, limit };
    if (e instanceof FormDataParseError || (e instanceof Error && /multipart|boundary|content-type/i.test(e.message))) {
      return { ok: false, limit: null, message: `The upload could not be read as multipart/form-data with one file field "file": ${e.message}` };
    }
    throw e;
  }
}

const PENDING_NAME = /^[0-9a-f-]{36}\.upload$/;

/** A received file waiting for its column mapping is named by its temporary file. */
export function pendingId(upload: StoredUpload): string {
  return path.basename(upload.tempPath);
}

export function pendingPath(id: string): string | null {
  return PENDING_NAME.test(id) ? path.join(path.resolve(env.STORAGE_DIR), "tmp", id) : null;
}

/**
 * Validates a received file against the mapping and stores it as the next revision, or
 * refuses it whole. A refused file is deleted, unless `keepRefused` keeps a file refused for
 * its problems waiting for another mapping (the mapping step); nothing of it is stored.
 */
export async function ingestUpload(args: {
  manuscriptId: string;
  datasetId: string;
  userId: string;
  ip: string | null;
  tempPath: string;
  raw: { sha256: string; bytes: number; fileName: string };
  mapping: ColumnMapping;
  quantity: QuantityDescription;
  /**
   * Keep a refused file where it is: a file waiting in the mapping step stays there, so that a
   * refusal caused by the mapping can be answered with another mapping, not another upload.
   */
  keepRefused?: boolean;
  /** Return the refused lines with the problems, for a page that shows the bad cells. */
  refusedLines?: boolean;
}): Promise<UploadOutcome> {
  const st = blobStore();
  // On a worker thread: seconds of parsing must not hold the event loop (decision 0012).
  const result = await ingestCsvOffThread(args.tempPath, { mapping: args.mapping, quantity: args.quantity, limits: { maxRows: env.UPLOAD_MAX_ROWS }, refusedLines: args.refusedLines });
  if (!result.ok) {
    // Kept only where another mapping could make the file good: a file over the row limit stays over it.
    if (!(args.keepRefused && result.reason === "problems")) await st.discard(args.tempPath);
    const detail = result.reason === "problems" ? { problemCount: result.problemCount, fileName: args.raw.fileName } : { limit: result.limit, fileName: args.raw.fileName };
    await recordAudit(db, { action: "revision-rejected", actorId: args.userId, manuscriptId: args.manuscriptId, ip: args.ip, detail: { datasetId: args.datasetId, ...detail } });
    return result.reason === "problems" ? { kind: "problems", problems: result.problems, problemCount: result.problemCount, refused: result.refused } : { kind: "limit", limit: result.limit };
  }
  const existing = await db.selectFrom("dataset_revision").select(["id", "number", "row_count"]).where("dataset_id", "=", args.datasetId).where("content_hash", "=", result.hash).executeTakeFirst();
  let saved: SaveRevisionResult;
  if (existing) {
    saved = { created: false, identicalTo: { id: existing.id, number: existing.number, contentHash: result.hash, rowCount: existing.row_count } };
    await st.discard(args.tempPath);
  } else {
    const { key } = await st.commit(args.tempPath, args.raw.sha256);
    saved = await saveRevision({
      datasetId: args.datasetId, userId: args.userId, contentHash: result.hash,
      raw: { sha256: args.raw.sha256, key, fileName: args.raw.fileName, bytes: args.raw.bytes },
      quantity: args.quantity, mapping: args.mapping, rowCount: result.rowCount, columns: result.columns,
    });
  }
  const revision = saved.created ? saved.revision : saved.identicalTo;
  await recordAudit(db, {
    action: saved.created ? "revision-uploaded" : "revision-identical",
    actorId: args.userId, manuscriptId: args.manuscriptId, ip: args.ip,
    detail: { datasetId: args.datasetId, revision: `r${revision.number}`, contentHash: revision.contentHash, rows: revision.rowCount, fileName: args.raw.fileName },
  });
  return { kind: saved.created ? "created" : "identical", revision };
}

/** A pending upload's file and size; null if it is gone (used, or cleaned up). */
export async function statPending(id: string): Promise<{ tempPath: string; bytes: number } | null> {
  const tempPath = pendingPath(id);
  if (!tempPath) return null;
  try {
    return { tempPath, bytes: (await stat(tempPath)).size };
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === "ENOENT") return null;
    throw e;
  }
}

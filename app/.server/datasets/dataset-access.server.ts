import { Readable } from "node:stream";
import { data } from "react-router";
import { apiError } from "../platform/http/api-error.server";
import { isUuid } from "~/is-uuid";
import type { ManuscriptAction } from "~/permissions";
import { recordAudit } from "../platform/audit.server";
import { findDataset, findRevision } from "./dataset-repository.server";
import { db } from "../platform/db.server";
import { type Mode, notFound, requireApiUser, requirePermission, requireUser } from "../platform/http/guards.server";
import { loadManuscriptPage } from "../manuscripts/manuscript-context.server";
import { blobStore } from "./revision-upload.server";
import type { SessionUser } from "../accounts/users.server";

/**
 * The dataset `datasetId` of the manuscript `manuscriptId`: the one look-up behind pages and
 * the API. A malformed id, or a dataset of another manuscript, is a 404. Authorise first.
 */
export async function datasetOfManuscript(mode: Mode, manuscriptId: string, datasetId: string) {
  const dataset = isUuid(datasetId) ? await findDataset(db, manuscriptId, datasetId) : undefined;
  if (!dataset) notFound(mode, "The dataset");
  return dataset;
}

/** Revision `r<n>` (or `<n>`) of a dataset found by datasetOfManuscript; anything else is a 404. */
export async function revisionOfDataset(mode: Mode, datasetId: string, numberText: string) {
  const number = parseRevisionNumber(mode, numberText);
  const revision = await findRevision(db, datasetId, number);
  if (!revision) notFound(mode, `Revision r${number}`);
  return revision;
}

/** Authorises and finds a dataset of a manuscript; a dataset of another manuscript is a 404. */
export async function accessDataset(mode: Mode, request: Request, manuscriptId: string, datasetId: string, action: ManuscriptAction) {
  const user = mode === "api" ? await requireApiUser(request) : await requireUser(request);
  const role = await requirePermission(mode, user, manuscriptId, action);
  const dataset = await datasetOfManuscript(mode, manuscriptId, datasetId);
  if (action === "upload:revision" && dataset.retired_at) {
    const message = "This dataset is retired: it takes no new revisions. Its revisions stay readable.";
    throw mode === "api" ? apiError(409, "dataset-retired", message) : data({ message }, { status: 409 });
  }
  return { user, role, dataset };
}

export function parseRevisionNumber(mode: Mode, text: string): number {
  const m = /^r?(\d{1,9})$/.exec(text);
  if (!m) notFound(mode, `Revision ${text}`);
  return Number(m[1]);
}

export async function accessRevision(mode: Mode, request: Request, params: { manuscriptId: string; datasetId: string; number: string }, action: ManuscriptAction = "read:dataset") {
  const found = await accessDataset(mode, request, params.manuscriptId, params.datasetId, action);
  const revision = await revisionOfDataset(mode, found.dataset.id, params.number);
  return { ...found, revision };
}

/** The original uploaded file, as it was received, with its own hash in the headers. */
export async function rawFileResponse(args: { user: SessionUser; manuscriptId: string; revision: { id: string; number: number; raw_key: string; raw_filename: string; raw_sha256: string; raw_bytes: number; dataset_id: string }; ip: string | null }) {
  const stream = await blobStore().read(args.revision.raw_key);
  await recordAudit(db, {
    action: "raw-file-downloaded", actorId: args.user.id, manuscriptId: args.manuscriptId, ip: args.ip,
    detail: { datasetId: args.revision.dataset_id, revision: `r${args.revision.number}`, sha256: args.revision.raw_sha256 },
  });
  const safeName = args.revision.raw_filename.replace(/[^\w.\- ]+/g, "_") || `r${args.revision.number}.csv`;
  return new Response(Readable.toWeb(stream) as ReadableStream, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Length": String(args.revision.raw_bytes),
      "Content-Disposition": `attachment; filename="${safeName}"`,
      "X-Content-SHA256": args.revision.raw_sha256,
    },
  });
}

/** Refusals before the file is even read (over the byte limit, not multipart, no file) are audited too. */
export async function auditRefusedUpload(args: { userId: string; manuscriptId: string; datasetId: string; ip: string | null; reason: string }) {
  await recordAudit(db, { action: "revision-rejected", actorId: args.userId, manuscriptId: args.manuscriptId, ip: args.ip, detail: { datasetId: args.datasetId, reason: args.reason } });
}

/** A dataset page's loader context: the manuscript page context and the dataset, authorised once. */
export async function loadDatasetPage(request: Request, params: { manuscriptId: string; datasetId: string }, action: ManuscriptAction = "read:dataset") {
  const page = await loadManuscriptPage(request, params.manuscriptId, action);
  const dataset = await datasetOfManuscript("page", params.manuscriptId, params.datasetId);
  return { ...page, dataset };
}

/** The same for a revision's pages. */
export async function loadRevisionPage(request: Request, params: { manuscriptId: string; datasetId: string; number: string }) {
  const page = await loadDatasetPage(request, params);
  const revision = await revisionOfDataset("page", page.dataset.id, params.number);
  return { ...page, revision };
}

// Reading exports: who may see one (a corresponding author of its manuscript) and how it is shown.
import { EXPORT_FILES, type ExportFileName, type ExportState, type StoredExportFile } from "~/exports/export-state";
import type { PreflightCheck } from "~/exports/preflight";
import { isUuid } from "~/is-uuid";
import { db, type Db } from "../platform/db.server";
import { type Mode, notFound, requireApiUser, requirePermission, requireUser } from "../platform/http/guards.server";

/** Exports with their version's figure, number and fingerprint and the requester's name. */
function exportsWithVersion(database: Db) {
  return database
    .selectFrom("figure_export")
    .innerJoin("figure_version", "figure_version.id", "figure_export.version_id")
    .innerJoin("app_user", "app_user.id", "figure_export.requested_by")
    .selectAll("figure_export")
    .select(["figure_version.figure_id", "figure_version.number", "figure_version.fingerprint", "app_user.name as requesterName"]);
}

export async function findExport(database: Db, exportId: string) {
  if (!isUuid(exportId)) return undefined;
  return exportsWithVersion(database)
    .where("figure_export.id", "=", exportId)
    .executeTakeFirst();
}

export type ExportRow = NonNullable<Awaited<ReturnType<typeof findExport>>>;

/** The newest exports of a version, newest first. */
export async function listVersionExports(database: Db, versionId: string, limit = 5) {
  return exportsWithVersion(database)
    .where("figure_export.version_id", "=", versionId)
    .orderBy("figure_export.requested_at", "desc")
    .orderBy("figure_export.id")
    .limit(limit)
    .execute();
}

/** An export is seen by whoever may export its version: a 404 for non-members, a 403 for other roles. */
export async function accessExport(mode: Mode, request: Request, exportId: string) {
  const user = mode === "api" ? await requireApiUser(request) : await requireUser(request);
  const row = await findExport(db, exportId);
  if (!row) notFound(mode, "The export");
  await requirePermission(mode, user, row.manuscript_id, "export:version");
  return { user, row };
}

export const exportFileUrl = (exportId: string, name: ExportFileName) => `/api/v1/exports/${exportId}/files/${name}`;

/** An export as the API and the page show it. */
export function exportJson(row: ExportRow) {
  const files = (row.files ?? null) as Record<ExportFileName, StoredExportFile> | null;
  return {
    id: row.id,
    figureId: row.figure_id,
    version: row.number,
    fingerprint: row.fingerprint,
    state: row.state as ExportState,
    reason: row.reason,
    overrideReason: row.override_reason,
    requestedBy: row.requesterName,
    requestedAt: new Date(row.requested_at).toISOString(),
    startedAt: row.started_at ? new Date(row.started_at).toISOString() : null,
    finishedAt: row.finished_at ? new Date(row.finished_at).toISOString() : null,
    attempts: row.attempts,
    preflight: (row.preflight ?? null) as PreflightCheck[] | null,
    files: files === null ? null : EXPORT_FILES.map((name) => ({ name, bytes: files[name].bytes, sha256: files[name].sha256, url: exportFileUrl(row.id, name) })),
    links: { self: `/api/v1/exports/${row.id}` },
  };
}
export type ExportJson = ReturnType<typeof exportJson>;

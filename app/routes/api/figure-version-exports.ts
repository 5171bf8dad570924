import { z } from "zod";
import type { Route } from "./+types/figure-version-exports";
import { exportJson, findExport, listVersionExports } from "~/.server/exports/export-access.server";
import { requestExport } from "~/.server/exports/export-jobs.server";
import { exportQueue } from "~/.server/exports/export-queue.server";
import { db } from "~/.server/platform/db.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { apiHandler, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { accessVersion, versionApiError } from "~/.server/versions/version-access.server";
import { VersionError } from "~/.server/versions/version-error.server";

/** GET …/exports: the newest exports of this version (corresponding authors only). */
export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { version } = await accessVersion("api", request, params.figureId, params.number, "export:version");
  return Response.json({ exports: (await listVersionExports(db, version.id, 20)).map(exportJson) });
});

const ExportBody = z.object({ overrideReason: z.string().trim().min(1, "Give a reason to override the preflight.").max(2000, "A reason is at most 2000 characters.").nullable().optional() });

/**
 * POST …/exports { overrideReason? }: queues an export of a signed-off version (202 with the
 * export and its address to poll). A corresponding author only; any other role gets 403.
 */
export const action = apiHandler(async ({ request, params, context }: Route.ActionArgs) => {
  const { user, version } = await accessVersion("api", request, params.figureId, params.number, "export:version");
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Request an export with POST.");
  const body = ExportBody.safeParse((await request.clone().text()) === "" ? {} : await readJsonBody(request));
  if (!body.success) return apiError(422, "invalid-export", body.error.issues[0].message, { field: body.error.issues[0].path.join(".") });
  try {
    const row = await requestExport(db, await exportQueue(), { version, userId: user.id, overrideReason: body.data.overrideReason ?? null, ip: clientIp(context) });
    const made = await findExport(db, row.id);
    return Response.json({ export: exportJson(made!) }, { status: 202, headers: { Location: `/api/v1/exports/${row.id}` } });
  } catch (e) {
    if (e instanceof VersionError) return versionApiError(e);
    throw e;
  }
});

import type { Route } from "./+types/export";
import { accessExport, exportJson } from "~/.server/exports/export-access.server";
import { apiHandler, methodNotAllowed } from "~/.server/platform/http/api-handler.server";

/** GET /api/v1/exports/:exportId: the export's state (queued, rendering, done, failed), preflight and files. */
export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { row } = await accessExport("api", request, params.exportId);
  return Response.json({ export: exportJson(row) }, { headers: { "Cache-Control": "no-store" } });
});

export const action = methodNotAllowed("GET");

import { Readable } from "node:stream";
import type { Route } from "./+types/export-file";
import { accessExport } from "~/.server/exports/export-access.server";
import { EXPORT_FILE_TYPES, EXPORT_FILES, type ExportFileName, type StoredExportFile } from "~/exports/export-state";
import { fileSlug } from "~/exports/figure-tables";
import { apiError } from "~/.server/platform/http/api-error.server";
import { apiHandler, methodNotAllowed } from "~/.server/platform/http/api-handler.server";
import { createBlobStoreFromEnv } from "~/.server/storage/from-env.server";

/** GET /api/v1/exports/:exportId/files/:name: figure.pdf, figure.svg, figure.png or bundle.zip of a finished export. */
export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { row } = await accessExport("api", request, params.exportId);
  const name = params.name as ExportFileName;
  if (!(EXPORT_FILES as readonly string[]).includes(name)) return apiError(404, "not-found", `An export has the files ${EXPORT_FILES.join(", ")}.`);
  if (row.state !== "done") return apiError(409, "not-ready", row.state === "failed" ? `This export was not made: ${row.reason ?? ""}` : `This export is ${row.state}; poll /api/v1/exports/${row.id} until it is done.`, { state: row.state });
  const file = (row.files as Record<ExportFileName, StoredExportFile>)[name];
  const stream = await createBlobStoreFromEnv().read(file.key);
  const base = `figure-${fileSlug(row.figure_id.slice(0, 8))}-v${row.number}`;
  return new Response(Readable.toWeb(stream) as ReadableStream, {
    headers: {
      "Content-Type": EXPORT_FILE_TYPES[name],
      "Content-Length": String(file.bytes),
      "Content-Disposition": `attachment; filename="${base}-${name}"`,
      "X-Content-SHA256": file.sha256,
      "Cache-Control": "private, max-age=31536000, immutable",
    },
  });
});

export const action = methodNotAllowed("GET");

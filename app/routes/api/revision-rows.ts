import { z } from "zod";
import type { Route } from "./+types/revision-rows";
import { accessRevision } from "~/.server/dataset-access.server";
import { revisionRowsPage } from "~/.server/dataset-repository.server";
import { ROW_SORTS } from "~/revision-row-sorts";
import { db } from "~/.server/db.server";
import { apiError } from "~/.server/guards.server";

const RowsQuery = z.object({
  page: z.coerce.number({ message: "page must be a whole number from 1" }).int().min(1, "page must be a whole number from 1").default(1),
  pageSize: z.coerce.number().int().min(1, "pageSize must be from 1 to 1000").max(1000, "pageSize must be from 1 to 1000").default(100),
  sort: z.enum(ROW_SORTS, { message: "sort must be idx, x or y" }).default("idx"),
  dir: z.enum(["asc", "desc"], { message: "dir must be asc or desc" }).default("asc"),
});

export async function loader({ request, params }: Route.LoaderArgs) {
  const { revision } = await accessRevision("api", request, params);
  const q = RowsQuery.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!q.success) return apiError(422, "invalid-query", q.error.issues[0].message, { field: q.error.issues[0].path.join(".") });
  const { page, pageSize, sort, dir } = q.data;
  const rows = await revisionRowsPage(db, revision.id, { offset: (page - 1) * pageSize, limit: pageSize, sort, dir });
  return Response.json({
    revision: `r${revision.number}`,
    page, pageSize, totalRows: revision.row_count, totalPages: Math.ceil(revision.row_count / pageSize),
    rows: rows.map((r) => ({ row: r.idx + 1, x: r.x, xLow: r.x_low, xHigh: r.x_high, y: r.y, statMinus: r.stat_minus, statPlus: r.stat_plus, systMinus: r.syst_minus, systPlus: r.syst_plus })),
  });
}

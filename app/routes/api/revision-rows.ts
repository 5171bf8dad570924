import { z } from "zod";
import type { Route } from "./+types/revision-rows";
import { apiHandler, methodNotAllowed } from "~/.server/platform/http/api-handler.server";
import { accessRevision } from "~/.server/datasets/dataset-access.server";
import { revisionRowsPage } from "~/.server/datasets/dataset-repository.server";
import { ROW_SORTS } from "~/revision-row-sorts";
import { NATURAL_Y_UNIT, quantitySchema } from "~/datasets/quantity";
import { resolveQuantityScales } from "~/datasets/quantity-scales";
import { db } from "~/.server/platform/db.server";
import { apiError } from "~/.server/platform/http/api-error.server";

const RowsQuery = z.object({
  page: z.coerce.number({ message: "page must be a whole number from 1" }).int().min(1, "page must be a whole number from 1").default(1),
  pageSize: z.coerce.number().int().min(1, "pageSize must be from 1 to 1000").max(1000, "pageSize must be from 1 to 1000").default(100),
  sort: z.enum(ROW_SORTS, { message: "sort must be idx, x or y" }).default("idx"),
  dir: z.enum(["asc", "desc"], { message: "dir must be asc or desc" }).default("asc"),
});

export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { revision } = await accessRevision("api", request, params);
  const q = RowsQuery.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!q.success) return apiError(422, "invalid-query", q.error.issues[0].message, { field: q.error.issues[0].path.join(".") });
  const { page, pageSize, sort, dir } = q.data;
  const rows = await revisionRowsPage(db, revision.id, { offset: (page - 1) * pageSize, limit: pageSize, sort, dir });
  const quantity = quantitySchema.parse(revision.quantity);
  return Response.json({
    revision: `r${revision.number}`,
    // Rows are the revision's normal form, in canonical units.
    units: { x: resolveQuantityScales(quantity).xCanonicalUnit, y: NATURAL_Y_UNIT[quantity.y.kind] },
    page, pageSize, totalRows: revision.row_count, totalPages: Math.ceil(revision.row_count / pageSize),
    rows: rows.map((r) => ({ row: r.idx + 1, x: r.x, xLow: r.x_low, xHigh: r.x_high, y: r.y, statMinus: r.stat_minus, statPlus: r.stat_plus, systMinus: r.syst_minus, systPlus: r.syst_plus })),
  });
});

export const action = methodNotAllowed("GET");

import type { Route } from "./+types/manuscripts";
import { apiHandler } from "~/.server/platform/http/api-handler.server";
import { db } from "~/.server/platform/db.server";
import { requireApiUser } from "~/.server/platform/http/guards.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { listManuscriptsForUser } from "~/.server/manuscripts/manuscripts.server";

export const loader = apiHandler(async ({ request }: Route.LoaderArgs) => {
  const user = await requireApiUser(request);
  const rows = await listManuscriptsForUser(db, user.id);
  return Response.json({
    manuscripts: rows.map((m) => ({ id: m.id, title: m.title, journal: m.journal, demo: m.is_demo, role: m.role, memberCount: Number(m.memberCount), createdAt: m.created_at })),
  });
});

export const action = apiHandler(async ({ request }: Route.ActionArgs) => {
  await requireApiUser(request);
  return apiError(405, "method-not-allowed", "Create manuscripts on the web page; this endpoint only lists them (GET).");
});

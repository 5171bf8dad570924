import type { Route } from "./+types/manuscript";
import { apiHandler, methodNotAllowed } from "~/.server/platform/http/api-handler.server";
import { db } from "~/.server/platform/db.server";
import { notFound, requireApiUser, requirePermission } from "~/.server/platform/http/guards.server";
import { getManuscript, listMembers } from "~/.server/manuscripts/manuscripts.server";
import { capabilities } from "~/permissions";

export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const user = await requireApiUser(request);
  const role = await requirePermission("api", user, params.manuscriptId, "read:manuscript");
  const manuscript = await getManuscript(db, params.manuscriptId);
  if (!manuscript) notFound("api", "The manuscript");
  const members = await listMembers(db, manuscript.id);
  return Response.json({
    id: manuscript.id,
    title: manuscript.title,
    journal: manuscript.journal,
    demo: manuscript.is_demo,
    createdAt: manuscript.created_at,
    role,
    permissions: capabilities(role),
    members: members.map((m) => ({ userId: m.userId, name: m.name, email: m.email, role: m.role, addedAt: m.added_at })),
  });
});

export const action = methodNotAllowed("GET");

import type { Route } from "./+types/figures";
import { apiHandler, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { db } from "~/.server/platform/db.server";
import { FigureTitleTaken, listFigures } from "~/.server/figures/figure-repository.server";
import { FigureStartError, figureJson, newFigureSchema, startFigure } from "~/.server/figures/figure-service.server";
import { findFigure } from "~/.server/figures/figure-repository.server";
import { requireApiUser, requirePermission } from "~/.server/platform/http/guards.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { latestVersionStates } from "~/.server/versions/version-repository.server";

export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const user = await requireApiUser(request);
  await requirePermission("api", user, params.manuscriptId, "read:manuscript");
  const rows = await listFigures(db, params.manuscriptId);
  const latest = await latestVersionStates(db, rows.map((f) => f.id));
  return Response.json({
    figures: rows.map((f) => ({
      id: f.id, title: f.title, draftRevision: f.draft_revision, panels: f.panelCount, updatedAt: f.updated_at, updatedBy: f.updatedByName, createdAt: f.created_at,
      latestVersion: latest.get(f.id) ?? null,
    })),
  });
});

export const action = apiHandler(async ({ request, params, context }: Route.ActionArgs) => {
  const user = await requireApiUser(request);
  await requirePermission("api", user, params.manuscriptId, "edit:figure");
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Create a figure with POST.");
  const parsed = newFigureSchema.safeParse(await readJsonBody(request));
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return apiError(422, "invalid-figure", issue.message, { field: issue.path.join("."), issues: parsed.error.issues.map((i) => ({ field: i.path.join("."), message: i.message })) });
  }
  try {
    const created = await startFigure(db, { manuscriptId: params.manuscriptId, userId: user.id, ip: clientIp(context), input: parsed.data });
    const row = (await findFigure(db, created.id))!;
    return Response.json({ figure: figureJson(row), model: row.draft }, { status: 201 });
  } catch (e) {
    if (e instanceof FigureTitleTaken) return apiError(422, "title-taken", e.message, { field: "title" });
    if (e instanceof FigureStartError) return apiError(422, "invalid-figure", e.message, { field: e.field, issues: e.issues.map((i) => ({ field: `model.${i.path}`, message: i.message })) });
    throw e;
  }
});

import type { Route } from "./+types/figure-draft";
import { apiHandler, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { db } from "~/.server/platform/db.server";
import { accessFigure } from "~/.server/figures/figure-access.server";
import { FigureTitleTaken, saveDraft } from "~/.server/figures/figure-repository.server";
import { draftSaveSchema, figureJson } from "~/.server/figures/figure-service.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { figureModelIssues, figureModelSchema } from "~/figures/figure-model";

export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { figure } = await accessFigure("api", request, params.figureId, "read:manuscript");
  return Response.json({ figure: figureJson(figure), draftRevision: figure.draft_revision, model: figure.draft });
});

/** PUT: replaces the draft if it is still at baseRevision (409 otherwise); 422 names the bad field's path. */
export const action = apiHandler(async ({ request, params, context }: Route.ActionArgs) => {
  const { user, figure } = await accessFigure("api", request, params.figureId, "edit:figure");
  if (request.method !== "PUT") return apiError(405, "method-not-allowed", "Replace the draft with PUT.");
  const body = draftSaveSchema.safeParse(await readJsonBody(request));
  if (!body.success) {
    const issue = body.error.issues[0];
    return apiError(422, "invalid-draft", issue.message, { field: issue.path.join(".") });
  }
  const model = figureModelSchema.safeParse(body.data.model);
  if (!model.success) {
    const issues = figureModelIssues(model.error);
    return apiError(422, "invalid-figure", `The figure model is not valid at model.${issues[0].path}: ${issues[0].message}`, {
      field: `model.${issues[0].path}`,
      issues: issues.map((i) => ({ field: `model.${i.path}`, message: i.message })),
    });
  }
  try {
    const saved = await saveDraft(db, {
      figureId: figure.id, manuscriptId: figure.manuscript_id, baseRevision: body.data.baseRevision, model: model.data,
      title: body.data.title, userId: user.id, ip: clientIp(context),
    });
    if (saved.kind === "conflict") {
      return apiError(409, "stale-draft", `The draft was saved by ${saved.updatedByName} since revision ${body.data.baseRevision} (it is now at revision ${saved.currentRevision}): reload it and apply your change again.`, {
        currentRevision: saved.currentRevision,
      });
    }
    return Response.json({ draftRevision: saved.draftRevision, updatedAt: saved.updatedAt, model: model.data });
  } catch (e) {
    if (e instanceof FigureTitleTaken) return apiError(422, "title-taken", e.message, { field: "title" });
    throw e;
  }
});

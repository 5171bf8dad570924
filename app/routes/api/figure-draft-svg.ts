import type { Route } from "./+types/figure-draft-svg";
import { apiHandler, methodNotAllowed } from "~/.server/platform/http/api-handler.server";
import { db } from "~/.server/platform/db.server";
import { accessFigure } from "~/.server/figures/figure-access.server";
import { parseStoredDraft, renderDraft } from "~/.server/figures/render-draft.server";
import { apiError } from "~/.server/platform/http/api-error.server";

/** The draft drawn on the server, by the same renderer as the page's preview; marked unsealed in its metadata. */
export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { figure } = await accessFigure("api", request, params.figureId, "read:manuscript");
  const draft = parseStoredDraft(figure);
  if (!draft.ok) return apiError(422, "invalid-figure", `The stored draft is not valid at ${draft.issues[0].path}: ${draft.issues[0].message}`, { field: `model.${draft.issues[0].path}` });
  const rendered = await renderDraft(db, figure, draft.model);
  const name = figure.title.replace(/[^\w.\- ]+/g, "_").trim() || "figure";
  return new Response(rendered.svg, {
    headers: {
      "Content-Type": "image/svg+xml; charset=utf-8",
      "Content-Disposition": `${new URL(request.url).searchParams.has("download") ? "attachment" : "inline"}; filename="${name} (draft r${figure.draft_revision}).svg"`,
      "X-Draft-Revision": String(figure.draft_revision),
    },
  });
});

export const action = methodNotAllowed("GET");

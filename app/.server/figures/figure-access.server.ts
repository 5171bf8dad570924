import { capabilities, type ManuscriptAction } from "~/permissions";
import { db } from "../platform/db.server";
import { type Mode, notFound, requireApiUser, requirePermission, requireUser } from "../platform/http/guards.server";
import { getManuscript } from "../manuscripts/manuscripts.server";
import { findFigure } from "./figure-repository.server";

/**
 * Authorises an action on a figure through its manuscript. A figure of a manuscript the caller
 * cannot see is a 404, the same answer as a figure that does not exist.
 */
export async function accessFigure(mode: Mode, request: Request, figureId: string, action: ManuscriptAction) {
  const user = mode === "api" ? await requireApiUser(request) : await requireUser(request);
  const figure = await findFigure(db, figureId);
  if (!figure) notFound(mode, "The figure");
  const role = await requirePermission(mode, user, figure.manuscript_id, action);
  return { user, role, figure };
}

/** A figure page's loader context: the manuscript page context and the figure, authorised once. */
export async function loadFigurePage(request: Request, params: { manuscriptId: string; figureId: string }, action: ManuscriptAction = "read:manuscript") {
  const { user, role, figure } = await accessFigure("page", request, params.figureId, action);
  if (figure.manuscript_id !== params.manuscriptId) notFound("page", "The figure");
  const manuscript = await getManuscript(db, figure.manuscript_id);
  if (!manuscript) notFound("page", "The manuscript");
  return { user, role, manuscript, figure, can: capabilities(role) };
}

import { capabilities } from "~/permissions";
import type { ManuscriptAction } from "~/permissions";
import { db } from "../platform/db.server";
import { notFound, requirePermission, requireUser } from "../platform/http/guards.server";
import { getManuscript } from "./manuscripts.server";

/** What every manuscript page's loader starts with: the user, their role, the manuscript. */
export async function loadManuscriptPage(request: Request, manuscriptId: string, action: ManuscriptAction = "read:manuscript") {
  const user = await requireUser(request);
  const role = await requirePermission("page", user, manuscriptId, action);
  const manuscript = await getManuscript(db, manuscriptId);
  if (!manuscript) notFound("page", "The manuscript");
  return { user, role, manuscript, can: capabilities(role) };
}

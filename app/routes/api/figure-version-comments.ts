import { z } from "zod";
import type { Route } from "./+types/figure-version-comments";
import { db } from "~/.server/platform/db.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { apiHandler, methodNotAllowed, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { commentOnVersion } from "~/.server/versions/review.server";
import { accessVersion, versionApiError } from "~/.server/versions/version-access.server";
import { VersionError } from "~/.server/versions/version-error.server";

export const loader = methodNotAllowed("POST");

const CommentBody = z.object({ comment: z.string({ message: "Send the comment's text as comment." }) });

/** POST { comment }: adds a comment to the version's thread (201). */
export const action = apiHandler(async ({ request, params, context }: Route.ActionArgs) => {
  const { user, version } = await accessVersion("api", request, params.figureId, params.number, "comment:version");
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Add a comment with POST.");
  const body = CommentBody.safeParse(await readJsonBody(request));
  if (!body.success) return apiError(422, "invalid-comment", body.error.issues[0].message, { field: "comment" });
  try {
    const row = await commentOnVersion(db, { version, userId: user.id, text: body.data.comment, ip: clientIp(context) });
    return Response.json({ comment: { id: row.id, at: row.at } }, { status: 201 });
  } catch (e) {
    if (e instanceof VersionError) return versionApiError(e);
    throw e;
  }
});

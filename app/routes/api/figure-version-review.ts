import { z } from "zod";
import type { Route } from "./+types/figure-version-review";
import { db } from "~/.server/platform/db.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { apiHandler, methodNotAllowed, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { requestSignoff } from "~/.server/versions/review.server";
import { accessVersion, versionApiError } from "~/.server/versions/version-access.server";
import { VersionError } from "~/.server/versions/version-error.server";

export const loader = methodNotAllowed("POST");

const RequestBody = z.object({
  reviewerIds: z.array(z.uuid("A reviewer is named by their user id.")).min(1, "Choose at least one co-author or corresponding author.").max(50),
});

/** POST { reviewerIds }: asks co-authors or corresponding authors to sign the version off (201). */
export const action = apiHandler(async ({ request, params, context }: Route.ActionArgs) => {
  const { user, version } = await accessVersion("api", request, params.figureId, params.number, "request:signoff");
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Request sign-off with POST.");
  const body = RequestBody.safeParse(await readJsonBody(request));
  if (!body.success) return apiError(422, "invalid-request", body.error.issues[0].message, { field: body.error.issues[0].path.join(".") });
  try {
    await requestSignoff(db, { version, requesterId: user.id, reviewerIds: body.data.reviewerIds, ip: clientIp(context) });
    return Response.json({ requested: body.data.reviewerIds, state: "in review" }, { status: 201 });
  } catch (e) {
    if (e instanceof VersionError) return versionApiError(e);
    throw e;
  }
});

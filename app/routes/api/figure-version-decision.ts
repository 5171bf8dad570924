import { z } from "zod";
import type { Route } from "./+types/figure-version-decision";
import { db } from "~/.server/platform/db.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { apiHandler, methodNotAllowed, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { decideVersion } from "~/.server/versions/review.server";
import { accessVersion, versionApiError } from "~/.server/versions/version-access.server";
import { VersionError } from "~/.server/versions/version-error.server";

export const loader = methodNotAllowed("POST");

const DecisionBody = z.object({ comment: z.string().max(5000, "A comment is at most 5000 characters.").nullable().optional() });

/**
 * POST …/sign-off { comment? } or …/return { comment }: a requested reviewer's decision (200 with
 * the version's state after it). One route module for both addresses; the address says which.
 */
export const action = apiHandler(async ({ request, params, context }: Route.ActionArgs) => {
  const { user, version } = await accessVersion("api", request, params.figureId, params.number, "signoff:version");
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Send the decision with POST.");
  const decision = new URL(request.url).pathname.endsWith("/return") ? "returned" : "signed-off";
  const body = DecisionBody.safeParse((await request.clone().text()) === "" ? {} : await readJsonBody(request));
  if (!body.success) return apiError(422, "invalid-decision", body.error.issues[0].message, { field: body.error.issues[0].path.join(".") });
  try {
    const result = await decideVersion(db, { version, reviewerId: user.id, decision, comment: body.data.comment ?? null, ip: clientIp(context) });
    return Response.json({ decision, state: result.state });
  } catch (e) {
    if (e instanceof VersionError) return versionApiError(e);
    throw e;
  }
});

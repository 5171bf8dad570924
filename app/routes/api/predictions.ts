import type { Route } from "./+types/predictions";
import { apiHandler, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { requireApiUser } from "~/.server/platform/http/guards.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { EngineInputError, runPrediction } from "~/engine";

export const loader = apiHandler(async ({ request }: Route.LoaderArgs) => {
  await requireApiUser(request);
  return apiError(405, "method-not-allowed", "Send the prediction request as JSON with POST.");
});

export const action = apiHandler(async ({ request }: Route.ActionArgs) => {
  await requireApiUser(request);
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Send the prediction request as JSON with POST.");
  // The same code as the command line's for the same mistake.
  const body = await readJsonBody(request, "malformed_json");
  try {
    return Response.json(runPrediction(body));
  } catch (e) {
    if (e instanceof EngineInputError) return apiError(422, e.code, e.message, { field: e.field });
    throw e;
  }
});

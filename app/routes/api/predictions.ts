import type { Route } from "./+types/predictions";
import { apiHandler } from "~/.server/api-handler.server";
import { apiError, requireApiUser } from "~/.server/guards.server";
import { EngineInputError, runPrediction } from "~/engine";

export const loader = apiHandler(async ({ request }: Route.LoaderArgs) => {
  await requireApiUser(request);
  return apiError(405, "method-not-allowed", "Send the prediction request as JSON with POST.");
});

export const action = apiHandler(async ({ request }: Route.ActionArgs) => {
  await requireApiUser(request);
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Send the prediction request as JSON with POST.");
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    // The same code as the command line's for the same mistake.
    return apiError(422, "malformed_json", "The request body is not valid JSON.", { field: "" });
  }
  try {
    return Response.json(runPrediction(body));
  } catch (e) {
    if (e instanceof EngineInputError) return apiError(422, e.code, e.message, { field: e.field });
    throw e;
  }
});

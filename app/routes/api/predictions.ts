import type { Route } from "./+types/predictions";
import { apiHandler, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { requireApiUser } from "~/.server/platform/http/guards.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { EngineInputError, runPrediction } from "~/engine";

/**
 * The most angles or energies, and the most bins, one web request may ask for (docs/product.md
 * "Prediction contract"); the command line has no such limit. Ten thousand points draw any curve
 * of a figure many times over and answer in well under a second.
 */
export const MAX_POINTS = 10_000;
export const MAX_BINS = 10_000;
const POINT_LISTS = ["thetaDeg", "cosTheta", "t", "sqrtS", "beam", "kinetic"];

/** The longest list of points and of bins in a request (top level and in `scan`). */
function listSizes(body: unknown): { points: number; bins: number; field: string | null } {
  let points = 0, bins = 0, field: string | null = null;
  const visit = (record: unknown, prefix: string) => {
    if (typeof record !== "object" || record === null || Array.isArray(record)) return;
    for (const [key, value] of Object.entries(record)) {
      if (!Array.isArray(value)) continue;
      const base = key.endsWith("Bins") ? key.slice(0, -4) : key;
      if (!POINT_LISTS.includes(base)) continue;
      if (key.endsWith("Bins") ? value.length > bins : value.length > points) field = `${prefix}${key}`;
      if (key.endsWith("Bins")) bins = Math.max(bins, value.length);
      else points = Math.max(points, value.length);
    }
  };
  visit(body, "");
  visit((body as { scan?: unknown } | null)?.scan, "scan.");
  return { points, bins, field };
}

export const loader = apiHandler(async ({ request }: Route.LoaderArgs) => {
  await requireApiUser(request);
  return apiError(405, "method-not-allowed", "Send the prediction request as JSON with POST.");
});

export const action = apiHandler(async ({ request }: Route.ActionArgs) => {
  await requireApiUser(request);
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Send the prediction request as JSON with POST.");
  // The same code as the command line's for the same mistake.
  const body = await readJsonBody(request, "malformed_json");
  const sizes = listSizes(body);
  if (sizes.points > MAX_POINTS || sizes.bins > MAX_BINS) {
    const [n, max, what] = sizes.points > MAX_POINTS ? [sizes.points, MAX_POINTS, "points"] : [sizes.bins, MAX_BINS, "bins"];
    return apiError(413, "too_many_points", `${sizes.field} has ${n.toLocaleString("en")} ${what}; one request takes at most ${max.toLocaleString("en")} (split the list, or use npm run predict for more).`, { field: sizes.field, max });
  }
  try {
    return Response.json(runPrediction(body));
  } catch (e) {
    if (e instanceof EngineInputError) return apiError(422, e.code, e.message, { field: e.field });
    throw e;
  }
});

import { apiError } from "./api-error.server";
import { requireApiUser } from "./guards.server";

/**
 * Wraps an API loader or action so that whatever goes wrong, the caller gets JSON: thrown
 * Responses (guards) pass through, a missing stored file is a 404, anything else a logged 500.
 */
export function apiHandler<A extends { request: Request }>(fn: (args: A) => Promise<Response>) {
  return async (args: A): Promise<Response> => {
    try {
      return await fn(args);
    } catch (e) {
      if (e instanceof Response) return e;
      // The client went away mid-request (an interrupted upload): nobody is left to answer.
      if (args.request.signal.aborted) return apiError(400, "aborted", "The request was interrupted by the client.");
      if ((e as NodeJS.ErrnoException)?.code === "ENOENT" || (e as { name?: string })?.name === "NoSuchKey") {
        return apiError(404, "not-found", "The stored file behind this resource is missing; tell the site admin.");
      }
      console.error(`[steradian] ${args.request.method} ${new URL(args.request.url).pathname} failed:`, e);
      return apiError(500, "internal", "Something went wrong on the server; the error has been logged.");
    }
  };
}

/** For the methods a resource does not take; the caller is still authenticated first. */
export function methodNotAllowed(allowed: string) {
  return apiHandler(async ({ request }: { request: Request }) => {
    await requireApiUser(request);
    return apiError(405, "method-not-allowed", `This resource takes ${allowed} only.`);
  });
}

/**
 * The request's JSON body; anything else is thrown as a 422 that apiHandler passes on. With the
 * session cookie the body must also be declared JSON (415 otherwise): a cross-site form can send
 * text/plain without asking first, never application/json.
 */
export async function readJsonBody(request: Request, code = "invalid-json"): Promise<unknown> {
  const type = (request.headers.get("Content-Type") ?? "").split(";")[0].trim().toLowerCase();
  if (!request.headers.has("Authorization") && !(type === "application/json" || type.endsWith("+json"))) {
    throw apiError(415, "unsupported-media-type", "Send the body as JSON with 'Content-Type: application/json'.");
  }
  try {
    return await request.json();
  } catch {
    throw apiError(422, code, "The request body is not valid JSON.", { field: "" });
  }
}

import type { Route } from "./+types/revision";
import { apiHandler, methodNotAllowed } from "~/.server/api-handler.server";
import { accessRevision } from "~/.server/dataset-access.server";
import { revisionJson } from "~/.server/dataset-json.server";

export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { revision } = await accessRevision("api", request, params);
  return Response.json({ revision: revisionJson(revision) });
});

export const action = methodNotAllowed("GET");

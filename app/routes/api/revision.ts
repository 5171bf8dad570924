import type { Route } from "./+types/revision";
import { apiHandler, methodNotAllowed } from "~/.server/platform/http/api-handler.server";
import { accessRevision } from "~/.server/datasets/dataset-access.server";
import { revisionJson } from "~/.server/datasets/dataset-json.server";

export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { revision } = await accessRevision("api", request, params);
  return Response.json({ revision: revisionJson(revision) });
});

export const action = methodNotAllowed("GET");

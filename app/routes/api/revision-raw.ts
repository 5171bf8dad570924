import type { Route } from "./+types/revision-raw";
import { apiHandler, methodNotAllowed } from "~/.server/platform/http/api-handler.server";
import { accessRevision, rawFileResponse } from "~/.server/datasets/dataset-access.server";
import { clientIp } from "~/.server/platform/http/client-address.server";

export const loader = apiHandler(async ({ request, params, context }: Route.LoaderArgs) => {
  const { user, revision } = await accessRevision("api", request, params, "download:raw");
  return rawFileResponse({ user, manuscriptId: params.manuscriptId, revision, ip: clientIp(context) });
});

export const action = methodNotAllowed("GET");

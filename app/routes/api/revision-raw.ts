import type { Route } from "./+types/revision-raw";
import { apiHandler, methodNotAllowed } from "~/.server/api-handler.server";
import { accessRevision, rawFileResponse } from "~/.server/dataset-access.server";
import { clientIp } from "~/.server/sign-in.server";

export const loader = apiHandler(async ({ request, params, context }: Route.LoaderArgs) => {
  const { user, revision } = await accessRevision("api", request, params, "download:raw");
  return rawFileResponse({ user, manuscriptId: params.manuscriptId, revision, ip: clientIp(context) });
});

export const action = methodNotAllowed("GET");

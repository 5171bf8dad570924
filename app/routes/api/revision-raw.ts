import type { Route } from "./+types/revision-raw";
import { accessRevision, rawFileResponse } from "~/.server/dataset-access.server";
import { clientIp } from "~/.server/sign-in.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { user, revision } = await accessRevision("api", request, params, "download:raw");
  return rawFileResponse({ user, manuscriptId: params.manuscriptId, revision, ip: clientIp(context) });
}

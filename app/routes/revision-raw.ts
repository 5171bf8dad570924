import type { Route } from "./+types/revision-raw";
import { accessRevision, rawFileResponse } from "~/.server/datasets/dataset-access.server";
import { clientIp } from "~/.server/platform/http/client-address.server";

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { user, revision } = await accessRevision("page", request, params, "download:raw");
  return rawFileResponse({ user, manuscriptId: params.manuscriptId, revision, ip: clientIp(context) });
}

import type { Route } from "./+types/revision";
import { accessRevision } from "~/.server/dataset-access.server";
import { revisionJson } from "~/.server/dataset-json.server";

export async function loader({ request, params }: Route.LoaderArgs) {
  const { revision } = await accessRevision("api", request, params);
  return Response.json({ revision: revisionJson(revision) });
}

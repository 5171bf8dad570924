import type { Route } from "./+types/dataset";
import { accessDataset } from "~/.server/dataset-access.server";
import { datasetJson, revisionJson } from "~/.server/dataset-json.server";
import { listRevisions } from "~/.server/dataset-repository.server";
import { db } from "~/.server/db.server";

export async function loader({ request, params }: Route.LoaderArgs) {
  const { dataset } = await accessDataset("api", request, params.manuscriptId, params.datasetId, "read:dataset");
  const revisions = await listRevisions(db, dataset.id);
  return Response.json({ dataset: datasetJson(dataset, revisions[0]?.number ?? null), revisions: revisions.map(revisionJson) });
}

import type { Route } from "./+types/dataset";
import { apiHandler, methodNotAllowed } from "~/.server/platform/http/api-handler.server";
import { accessDataset } from "~/.server/datasets/dataset-access.server";
import { datasetJson, revisionJson } from "~/.server/datasets/dataset-json.server";
import { listRevisions } from "~/.server/datasets/dataset-repository.server";
import { db } from "~/.server/platform/db.server";

export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { dataset } = await accessDataset("api", request, params.manuscriptId, params.datasetId, "read:dataset");
  const revisions = await listRevisions(db, dataset.id);
  return Response.json({ dataset: datasetJson(dataset, revisions[0]?.number ?? null), revisions: revisions.map(revisionJson) });
});

export const action = methodNotAllowed("GET");

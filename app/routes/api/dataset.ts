import { z } from "zod";
import type { Route } from "./+types/dataset";
import { apiHandler, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { accessDataset } from "~/.server/datasets/dataset-access.server";
import { DatasetNameTaken } from "~/.server/datasets/dataset-create.server";
import { datasetJson, revisionJson } from "~/.server/datasets/dataset-json.server";
import { listRevisions } from "~/.server/datasets/dataset-repository.server";
import { TIDY_REFUSAL, canTidyDataset, datasetNameSchema, renameDataset, retireDataset } from "~/.server/datasets/dataset-tidy.server";
import { db } from "~/.server/platform/db.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { clientIp } from "~/.server/platform/http/client-address.server";

export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { dataset } = await accessDataset("api", request, params.manuscriptId, params.datasetId, "read:dataset");
  const revisions = await listRevisions(db, dataset.id);
  return Response.json({ dataset: datasetJson(dataset, revisions[0]?.number ?? null), revisions: revisions.map(revisionJson) });
});

const DatasetPatch = z.strictObject({
  name: datasetNameSchema.optional(),
  retired: z.literal(true, { error: "Only `retired: true` is accepted: a retired dataset stays retired." }).optional(),
});

/** PATCH renames (`name`) and/or retires (`retired: true`) a dataset; both are audited. */
export const action = apiHandler(async ({ request, params, context }: Route.ActionArgs) => {
  if (request.method !== "PATCH") return apiError(405, "method-not-allowed", "Read a dataset with GET; rename or retire it with PATCH.");
  const { user, role, dataset } = await accessDataset("api", request, params.manuscriptId, params.datasetId, "read:dataset");
  if (!canTidyDataset(role, user.id, dataset)) return apiError(403, "forbidden", TIDY_REFUSAL);
  const parsed = DatasetPatch.safeParse(await readJsonBody(request));
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return apiError(422, "invalid-dataset", issue.message, { field: issue.path.join(".") });
  }
  const ip = clientIp(context);
  if (parsed.data.name !== undefined) {
    try {
      await renameDataset(db, { dataset, userId: user.id, ip, name: parsed.data.name });
    } catch (e) {
      if (e instanceof DatasetNameTaken) return apiError(422, "name-taken", e.message, { field: "name" });
      throw e;
    }
  }
  if (parsed.data.retired) await retireDataset(db, { dataset: { ...dataset, name: parsed.data.name ?? dataset.name }, userId: user.id, ip });
  const fresh = await db.selectFrom("dataset").selectAll().where("id", "=", dataset.id).executeTakeFirstOrThrow();
  const revisions = await listRevisions(db, dataset.id);
  return Response.json({ dataset: datasetJson(fresh, revisions[0]?.number ?? null) });
});

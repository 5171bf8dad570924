import type { Route } from "./+types/datasets";
import { apiHandler, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { DatasetNameTaken, createDatasetAudited } from "~/.server/datasets/dataset-create.server";
import { DatasetInput } from "~/.server/datasets/dataset-input.server";
import { datasetJson } from "~/.server/datasets/dataset-json.server";
import { listDatasets } from "~/.server/datasets/dataset-repository.server";
import { db } from "~/.server/platform/db.server";
import { requireApiUser, requirePermission } from "~/.server/platform/http/guards.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { clientIp } from "~/.server/platform/http/client-address.server";

export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const user = await requireApiUser(request);
  await requirePermission("api", user, params.manuscriptId, "read:dataset");
  const rows = await listDatasets(db, params.manuscriptId);
  return Response.json({ datasets: rows.map((d) => datasetJson({ ...d, mapping: null }, d.latestRevision)) });
});

export const action = apiHandler(async ({ request, params, context }: Route.ActionArgs) => {
  const user = await requireApiUser(request);
  await requirePermission("api", user, params.manuscriptId, "create:dataset");
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Create a dataset with POST.");
  const body = await readJsonBody(request);
  const parsed = DatasetInput.safeParse(body);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return apiError(422, "invalid-dataset", issue.message, { field: issue.path.join("."), issues: parsed.error.issues.map((i) => ({ field: i.path.join("."), message: i.message })) });
  }
  let created;
  try {
    created = await createDatasetAudited(db, { manuscriptId: params.manuscriptId, userId: user.id, ip: clientIp(context), input: parsed.data });
  } catch (e) {
    if (e instanceof DatasetNameTaken) return apiError(422, "name-taken", e.message, { field: "name" });
    throw e;
  }
  const full = await db.selectFrom("dataset").selectAll().where("id", "=", created.id).executeTakeFirstOrThrow();
  return Response.json({ dataset: datasetJson(full, null) }, { status: 201 });
});

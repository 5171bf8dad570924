import type { Route } from "./+types/revisions";
import { apiHandler } from "~/.server/platform/http/api-handler.server";
import { accessDataset, auditRefusedUpload } from "~/.server/datasets/dataset-access.server";
import { uploadMapping } from "~/.server/datasets/dataset-input.server";
import { limitMessage, revisionJson, uploadOutcomeResponse } from "~/.server/datasets/dataset-json.server";
import { listRevisions } from "~/.server/datasets/dataset-repository.server";
import { db } from "~/.server/platform/db.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { ingestUpload, receiveUploadForm } from "~/.server/datasets/revision-upload.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { quantitySchema } from "~/datasets/quantity";

export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { dataset } = await accessDataset("api", request, params.manuscriptId, params.datasetId, "read:dataset");
  return Response.json({ revisions: (await listRevisions(db, dataset.id)).map(revisionJson) });
});

export const action = apiHandler(async ({ request, params, context }: Route.ActionArgs) => {
  const { user, dataset } = await accessDataset("api", request, params.manuscriptId, params.datasetId, "upload:revision");
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Upload a revision with POST (multipart/form-data).");
  const refused = (reason: string) => auditRefusedUpload({ userId: user.id, manuscriptId: params.manuscriptId, datasetId: dataset.id, ip: clientIp(context), reason });
  const form = await receiveUploadForm(request);
  if (!form.ok) {
    await refused(form.limit ? limitMessage(form.limit) : form.message);
    return form.limit ? apiError(413, "too-large", limitMessage(form.limit), { limit: form.limit }) : apiError(422, "invalid-upload", form.message, { field: "file" });
  }
  try {
    if (!form.upload) {
      await refused("no file part");
      return apiError(422, "missing-file", "Send the CSV file in a multipart field named “file”.", { field: "file" });
    }
    const mapping = uploadMapping(form.fields.get("mapping"), dataset.mapping);
    if (!mapping.ok) return apiError(422, mapping.code, mapping.message, { field: mapping.field });
    const quantity = quantitySchema.parse(dataset.quantity);
    const outcome = await ingestUpload({
      manuscriptId: params.manuscriptId, datasetId: dataset.id, userId: user.id, ip: clientIp(context),
      tempPath: form.upload.tempPath, raw: { sha256: form.upload.sha256, bytes: form.upload.bytes, fileName: form.upload.fileName },
      mapping: mapping.mapping, quantity,
    });
    return uploadOutcomeResponse(outcome);
  } finally {
    await form.discard();
  }
});

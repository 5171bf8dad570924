import type { Dataset, DatasetRevision } from "../../../db/types";
import type { UploadOutcome } from "./revision-upload.server";

/** The JSON shapes of the datasets API, in one place. */
export function datasetJson(d: Pick<Dataset, "id" | "name" | "quantity" | "mapping" | "process" | "beam_energy_gev" | "target" | "description" | "is_demo" | "created_at"> & Partial<Pick<Dataset, "retired_at">>, latestRevision?: number | null) {
  return {
    id: d.id,
    name: d.name,
    quantity: d.quantity,
    mapping: d.mapping,
    metadata: { process: d.process, beamEnergyGeV: d.beam_energy_gev, target: d.target, description: d.description },
    demo: d.is_demo,
    createdAt: d.created_at,
    /** When the dataset was retired (it then leaves the lists), or null. */
    retiredAt: d.retired_at ?? null,
    ...(latestRevision !== undefined ? { latestRevision: latestRevision ?? null } : {}),
  };
}

export function revisionJson(r: Pick<DatasetRevision, "id" | "number" | "content_hash" | "raw_sha256" | "raw_filename" | "raw_bytes" | "row_count" | "created_at"> & Partial<Pick<DatasetRevision, "quantity" | "mapping">>) {
  return {
    id: r.id,
    number: r.number,
    label: `r${r.number}`,
    hash: r.content_hash,
    rowCount: r.row_count,
    raw: { sha256: r.raw_sha256, fileName: r.raw_filename, bytes: Number(r.raw_bytes) },
    createdAt: r.created_at,
    ...(r.quantity !== undefined ? { quantity: r.quantity, mapping: r.mapping } : {}),
  };
}

/** 201 for a new revision, 200 for identical content, 422 with the problems, 413 over a limit. */
export function uploadOutcomeResponse(o: UploadOutcome): Response {
  switch (o.kind) {
    case "created":
      return Response.json({ revision: { ...o.revision, label: `r${o.revision.number}`, hash: o.revision.contentHash } }, { status: 201 });
    case "identical":
      return Response.json({ message: `identical to r${o.revision.number}`, identicalTo: `r${o.revision.number}`, revision: { ...o.revision, label: `r${o.revision.number}`, hash: o.revision.contentHash } }, { status: 200 });
    case "problems":
      return Response.json(
        { error: { code: "invalid-file", message: `The file has ${o.problemCount} problem${o.problemCount === 1 ? "" : "s"}; nothing was stored.`, problems: o.problems, problemCount: o.problemCount } },
        { status: 422 },
      );
    case "limit":
      return Response.json({ error: { code: "too-large", message: limitMessage(o.limit), limit: o.limit } }, { status: 413 });
  }
}

export function limitMessage(limit: { kind: "rows" | "bytes"; max: number }): string {
  return limit.kind === "rows"
    ? `The file has more than ${limit.max.toLocaleString("en")} data rows, the upload limit (UPLOAD_MAX_ROWS); nothing was stored.`
    : `The file is larger than ${limit.max.toLocaleString("en")} bytes, the upload limit (UPLOAD_MAX_BYTES); nothing was stored.`;
}

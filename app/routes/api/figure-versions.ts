import { z } from "zod";
import type { Route } from "./+types/figure-versions";
import { accessFigure } from "~/.server/figures/figure-access.server";
import { db } from "~/.server/platform/db.server";
import { apiError } from "~/.server/platform/http/api-error.server";
import { apiHandler, readJsonBody } from "~/.server/platform/http/api-handler.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { sealVersion } from "~/.server/versions/seal-version.server";
import { versionApiError } from "~/.server/versions/version-access.server";
import { VersionError } from "~/.server/versions/version-error.server";
import { listVersionSummaries, versionJson } from "~/.server/versions/version-repository.server";

/** The versions of a figure, newest first, each with its derived state and who acts next. */
export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { figure } = await accessFigure("api", request, params.figureId, "read:manuscript");
  const versions = await listVersionSummaries(db, figure.id);
  return Response.json({
    figureId: figure.id,
    draftRevision: figure.draft_revision,
    versions: versions.map((v) => ({
      ...versionJson(v, v.derived, v.names),
      sealedByName: v.sealedByName,
      supersededByNumber: v.supersededByNumber,
    })),
  });
});

const SealBody = z.object({
  draftRevision: z.number({ message: "Send the draft revision you looked at as draftRevision: a newer save is not sealed unseen." }).int().min(1),
});

/** POST: seals the draft at `draftRevision` into the next version (201); 409 if the draft moved on. */
export const action = apiHandler(async ({ request, params, context }: Route.ActionArgs) => {
  const { user, figure } = await accessFigure("api", request, params.figureId, "seal:figure");
  if (request.method !== "POST") return apiError(405, "method-not-allowed", "Seal the draft with POST.");
  const body = SealBody.safeParse(await readJsonBody(request));
  if (!body.success) return apiError(422, "invalid-seal", body.error.issues[0].message, { field: body.error.issues[0].path.join(".") });
  try {
    const sealed = await sealVersion(db, { figureId: figure.id, userId: user.id, draftRevision: body.data.draftRevision, ip: clientIp(context) });
    return Response.json({
      version: { id: sealed.id, figureId: sealed.figureId, number: sealed.number, label: `v${sealed.number}`, fingerprint: sealed.fingerprint, svgSha256: sealed.svgSha256, sealedAt: sealed.sealed_at, state: "sealed" },
    }, { status: 201 });
  } catch (e) {
    if (e instanceof VersionError) return versionApiError(e);
    throw e;
  }
});

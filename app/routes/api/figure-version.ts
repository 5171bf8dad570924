import type { Route } from "./+types/figure-version";
import { db } from "~/.server/platform/db.server";
import { apiHandler, methodNotAllowed } from "~/.server/platform/http/api-handler.server";
import { accessVersion } from "~/.server/versions/version-access.server";
import { listEvents, snapshotOf, userNames, versionJson, asStateInput } from "~/.server/versions/version-repository.server";
import { deriveVersionState } from "~/figures/version-state";

/** One version: its state, its thread of events, and the whole sealed snapshot (JSON). */
export const loader = apiHandler(async ({ request, params }: Route.LoaderArgs) => {
  const { version } = await accessVersion("api", request, params.figureId, params.number, "read:manuscript");
  const events = await listEvents(db, [version.id]);
  const derived = deriveVersionState(events.map(asStateInput));
  const names = await userNames(db, derived.reviewers.map((r) => r.reviewerId));
  return Response.json({
    version: versionJson(version, derived, names),
    events: events.map((e) => ({
      id: e.id, kind: e.kind, at: e.at, actor: { id: e.actor_id, name: e.actorName },
      ...(e.reviewer_id ? { reviewer: { id: e.reviewer_id, name: e.reviewerName } } : {}),
      ...(e.superseded_by ? { supersededBy: { id: e.superseded_by, number: e.supersededByNumber } } : {}),
      ...(e.comment !== null ? { comment: e.comment } : {}),
    })),
    snapshot: snapshotOf(version),
  });
});

export const action = methodNotAllowed("GET");

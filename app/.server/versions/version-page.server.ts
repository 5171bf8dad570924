import { can } from "~/permissions";
import { requestParameters } from "~/figures/version-diff";
import { deriveVersionState, nextActor } from "~/figures/version-state";
import { loadFigurePage } from "../figures/figure-access.server";
import { listMembers } from "../manuscripts/manuscripts.server";
import { db } from "../platform/db.server";
import { notFound } from "../platform/http/guards.server";
import { markRead } from "./notifications.server";
import { parseVersionNumber } from "./version-access.server";
import { asStateInput, findVersion, listEvents, snapshotOf } from "./version-repository.server";

/**
 * Everything the version page shows: the version and its derived state, the thread, who may be
 * asked to sign off, and a summary of the snapshot (without the prediction tables). Opening the
 * page marks the reader's notifications about this version as read.
 */
export async function loadVersionPage(request: Request, params: { manuscriptId: string; figureId: string; number: string }) {
  const page = await loadFigurePage(request, params);
  const version = await findVersion(db, page.figure.id, parseVersionNumber(params.number));
  if (!version) notFound("page", "The version");
  const [events, members, latest, sealer] = await Promise.all([
    listEvents(db, [version.id]),
    listMembers(db, page.figure.manuscript_id),
    db.selectFrom("figure_version").select((eb) => eb.fn.max("number").as("n")).where("figure_id", "=", page.figure.id).executeTakeFirst(),
    db.selectFrom("app_user").select("name").where("id", "=", version.sealed_by).executeTakeFirstOrThrow(),
  ]);
  await markRead(db, page.user.id, { versionId: version.id });
  const derived = deriveVersionState(events.map(asStateInput));
  const nameOf = new Map(members.map((m) => [m.userId, m.name]));
  for (const e of events) nameOf.set(e.actor_id, e.actorName);
  const next = nextActor(derived);
  const requested = new Set(derived.reviewers.map((r) => r.reviewerId));
  const snapshot = snapshotOf(version);
  const mine = derived.reviewers.find((r) => r.reviewerId === page.user.id);
  return {
    manuscript: page.manuscript, role: page.role, can: page.can, userId: page.user.id,
    figure: { id: page.figure.id, title: page.figure.title, draftRevision: page.figure.draft_revision },
    version: {
      id: version.id, number: version.number, draftRevision: version.draft_revision, fingerprint: version.fingerprint, svgSha256: version.svg_sha256,
      sealedAt: version.sealed_at, sealedBy: version.sealed_by, sealedByName: sealer.name, title: snapshot.figure.title,
    },
    latestNumber: Number(latest?.n ?? version.number),
    state: derived.state,
    supersededByNumber: events.find((e) => e.kind === "superseded")?.supersededByNumber ?? null,
    reviewers: derived.reviewers.map((r) => ({ ...r, name: nameOf.get(r.reviewerId) ?? "?" })),
    next: { text: next.text, names: next.userIds.map((id) => nameOf.get(id) ?? "?") },
    myDecision: mine?.decision ?? null,
    events: events.map((e) => ({ id: e.id, kind: e.kind, at: e.at, actorName: e.actorName, reviewerName: e.reviewerName, comment: e.comment, supersededByNumber: e.supersededByNumber })),
    // Who may be asked: co-authors and corresponding authors, not the reader, not the sealer, not asked already.
    candidates: members
      .filter((m) => can(m.role, "signoff:version") && m.userId !== page.user.id && m.userId !== version.sealed_by && !requested.has(m.userId))
      .map((m) => ({ userId: m.userId, name: m.name, role: m.role })),
    snapshot: {
      engineVersion: snapshot.engineVersion,
      datasets: snapshot.datasets,
      predictions: snapshot.predictions.map((p) => ({ panelId: p.panelId, layerId: p.layerId, label: p.label, process: p.process, engineVersion: p.engineVersion, parametersHash: p.parametersHash, parameters: requestParameters(p.request), points: p.table.x.length })),
      problems: snapshot.problems,
      altText: snapshot.model.altText,
      preset: snapshot.model.preset,
    },
  };
}

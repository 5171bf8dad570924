import { deriveVersionState, nextActor, type DerivedVersionState, type VersionEventInput } from "~/figures/version-state";
import type { VersionSnapshot } from "~/figures/version-snapshot";
import type { Db } from "../platform/db.server";

/** A version's row without its large columns (snapshot, SVG), for lists. */
const SUMMARY_COLUMNS = [
  "figure_version.id", "figure_version.figure_id", "figure_version.manuscript_id", "figure_version.number", "figure_version.draft_revision",
  "figure_version.fingerprint", "figure_version.svg_sha256", "figure_version.sealed_by", "figure_version.sealed_at",
] as const;

export async function findVersion(db: Db, figureId: string, number: number) {
  if (!Number.isSafeInteger(number) || number < 1) return undefined;
  return db.selectFrom("figure_version").selectAll().where("figure_id", "=", figureId).where("number", "=", number).executeTakeFirst();
}

export type VersionRow = NonNullable<Awaited<ReturnType<typeof findVersion>>>;

/** The events of some versions in the order they were appended, with the actors' names. */
export async function listEvents(db: Db, versionIds: readonly string[]) {
  if (versionIds.length === 0) return [];
  return db
    .selectFrom("version_event")
    .innerJoin("app_user as actor", "actor.id", "version_event.actor_id")
    .leftJoin("app_user as reviewer", "reviewer.id", "version_event.reviewer_id")
    .leftJoin("figure_version as newer", "newer.id", "version_event.superseded_by")
    .select([
      "version_event.id", "version_event.version_id", "version_event.kind", "version_event.actor_id", "version_event.reviewer_id",
      "version_event.superseded_by", "version_event.comment", "version_event.at",
      "actor.name as actorName", "reviewer.name as reviewerName", "newer.number as supersededByNumber",
    ])
    .where("version_event.version_id", "in", versionIds)
    .orderBy("version_event.id")
    .execute();
}

export type EventRow = Awaited<ReturnType<typeof listEvents>>[number];

export const asStateInput = (e: Pick<EventRow, "kind" | "actor_id" | "reviewer_id" | "superseded_by" | "at">): VersionEventInput => ({
  kind: e.kind, actorId: e.actor_id, reviewerId: e.reviewer_id, supersededBy: e.superseded_by, at: e.at,
});

/** The derived state of each version, from its events (docs/decisions/0010). */
export async function versionStates(db: Db, versionIds: readonly string[]): Promise<Map<string, DerivedVersionState>> {
  const events = await listEvents(db, versionIds);
  const out = new Map<string, DerivedVersionState>();
  for (const id of versionIds) out.set(id, deriveVersionState(events.filter((e) => e.version_id === id).map(asStateInput)));
  return out;
}

async function userNames(db: Db, ids: readonly string[]) {
  if (ids.length === 0) return new Map<string, string>();
  const rows = await db.selectFrom("app_user").select(["id", "name"]).where("id", "in", [...new Set(ids)]).execute();
  return new Map(rows.map((r) => [r.id, r.name]));
}

/** Every version of a figure, newest first, with its state, reviewers and who acts next. */
export async function listVersionSummaries(db: Db, figureId: string) {
  const rows = await db
    .selectFrom("figure_version")
    .innerJoin("app_user as sealer", "sealer.id", "figure_version.sealed_by")
    .select([...SUMMARY_COLUMNS, "sealer.name as sealedByName"])
    .where("figure_version.figure_id", "=", figureId)
    .orderBy("figure_version.number", "desc")
    .execute();
  const events = await listEvents(db, rows.map((r) => r.id));
  const names = await userNames(db, events.flatMap((e) => [e.actor_id, ...(e.reviewer_id ? [e.reviewer_id] : [])]));
  return rows.map((r) => {
    const own = events.filter((e) => e.version_id === r.id);
    const derived = deriveVersionState(own.map(asStateInput));
    const next = nextActor(derived);
    return {
      ...r,
      derived,
      names,
      state: derived.state,
      supersededByNumber: own.find((e) => e.kind === "superseded")?.supersededByNumber ?? null,
      reviewers: derived.reviewers.map((x) => ({ ...x, name: names.get(x.reviewerId) ?? "?" })),
      next: { ...next, names: next.userIds.map((id) => names.get(id) ?? "?") },
    };
  });
}

export type VersionSummary = Awaited<ReturnType<typeof listVersionSummaries>>[number];

/** The newest version of each figure with its state, for the manuscript's figure lists. */
export async function latestVersionStates(db: Db, figureIds: readonly string[]) {
  if (figureIds.length === 0) return new Map<string, { number: number; state: DerivedVersionState["state"]; fingerprint: string }>();
  const latest = await db
    .selectFrom("figure_version")
    .select(["id", "figure_id", "number", "fingerprint"])
    .distinctOn("figure_id")
    .where("figure_id", "in", figureIds)
    .orderBy("figure_id")
    .orderBy("number", "desc")
    .execute();
  const states = await versionStates(db, latest.map((l) => l.id));
  return new Map(latest.map((l) => [l.figure_id, { number: l.number, state: states.get(l.id)!.state, fingerprint: l.fingerprint }]));
}

/** The snapshot as stored; it was written by sealVersion from a VersionSnapshot. */
export function snapshotOf(version: Pick<VersionRow, "snapshot">): VersionSnapshot {
  return version.snapshot as VersionSnapshot;
}

/** A version as the API shows it (without the snapshot and the SVG). */
export function versionJson(v: Pick<VersionRow, "id" | "figure_id" | "number" | "draft_revision" | "fingerprint" | "svg_sha256" | "sealed_by" | "sealed_at">, derived: DerivedVersionState, names: Map<string, string> = new Map()) {
  const next = nextActor(derived);
  return {
    id: v.id,
    figureId: v.figure_id,
    number: v.number,
    label: `v${v.number}`,
    draftRevision: v.draft_revision,
    fingerprint: v.fingerprint,
    svgSha256: v.svg_sha256,
    sealedBy: v.sealed_by,
    sealedAt: v.sealed_at,
    state: derived.state,
    supersededBy: derived.supersededBy,
    reviewers: derived.reviewers.map((r) => ({ userId: r.reviewerId, name: names.get(r.reviewerId) ?? null, decision: r.decision, requestedBy: r.requestedBy, requestedAt: r.requestedAt, decidedAt: r.decidedAt })),
    next: { who: next.who, userIds: next.userIds, text: next.text },
  };
}

export { userNames };

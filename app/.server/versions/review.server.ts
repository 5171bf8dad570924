import { sql } from "kysely";
import { ROLE_LABELS, can, type MemberRole } from "~/permissions";
import { deriveVersionState, type DerivedVersionState } from "~/figures/version-state";
import { recordAudit } from "../platform/audit.server";
import type { Db } from "../platform/db.server";
import { deliver, notify, type NotificationSubject, type PendingMail } from "./notifications.server";
import { conflictFromDatabase, VersionError } from "./version-error.server";
import { asStateInput, listEvents, type VersionRow } from "./version-repository.server";

type VersionRef = Pick<VersionRow, "id" | "figure_id" | "manuscript_id" | "number" | "fingerprint" | "sealed_by">;

export const MAX_COMMENT = 5000;

/**
 * Everything a review step needs, read inside the step's transaction after locking the figure
 * row: every seal, request, decision and comment of one figure takes its turn, so two reviewers
 * at the same moment or a sign-off sent twice each see what the other committed.
 */
async function lockedContext(tx: Db, version: VersionRef, actorId: string) {
  await sql`SELECT 1 FROM figure WHERE id = ${version.figure_id} FOR NO KEY UPDATE`.execute(tx);
  const events = await listEvents(tx, [version.id]);
  const derived = deriveVersionState(events.map(asStateInput));
  const figure = await tx.selectFrom("figure").select(["id", "title"]).where("id", "=", version.figure_id).executeTakeFirstOrThrow();
  const manuscript = await tx.selectFrom("manuscript").select(["id", "title"]).where("id", "=", version.manuscript_id).executeTakeFirstOrThrow();
  const actor = await tx.selectFrom("app_user").select(["id", "name"]).where("id", "=", actorId).executeTakeFirstOrThrow();
  const subject: NotificationSubject = { manuscript, figure, version: { id: version.id, number: version.number, fingerprint: version.fingerprint } };
  return { events, derived, subject, actor };
}

function closedMessage(number: number, derived: DerivedVersionState, events: Awaited<ReturnType<typeof listEvents>>): string {
  if (derived.state === "superseded") return `v${number} is superseded by v${events.find((e) => e.kind === "superseded")?.supersededByNumber ?? "?"}: its review is closed.`;
  if (derived.state === "returned") return `v${number} was returned by ${events.find((e) => e.kind === "returned")?.actorName ?? "a reviewer"}: its review is closed.`;
  if (derived.state === "signed off") return `v${number} is signed off already.`;
  return `v${number} is ${derived.state}.`;
}

async function rolesOf(tx: Db, manuscriptId: string, userIds: readonly string[]) {
  const rows = userIds.length === 0 ? [] : await tx
    .selectFrom("membership").innerJoin("app_user", "app_user.id", "membership.user_id")
    .select(["membership.user_id", "membership.role", "app_user.name"])
    .where("membership.manuscript_id", "=", manuscriptId).where("membership.user_id", "in", [...userIds]).execute();
  return new Map(rows.map((r) => [r.user_id, { role: r.role as MemberRole, name: r.name }]));
}

/**
 * Asks co-authors or corresponding authors to sign a version off. Not an observer or a
 * contributor, not the one asking, not the sealer (nobody reviews their own version); each
 * reviewer once. A version that is returned, signed off or superseded takes no new request.
 */
export async function requestSignoff(db: Db, args: { version: VersionRef; requesterId: string; reviewerIds: readonly string[]; ip: string | null; mail?: "send" | "skip" }) {
  const reviewerIds = [...new Set(args.reviewerIds)];
  if (reviewerIds.length === 0) throw new VersionError(422, "no-reviewers", "Choose at least one co-author or corresponding author to sign this version off.", "reviewerIds");
  let mails: PendingMail[] = [];
  try {
    await db.transaction().execute(async (tx) => {
      const { events, derived, subject, actor } = await lockedContext(tx, args.version, args.requesterId);
      if (derived.state !== "sealed" && derived.state !== "in review") throw new VersionError(409, "version-closed", closedMessage(args.version.number, derived, events));
      const roles = await rolesOf(tx, args.version.manuscript_id, reviewerIds);
      for (const id of reviewerIds) {
        const member = roles.get(id);
        if (id === args.requesterId) throw new VersionError(422, "self-review", "You cannot ask yourself to sign off: choose someone else.", "reviewerIds");
        if (!member) throw new VersionError(422, "not-a-member", "One of the chosen reviewers is not a member of this manuscript.", "reviewerIds");
        if (id === args.version.sealed_by) throw new VersionError(422, "sealer-review", `${member.name} sealed v${args.version.number} and cannot sign it off: choose someone else.`, "reviewerIds");
        if (!can(member.role, "signoff:version")) throw new VersionError(422, "not-a-reviewer", `${member.name} is ${ROLE_LABELS[member.role]} here: only co-authors and corresponding authors sign off.`, "reviewerIds");
        if (derived.reviewers.some((r) => r.reviewerId === id)) throw new VersionError(409, "already-requested", `${member.name} was asked to sign off v${args.version.number} already.`, "reviewerIds");
      }
      await tx.insertInto("review_request").values(reviewerIds.map((id) => ({ version_id: args.version.id, reviewer_id: id, requested_by: args.requesterId }))).execute();
      await tx.insertInto("version_event").values(reviewerIds.map((id) => ({ version_id: args.version.id, kind: "requested" as const, actor_id: args.requesterId, reviewer_id: id }))).execute();
      await recordAudit(tx, {
        action: "signoff-requested", actorId: args.requesterId, manuscriptId: args.version.manuscript_id, ip: args.ip,
        detail: { figureId: args.version.figure_id, versionId: args.version.id, number: args.version.number, reviewers: reviewerIds.map((id) => ({ userId: id, name: roles.get(id)!.name })) },
      });
      mails = await notify(tx, { ...subject, kind: "requested", recipientIds: reviewerIds, actor });
    });
  } catch (e) {
    throw conflictFromDatabase(e, `Someone changed the review of v${args.version.number} at the same moment: reload and look again.`) ?? e;
  }
  await deliver(mails, args.mail);
}

/**
 * A requested reviewer's decision. `signed-off`: when every requested reviewer has signed off,
 * the version is signed off, an older signed-off version becomes superseded, and the sealer, the
 * requesters and the corresponding authors are told. `returned` (with a comment): the version
 * goes back; the sealer, the requesters and the reviewers still pending are told.
 */
export async function decideVersion(db: Db, args: { version: VersionRef; reviewerId: string; decision: "signed-off" | "returned"; comment: string | null; ip: string | null; mail?: "send" | "skip" }) {
  const comment = args.comment?.trim() ? args.comment.trim() : null;
  if (args.decision === "returned" && comment === null) throw new VersionError(422, "comment-required", "Say what should change: a return needs a comment.", "comment");
  if (comment !== null && comment.length > MAX_COMMENT) throw new VersionError(422, "comment-too-long", `A comment is at most ${MAX_COMMENT} characters.`, "comment");
  let mails: PendingMail[] = [];
  let state: DerivedVersionState["state"] = "in review";
  try {
    await db.transaction().execute(async (tx) => {
      const { events, derived, subject, actor } = await lockedContext(tx, args.version, args.reviewerId);
      const mine = derived.reviewers.find((r) => r.reviewerId === args.reviewerId);
      if (!mine) throw new VersionError(403, "not-requested", `You were not asked to sign off v${args.version.number}; the sealer or a corresponding author can ask you.`);
      if (mine.decision !== "pending") throw new VersionError(409, "already-decided", `You ${mine.decision === "signed-off" ? "signed off" : "returned"} v${args.version.number} already.`, null, { decision: mine.decision });
      if (derived.state !== "in review") throw new VersionError(409, "version-closed", closedMessage(args.version.number, derived, events));
      await tx.insertInto("version_event").values({ version_id: args.version.id, kind: args.decision, actor_id: args.reviewerId, reviewer_id: args.reviewerId, comment }).execute();
      const after = deriveVersionState([...events.map(asStateInput), { kind: args.decision, actorId: args.reviewerId, reviewerId: args.reviewerId, supersededBy: null, at: new Date() }]);
      state = after.state;
      await recordAudit(tx, {
        action: args.decision === "signed-off" ? "version-signed-off" : "version-returned", actorId: args.reviewerId, manuscriptId: args.version.manuscript_id, ip: args.ip,
        detail: { figureId: args.version.figure_id, versionId: args.version.id, number: args.version.number, fingerprint: args.version.fingerprint, state: after.state, ...(comment ? { comment } : {}) },
      });
      const requesters = after.reviewers.map((r) => r.requestedBy);
      if (after.state === "signed off") {
        const corresponding = await tx.selectFrom("membership").select("user_id").where("manuscript_id", "=", args.version.manuscript_id).where("role", "=", "corresponding").execute();
        mails = await notify(tx, { ...subject, kind: "signed-off", recipientIds: [args.version.sealed_by, ...requesters, ...corresponding.map((c) => c.user_id)], actor });
        await supersedeSignedOff(tx, { version: args.version, actorId: args.reviewerId, ip: args.ip });
      } else if (after.state === "returned") {
        const pending = after.reviewers.filter((r) => r.decision === "pending").map((r) => r.reviewerId);
        mails = await notify(tx, { ...subject, kind: "returned", recipientIds: [args.version.sealed_by, ...requesters, ...pending], actor, comment });
      }
    });
  } catch (e) {
    throw conflictFromDatabase(e, `Someone decided on v${args.version.number} at the same moment: reload to see its state.`) ?? e;
  }
  await deliver(mails, args.mail);
  return { state };
}

/** An older signed-off version is superseded when a newer one is signed off (docs/product.md, "Vocabulary"). */
async function supersedeSignedOff(tx: Db, args: { version: VersionRef; actorId: string; ip: string | null }) {
  const older = await tx.selectFrom("figure_version").select(["id", "number"]).where("figure_id", "=", args.version.figure_id).where("number", "<", args.version.number).execute();
  const events = await listEvents(tx, older.map((o) => o.id));
  for (const v of older) {
    const derived = deriveVersionState(events.filter((e) => e.version_id === v.id).map(asStateInput));
    if (derived.state !== "signed off") continue;
    await tx.insertInto("version_event").values({ version_id: v.id, kind: "superseded", actor_id: args.actorId, superseded_by: args.version.id }).execute();
    await recordAudit(tx, {
      action: "version-superseded", actorId: args.actorId, manuscriptId: args.version.manuscript_id, ip: args.ip,
      detail: { figureId: args.version.figure_id, versionId: v.id, number: v.number, supersededBy: args.version.number, wasState: derived.state },
    });
  }
}

/** A comment in the version's thread; any member who may comment, on any version. */
export async function commentOnVersion(db: Db, args: { version: VersionRef; userId: string; text: string; ip: string | null }) {
  const text = args.text.trim();
  if (text === "") throw new VersionError(422, "comment-required", "Write a comment first.", "comment");
  if (text.length > MAX_COMMENT) throw new VersionError(422, "comment-too-long", `A comment is at most ${MAX_COMMENT} characters.`, "comment");
  return db.transaction().execute(async (tx) => {
    const row = await tx.insertInto("version_event").values({ version_id: args.version.id, kind: "comment", actor_id: args.userId, comment: text }).returning(["id", "at"]).executeTakeFirstOrThrow();
    await recordAudit(tx, {
      action: "version-commented", actorId: args.userId, manuscriptId: args.version.manuscript_id, ip: args.ip,
      detail: { figureId: args.version.figure_id, versionId: args.version.id, number: args.version.number, eventId: row.id, comment: text },
    });
    return row;
  });
}

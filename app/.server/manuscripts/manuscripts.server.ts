import { z } from "zod";
import { MEMBER_ROLES, type MemberRole, ROLE_LABELS } from "~/permissions";
import { recordAudit } from "../platform/audit.server";
import type { Db } from "../platform/db.server";
import { appLink, sendMail } from "../platform/mail.server";
import { hashSecret, newSecret } from "../platform/tokens.server";

export const INVITATION_TTL_MS = 14 * 24 * 3600_000;

export const ManuscriptForm = z.object({
  title: z.string().trim().min(1, "Give the manuscript a working title.").max(300, "At most 300 characters."),
  journal: z.string().trim().max(200, "At most 200 characters.").optional().transform((v) => v || null),
});

export const RoleSchema = z.enum(MEMBER_ROLES, { message: "Choose one of: corresponding author, co-author, contributor, observer." });

export async function listManuscriptsForUser(db: Db, userId: string) {
  return db
    .selectFrom("membership")
    .innerJoin("manuscript", "manuscript.id", "membership.manuscript_id")
    .select((eb) => [
      "manuscript.id",
      "manuscript.title",
      "manuscript.journal",
      "manuscript.is_demo",
      "manuscript.created_at",
      "membership.role",
      eb.selectFrom("membership as m2").select(eb.fn.countAll<number>().as("n")).whereRef("m2.manuscript_id", "=", "manuscript.id").as("memberCount"),
    ])
    .where("membership.user_id", "=", userId)
    .orderBy("manuscript.created_at", "desc")
    .execute();
}

export async function createManuscript(db: Db, userId: string, input: z.infer<typeof ManuscriptForm>, ip: string | null) {
  return db.transaction().execute(async (tx) => {
    const m = await tx
      .insertInto("manuscript")
      .values({ title: input.title, journal: input.journal ?? null, created_by: userId })
      .returning("id")
      .executeTakeFirstOrThrow();
    await tx.insertInto("membership").values({ manuscript_id: m.id, user_id: userId, role: "corresponding" }).execute();
    await recordAudit(tx, { action: "manuscript-created", actorId: userId, manuscriptId: m.id, ip, detail: { title: input.title } });
    return m.id;
  });
}

export async function getManuscript(db: Db, id: string) {
  return db.selectFrom("manuscript").selectAll().where("id", "=", id).executeTakeFirst();
}

export async function listMembers(db: Db, manuscriptId: string) {
  return db
    .selectFrom("membership")
    .innerJoin("app_user", "app_user.id", "membership.user_id")
    .select(["app_user.id as userId", "app_user.name", "app_user.email", "membership.role", "membership.added_at"])
    .where("membership.manuscript_id", "=", manuscriptId)
    .orderBy("membership.added_at", "asc")
    .execute();
}

export async function listOpenInvitations(db: Db, manuscriptId: string) {
  return db
    .selectFrom("invitation")
    .select(["id", "email", "role", "created_at", "expires_at"])
    .where("manuscript_id", "=", manuscriptId)
    .where("accepted_at", "is", null)
    .where("expires_at", ">", new Date())
    .orderBy("created_at", "desc")
    .execute();
}

export class MembershipError extends Error {
  constructor(message: string, readonly field: string) {
    super(message);
  }
}

export async function inviteMember(
  db: Db,
  args: { manuscriptId: string; inviter: { id: string; name: string }; email: string; role: MemberRole; ip: string | null },
) {
  const manuscript = await getManuscript(db, args.manuscriptId);
  if (!manuscript) throw new MembershipError("The manuscript does not exist.", "form");
  const already = await db
    .selectFrom("membership")
    .innerJoin("app_user", "app_user.id", "membership.user_id")
    .select("app_user.id")
    .where("membership.manuscript_id", "=", args.manuscriptId)
    .where("app_user.email", "=", args.email)
    .executeTakeFirst();
  if (already) throw new MembershipError(`${args.email} is already a member of this manuscript.`, "email");
  const token = newSecret();
  await db.transaction().execute(async (tx) => {
    await tx
      .insertInto("invitation")
      .values({
        manuscript_id: args.manuscriptId,
        email: args.email,
        role: args.role,
        token_hash: token.hash,
        invited_by: args.inviter.id,
        expires_at: new Date(Date.now() + INVITATION_TTL_MS),
      })
      .execute();
    await recordAudit(tx, { action: "member-invited", actorId: args.inviter.id, manuscriptId: args.manuscriptId, ip: args.ip, detail: { email: args.email, role: args.role } });
  });
  await sendMail({
    to: args.email,
    subject: `Invitation to “${manuscript.title}” on Steradian`,
    paragraphs: [
      `${args.inviter.name} invites you to join the manuscript “${manuscript.title}” as ${ROLE_LABELS[args.role]}.`,
      "The link below works for 14 days. If you have no Steradian account yet, it lets you create one.",
    ],
    action: { label: "Open the invitation", url: appLink(`/invitations/${token.secret}`) },
  });
}

export async function findInvitation(db: Db, secret: string) {
  return db
    .selectFrom("invitation")
    .innerJoin("manuscript", "manuscript.id", "invitation.manuscript_id")
    .innerJoin("app_user as inviter", "inviter.id", "invitation.invited_by")
    .select(["invitation.id", "invitation.email", "invitation.role", "invitation.expires_at", "invitation.accepted_at", "invitation.manuscript_id", "manuscript.title", "inviter.name as inviterName"])
    .where("invitation.token_hash", "=", hashSecret(secret))
    .executeTakeFirst();
}

/** Adds the user to the manuscript named by the invitation; one use, before it expires. */
export async function acceptInvitation(db: Db, invitationId: string, userId: string, ip: string | null): Promise<string> {
  return db.transaction().execute((tx) => joinByInvitation(tx, invitationId, userId, ip));
}

/** The body of acceptInvitation, inside a transaction the caller holds. */
async function joinByInvitation(tx: Db, invitationId: string, userId: string, ip: string | null): Promise<string> {
  const inv = await tx
    .updateTable("invitation")
    .set({ accepted_at: new Date(), accepted_by: userId })
    .where("id", "=", invitationId)
    .where("accepted_at", "is", null)
    .where("expires_at", ">", new Date())
    .returning(["manuscript_id", "role"])
    .executeTakeFirst();
  if (!inv) throw new MembershipError("This invitation has expired or was already used.", "form");
  await tx
    .insertInto("membership")
    .values({ manuscript_id: inv.manuscript_id, user_id: userId, role: inv.role })
    .onConflict((oc) => oc.columns(["manuscript_id", "user_id"]).doNothing())
    .execute();
  await recordAudit(tx, { action: "member-joined", actorId: userId, manuscriptId: inv.manuscript_id, ip, detail: { role: inv.role } });
  return inv.manuscript_id;
}

/**
 * A new person accepts an invitation: the account (active at once, since following the e-mailed
 * link proves the address) and the membership in one transaction, so that a double submit or
 * an expired invitation leaves no account behind.
 */
export async function createAccountFromInvitation(
  db: Db,
  args: { invitationId: string; email: string; name: string; passwordHash: string; ip: string | null },
): Promise<{ userId: string; manuscriptId: string }> {
  return db.transaction().execute(async (tx) => {
    const created = await tx
      .insertInto("app_user")
      .values({ email: args.email, name: args.name, password_hash: args.passwordHash, status: "active", email_confirmed_at: new Date() })
      .onConflict((oc) => oc.column("email").doNothing())
      .returning("id")
      .executeTakeFirst();
    if (!created) throw new MembershipError("An account with this address exists already: sign in to accept the invitation.", "form");
    const manuscriptId = await joinByInvitation(tx, args.invitationId, created.id, args.ip);
    return { userId: created.id, manuscriptId };
  });
}

function lastCorresponding(e: unknown): boolean {
  return typeof e === "object" && e !== null && "constraint" in e && (e as { constraint?: string }).constraint === "membership_last_corresponding";
}

export async function changeRole(db: Db, args: { manuscriptId: string; actorId: string; userId: string; role: MemberRole; ip: string | null }) {
  try {
    await db.transaction().execute(async (tx) => {
      const res = await tx
        .updateTable("membership")
        .set({ role: args.role })
        .where("manuscript_id", "=", args.manuscriptId)
        .where("user_id", "=", args.userId)
        .executeTakeFirst();
      if (Number(res.numUpdatedRows) === 0) throw new MembershipError("That person is not a member of this manuscript.", "userId");
      await recordAudit(tx, { action: "member-role-changed", actorId: args.actorId, manuscriptId: args.manuscriptId, ip: args.ip, detail: { userId: args.userId, role: args.role } });
    });
  } catch (e) {
    if (lastCorresponding(e)) throw new MembershipError("The manuscript needs at least one corresponding author: name another one first.", "role");
    throw e;
  }
}

export async function removeMember(db: Db, args: { manuscriptId: string; actorId: string; userId: string; ip: string | null }) {
  try {
    await db.transaction().execute(async (tx) => {
      const res = await tx.deleteFrom("membership").where("manuscript_id", "=", args.manuscriptId).where("user_id", "=", args.userId).executeTakeFirst();
      if (Number(res.numDeletedRows) === 0) throw new MembershipError("That person is not a member of this manuscript.", "userId");
      await recordAudit(tx, { action: "member-removed", actorId: args.actorId, manuscriptId: args.manuscriptId, ip: args.ip, detail: { userId: args.userId } });
    });
  } catch (e) {
    if (lastCorresponding(e)) throw new MembershipError("The last corresponding author cannot be removed: name another one first.", "userId");
    throw e;
  }
}

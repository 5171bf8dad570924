import { sql } from "kysely";
import type { NotificationKind } from "../../../db/types";
import { shortFingerprint } from "~/figures/version-snapshot";
import type { Db } from "../platform/db.server";
import { appLink, sendMail, type Message } from "../platform/mail.server";

/** What a notification is about: every one names the manuscript, the figure, the version and its fingerprint. */
export interface NotificationSubject {
  manuscript: { id: string; title: string };
  figure: { id: string; title: string };
  version: { id: string; number: number; fingerprint: string };
}

export interface NotificationDraft extends NotificationSubject {
  kind: NotificationKind;
  recipientIds: readonly string[];
  actor: { id: string; name: string };
  /** The reviewer's comment of a return. */
  comment?: string | null;
  /** The newer version that superseded this one. */
  newerNumber?: number;
}

/** An e-mail to send once the transaction that wrote its notification has committed. */
export type PendingMail = Message;

export const versionPath = (s: Pick<NotificationSubject, "manuscript" | "figure"> & { version: { number: number } }) =>
  `/manuscripts/${s.manuscript.id}/figures/${s.figure.id}/versions/${s.version.number}`;

/** The words of a notification, the same in the inbox and in the e-mail. */
export function composeNotification(d: NotificationDraft): { subject: string; paragraphs: string[]; link: string } {
  const v = `v${d.version.number}`;
  const where = `the figure “${d.figure.title}” in the manuscript “${d.manuscript.title}”`;
  const print = `Fingerprint of ${v}: ${shortFingerprint(d.version.fingerprint)} … (in full: ${d.version.fingerprint}).`;
  const link = versionPath(d);
  switch (d.kind) {
    case "requested":
      return {
        subject: `Sign-off requested: “${d.figure.title}” ${v}`,
        paragraphs: [`${d.actor.name} asks you to sign off version ${v} of ${where}.`, print, "Open it to see the sealed figure and what changed since the previous version, then sign it off or return it with comments."],
        link,
      };
    case "signed-off":
      return {
        subject: `Signed off: “${d.figure.title}” ${v}`,
        paragraphs: [`Version ${v} of ${where} is signed off by every reviewer who was asked (the last: ${d.actor.name}).`, print, "The corresponding author can now export it for the journal."],
        link,
      };
    case "returned":
      return {
        subject: `Returned: “${d.figure.title}” ${v}`,
        paragraphs: [`${d.actor.name} returned version ${v} of ${where} with comments:`, `“${d.comment ?? ""}”`, print, `The review of ${v} is closed: revise the draft and seal a new version.`],
        link,
      };
    case "superseded":
      return {
        subject: `Superseded: “${d.figure.title}” ${v}`,
        paragraphs: [
          `${d.actor.name} sealed v${d.newerNumber} of ${where} while ${v} was waiting for review, so ${v} is superseded and its review is closed.`,
          print,
          `Nothing is asked of you for ${v}; a request for v${d.newerNumber}, if any, comes separately.`,
        ],
        link,
      };
  }
}

/**
 * Writes the in-app notifications (inside the caller's transaction) and returns the e-mails to
 * send after it commits, so that nobody is told of a change that was rolled back.
 */
export async function notify(tx: Db, d: NotificationDraft): Promise<PendingMail[]> {
  const recipients = [...new Set(d.recipientIds)].filter((id) => id !== d.actor.id);
  if (recipients.length === 0) return [];
  const { subject, paragraphs, link } = composeNotification(d);
  const users = await tx.selectFrom("app_user").select(["id", "email", "status"]).where("id", "in", recipients).execute();
  await tx
    .insertInto("notification")
    .values(users.map((u) => ({
      user_id: u.id, kind: d.kind, manuscript_id: d.manuscript.id, figure_id: d.figure.id, version_id: d.version.id,
      actor_id: d.actor.id, subject, body: paragraphs.join("\n\n"), link,
    })))
    .execute();
  return users.filter((u) => u.status === "active").map((u) => ({ to: u.email, subject, paragraphs, action: { label: `Open v${d.version.number}`, url: appLink(link) } }));
}

/**
 * Sends the e-mails of a committed change. The change stands whatever the mail relay does: a
 * failure is logged, and the in-app inbox still has the notification. `skip` is for the demo
 * seed, which runs before any mail relay exists and writes only to example.org accounts.
 */
export async function deliver(mails: readonly PendingMail[], mode: "send" | "skip" = "send"): Promise<void> {
  if (mode === "skip") return;
  const results = await Promise.allSettled(mails.map((m) => sendMail(m)));
  results.forEach((r, i) => {
    if (r.status === "rejected") console.error(`[steradian] notification e-mail to ${mails[i].to} failed:`, r.reason);
  });
}

export async function listNotifications(db: Db, userId: string, limit = 100) {
  return db
    .selectFrom("notification")
    .leftJoin("app_user as actor", "actor.id", "notification.actor_id")
    .select(["notification.id", "notification.kind", "notification.subject", "notification.body", "notification.link", "notification.created_at", "notification.read_at", "actor.name as actorName"])
    .where("notification.user_id", "=", userId)
    .orderBy("notification.created_at", "desc")
    .orderBy("notification.id")
    .limit(limit)
    .execute();
}

/**
 * Unread notifications. `openingPath` is the page being loaded: its own notifications are being
 * marked read by that page's loader, which runs alongside the header's, so they are not counted.
 */
export async function unreadCount(db: Db, userId: string, openingPath?: string): Promise<number> {
  let q = db.selectFrom("notification").select((eb) => eb.fn.countAll<number>().as("n")).where("user_id", "=", userId).where("read_at", "is", null);
  if (openingPath) q = q.where("link", "<>", openingPath);
  const row = await q.executeTakeFirst();
  return Number(row?.n ?? 0);
}

/** Marks a user's notifications read: all of them, or those about one version (opened by the user). */
export async function markRead(db: Db, userId: string, scope: { all: true } | { versionId: string } | { id: string }) {
  let q = db.updateTable("notification").set({ read_at: sql`now()` }).where("user_id", "=", userId).where("read_at", "is", null);
  if ("versionId" in scope) q = q.where("version_id", "=", scope.versionId);
  if ("id" in scope) q = q.where("id", "=", scope.id);
  const res = await q.executeTakeFirst();
  return Number(res.numUpdatedRows);
}

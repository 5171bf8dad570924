import { recordAudit } from "../platform/audit.server";
import type { Db } from "../platform/db.server";
import { endAllSessions } from "../platform/session.server";
import { requestPasswordReset } from "./accounts.server";

export class AdminError extends Error {}

export async function setAccountStatus(db: Db, adminId: string, userId: string, status: "active" | "disabled", ip: string | null) {
  if (adminId === userId && status === "disabled") throw new AdminError("You cannot disable your own account.");
  await db.transaction().execute(async (tx) => {
    const res = await tx.updateTable("app_user").set({ status }).where("id", "=", userId).executeTakeFirst();
    if (Number(res.numUpdatedRows) === 0) throw new AdminError("No such account.");
    if (status === "disabled") await endAllSessions(tx, userId);
    await recordAudit(tx, { action: status === "disabled" ? "account-disabled" : "account-enabled", actorId: adminId, ip, detail: { userId } });
  });
}

/** An admin reset sends the owner a reset link; the admin never sees or sets a password. */
export async function resetAccount(db: Db, adminId: string, userId: string, ip: string | null) {
  const user = await db.selectFrom("app_user").select(["email"]).where("id", "=", userId).executeTakeFirst();
  if (!user) throw new AdminError("No such account.");
  await db.deleteFrom("sign_in_attempt").where("email", "=", user.email).execute();
  await requestPasswordReset(db, user.email, ip ?? "admin");
  await recordAudit(db, { action: "account-reset", actorId: adminId, ip, detail: { userId } });
}

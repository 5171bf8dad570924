import { z } from "zod";
import { recordAudit } from "../platform/audit.server";
import type { Db } from "../platform/db.server";
import { appLink, sendMail } from "../platform/mail.server";
import { endAllSessions } from "../platform/session.server";
import { hashSecret, newSecret } from "../platform/tokens.server";
import { findUserByEmail, hashPassword } from "./users.server";

export const CONFIRM_TTL_MS = 24 * 3600_000;
export const RESET_TTL_MS = 3600_000;

export const PasswordSchema = z
  .string()
  .min(10, "Use at least 10 characters.")
  .max(200, "At most 200 characters.");
export const EmailSchema = z.string().trim().max(254, "At most 254 characters.").email("Enter an e-mail address like name@example.org.");
export const NameSchema = z.string().trim().min(1, "Enter your name as it should appear to co-authors.").max(120, "At most 120 characters.");

export const SignUpForm = z.object({ name: NameSchema, email: EmailSchema, password: PasswordSchema });

/**
 * Open sign-up: the account stays pending until the e-mailed link is followed. An address that
 * already has an account gets a note instead, and the page says the same thing either way.
 */
export async function signUp(db: Db, input: z.infer<typeof SignUpForm>, ip: string): Promise<void> {
  const existing = await findUserByEmail(db, input.email);
  // Hashed in both branches, so that the answer's timing does not tell whether an account exists.
  const passwordHash = await hashPassword(input.password);
  if (existing) {
    await sendMail({
      to: input.email,
      subject: "Someone tried to create a Steradian account with your address",
      paragraphs: ["An account with this e-mail address already exists. If that was you, sign in or reset your password."],
      action: { label: "Reset your password", url: appLink("/forgot-password") },
    });
    return;
  }
  const token = newSecret();
  await db.transaction().execute(async (tx) => {
    const user = await tx
      .insertInto("app_user")
      .values({ email: input.email, name: input.name, password_hash: passwordHash, status: "pending" })
      .returning("id")
      .executeTakeFirstOrThrow();
    await tx
      .insertInto("one_time_token")
      .values({ user_id: user.id, purpose: "confirm-email", token_hash: token.hash, expires_at: new Date(Date.now() + CONFIRM_TTL_MS) })
      .execute();
    await recordAudit(tx, { action: "sign-up", actorId: user.id, ip, detail: { email: input.email } });
  });
  await sendMail({
    to: input.email,
    subject: "Confirm your e-mail address for Steradian",
    paragraphs: [`Hello ${input.name},`, "Follow the link below within 24 hours to confirm your address and activate your account."],
    action: { label: "Confirm my address", url: appLink(`/confirm-email/${token.secret}`) },
  });
}

/** Uses a one-time token if it is unused and unexpired; returns its user, or null. */
export async function consumeToken(db: Db, secret: string, purpose: "confirm-email" | "reset-password"): Promise<string | null> {
  const row = await db
    .updateTable("one_time_token")
    .set({ used_at: new Date() })
    .where("token_hash", "=", hashSecret(secret))
    .where("purpose", "=", purpose)
    .where("used_at", "is", null)
    .where("expires_at", ">", new Date())
    .returning("user_id")
    .executeTakeFirst();
  return row?.user_id ?? null;
}

export async function peekToken(db: Db, secret: string, purpose: "confirm-email" | "reset-password") {
  return db
    .selectFrom("one_time_token")
    .select(["user_id", "expires_at"])
    .where("token_hash", "=", hashSecret(secret))
    .where("purpose", "=", purpose)
    .where("used_at", "is", null)
    .where("expires_at", ">", new Date())
    .executeTakeFirst();
}

export async function confirmEmail(db: Db, secret: string, ip: string): Promise<boolean> {
  return db.transaction().execute(async (tx) => {
    const userId = await consumeToken(tx, secret, "confirm-email");
    if (!userId) return false;
    await tx.updateTable("app_user").set({ status: "active", email_confirmed_at: new Date() }).where("id", "=", userId).where("status", "=", "pending").execute();
    await recordAudit(tx, { action: "email-confirmed", actorId: userId, ip });
    return true;
  });
}

export async function requestPasswordReset(db: Db, email: string, ip: string): Promise<void> {
  const user = await findUserByEmail(db, email);
  if (!user || user.status === "disabled") return;
  const token = newSecret();
  await db
    .insertInto("one_time_token")
    .values({ user_id: user.id, purpose: "reset-password", token_hash: token.hash, expires_at: new Date(Date.now() + RESET_TTL_MS) })
    .execute();
  await recordAudit(db, { action: "password-reset-requested", actorId: user.id, ip });
  await sendMail({
    to: user.email,
    subject: "Reset your Steradian password",
    paragraphs: [`Hello ${user.name},`, "Follow the link below within one hour to choose a new password. It works once. If you did not ask for this, ignore this message."],
    action: { label: "Choose a new password", url: appLink(`/reset-password/${token.secret}`) },
  });
}

export async function resetPassword(db: Db, secret: string, password: string, ip: string): Promise<boolean> {
  const passwordHash = await hashPassword(password);
  return db.transaction().execute(async (tx) => {
    const userId = await consumeToken(tx, secret, "reset-password");
    if (!userId) return false;
    // A reset link proves the address, so it also confirms a pending account.
    await tx
      .updateTable("app_user")
      .set((eb) => ({
        password_hash: passwordHash,
        status: eb.case().when("status", "=", "pending").then(eb.val<"active">("active")).else(eb.ref("status")).end(),
        email_confirmed_at: eb.fn.coalesce("email_confirmed_at", eb.val(new Date())),
      }))
      .where("id", "=", userId)
      .execute();
    const user = await tx.selectFrom("app_user").select("email").where("id", "=", userId).executeTakeFirstOrThrow();
    // A successful reset lifts the per-account throttle.
    await tx.deleteFrom("sign_in_attempt").where("email", "=", user.email).where("succeeded", "=", false).execute();
    // Whoever knew the old password is signed out everywhere.
    await endAllSessions(tx, userId);
    await recordAudit(tx, { action: "password-reset", actorId: userId, ip });
    return true;
  });
}

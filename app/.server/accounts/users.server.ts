import bcrypt from "bcryptjs";
import type { Db } from "../platform/db.server";
import { env } from "../platform/env.server";
import type { SessionUser } from "~/session-user";

export type { SessionUser } from "~/session-user";

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, env.BCRYPT_COST);
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}

export async function findUserByEmail(db: Db, email: string) {
  return db.selectFrom("app_user").selectAll().where("email", "=", email.trim()).executeTakeFirst();
}

/** An active account as the session sees it; disabled and unconfirmed accounts are signed out. */
export async function findActiveUser(db: Db, id: string): Promise<SessionUser | null> {
  const row = await db
    .selectFrom("app_user")
    .select(["id", "email", "name", "site_role", "is_demo"])
    .where("id", "=", id)
    .where("status", "=", "active")
    .executeTakeFirst();
  return row ? { id: row.id, email: row.email, name: row.name, siteRole: row.site_role, isDemo: row.is_demo } : null;
}

export async function listUsers(db: Db) {
  return db
    .selectFrom("app_user")
    .select(["id", "email", "name", "site_role", "status", "is_demo", "created_at", "email_confirmed_at"])
    .orderBy("created_at", "asc")
    .execute();
}

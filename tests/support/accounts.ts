import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import type { Kysely } from "kysely";
import type { Database, MemberRole } from "../../db/types";

export const TEST_PASSWORD = "correct horse battery";
// A low bcrypt cost only for fixtures; the app hashes at cost 12 (its BCRYPT_COST).
const fixtureHash = bcrypt.hashSync(TEST_PASSWORD, 4);

export function uniqueEmail(tag: string): string {
  return `${tag}-${randomBytes(4).toString("hex")}@example.org`;
}

export async function createAccount(db: Kysely<Database>, tag: string, opts: { siteRole?: "member" | "admin"; status?: "active" | "pending" | "disabled" } = {}) {
  const email = uniqueEmail(tag);
  const row = await db
    .insertInto("app_user")
    .values({ email, name: `Test ${tag}`, password_hash: fixtureHash, site_role: opts.siteRole ?? "member", status: opts.status ?? "active", email_confirmed_at: new Date() })
    .returning("id")
    .executeTakeFirstOrThrow();
  return { id: row.id, email };
}

export async function createManuscriptWith(db: Kysely<Database>, members: Array<{ id: string; role: MemberRole }>, title = "Test manuscript") {
  const m = await db.insertInto("manuscript").values({ title, created_by: members[0].id }).returning("id").executeTakeFirstOrThrow();
  await db.insertInto("membership").values(members.map((x) => ({ manuscript_id: m.id, user_id: x.id, role: x.role }))).execute();
  return m.id;
}

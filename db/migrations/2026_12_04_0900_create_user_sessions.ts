import { type Kysely, sql } from "kysely";

// Frozen in time: never import app code here.
// Server-side sessions (docs/decisions/0012-hardening.md): the signed cookie names a row here,
// and a session ends when its row is deleted — at sign-out (that one), and at a password reset,
// a disabled account or "sign out everywhere" (all of the user's). A cookie whose row is gone
// signs nobody in, however valid its signature.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("user_session")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("user_id", "uuid", (c) => c.notNull().references("app_user.id").onDelete("cascade"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("expires_at", "timestamptz", (c) => c.notNull())
    .addCheckConstraint("user_session_expiry_check", sql`expires_at > created_at`)
    .execute();
  await db.schema.createIndex("user_session_user_idx").on("user_session").column("user_id").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("user_session").execute();
}

import { type Kysely, sql } from "kysely";

// Frozen in time: never import app code here.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`CREATE EXTENSION IF NOT EXISTS citext`.execute(db);

  await db.schema
    .createTable("app_user")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("email", sql`citext`, (c) => c.notNull().unique())
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("password_hash", "text")
    .addColumn("site_role", "text", (c) => c.notNull().defaultTo("member"))
    .addColumn("status", "text", (c) => c.notNull().defaultTo("active"))
    .addColumn("email_confirmed_at", "timestamptz")
    .addColumn("is_demo", "boolean", (c) => c.notNull().defaultTo(false))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint("app_user_site_role_check", sql`site_role IN ('member', 'admin')`)
    .addCheckConstraint("app_user_status_check", sql`status IN ('pending', 'active', 'disabled')`)
    .addCheckConstraint("app_user_email_check", sql`email ~ '^[^@\\s]+@[^@\\s]+\\.[^@\\s]+$'`)
    .addCheckConstraint("app_user_name_check", sql`length(name) BETWEEN 1 AND 120`)
    .execute();

  await db.schema
    .createTable("manuscript")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("title", "text", (c) => c.notNull())
    .addColumn("journal", "text")
    .addColumn("is_demo", "boolean", (c) => c.notNull().defaultTo(false))
    .addColumn("created_by", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint("manuscript_title_check", sql`length(title) BETWEEN 1 AND 300`)
    .execute();

  await db.schema
    .createTable("membership")
    .addColumn("manuscript_id", "uuid", (c) => c.notNull().references("manuscript.id").onDelete("cascade"))
    .addColumn("user_id", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("role", "text", (c) => c.notNull())
    .addColumn("added_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint("membership_pkey", ["manuscript_id", "user_id"])
    .addCheckConstraint(
      "membership_role_check",
      sql`role IN ('corresponding', 'coauthor', 'contributor', 'observer')`,
    )
    .execute();

  // A manuscript never loses its last corresponding author, whatever path the change takes.
  await sql`
    CREATE FUNCTION membership_keep_corresponding() RETURNS trigger AS $$
    DECLARE remaining integer;
    BEGIN
      IF OLD.role <> 'corresponding' THEN RETURN COALESCE(NEW, OLD); END IF;
      IF TG_OP = 'UPDATE' AND NEW.role = 'corresponding' THEN RETURN NEW; END IF;
      IF NOT EXISTS (SELECT 1 FROM manuscript WHERE id = OLD.manuscript_id) THEN RETURN COALESCE(NEW, OLD); END IF;
      SELECT count(*) INTO remaining FROM membership
        WHERE manuscript_id = OLD.manuscript_id AND role = 'corresponding' AND user_id <> OLD.user_id;
      IF remaining = 0 THEN
        RAISE EXCEPTION 'a manuscript must keep at least one corresponding author'
          USING ERRCODE = 'check_violation', CONSTRAINT = 'membership_last_corresponding';
      END IF;
      RETURN COALESCE(NEW, OLD);
    END $$ LANGUAGE plpgsql`.execute(db);
  await sql`
    CREATE TRIGGER membership_keep_corresponding BEFORE UPDATE OR DELETE ON membership
    FOR EACH ROW EXECUTE FUNCTION membership_keep_corresponding()`.execute(db);

  await db.schema
    .createTable("invitation")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("manuscript_id", "uuid", (c) => c.notNull().references("manuscript.id").onDelete("cascade"))
    .addColumn("email", sql`citext`, (c) => c.notNull())
    .addColumn("role", "text", (c) => c.notNull())
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("invited_by", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("expires_at", "timestamptz", (c) => c.notNull())
    .addColumn("accepted_at", "timestamptz")
    .addColumn("accepted_by", "uuid", (c) => c.references("app_user.id"))
    .addCheckConstraint(
      "invitation_role_check",
      sql`role IN ('corresponding', 'coauthor', 'contributor', 'observer')`,
    )
    .addCheckConstraint("invitation_accept_check", sql`(accepted_at IS NULL) = (accepted_by IS NULL)`)
    .execute();

  await db.schema
    .createTable("one_time_token")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("user_id", "uuid", (c) => c.notNull().references("app_user.id").onDelete("cascade"))
    .addColumn("purpose", "text", (c) => c.notNull())
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("expires_at", "timestamptz", (c) => c.notNull())
    .addColumn("used_at", "timestamptz")
    .addCheckConstraint("one_time_token_purpose_check", sql`purpose IN ('confirm-email', 'reset-password')`)
    .addCheckConstraint("one_time_token_expiry_check", sql`expires_at > created_at`)
    .execute();

  await db.schema
    .createTable("api_token")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("user_id", "uuid", (c) => c.notNull().references("app_user.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("prefix", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("last_used_at", "timestamptz")
    .addColumn("revoked_at", "timestamptz")
    .addCheckConstraint("api_token_name_check", sql`length(name) BETWEEN 1 AND 80`)
    .execute();

  await db.schema
    .createTable("sign_in_attempt")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("email", sql`citext`, (c) => c.notNull())
    .addColumn("ip", "text", (c) => c.notNull())
    .addColumn("succeeded", "boolean", (c) => c.notNull())
    .addColumn("at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex("sign_in_attempt_email_at").on("sign_in_attempt").columns(["email", "at"]).execute();
  await db.schema.createIndex("sign_in_attempt_ip_at").on("sign_in_attempt").columns(["ip", "at"]).execute();

  await db.schema
    .createTable("audit_event")
    .addColumn("id", "bigserial", (c) => c.primaryKey())
    .addColumn("at", "timestamptz", (c) => c.notNull().defaultTo(sql`clock_timestamp()`))
    .addColumn("actor_id", "uuid", (c) => c.references("app_user.id"))
    .addColumn("manuscript_id", "uuid", (c) => c.references("manuscript.id"))
    .addColumn("action", "text", (c) => c.notNull())
    .addColumn("detail", "jsonb", (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn("ip", "text")
    .execute();
  await db.schema.createIndex("audit_event_manuscript_at").on("audit_event").columns(["manuscript_id", "at"]).execute();

  // Append-only: the database itself refuses to rewrite history.
  await sql`
    CREATE FUNCTION refuse_change() RETURNS trigger AS $$
    BEGIN
      RAISE EXCEPTION '% rows are immutable (% refused)', TG_TABLE_NAME, TG_OP
        USING ERRCODE = 'insufficient_privilege';
    END $$ LANGUAGE plpgsql`.execute(db);
  await sql`
    CREATE TRIGGER audit_event_append_only BEFORE UPDATE OR DELETE ON audit_event
    FOR EACH ROW EXECUTE FUNCTION refuse_change()`.execute(db);
  await sql`
    CREATE TRIGGER audit_event_no_truncate BEFORE TRUNCATE ON audit_event
    FOR EACH STATEMENT EXECUTE FUNCTION refuse_change()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const t of ["audit_event", "sign_in_attempt", "api_token", "one_time_token", "invitation", "membership", "manuscript", "app_user"]) {
    await db.schema.dropTable(t).ifExists().cascade().execute();
  }
  await sql`DROP FUNCTION IF EXISTS refuse_change()`.execute(db);
  await sql`DROP FUNCTION IF EXISTS membership_keep_corresponding()`.execute(db);
}

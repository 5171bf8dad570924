import { type Kysely, sql } from "kysely";

// Frozen in time: never import app code here.
// Exports of signed-off versions (docs/decisions/0011-export-jobs.md): one row per request,
// moved by the export job through queued → rendering → done or failed. The files themselves sit
// in the blob store under their content hash; a row names them only once they are all stored,
// so a row in state `done` always points at complete files.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("figure_export")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("version_id", "uuid", (c) => c.notNull().references("figure_version.id"))
    .addColumn("manuscript_id", "uuid", (c) => c.notNull().references("manuscript.id"))
    .addColumn("requested_by", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("requested_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("state", "text", (c) => c.notNull().defaultTo("queued"))
    .addColumn("reason", "text")
    .addColumn("override_reason", "text")
    .addColumn("preflight", "jsonb")
    .addColumn("files", "jsonb")
    .addColumn("bundle_key", "text")
    .addColumn("bundle_sha256", "text")
    .addColumn("attempts", "integer", (c) => c.notNull().defaultTo(0))
    .addColumn("started_at", "timestamptz")
    .addColumn("finished_at", "timestamptz")
    .addCheckConstraint("figure_export_state_check", sql`state IN ('queued', 'rendering', 'done', 'failed')`)
    // Done means every file is stored and named; failed always says why.
    .addCheckConstraint("figure_export_done_check", sql`state <> 'done' OR (bundle_key IS NOT NULL AND bundle_sha256 ~ '^[0-9a-f]{64}$' AND files IS NOT NULL AND finished_at IS NOT NULL)`)
    .addCheckConstraint("figure_export_failed_check", sql`state <> 'failed' OR (reason IS NOT NULL AND finished_at IS NOT NULL)`)
    .addCheckConstraint("figure_export_override_check", sql`override_reason IS NULL OR length(btrim(override_reason)) > 0`)
    .execute();
  await db.schema.createIndex("figure_export_version_idx").on("figure_export").columns(["version_id", "requested_at"]).execute();

  // A finished export never changes again: what was delivered stays what the row says.
  await sql`
    CREATE FUNCTION figure_export_finished_check() RETURNS trigger AS $$
    BEGIN
      IF OLD.state IN ('done', 'failed') THEN
        RAISE EXCEPTION 'a finished export does not change' USING ERRCODE = 'check_violation', CONSTRAINT = 'figure_export_finished';
      END IF;
      IF NEW.version_id <> OLD.version_id OR NEW.requested_by <> OLD.requested_by OR NEW.manuscript_id <> OLD.manuscript_id THEN
        RAISE EXCEPTION 'an export keeps its version and requester' USING ERRCODE = 'check_violation', CONSTRAINT = 'figure_export_identity';
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql`.execute(db);
  await sql`CREATE TRIGGER figure_export_finished_check BEFORE UPDATE ON figure_export FOR EACH ROW EXECUTE FUNCTION figure_export_finished_check()`.execute(db);
  await sql`CREATE TRIGGER figure_export_no_delete BEFORE DELETE ON figure_export FOR EACH ROW EXECUTE FUNCTION refuse_change()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("figure_export").ifExists().execute();
  await sql`DROP FUNCTION IF EXISTS figure_export_finished_check()`.execute(db);
}

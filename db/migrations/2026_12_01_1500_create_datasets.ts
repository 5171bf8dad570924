import { type Kysely, sql } from "kysely";

// Frozen in time: never import app code here.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("dataset")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("manuscript_id", "uuid", (c) => c.notNull().references("manuscript.id"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("quantity", "jsonb", (c) => c.notNull())
    .addColumn("mapping", "jsonb")
    .addColumn("process", "text")
    .addColumn("beam_energy_gev", "double precision")
    .addColumn("target", "text")
    .addColumn("description", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("is_demo", "boolean", (c) => c.notNull().defaultTo(false))
    .addColumn("created_by", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("dataset_manuscript_name_key", ["manuscript_id", "name"])
    .addCheckConstraint("dataset_name_check", sql`length(name) BETWEEN 1 AND 200`)
    .addCheckConstraint("dataset_beam_energy_check", sql`beam_energy_gev IS NULL OR beam_energy_gev > 0`)
    .execute();

  await db.schema
    .createTable("dataset_revision")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("dataset_id", "uuid", (c) => c.notNull().references("dataset.id"))
    .addColumn("number", "integer", (c) => c.notNull())
    .addColumn("content_hash", "text", (c) => c.notNull())
    .addColumn("raw_sha256", "text", (c) => c.notNull())
    .addColumn("raw_key", "text", (c) => c.notNull())
    .addColumn("raw_filename", "text", (c) => c.notNull())
    .addColumn("raw_bytes", "bigint", (c) => c.notNull())
    .addColumn("row_count", "integer", (c) => c.notNull())
    .addColumn("quantity", "jsonb", (c) => c.notNull())
    .addColumn("mapping", "jsonb", (c) => c.notNull())
    .addColumn("created_by", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("dataset_revision_number_key", ["dataset_id", "number"])
    .addUniqueConstraint("dataset_revision_hash_key", ["dataset_id", "content_hash"])
    .addCheckConstraint("dataset_revision_number_check", sql`number >= 1`)
    .addCheckConstraint("dataset_revision_hash_check", sql`content_hash ~ '^[0-9a-f]{64}$' AND raw_sha256 ~ '^[0-9a-f]{64}$'`)
    .addCheckConstraint("dataset_revision_rows_check", sql`row_count >= 1`)
    .execute();

  await db.schema
    .createTable("dataset_row")
    .addColumn("revision_id", "uuid", (c) => c.notNull().references("dataset_revision.id"))
    .addColumn("idx", "integer", (c) => c.notNull())
    .addColumn("x", "double precision", (c) => c.notNull())
    .addColumn("x_low", "double precision")
    .addColumn("x_high", "double precision")
    .addColumn("y", "double precision", (c) => c.notNull())
    .addColumn("stat_minus", "double precision")
    .addColumn("stat_plus", "double precision")
    .addColumn("syst_minus", "double precision")
    .addColumn("syst_plus", "double precision")
    .addPrimaryKeyConstraint("dataset_row_pkey", ["revision_id", "idx"])
    .execute();

  // Revisions and their rows are immutable: the database refuses to change or remove them.
  // (refuse_change() comes from the first migration.) Statement-level for the rows, so that
  // bulk COPY pays nothing and any UPDATE or DELETE at all is refused.
  await sql`CREATE TRIGGER dataset_revision_immutable BEFORE UPDATE OR DELETE ON dataset_revision FOR EACH ROW EXECUTE FUNCTION refuse_change()`.execute(db);
  await sql`CREATE TRIGGER dataset_revision_no_truncate BEFORE TRUNCATE ON dataset_revision FOR EACH STATEMENT EXECUTE FUNCTION refuse_change()`.execute(db);
  await sql`CREATE TRIGGER dataset_row_immutable BEFORE UPDATE OR DELETE OR TRUNCATE ON dataset_row FOR EACH STATEMENT EXECUTE FUNCTION refuse_change()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("dataset_row").ifExists().execute();
  await db.schema.dropTable("dataset_revision").ifExists().execute();
  await db.schema.dropTable("dataset").ifExists().execute();
}

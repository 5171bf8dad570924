import { type Kysely, sql } from "kysely";

// Frozen in time: never import app code here.
// A figure of a manuscript and its draft: the figure model as JSON with a draft revision that
// each save increments, so that a save based on an older revision is refused (409) instead of
// overwriting another tab's work. Sealed versions (immutable) come in a later migration.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("figure")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("manuscript_id", "uuid", (c) => c.notNull().references("manuscript.id"))
    .addColumn("title", "text", (c) => c.notNull())
    .addColumn("draft", "jsonb", (c) => c.notNull())
    .addColumn("draft_revision", "integer", (c) => c.notNull().defaultTo(1))
    .addColumn("is_demo", "boolean", (c) => c.notNull().defaultTo(false))
    .addColumn("created_by", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("updated_by", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("updated_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint("figure_manuscript_title_key", ["manuscript_id", "title"])
    .addCheckConstraint("figure_title_check", sql`length(title) BETWEEN 1 AND 200`)
    .addCheckConstraint("figure_draft_revision_check", sql`draft_revision >= 1`)
    .addCheckConstraint("figure_draft_object_check", sql`jsonb_typeof(draft) = 'object'`)
    .execute();
  await db.schema.createIndex("figure_manuscript_idx").on("figure").column("manuscript_id").execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable("figure").ifExists().execute();
}

import { type Kysely, sql } from "kysely";

// Frozen in time: never import app code here.
// A dataset that is no longer wanted is retired, never deleted: it leaves the dataset lists but
// keeps its revisions, since a sealed figure version may cite them. Retired says when and by whom.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("dataset")
    .addColumn("retired_at", "timestamptz")
    .addColumn("retired_by", "uuid", (c) => c.references("app_user.id"))
    .execute();
  await sql`ALTER TABLE dataset ADD CONSTRAINT dataset_retired_check CHECK ((retired_at IS NULL) = (retired_by IS NULL))`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE dataset DROP CONSTRAINT IF EXISTS dataset_retired_check`.execute(db);
  await db.schema.alterTable("dataset").dropColumn("retired_by").dropColumn("retired_at").execute();
}

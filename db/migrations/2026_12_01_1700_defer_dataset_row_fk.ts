import { type Kysely, sql } from "kysely";

// Frozen in time: never import app code here.
// A revision's rows are copied while its file is still being read, and the revision row, which
// needs the hash of the whole file, is inserted after them in the same transaction; the
// reference is therefore checked at COMMIT. It is still checked: no row can outlive a
// transaction without its revision. See docs/decisions/0005-streamed-copy.md.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE dataset_row ALTER CONSTRAINT dataset_row_revision_id_fkey DEFERRABLE INITIALLY DEFERRED`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`ALTER TABLE dataset_row ALTER CONSTRAINT dataset_row_revision_id_fkey NOT DEFERRABLE`.execute(db);
}

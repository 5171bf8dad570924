import { type Kysely, sql } from "kysely";

// Frozen in time: never import app code here.
// Two corresponding authors demoting each other at the same moment could each see the other
// still in place (READ COMMITTED) and leave the manuscript with none. Locking the manuscript
// row first makes such changes take turns.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    CREATE OR REPLACE FUNCTION membership_keep_corresponding() RETURNS trigger AS $$
    DECLARE remaining integer;
    BEGIN
      IF OLD.role <> 'corresponding' THEN RETURN COALESCE(NEW, OLD); END IF;
      IF TG_OP = 'UPDATE' AND NEW.role = 'corresponding' THEN RETURN NEW; END IF;
      PERFORM 1 FROM manuscript WHERE id = OLD.manuscript_id FOR UPDATE;
      IF NOT FOUND THEN RETURN COALESCE(NEW, OLD); END IF;
      SELECT count(*) INTO remaining FROM membership
        WHERE manuscript_id = OLD.manuscript_id AND role = 'corresponding' AND user_id <> OLD.user_id;
      IF remaining = 0 THEN
        RAISE EXCEPTION 'a manuscript must keep at least one corresponding author'
          USING ERRCODE = 'check_violation', CONSTRAINT = 'membership_last_corresponding';
      END IF;
      RETURN COALESCE(NEW, OLD);
    END $$ LANGUAGE plpgsql`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    CREATE OR REPLACE FUNCTION membership_keep_corresponding() RETURNS trigger AS $$
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
}

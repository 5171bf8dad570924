import { type Kysely, sql } from "kysely";

// Frozen in time: never import app code here.
// Sealed versions of a figure and their review (docs/decisions/0010-sealed-versions.md):
// - figure_version: the frozen snapshot (model, inputs, engine, prediction tables, SVG) with its
//   fingerprint; numbered v1, v2, … per figure without gaps; never updated or deleted.
// - figure_version_input: the dataset revisions a version was drawn from, tied by foreign key to
//   the very revision (id, dataset, number and content hash together); never changed.
// - review_request: who was asked to sign a version off; only a co-author or corresponding
//   author of the manuscript, never the sealer nor the one asking; never changed.
// - version_event: the append-only history (requested, signed-off, returned, superseded,
//   comment) from which a version's state is derived; a trigger refuses impossible steps.
// - notification: the in-app inbox; only read_at may change.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable("figure_version")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("figure_id", "uuid", (c) => c.notNull().references("figure.id"))
    .addColumn("manuscript_id", "uuid", (c) => c.notNull().references("manuscript.id"))
    .addColumn("number", "integer", (c) => c.notNull())
    .addColumn("draft_revision", "integer", (c) => c.notNull())
    .addColumn("snapshot", "jsonb", (c) => c.notNull())
    .addColumn("svg", "text", (c) => c.notNull())
    .addColumn("svg_sha256", "text", (c) => c.notNull())
    .addColumn("fingerprint", "text", (c) => c.notNull().unique())
    .addColumn("sealed_by", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("sealed_at", "timestamptz", (c) => c.notNull())
    .addUniqueConstraint("figure_version_number_key", ["figure_id", "number"])
    .addUniqueConstraint("figure_version_draft_revision_key", ["figure_id", "draft_revision"])
    .addCheckConstraint("figure_version_number_check", sql`number >= 1 AND draft_revision >= 1`)
    .addCheckConstraint("figure_version_snapshot_check", sql`jsonb_typeof(snapshot) = 'object'`)
    .addCheckConstraint("figure_version_hash_check", sql`svg_sha256 ~ '^[0-9a-f]{64}$' AND fingerprint ~ '^[0-9a-f]{64}$'`)
    // The stored SVG is the one its hash names: PostgreSQL hashes it itself.
    .addCheckConstraint("figure_version_svg_hash_check", sql`svg_sha256 = encode(sha256(convert_to(svg, 'UTF8')), 'hex')`)
    .execute();

  // Numbered without gaps per figure, in the figure's own manuscript. Locking the figure row makes
  // two seals (and a draft save) take turns whatever path they come by.
  await sql`
    CREATE FUNCTION figure_version_number_check() RETURNS trigger AS $$
    DECLARE owner uuid; latest integer;
    BEGIN
      SELECT manuscript_id INTO owner FROM figure WHERE id = NEW.figure_id FOR NO KEY UPDATE;
      IF owner IS DISTINCT FROM NEW.manuscript_id THEN
        RAISE EXCEPTION 'a version belongs to its figure''s manuscript' USING ERRCODE = 'check_violation', CONSTRAINT = 'figure_version_manuscript';
      END IF;
      SELECT coalesce(max(number), 0) INTO latest FROM figure_version WHERE figure_id = NEW.figure_id;
      IF NEW.number <> latest + 1 THEN
        RAISE EXCEPTION 'versions of a figure are numbered without gaps: the next one is v%, not v%', latest + 1, NEW.number
          USING ERRCODE = 'check_violation', CONSTRAINT = 'figure_version_sequence';
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql`.execute(db);
  await sql`CREATE TRIGGER figure_version_number_check BEFORE INSERT ON figure_version FOR EACH ROW EXECUTE FUNCTION figure_version_number_check()`.execute(db);

  // A version's inputs name one existing revision by id, dataset, number and content hash at once.
  await sql`ALTER TABLE dataset_revision ADD CONSTRAINT dataset_revision_identity_key UNIQUE (id, dataset_id, number, content_hash)`.execute(db);
  await db.schema
    .createTable("figure_version_input")
    .addColumn("version_id", "uuid", (c) => c.notNull().references("figure_version.id"))
    .addColumn("revision_id", "uuid", (c) => c.notNull())
    .addColumn("dataset_id", "uuid", (c) => c.notNull())
    .addColumn("revision_number", "integer", (c) => c.notNull())
    .addColumn("content_hash", "text", (c) => c.notNull())
    .addPrimaryKeyConstraint("figure_version_input_pkey", ["version_id", "revision_id"])
    .addForeignKeyConstraint("figure_version_input_revision_fkey", ["revision_id", "dataset_id", "revision_number", "content_hash"], "dataset_revision", ["id", "dataset_id", "number", "content_hash"])
    .execute();

  await db.schema
    .createTable("review_request")
    .addColumn("version_id", "uuid", (c) => c.notNull().references("figure_version.id"))
    .addColumn("reviewer_id", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("requested_by", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("requested_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint("review_request_pkey", ["version_id", "reviewer_id"])
    .addCheckConstraint("review_request_not_self_check", sql`reviewer_id <> requested_by`)
    .execute();
  await sql`
    CREATE FUNCTION review_request_check() RETURNS trigger AS $$
    DECLARE v record; reviewer_role text;
    BEGIN
      SELECT manuscript_id, sealed_by INTO v FROM figure_version WHERE id = NEW.version_id;
      IF v.sealed_by = NEW.reviewer_id THEN
        RAISE EXCEPTION 'the sealer of a version cannot review it' USING ERRCODE = 'check_violation', CONSTRAINT = 'review_request_not_sealer';
      END IF;
      SELECT role INTO reviewer_role FROM membership WHERE manuscript_id = v.manuscript_id AND user_id = NEW.reviewer_id;
      IF reviewer_role IS NULL OR reviewer_role NOT IN ('coauthor', 'corresponding') THEN
        RAISE EXCEPTION 'only a co-author or corresponding author of the manuscript can be asked to sign off (this member is %)', coalesce(reviewer_role, 'not a member')
          USING ERRCODE = 'check_violation', CONSTRAINT = 'review_request_reviewer_role';
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql`.execute(db);
  await sql`CREATE TRIGGER review_request_check BEFORE INSERT ON review_request FOR EACH ROW EXECUTE FUNCTION review_request_check()`.execute(db);

  await db.schema
    .createTable("version_event")
    .addColumn("id", "bigint", (c) => c.primaryKey().generatedAlwaysAsIdentity())
    .addColumn("version_id", "uuid", (c) => c.notNull().references("figure_version.id"))
    .addColumn("kind", "text", (c) => c.notNull())
    .addColumn("actor_id", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("reviewer_id", "uuid", (c) => c.references("app_user.id"))
    .addColumn("superseded_by", "uuid", (c) => c.references("figure_version.id"))
    .addColumn("comment", "text")
    .addColumn("at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint("version_event_kind_check", sql`kind IN ('requested', 'signed-off', 'returned', 'superseded', 'comment')`)
    // A request names its reviewer; a decision is the reviewer's own; the others name nobody.
    .addCheckConstraint("version_event_reviewer_check", sql`CASE kind
      WHEN 'requested' THEN reviewer_id IS NOT NULL
      WHEN 'signed-off' THEN reviewer_id IS NOT NULL AND reviewer_id = actor_id
      WHEN 'returned' THEN reviewer_id IS NOT NULL AND reviewer_id = actor_id
      ELSE reviewer_id IS NULL END`)
    .addCheckConstraint("version_event_superseded_check", sql`(kind = 'superseded') = (superseded_by IS NOT NULL)`)
    .addCheckConstraint("version_event_comment_check", sql`(kind NOT IN ('returned', 'comment') OR (comment IS NOT NULL AND length(btrim(comment)) >= 1)) AND (comment IS NULL OR length(comment) <= 5000)`)
    // Requests and decisions only for a reviewer who was asked.
    .addForeignKeyConstraint("version_event_request_fkey", ["version_id", "reviewer_id"], "review_request", ["version_id", "reviewer_id"])
    .execute();
  await sql`CREATE UNIQUE INDEX version_event_one_request ON version_event (version_id, reviewer_id) WHERE kind = 'requested'`.execute(db);
  await sql`CREATE UNIQUE INDEX version_event_one_decision ON version_event (version_id, reviewer_id) WHERE kind IN ('signed-off', 'returned')`.execute(db);
  await sql`CREATE UNIQUE INDEX version_event_one_supersession ON version_event (version_id) WHERE kind = 'superseded'`.execute(db);
  await sql`CREATE INDEX version_event_version_idx ON version_event (version_id, id)`.execute(db);

  // The steps a version's review may take, checked here as well as in the app. The version's
  // row is locked first, so that events of one version take turns (two reviewers at the same
  // moment, a sign-off sent twice), and each check sees what the previous event committed.
  await sql`
    CREATE FUNCTION version_event_check() RETURNS trigger AS $$
    DECLARE v record; closed text; asked integer; signed integer;
    BEGIN
      SELECT figure_id, number INTO v FROM figure_version WHERE id = NEW.version_id FOR NO KEY UPDATE;
      IF NEW.kind = 'comment' THEN RETURN NEW; END IF;
      SELECT kind INTO closed FROM version_event WHERE version_id = NEW.version_id AND kind IN ('superseded', 'returned') ORDER BY id LIMIT 1;
      IF closed IS NOT NULL THEN
        RAISE EXCEPTION 'version v% is % already: no % now', v.number, closed, NEW.kind
          USING ERRCODE = 'check_violation', CONSTRAINT = 'version_event_closed';
      END IF;
      IF NEW.kind = 'superseded' THEN
        IF NOT EXISTS (SELECT 1 FROM figure_version WHERE id = NEW.superseded_by AND figure_id = v.figure_id AND number > v.number) THEN
          RAISE EXCEPTION 'a version is superseded only by a newer version of the same figure'
            USING ERRCODE = 'check_violation', CONSTRAINT = 'version_event_superseded_by';
        END IF;
        RETURN NEW;
      END IF;
      SELECT count(*) FILTER (WHERE kind = 'requested'), count(*) FILTER (WHERE kind = 'signed-off')
        INTO asked, signed FROM version_event WHERE version_id = NEW.version_id;
      IF asked > 0 AND signed = asked THEN
        RAISE EXCEPTION 'version v% is signed off already: no % now', v.number, NEW.kind
          USING ERRCODE = 'check_violation', CONSTRAINT = 'version_event_closed';
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql`.execute(db);
  await sql`CREATE TRIGGER version_event_check BEFORE INSERT ON version_event FOR EACH ROW EXECUTE FUNCTION version_event_check()`.execute(db);

  // Sealed versions, their inputs, requests and events never change (refuse_change() comes from
  // the first migration).
  for (const table of ["figure_version", "figure_version_input", "review_request", "version_event"]) {
    await sql`CREATE TRIGGER ${sql.id(`${table}_immutable`)} BEFORE UPDATE OR DELETE ON ${sql.table(table)} FOR EACH ROW EXECUTE FUNCTION refuse_change()`.execute(db);
    await sql`CREATE TRIGGER ${sql.id(`${table}_no_truncate`)} BEFORE TRUNCATE ON ${sql.table(table)} FOR EACH STATEMENT EXECUTE FUNCTION refuse_change()`.execute(db);
  }

  await db.schema
    .createTable("notification")
    .addColumn("id", "uuid", (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn("user_id", "uuid", (c) => c.notNull().references("app_user.id"))
    .addColumn("kind", "text", (c) => c.notNull())
    .addColumn("manuscript_id", "uuid", (c) => c.notNull().references("manuscript.id"))
    .addColumn("figure_id", "uuid", (c) => c.notNull().references("figure.id"))
    .addColumn("version_id", "uuid", (c) => c.notNull().references("figure_version.id"))
    .addColumn("actor_id", "uuid", (c) => c.references("app_user.id"))
    .addColumn("subject", "text", (c) => c.notNull())
    .addColumn("body", "text", (c) => c.notNull())
    .addColumn("link", "text", (c) => c.notNull())
    .addColumn("created_at", "timestamptz", (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn("read_at", "timestamptz")
    .addCheckConstraint("notification_kind_check", sql`kind IN ('requested', 'signed-off', 'returned', 'superseded')`)
    .addCheckConstraint("notification_link_check", sql`link LIKE '/%'`)
    .execute();
  await sql`CREATE INDEX notification_user_idx ON notification (user_id, created_at DESC)`.execute(db);
  await sql`CREATE INDEX notification_unread_idx ON notification (user_id) WHERE read_at IS NULL`.execute(db);
  await sql`
    CREATE FUNCTION notification_only_read_at() RETURNS trigger AS $$
    BEGIN
      IF (to_jsonb(NEW) - 'read_at') IS DISTINCT FROM (to_jsonb(OLD) - 'read_at') THEN
        RAISE EXCEPTION 'a notification only changes when it is read' USING ERRCODE = 'insufficient_privilege';
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql`.execute(db);
  await sql`CREATE TRIGGER notification_only_read_at BEFORE UPDATE ON notification FOR EACH ROW EXECUTE FUNCTION notification_only_read_at()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const t of ["notification", "version_event", "review_request", "figure_version_input", "figure_version"]) {
    await db.schema.dropTable(t).ifExists().execute();
  }
  await sql`ALTER TABLE dataset_revision DROP CONSTRAINT IF EXISTS dataset_revision_identity_key`.execute(db);
  for (const f of ["notification_only_read_at", "version_event_check", "review_request_check", "figure_version_number_check"]) {
    await sql`DROP FUNCTION IF EXISTS ${sql.id(f)}()`.execute(db);
  }
}

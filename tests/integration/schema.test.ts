// The migrations from an empty database, and the rules the database itself enforces.
import { sql } from "kysely";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { migrateToLatest } from "../../db/migrate";
import { connect } from "../support/db";
import { testEnv } from "../support/env";

const name = `steradian_schema_${process.env.VITEST_POOL_ID ?? 0}_${Date.now()}`;
const adminUrl = testEnv.templateDatabaseUrl.replace(/\/[^/]+$/, "/postgres");
const url = testEnv.templateDatabaseUrl.replace(/\/[^/]+$/, `/${name}`);
let db: ReturnType<typeof connect>;

async function admin(q: string) {
  const c = new pg.Client({ connectionString: adminUrl });
  await c.connect();
  await c.query(q);
  await c.end();
}

beforeAll(async () => {
  await admin(`CREATE DATABASE ${name} TEMPLATE template0`);
  await migrateToLatest(url);
  db = connect(url);
});
afterAll(async () => {
  await db?.destroy();
  await admin(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
});

async function user(email: string) {
  return (await db.insertInto("app_user").values({ email, name: "N" }).returning("id").executeTakeFirstOrThrow()).id;
}

describe("migrations from an empty database", () => {
  it("create every table, and go down and up again", async () => {
    const tables = await sql<{ tablename: string }>`SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`.execute(db);
    const names = tables.rows.map((r) => r.tablename);
    for (const t of ["api_token", "app_user", "audit_event", "dataset", "dataset_revision", "dataset_row", "invitation", "manuscript", "membership", "one_time_token", "sign_in_attempt", "figure", "figure_version", "figure_version_input", "review_request", "version_event", "notification"]) expect(names).toContain(t);
    process.env.MIGRATE_QUIET = "1";
    await migrateToLatest(url, "reset");
    const after = await sql<{ n: number }>`SELECT count(*)::int AS n FROM pg_tables WHERE schemaname = 'public' AND tablename NOT LIKE 'kysely%'`.execute(db);
    expect(after.rows[0].n).toBe(0);
    await migrateToLatest(url);
    const again = await sql<{ n: number }>`SELECT count(*)::int AS n FROM pg_tables WHERE schemaname = 'public' AND tablename = 'app_user'`.execute(db);
    expect(again.rows[0].n).toBe(1);
  });
});

describe("constraints", () => {
  it("e-mail addresses are unique regardless of case, and must look like addresses", async () => {
    await user("Case@Example.org");
    await expect(user("case@example.org")).rejects.toThrow(/unique/);
    await expect(user("no-at-sign")).rejects.toThrow(/app_user_email_check/);
  });

  it("roles and statuses are from their lists", async () => {
    const u = await user("roles@example.org");
    const m = (await db.insertInto("manuscript").values({ title: "T", created_by: u }).returning("id").executeTakeFirstOrThrow()).id;
    await expect(db.insertInto("membership").values({ manuscript_id: m, user_id: u, role: "editor" as never }).execute()).rejects.toThrow(/membership_role_check/);
    await expect(db.updateTable("app_user").set({ status: "asleep" as never }).where("id", "=", u).execute()).rejects.toThrow(/app_user_status_check/);
  });

  it("the last corresponding author cannot be deleted or demoted, even in raw SQL", async () => {
    const a = await user("ca@example.org");
    const b = await user("cb@example.org");
    const m = (await db.insertInto("manuscript").values({ title: "T", created_by: a }).returning("id").executeTakeFirstOrThrow()).id;
    await db.insertInto("membership").values([{ manuscript_id: m, user_id: a, role: "corresponding" }, { manuscript_id: m, user_id: b, role: "observer" }]).execute();
    await expect(sql`DELETE FROM membership WHERE user_id = ${a}`.execute(db)).rejects.toThrow(/at least one corresponding author/);
    await expect(sql`UPDATE membership SET role = 'coauthor' WHERE user_id = ${a}`.execute(db)).rejects.toThrow(/at least one corresponding author/);
    await sql`UPDATE membership SET role = 'corresponding' WHERE user_id = ${b}`.execute(db);
    await sql`DELETE FROM membership WHERE user_id = ${a}`.execute(db);
    const left = await db.selectFrom("membership").select("role").where("manuscript_id", "=", m).execute();
    expect(left).toEqual([{ role: "corresponding" }]);
  });

  it("the audit log refuses UPDATE, DELETE and TRUNCATE", async () => {
    await db.insertInto("audit_event").values({ action: "sign-in", detail: "{}" }).execute();
    await expect(sql`UPDATE audit_event SET action = 'x'`.execute(db)).rejects.toThrow(/immutable/);
    await expect(sql`DELETE FROM audit_event`.execute(db)).rejects.toThrow(/immutable/);
    await expect(sql`TRUNCATE audit_event`.execute(db)).rejects.toThrow(/immutable/);
    const n = await sql<{ n: number }>`SELECT count(*)::int AS n FROM audit_event`.execute(db);
    expect(n.rows[0].n).toBe(1);
  });

  it("a dataset row must belong to an existing revision, in bulk and row by row", async () => {
    const u = await user("rows@example.org");
    const m = (await db.insertInto("manuscript").values({ title: "T", created_by: u }).returning("id").executeTakeFirstOrThrow()).id;
    const d = (await db.insertInto("dataset").values({ manuscript_id: m, name: "d", quantity: "{}", created_by: u }).returning("id").executeTakeFirstOrThrow()).id;
    const r = (await db.insertInto("dataset_revision").values({ dataset_id: d, number: 1, content_hash: "a".repeat(64), raw_sha256: "b".repeat(64), raw_key: "k", raw_filename: "f.csv", raw_bytes: 1, row_count: 1, quantity: "{}", mapping: "{}", created_by: u }).returning("id").executeTakeFirstOrThrow()).id;
    await db.insertInto("dataset_row").values({ revision_id: r, idx: 0, x: 1, y: 1 }).execute();
    const ghost = "00000000-0000-4000-8000-000000000000";
    await expect(db.insertInto("dataset_row").values({ revision_id: ghost, idx: 0, x: 1, y: 1 }).execute()).rejects.toThrow(/does not exist/);
    await expect(db.insertInto("dataset_row").values([{ revision_id: r, idx: 1, x: 2, y: 1 }, { revision_id: ghost, idx: 1, x: 2, y: 1 }]).execute()).rejects.toThrow(/does not exist/);
    const n = await sql<{ n: number }>`SELECT count(*)::int AS n FROM dataset_row`.execute(db);
    expect(n.rows[0].n).toBe(1);
  });

  it("an invitation is accepted by someone exactly when it has an acceptance time", async () => {
    const u = await user("inv@example.org");
    const m = (await db.insertInto("manuscript").values({ title: "T", created_by: u }).returning("id").executeTakeFirstOrThrow()).id;
    await expect(
      db.insertInto("invitation").values({ manuscript_id: m, email: "x@example.org", role: "observer", token_hash: "h", invited_by: u, expires_at: new Date(Date.now() + 1e6), accepted_at: new Date() }).execute(),
    ).rejects.toThrow(/invitation_accept_check/);
  });
});

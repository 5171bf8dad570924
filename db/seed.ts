// Seeds the invented demonstration scenario (docs/product.md, "Demo scenario"): a fictional fixed-target collaboration
// studying positron annihilation in flight, plus a two-photon analysis of charged-pion pairs.
// Idempotent: a second run changes nothing.
import bcrypt from "bcryptjs";
import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import type { Database, MemberRole } from "./types";

export const DEMO_PASSWORD = "demo-steradian-2026";
export const DEMO_MANUSCRIPT_ID = "5e7ad1a0-0000-4000-8000-00000000d3e0";

export const DEMO_USERS = [
  { email: "ada.contributor@example.org", name: "Ada Lindqvist (demo)", role: "contributor", siteRole: "member" },
  { email: "bruno.coauthor@example.org", name: "Bruno Okafor (demo)", role: "coauthor", siteRole: "member" },
  { email: "carla.corresponding@example.org", name: "Carla Ferreira (demo)", role: "corresponding", siteRole: "member" },
  { email: "admin@example.org", name: "Site admin (demo)", role: null, siteRole: "admin" },
] as const satisfies ReadonlyArray<{ email: string; name: string; role: MemberRole | null; siteRole: "member" | "admin" }>;

export async function seedDemo(db: Kysely<Database>, opts: { bcryptCost?: number } = {}): Promise<{ created: number }> {
  let created = 0;
  const ids = new Map<string, string>();
  for (const u of DEMO_USERS) {
    const existing = await db.selectFrom("app_user").select("id").where("email", "=", u.email).executeTakeFirst();
    if (existing) {
      ids.set(u.email, existing.id);
      continue;
    }
    const hash = await bcrypt.hash(DEMO_PASSWORD, opts.bcryptCost ?? 12);
    const row = await db
      .insertInto("app_user")
      .values({ email: u.email, name: u.name, password_hash: hash, site_role: u.siteRole, status: "active", email_confirmed_at: new Date(), is_demo: true })
      .returning("id")
      .executeTakeFirstOrThrow();
    ids.set(u.email, row.id);
    created++;
  }
  const carla = ids.get("carla.corresponding@example.org")!;
  const ms = await db
    .insertInto("manuscript")
    .values({
      id: DEMO_MANUSCRIPT_ID,
      title: "Positron annihilation in flight at the Kestrel Ridge linac (synthetic demo)",
      journal: "an invented journal",
      is_demo: true,
      created_by: carla,
    })
    .onConflict((oc) => oc.column("id").doNothing())
    .returning("id")
    .executeTakeFirst();
  if (ms) created++;
  for (const u of DEMO_USERS) {
    if (!u.role) continue;
    const r = await db
      .insertInto("membership")
      .values({ manuscript_id: DEMO_MANUSCRIPT_ID, user_id: ids.get(u.email)!, role: u.role })
      .onConflict((oc) => oc.columns(["manuscript_id", "user_id"]).doNothing())
      .returning("user_id")
      .executeTakeFirst();
    if (r) created++;
  }
  return { created };
}

const isMain = process.argv[1] && import.meta.url.endsWith(process.argv[1].split("/").pop()!);
if (isMain) {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set");
  const db = new Kysely<Database>({ dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: url, max: 2 }) }) });
  const run = async () => {
    const { created } = await seedDemo(db);
    // The datasets go through the app's own ingest path (storage, validation, COPY).
    const { seedDemoDatasets } = await import("../app/.server/datasets/demo-datasets.server");
    const { db: appDb } = await import("../app/.server/platform/db.server");
    const carla = await db.selectFrom("app_user").select("id").where("email", "=", "carla.corresponding@example.org").executeTakeFirstOrThrow();
    const datasets = await seedDemoDatasets(appDb, DEMO_MANUSCRIPT_ID, carla.id);
    // The sealed demo figure goes through the app's own seal and review functions.
    const { seedDemoVersions } = await import("../app/.server/versions/demo-versions.server");
    const idOf = async (email: string) => (await db.selectFrom("app_user").select("id").where("email", "=", email).executeTakeFirstOrThrow()).id;
    const versionSteps = await seedDemoVersions(appDb, DEMO_MANUSCRIPT_ID, {
      contributor: await idOf("ada.contributor@example.org"), coauthor: await idOf("bruno.coauthor@example.org"), corresponding: carla.id,
    });
    await appDb.destroy();
    const total = created + datasets + versionSteps;
    console.log(total ? `demo scenario: ${created} account/manuscript row(s), ${datasets} synthetic dataset(s) and ${versionSteps} step(s) of the sealed demo figure created` : "demo scenario: already present, nothing changed");
  };
  run().finally(() => db.destroy());
}

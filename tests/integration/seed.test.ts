// The demo scenario: seeded once by `npm test`'s set-up; a second run changes nothing.
import { execFile } from "node:child_process";
import { promisify } from "node:util";
import { afterAll, describe, expect, it } from "vitest";
import { connect } from "../support/db";
import { testEnv } from "../support/env";
import { DEMO } from "../support/http";

const db = connect(testEnv.appDatabaseUrl);
afterAll(() => db.destroy());

async function counts() {
  const n = async (t: "app_user" | "manuscript" | "membership" | "dataset" | "dataset_revision" | "dataset_row" | "figure" | "figure_version" | "version_event" | "notification") =>
    Number((await db.selectFrom(t).select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow()).n);
  return {
    users: await n("app_user"), manuscripts: await n("manuscript"), memberships: await n("membership"), datasets: await n("dataset"), revisions: await n("dataset_revision"), rows: await n("dataset_row"),
    figures: await n("figure"), versions: await n("figure_version"), events: await n("version_event"), notifications: await n("notification"),
  };
}

describe("demo seed", () => {
  it("is idempotent: a second run creates nothing", async () => {
    const before = await counts();
    const { stdout } = await promisify(execFile)("node_modules/.bin/tsx", ["db/seed.ts"], {
      env: { ...process.env, DATABASE_URL: testEnv.appDatabaseUrl, STORAGE_DIR: testEnv.storageDir, NODE_ENV: "production" },
    });
    expect(stdout).toContain("already present, nothing changed");
    expect(await counts()).toEqual(before);
  });

  it("marks the demo manuscript and its datasets as demo data, with synthetic data in every revision", async () => {
    const m = await db.selectFrom("manuscript").select(["title", "is_demo"]).where("id", "=", DEMO.manuscriptId).executeTakeFirstOrThrow();
    expect(m.is_demo).toBe(true);
    expect(m.title).toMatch(/synthetic/);
    const ds = await db.selectFrom("dataset").select(["name", "is_demo", "description"]).where("manuscript_id", "=", DEMO.manuscriptId).where("is_demo", "=", true).execute();
    expect(ds.length).toBe(2);
    for (const d of ds) {
      expect(d.name).toMatch(/synthetic/);
      expect(d.description).toMatch(/^SYNTHETIC/);
    }
    const users = await db.selectFrom("app_user").select(["email", "is_demo"]).where("is_demo", "=", true).execute();
    expect(users.map((u) => u.email).sort()).toEqual([DEMO.admin, DEMO.contributor, DEMO.coauthor, DEMO.corresponding].sort());
  });

  it("gives the demo manuscript a sealed figure: v1 signed off by the co-author, v2 in review with the co-author and the corresponding author", async () => {
    const figure = await db.selectFrom("figure").select(["id", "is_demo"]).where("manuscript_id", "=", DEMO.manuscriptId).where("title", "like", "Fig. 1:%(synthetic demo)").executeTakeFirstOrThrow();
    expect(figure.is_demo).toBe(true);
    const versions = await db.selectFrom("figure_version").select(["id", "number"]).where("figure_id", "=", figure.id).orderBy("number").execute();
    expect(versions.map((v) => v.number)).toEqual([1, 2]);
    const events = await db
      .selectFrom("version_event").innerJoin("app_user as actor", "actor.id", "version_event.actor_id").leftJoin("app_user as reviewer", "reviewer.id", "version_event.reviewer_id")
      .select(["version_event.version_id", "version_event.kind", "actor.email as actor", "reviewer.email as reviewer"]).where("version_event.version_id", "in", versions.map((v) => v.id)).orderBy("version_event.id").execute();
    const of = (id: string) => events.filter((e) => e.version_id === id).map((e) => [e.kind, e.actor, e.reviewer]);
    expect(of(versions[0].id)).toEqual([["requested", DEMO.contributor, DEMO.coauthor], ["signed-off", DEMO.coauthor, DEMO.coauthor]]);
    expect(of(versions[1].id)).toEqual([["requested", DEMO.contributor, DEMO.coauthor], ["requested", DEMO.contributor, DEMO.corresponding]]);
  });
});

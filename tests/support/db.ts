import { randomBytes } from "node:crypto";
import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import type { Database } from "../../db/types";
import { testEnv } from "./env";

export function connect(url: string, max = 4): Kysely<Database> {
  const pool = new pg.Pool({ connectionString: url, max });
  // pg-pool's end() resolves once its clients are told to end, not when their sockets close: a
  // DROP DATABASE … WITH (FORCE) right after it can reach a backend before the client's goodbye
  // and be answered with "terminating connection due to administrator command" (57P01) on a
  // client the pool no longer holds. That one error is the teardown's own; any other is reported.
  pool.on("error", (e: Error & { code?: string }) => {
    if (e.code !== "57P01") console.error("test database pool:", e);
  });
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}

/** A database of its own for one test file, cloned from the template migrated once by `npm test`. */
export async function createTestDatabase(): Promise<{ db: Kysely<Database>; url: string; drop(): Promise<void> }> {
  const template = new URL(testEnv.templateDatabaseUrl);
  const name = `steradian_it_${process.env.VITEST_POOL_ID ?? "0"}_${randomBytes(4).toString("hex")}`;
  const admin = new pg.Client({ connectionString: testEnv.templateDatabaseUrl.replace(/\/[^/]+$/, "/postgres") });
  await admin.connect();
  await admin.query(`CREATE DATABASE ${name} TEMPLATE ${template.pathname.slice(1)}`);
  await admin.end();
  const url = testEnv.templateDatabaseUrl.replace(/\/[^/]+$/, `/${name}`);
  const db = connect(url);
  return {
    db,
    url,
    async drop() {
      await db.destroy();
      const c = new pg.Client({ connectionString: testEnv.templateDatabaseUrl.replace(/\/[^/]+$/, "/postgres") });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      await c.end();
    },
  };
}

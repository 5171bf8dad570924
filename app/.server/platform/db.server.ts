import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import type { Database } from "../../../db/types";
import { env } from "./env.server";

// NUMERIC and BIGINT come back as strings by default; counts and ids here fit a double.
pg.types.setTypeParser(20, (v) => Number(v));

declare global {
  // Survive dev-server reloads so that connections are not leaked.
  var __steradianPool: pg.Pool | undefined;
  var __steradianDb: Kysely<Database> | undefined;
}

/**
 * An idle connection that PostgreSQL closes (a restart, a crash, an administrator) makes the pool
 * emit "error"; without a listener Node ends the process. The pool drops that connection and opens
 * a new one on the next query, so the error is logged and the server keeps running (pg's own advice).
 */
function idleErrorsLogged(p: pg.Pool): pg.Pool {
  p.on("error", (e) => console.error("[steradian] an idle database connection was closed:", e.message));
  return p;
}

/** The raw pool, for what Kysely does not do (COPY … FROM STDIN for bulk rows). */
export const pool: pg.Pool = (globalThis.__steradianPool ??= idleErrorsLogged(new pg.Pool({ connectionString: env.DATABASE_URL, max: 10 })));
export const db: Kysely<Database> = (globalThis.__steradianDb ??= new Kysely<Database>({ dialect: new PostgresDialect({ pool }) }));
export type Db = Kysely<Database>;

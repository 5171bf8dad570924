import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import type { Database } from "../../db/types";
import { env } from "./env.server";

// NUMERIC and BIGINT come back as strings by default; counts and ids here fit a double.
pg.types.setTypeParser(20, (v) => Number(v));

declare global {
  // Survives dev-server reloads so that connections are not leaked.
  var __steradianDb: Kysely<Database> | undefined;
}

export function createDb(connectionString: string, max = 10): Kysely<Database> {
  return new Kysely<Database>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString, max }) }),
  });
}

export const db: Kysely<Database> = (globalThis.__steradianDb ??= createDb(env.DATABASE_URL));
export type Db = Kysely<Database>;

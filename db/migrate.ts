// Runs the Kysely migrations in db/migrations against DATABASE_URL (through tsx: the
// migrations are TypeScript). `--down` reverts the newest one.
import path from "node:path";
import { fileURLToPath } from "node:url";
import { Kysely, Migrator, NO_MIGRATIONS, PostgresDialect } from "kysely";
import pg from "pg";
import { MIGRATIONS } from "./migration-list";

/** "up": to the newest; "down": revert the newest one; "reset": revert them all. */
export async function migrateToLatest(databaseUrl: string, direction: "up" | "down" | "reset" = "up") {
  const db = new Kysely<unknown>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: databaseUrl, max: 1 }) }),
  });
  const migrator = new Migrator({
    db,
    provider: { getMigrations: async () => MIGRATIONS },
  });
  try {
    const { error, results } =
      direction === "up" ? await migrator.migrateToLatest() : direction === "down" ? await migrator.migrateDown() : await migrator.migrateTo(NO_MIGRATIONS);
    for (const r of results ?? []) {
      if (r.status === "Error") console.error(`migration ${r.migrationName} failed`);
      else if (process.env.MIGRATE_QUIET !== "1") console.log(`migration ${r.migrationName}: ${r.status.toLowerCase()}`);
    }
    if (error) throw error;
  } finally {
    await db.destroy();
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error("DATABASE_URL is not set");
    process.exit(1);
  }
  migrateToLatest(url, process.argv.includes("--down") ? "down" : "up").catch((e) => {
    console.error(e);
    process.exit(1);
  });
}

// Runs the Kysely migrations in db/migrations against DATABASE_URL (through tsx: the
// migrations are TypeScript). `--down` reverts the newest one.
import { promises as fs } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { FileMigrationProvider, Kysely, Migrator, PostgresDialect } from "kysely";
import pg from "pg";

export async function migrateToLatest(databaseUrl: string, direction: "up" | "down" = "up") {
  const db = new Kysely<unknown>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: databaseUrl, max: 1 }) }),
  });
  const migrator = new Migrator({
    db,
    provider: new FileMigrationProvider({
      fs,
      path,
      migrationFolder: path.join(path.dirname(fileURLToPath(import.meta.url)), "migrations"),
    }),
  });
  try {
    const { error, results } = direction === "up" ? await migrator.migrateToLatest() : await migrator.migrateDown();
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

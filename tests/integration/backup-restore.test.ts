// `npm run backup` → wipe → `npm run restore` gives back every table's rows and every stored
// file exactly (issue 11 item 8, docs/decisions/0012-hardening.md). Runs on a database and a
// storage folder of its own, filled by the demo seed; DATABASE_URL and STORAGE_DIR are always
// passed explicitly to the scripts, never left to their defaults.
import { execFile } from "node:child_process";
import { createHash, randomBytes } from "node:crypto";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listStoredFiles } from "../../scripts/lib/backup-files";
import { testEnv } from "../support/env";

const exec = promisify(execFile);
const name = `steradian_backup_${randomBytes(4).toString("hex")}`;
const adminUrl = () => testEnv.templateDatabaseUrl.replace(/\/[^/]+$/, "/postgres");
const url = () => testEnv.templateDatabaseUrl.replace(/\/[^/]+$/, `/${name}`);
const work = mkdtempSync(path.join(tmpdir(), "steradian-backup-"));
const storage = path.join(work, "storage");
const backup = path.join(work, "backup");

async function admin(statement: string) {
  const c = new pg.Client({ connectionString: adminUrl() });
  await c.connect();
  try {
    await c.query(statement);
  } finally {
    await c.end();
  }
}

function script(args: string[]) {
  const env = { ...process.env, DATABASE_URL: url(), STORAGE_DIR: storage, STORAGE_DRIVER: "local", NODE_ENV: "development", MIGRATE_QUIET: "1" };
  return exec("node_modules/.bin/tsx", args, { env, maxBuffer: 16 * 1024 * 1024 });
}

/** Every row of every table (as JSON text, sorted), and every sequence's position. */
async function databaseState(): Promise<Record<string, string[]>> {
  const c = new pg.Client({ connectionString: url() });
  await c.connect();
  try {
    const tables = await c.query<{ table_name: string }>(
      "SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY table_name",
    );
    const state: Record<string, string[]> = {};
    for (const { table_name } of tables.rows) {
      const rows = await c.query<{ row: string }>(`SELECT to_jsonb(t)::text AS row FROM "${table_name}" t`);
      state[table_name] = rows.rows.map((r) => r.row).sort();
    }
    const sequences = await c.query<{ sequencename: string; last_value: string | null }>("SELECT sequencename, last_value::text FROM pg_sequences WHERE schemaname = 'public' ORDER BY sequencename");
    state["(sequences)"] = sequences.rows.map((s) => `${s.sequencename}=${s.last_value}`);
    return state;
  } finally {
    await c.end();
  }
}

function storedFiles(): Record<string, string> {
  return Object.fromEntries(listStoredFiles(storage).map((rel) => [rel, createHash("sha256").update(readFileSync(path.join(storage, rel))).digest("hex")]));
}

beforeAll(async () => {
  await admin(`CREATE DATABASE ${name} TEMPLATE ${new URL(testEnv.templateDatabaseUrl).pathname.slice(1)}`);
  await script(["db/seed.ts"]);
}, 180_000);

afterAll(async () => {
  await admin(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  rmSync(work, { recursive: true, force: true });
});

describe("backup and restore", () => {
  it("restores every table's rows and every stored file into a wiped installation", async () => {
    const before = await databaseState();
    const filesBefore = storedFiles();
    // The seed made a real installation: accounts, datasets with stored raw files, figures.
    expect(before.app_user.length).toBeGreaterThan(0);
    expect(before.dataset_row.length).toBeGreaterThan(0);
    expect(before.kysely_migration.length).toBeGreaterThan(0);
    expect(Object.keys(filesBefore).length).toBeGreaterThan(0);

    const { stdout } = await script(["scripts/backup.ts", backup]);
    expect(stdout).toContain(`${Object.keys(filesBefore).length} stored files`);
    const manifest = JSON.parse(readFileSync(path.join(backup, "manifest.json"), "utf8")) as { files: { path: string; sha256: string }[] };
    expect(Object.fromEntries(manifest.files.map((f) => [f.path, f.sha256]))).toEqual(filesBefore);

    // Wipe: a brand-new empty database of the same name and an empty storage folder.
    await admin(`DROP DATABASE ${name} WITH (FORCE)`);
    await admin(`CREATE DATABASE ${name} OWNER ${new URL(testEnv.templateDatabaseUrl).username}`);
    rmSync(storage, { recursive: true, force: true });
    expect(storedFiles()).toEqual({});

    await script(["scripts/restore.ts", backup]);
    expect(await databaseState()).toEqual(before);
    expect(storedFiles()).toEqual(filesBefore);
  }, 180_000);

  it("restores over a changed installation too, and refuses a damaged backup", async () => {
    const before = await databaseState();
    const filesBefore = storedFiles();
    // The installation moves on after the backup: a new row and a new stored file.
    const c = new pg.Client({ connectionString: url() });
    await c.connect();
    await c.query("INSERT INTO app_user (email, name, password_hash, status) VALUES ('later@example.org', 'Later', 'x', 'pending')");
    await c.end();
    writeFileSync(path.join(storage, "later.bin"), "later");
    await script(["scripts/restore.ts", backup]);
    expect(await databaseState()).toEqual(before);
    expect(storedFiles()).toEqual(filesBefore);

    const damaged = path.join(backup, "files", Object.keys(filesBefore)[0]);
    writeFileSync(damaged, "not the stored bytes");
    await expect(script(["scripts/restore.ts", backup])).rejects.toThrow(/does not match its manifest/);
    // Nothing was touched by the refused restore.
    expect(await databaseState()).toEqual(before);
  }, 180_000);
});

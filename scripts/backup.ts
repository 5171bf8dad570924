// `npm run backup [-- <folder>]`: a consistent backup of one installation into a folder —
// the database as a pg_dump archive, the stored files (local storage), and manifest.json with
// the SHA-256 of every file. `npm run restore -- <folder>` brings a fresh installation back to
// that state (docs/decisions/0012-hardening.md). Reads DATABASE_URL and STORAGE_DIR.
import { mkdirSync } from "node:fs";
import path from "node:path";
import { copyStoredFiles, describeFile, pgTool, requireSettings, run, writeManifest, type Manifest } from "./lib/backup-files";

const { databaseUrl, storageDir } = requireSettings();
const stamp = new Date().toISOString().replace(/[:.]/g, "-");
const folder = path.resolve(process.argv[2] ?? path.join("backups", stamp));
mkdirSync(folder, { recursive: true });

// The dump is one snapshot of the database (pg_dump reads in one repeatable-read transaction).
// Stored files are named by their content hash and never change; copying them after the dump
// means every file a dumped row names is in the backup (files stored meanwhile are extra and
// harmless). Temporary uploads (storage/tmp) are not part of the state.
const dumpPath = path.join(folder, "database.dump");
await run(pgTool("pg_dump"), ["--format=custom", "--no-owner", "--no-privileges", `--file=${dumpPath}`, `--dbname=${databaseUrl}`]);
const files = await copyStoredFiles(storageDir, path.join(folder, "files"));
const manifest: Manifest = {
  format: "steradian-backup-1",
  createdAt: new Date().toISOString(),
  database: await describeFile(folder, "database.dump"),
  files,
};
await writeManifest(folder, manifest);
const bytes = files.reduce((n, f) => n + f.bytes, manifest.database.bytes);
console.log(`[steradian] backup written to ${folder}: the database and ${files.length} stored files, ${bytes.toLocaleString("en")} bytes`);

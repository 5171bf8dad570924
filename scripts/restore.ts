// `npm run restore -- <folder>`: brings an installation back to the state of a backup written by
// `npm run backup` (docs/decisions/0012-hardening.md). Every file is checked against the
// manifest first; then the database's public schema is dropped and made again empty, the dump
// restored into it (so nothing of the installation's own — not even a migration lock row —
// survives), and the stored files are replaced by the backup's. Stop the app first.
import { existsSync } from "node:fs";
import { copyFile, mkdir, rm } from "node:fs/promises";
import path from "node:path";
import { listStoredFiles, pgTool, readVerifiedManifest, requireSettings, run } from "./lib/backup-files";

const folderArg = process.argv[2];
if (!folderArg) {
  console.error("Usage: npm run restore -- <backup folder>");
  process.exit(2);
}
const folder = path.resolve(folderArg);
const { databaseUrl, storageDir } = requireSettings();
const manifest = await readVerifiedManifest(folder);

await run(pgTool("psql"), ["--no-psqlrc", "--quiet", "--set=ON_ERROR_STOP=1", `--dbname=${databaseUrl}`, "--command=DROP SCHEMA IF EXISTS public CASCADE; CREATE SCHEMA public;"]);
await run(pgTool("pg_restore"), ["--no-owner", "--no-privileges", "--exit-on-error", "--single-transaction", `--dbname=${databaseUrl}`, path.join(folder, "database.dump")]);

// Stored files: exactly the backup's (the temporary area is emptied as well).
for (const rel of listStoredFiles(storageDir)) await rm(path.join(storageDir, rel));
if (existsSync(path.join(storageDir, "tmp"))) await rm(path.join(storageDir, "tmp"), { recursive: true, force: true });
for (const f of manifest.files) {
  const target = path.join(storageDir, f.path);
  await mkdir(path.dirname(target), { recursive: true });
  await copyFile(path.join(folder, "files", f.path), target);
}
console.log(`[steradian] restored the backup of ${manifest.createdAt}: the database and ${manifest.files.length} stored files`);

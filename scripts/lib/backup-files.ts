// Shared by scripts/backup.ts and scripts/restore.ts: settings, the PostgreSQL tools, the
// manifest, and copying stored files with their hashes.
import { execFile } from "node:child_process";
import { createHash } from "node:crypto";
import { createReadStream, existsSync, readdirSync } from "node:fs";
import { copyFile, mkdir, readFile, stat, writeFile } from "node:fs/promises";
import path from "node:path";
import { promisify } from "node:util";

export interface FileEntry {
  /** Relative to the backup folder (database) or to the storage root (stored files), with "/". */
  path: string;
  sha256: string;
  bytes: number;
}

export interface Manifest {
  format: "steradian-backup-1";
  createdAt: string;
  database: FileEntry;
  files: FileEntry[];
}

export function requireSettings(): { databaseUrl: string; storageDir: string } {
  const databaseUrl = process.env.DATABASE_URL;
  const storageDir = process.env.STORAGE_DIR;
  if (!databaseUrl || !storageDir) {
    console.error("Set DATABASE_URL and STORAGE_DIR to the installation's own (as `npm start` does).");
    process.exit(2);
  }
  if ((process.env.STORAGE_DRIVER ?? "local") !== "local") {
    console.error("Only local storage is backed up here: back an S3 bucket up with the provider's own versioning or replication.");
    process.exit(2);
  }
  return { databaseUrl, storageDir: path.resolve(storageDir) };
}

/** A PostgreSQL client tool of the installed server's version (Debian keeps them off PATH). */
export function pgTool(name: "pg_dump" | "pg_restore" | "psql"): string {
  const dirs = [process.env.PG_BIN, "/usr/lib/postgresql/15/bin", ...(existsSync("/usr/lib/postgresql") ? readdirSync("/usr/lib/postgresql").sort().reverse().map((v) => `/usr/lib/postgresql/${v}/bin`) : [])];
  for (const dir of dirs) if (dir && existsSync(path.join(dir, name))) return path.join(dir, name);
  return name;
}

export async function run(command: string, args: string[]): Promise<string> {
  try {
    const { stdout } = await promisify(execFile)(command, args, { maxBuffer: 64 * 1024 * 1024 });
    return stdout;
  } catch (e) {
    const err = e as { stderr?: string; message: string };
    throw new Error(`${path.basename(command)} failed: ${err.stderr?.trim() || err.message}`);
  }
}

export function sha256File(file: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const hash = createHash("sha256");
    createReadStream(file).on("data", (d) => hash.update(d)).on("error", reject).on("end", () => resolve(hash.digest("hex")));
  });
}

export async function describeFile(root: string, relative: string): Promise<FileEntry> {
  const full = path.join(root, relative);
  return { path: relative, sha256: await sha256File(full), bytes: (await stat(full)).size };
}

/** Every file under `root`, relative with "/", sorted; the temporary area is left out. */
export function listStoredFiles(root: string): string[] {
  if (!existsSync(root)) return [];
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      const rel = path.relative(root, full).split(path.sep).join("/");
      if (rel === "tmp") continue;
      if (entry.isDirectory()) walk(full);
      else if (entry.isFile()) out.push(rel);
    }
  };
  walk(root);
  return out.sort();
}

export async function copyStoredFiles(from: string, to: string): Promise<FileEntry[]> {
  const entries: FileEntry[] = [];
  for (const rel of listStoredFiles(from)) {
    const target = path.join(to, rel);
    await mkdir(path.dirname(target), { recursive: true });
    await copyFile(path.join(from, rel), target);
    entries.push(await describeFile(to, rel));
  }
  return entries;
}

export async function writeManifest(folder: string, manifest: Manifest): Promise<void> {
  await writeFile(path.join(folder, "manifest.json"), `${JSON.stringify(manifest, null, 2)}\n`);
}

/** The manifest, after checking every file it names against its hash. */
export async function readVerifiedManifest(folder: string): Promise<Manifest> {
  const manifest = JSON.parse(await readFile(path.join(folder, "manifest.json"), "utf8")) as Manifest;
  if (manifest.format !== "steradian-backup-1") throw new Error(`${folder} is not a Steradian backup (manifest format ${String(manifest.format)})`);
  const check = async (root: string, entry: FileEntry) => {
    const got = await describeFile(root, entry.path);
    if (got.sha256 !== entry.sha256 || got.bytes !== entry.bytes) throw new Error(`${entry.path} in the backup does not match its manifest entry (damaged or changed)`);
  };
  await check(folder, manifest.database);
  for (const f of manifest.files) await check(path.join(folder, "files"), f);
  return manifest;
}

// End-to-end ingest through the HTTP upload (receive, stream-parse, validate, normalise, hash,
// COPY into PostgreSQL), against the floor of loading the same normalised rows with psql's
// \copy into an equivalent table, alternating, in the same run. Started by bench-ingest.sh.
import { execFileSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import { createWriteStream, openAsBlob, readFileSync, writeFileSync } from "node:fs";
import { mkdtemp, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import bcrypt from "bcryptjs";
import { Kysely, PostgresDialect, sql } from "kysely";
import pg from "pg";
import type { Database } from "../db/types";

const APP = process.env.BENCH_APP_URL!;
const SERVER_PID = Number(process.env.BENCH_SERVER_PID);
const SIZES = (process.argv.slice(2).length ? process.argv.slice(2) : ["100000", "1000000"]).map(Number);
const REPEATS = Number(process.env.BENCH_REPEATS ?? 2);

const db = new Kysely<Database>({ dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 }) }) });

function peakRssMb(): number {
  const m = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${SERVER_PID}/status`, "utf8"));
  return Number(m![1]) / 1024;
}
function resetPeakRss(): void {
  // Writing 5 to clear_refs resets the peak resident set size (Linux, proc(5)).
  writeFileSync(`/proc/${SERVER_PID}/clear_refs`, "5");
}

/** Synthetic angular rows (invented numbers): θ strictly increasing inside (0°, 180°). */
async function writeCsv(file: string, n: number): Promise<void> {
  const out = createWriteStream(file);
  out.write("theta,dsigma,stat,syst\n");
  let chunk = "";
  for (let i = 0; i < n; i++) {
    const theta = (180 * (i + 0.5)) / n;
    chunk += `${theta.toFixed(7)},${(1 + (i % 97) / 100).toFixed(4)},0.01,0.02\n`;
    if (chunk.length > 1 << 16) {
      if (!out.write(chunk)) await new Promise<void>((r) => out.once("drain", () => r()));
      chunk = "";
    }
  }
  out.end(chunk);
  await new Promise<void>((r) => out.on("finish", () => r()));
}

async function setUp() {
  const email = `bench-${randomBytes(4).toString("hex")}@example.org`;
  const password = "bench password 2026";
  const user = await db.insertInto("app_user").values({ email, name: "Bench", password_hash: bcrypt.hashSync(password, 4), status: "active" }).returning("id").executeTakeFirstOrThrow();
  const ms = await db.insertInto("manuscript").values({ title: "Ingest benchmark (synthetic)", created_by: user.id }).returning("id").executeTakeFirstOrThrow();
  await db.insertInto("membership").values({ manuscript_id: ms.id, user_id: user.id, role: "corresponding" }).execute();
  const res = await fetch(`${APP}/sign-in`, { method: "POST", body: new URLSearchParams({ email, password }), redirect: "manual" });
  const cookie = res.headers.getSetCookie()[0].split(";")[0];
  return { userId: user.id, manuscriptId: ms.id, cookie };
}

async function newDataset(ctx: { manuscriptId: string; cookie: string }, name: string): Promise<string> {
  const res = await fetch(`${APP}/api/v1/manuscripts/${ctx.manuscriptId}/datasets`, {
    method: "POST", headers: { Cookie: ctx.cookie, "content-type": "application/json" },
    body: JSON.stringify({ name, quantity: { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "nb/sr" } }, mapping: { x: "theta", y: "dsigma", stat: { kind: "symmetric", column: "stat" }, syst: { kind: "symmetric", column: "syst" } } }),
  });
  if (res.status !== 201) throw new Error(`dataset: ${res.status} ${await res.text()}`);
  return ((await res.json()) as { dataset: { id: string } }).dataset.id;
}

async function uploadOnce(ctx: { manuscriptId: string; cookie: string }, file: string, n: number, run: number) {
  const datasetId = await newDataset(ctx, `bench ${n} #${run} ${randomBytes(3).toString("hex")}`);
  const form = new FormData();
  form.set("file", await openAsBlob(file, { type: "text/csv" }), path.basename(file));
  resetPeakRss();
  const t0 = performance.now();
  const res = await fetch(`${APP}/api/v1/manuscripts/${ctx.manuscriptId}/datasets/${datasetId}/revisions`, { method: "POST", headers: { Cookie: ctx.cookie }, body: form });
  const body = await res.text();
  const ms = performance.now() - t0;
  if (res.status !== 201) throw new Error(`upload of ${n} rows: ${res.status} ${body.slice(0, 400)}`);
  const rev = (JSON.parse(body) as { revision: { id: string; rowCount: number } }).revision;
  if (rev.rowCount !== n) throw new Error(`stored ${rev.rowCount} rows, expected ${n}`);
  return { ms, rssMb: peakRssMb(), revisionId: rev.id };
}

/** The floor: the same normalised rows, as COPY text, loaded by psql's \copy into a plain table. */
async function copyFloor(tsv: string) {
  await sql`DROP TABLE IF EXISTS bench_floor`.execute(db);
  await sql`CREATE TABLE bench_floor (LIKE dataset_row INCLUDING DEFAULTS INCLUDING CONSTRAINTS INCLUDING INDEXES)`.execute(db);
  const url = new URL(process.env.DATABASE_URL!);
  const t0 = performance.now();
  execFileSync("psql", ["-X", "-q", "-v", "ON_ERROR_STOP=1", "-h", url.hostname, "-p", url.port, "-U", url.username, "-d", url.pathname.slice(1), "-c", `\\copy bench_floor FROM '${tsv}'`], {
    env: { ...process.env, PGPASSWORD: decodeURIComponent(url.password) },
  });
  return performance.now() - t0;
}

async function exportNormalised(revisionId: string, tsv: string) {
  const url = new URL(process.env.DATABASE_URL!);
  execFileSync("psql", ["-X", "-q", "-h", url.hostname, "-p", url.port, "-U", url.username, "-d", url.pathname.slice(1), "-c", `\\copy (SELECT * FROM dataset_row WHERE revision_id = '${revisionId}' ORDER BY idx) TO '${tsv}'`], {
    env: { ...process.env, PGPASSWORD: decodeURIComponent(url.password) },
  });
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function main() {
  const dir = await mkdtemp(path.join(tmpdir(), "steradian-bench-"));
  const ctx = await setUp();
  const figures: Record<string, number> = {};
  const table: string[] = [];
  try {
    for (const n of SIZES) {
      const file = path.join(dir, `rows-${n}.csv`);
      await writeCsv(file, n);
      const tsv = path.join(dir, `rows-${n}.tsv`);
      const ours: number[] = [];
      const floors: number[] = [];
      const rss: number[] = [];
      for (let run = 0; run < REPEATS; run++) {
        const up = await uploadOnce(ctx, file, n, run);
        ours.push(up.ms);
        rss.push(up.rssMb);
        if (run === 0) await exportNormalised(up.revisionId, tsv);
        floors.push(await copyFloor(tsv));
      }
      const tag = n >= 1e6 ? `${n / 1e6}e6` : `${n / 1e5}e5`;
      figures[`rows_${tag}_upload_s_median`] = Number((median(ours) / 1000).toFixed(3));
      figures[`rows_${tag}_server_peak_rss_mb_max`] = Number(Math.max(...rss).toFixed(1));
      figures[`rows_${tag}_psql_copy_floor_s_median`] = Number((median(floors) / 1000).toFixed(3));
      figures[`rows_${tag}_ratio_vs_floor`] = Number((median(ours) / median(floors)).toFixed(2));
      table.push(`${String(n).padStart(9)}  ${(median(ours) / 1000).toFixed(2).padStart(9)} s  ${Math.max(...rss).toFixed(0).padStart(7)} MB  ${(median(floors) / 1000).toFixed(2).padStart(9)} s  ${(median(ours) / median(floors)).toFixed(2).padStart(6)}×`);
    }
  } finally {
    await rm(dir, { recursive: true, force: true });
    await sql`DROP TABLE IF EXISTS bench_floor`.execute(db);
    await db.destroy();
  }
  console.log(`ingest through HTTP (${REPEATS} runs each, median; goals: 1e6 rows ≤ 20 s, peak RSS ≤ 300 MB, ≤ 3× the psql \\copy floor)`);
  console.log("     rows     upload   peak RSS   \\copy floor   ratio");
  for (const line of table) console.log(line);
  console.log(JSON.stringify(figures));
}

await main();

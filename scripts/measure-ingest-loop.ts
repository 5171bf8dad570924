// How long the event loop is held while a 10⁶-row CSV file is ingested: once with ingestCsv on
// the event loop's own thread, once with ingestCsvOffThread (a worker thread), interleaved
// `--rounds` times (default 2). perf_hooks.monitorEventLoopDelay samples every 5 ms; its
// percentiles are the delays a request arriving during the ingest would wait before being
// looked at. Both ways must give the same hash. No HTTP, no database.
//
//   npx tsx scripts/measure-ingest-loop.ts [--rows 1000000] [--rounds 2]
import { writeFile, mkdtemp, rm } from "node:fs/promises";
import { loadavg, tmpdir } from "node:os";
import path from "node:path";
import { monitorEventLoopDelay } from "node:perf_hooks";
import { parseArgs } from "node:util";
import { closeIngestPool, ingestCsvOffThread } from "../app/.server/datasets/csv/ingest-csv-pool.server";
import { ingestCsv, type IngestOptions, type IngestResult } from "../app/.server/datasets/csv/ingest-csv.server";

const { values } = parseArgs({ options: { rows: { type: "string", default: "1000000" }, rounds: { type: "string", default: "2" } } });
const rows = Number(values.rows);
const rounds = Number(values.rounds);

// The shape bench:load uploads: invented angles and cross sections (synthetic).
const csv = ["theta,dsigma,stat"];
for (let i = 0; i < rows; i++) csv.push(`${(0.1 + (179.8 * i) / rows).toFixed(7)},${(1 + ((i * 7919 + 1) % 1000) / 1000).toFixed(5)},0.05`);
const dir = await mkdtemp(path.join(tmpdir(), "steradian-loop-"));
const file = path.join(dir, "rows.csv");
await writeFile(file, csv.join("\n") + "\n");
csv.length = 0;

const options: IngestOptions = {
  mapping: { x: "theta", y: "dsigma", stat: { kind: "symmetric", column: "stat" } },
  quantity: { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } },
  limits: { maxRows: 5_000_000 },
};

interface Figures { wallMs: number; p50: number; p99: number; max: number; hash: string }
async function run(ingest: (f: string, o: IngestOptions) => Promise<IngestResult>): Promise<Figures> {
  const h = monitorEventLoopDelay({ resolution: 5 });
  h.enable();
  const t0 = performance.now();
  const result = await ingest(file, options);
  const wallMs = performance.now() - t0;
  h.disable();
  if (!result.ok) throw new Error(`the synthetic file was refused: ${JSON.stringify(result).slice(0, 300)}`);
  const ms = (ns: number) => Math.round(ns / 1e5) / 10;
  return { wallMs: Math.round(wallMs), p50: ms(h.percentile(50)), p99: ms(h.percentile(99)), max: ms(h.max), hash: result.hash };
}

// Start the worker once so that its start-up (tsx loading the sources) is not counted.
await ingestCsvOffThread(file, { ...options, limits: { maxRows: 10 } });
const figures: Record<string, number> = {};
const hashes = new Set<string>();
console.log(`${rows.toLocaleString("en")} rows, load average ${loadavg().map((x) => x.toFixed(1)).join(" ")}`);
console.log("round  where           wall ms   loop delay p50 / p99 / max ms");
for (let r = 1; r <= rounds; r++) {
  for (const [key, ingest] of [["event_loop", ingestCsv], ["worker", ingestCsvOffThread]] as const) {
    const f = await run(ingest);
    hashes.add(f.hash);
    console.log(`${String(r).padEnd(7)}${key.padEnd(16)}${String(f.wallMs).padStart(7)}   ${f.p50} / ${f.p99} / ${f.max}`);
    for (const k of ["wallMs", "p50", "p99", "max"] as const) figures[`${key}_${k}_r${r}`] = f[k];
  }
}
await closeIngestPool();
await rm(dir, { recursive: true, force: true });
if (hashes.size !== 1) throw new Error(`the two ways gave different hashes: ${[...hashes].join(", ")}`);
console.log(`same hash every time: ${[...hashes][0]}`);
figures.load_average_1min = Math.round(loadavg()[0] * 10) / 10;
console.log(JSON.stringify(figures));

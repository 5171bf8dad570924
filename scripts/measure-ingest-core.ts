// Times the dataset ingest core alone (no HTTP, no database): streaming CSV read, validation,
// normalisation and hashing of generated synthetic rows. Each size runs in a fresh child
// process so that its peak RSS is its own. The HTTP end-to-end figures come from bench:ingest.
//
//   npx tsx scripts/measure-ingest-core.ts            # 1e5 and 1e6 rows
//   npx tsx scripts/measure-ingest-core.ts 200000     # other sizes
import { execFileSync } from "node:child_process";
import { createWriteStream } from "node:fs";
import { mkdtemp, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { ingestCsv } from "../app/.server/datasets/csv/ingest-csv.server";
import { seededRandom } from "../app/engine/testing/seeded-random";

const MAPPING = {
  x: "theta",
  xLow: "theta_low",
  xHigh: "theta_high",
  y: "dsigma",
  stat: { kind: "symmetric", column: "stat" },
  syst: { kind: "asymmetric", minus: "syst_minus", plus: "syst_plus" },
} as const;
const QUANTITY = { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "nb/sr" } } as const;

/** Invented angular bins over [0°, 180°] with a smooth shape and seeded ±1 % wiggles. */
async function writeSyntheticCsv(file: string, rows: number): Promise<void> {
  const out = createWriteStream(file);
  out.write("theta_low,theta_high,theta,dsigma,stat,syst_minus,syst_plus\n");
  const random = seededRandom(12345);
  let buffer = "";
  for (let i = 0; i < rows; i++) {
    const lo = (i * 180) / rows;
    const hi = ((i + 1) * 180) / rows;
    const x = (lo + hi) / 2;
    const y = (1.2 / (1 + x * x * 1e-3)) * (1 + 0.01 * (random() - 0.5));
    buffer += `${+lo.toPrecision(7)},${+hi.toPrecision(7)},${+x.toPrecision(7)},${y.toPrecision(6)},${(y * 0.03).toPrecision(3)},${(y * 0.02).toPrecision(3)},${(y * 0.025).toPrecision(3)}\n`;
    if (buffer.length > 1 << 16) {
      if (!out.write(buffer)) await new Promise<void>((resolve) => out.once("drain", () => resolve()));
      buffer = "";
    }
  }
  out.end(buffer);
  await new Promise<void>((resolve, reject) => out.on("finish", () => resolve()).on("error", reject));
}

async function child(file: string): Promise<void> {
  let peak = process.memoryUsage().rss;
  const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 10);
  const t0 = performance.now();
  const cpu0 = process.cpuUsage();
  const result = await ingestCsv(file, { mapping: MAPPING, quantity: QUANTITY, limits: { maxRows: 5_000_000 } });
  const ms = performance.now() - t0;
  // CPU time as well as wall time: on a shared machine the wall time also measures the neighbours.
  const cpu = process.cpuUsage(cpu0);
  const cpuMs = (cpu.user + cpu.system) / 1000;
  clearInterval(timer);
  peak = Math.max(peak, process.memoryUsage().rss);
  if (!result.ok) throw new Error(`ingest refused the synthetic file: ${JSON.stringify(result).slice(0, 500)}`);
  process.stdout.write(JSON.stringify({ rows: result.rowCount, ms, cpuMs, peakRssMb: peak / 2 ** 20 }) + "\n");
}

async function main(): Promise<void> {
  const sizes = process.argv.slice(2).map(Number).filter((n) => n > 0);
  const dir = await mkdtemp(path.join(tmpdir(), "steradian-measure-"));
  const figures: Record<string, number> = {};
  try {
    console.log("rows        wall ms     CPU ms      rows/s      peak RSS MiB");
    for (const rows of sizes.length > 0 ? sizes : [100_000, 1_000_000]) {
      const file = path.join(dir, `synthetic-${rows}.csv`);
      await writeSyntheticCsv(file, rows);
      const output = execFileSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), "--child", file], {
        encoding: "utf8",
      });
      const r = JSON.parse(output.trim().split("\n").at(-1) ?? "{}") as { rows: number; ms: number; cpuMs: number; peakRssMb: number };
      console.log(
        `${String(r.rows).padEnd(12)}${r.ms.toFixed(0).padEnd(12)}${r.cpuMs.toFixed(0).padEnd(12)}${Math.round(r.rows / (r.ms / 1000)).toString().padEnd(12)}${r.peakRssMb.toFixed(0)}`,
      );
      figures[`ingest_ms_${rows}`] = Math.round(r.ms);
      figures[`ingest_cpu_ms_${rows}`] = Math.round(r.cpuMs);
      figures[`peak_rss_mb_${rows}`] = Math.round(r.peakRssMb);
    }
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
  console.log(JSON.stringify(figures));
}

if (process.argv[2] === "--child") await child(process.argv[3]);
else await main();

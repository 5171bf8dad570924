// ingestCsvOffThread runs ingestCsv on a worker thread: the result must be the same, field for
// field and byte for byte, as on the calling thread (docs/decisions/0012-hardening.md).
import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { ColumnMapping } from "~/datasets/column-mapping";
import type { QuantityDescription } from "~/datasets/quantity";
import { closeIngestPool, ingestCsvOffThread } from "./ingest-csv-pool.server";
import { ingestCsv, type IngestOptions, type IngestResult } from "./ingest-csv.server";

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), "steradian-ingest-pool-"));
});
afterAll(async () => {
  await closeIngestPool();
  await rm(dir, { recursive: true, force: true });
});

const THETA_NB: QuantityDescription = { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "nb/sr" } };
const SYMMETRIC: ColumnMapping = { x: "theta", y: "y", stat: { kind: "symmetric", column: "stat" } };
const FULL: ColumnMapping = {
  x: "theta", xLow: "lo", xHigh: "hi", y: "y",
  stat: { kind: "symmetric", column: "stat" },
  syst: { kind: "asymmetric", minus: "sm", plus: "sp" },
};

/** Every column's bytes, so that equality is byte-for-byte (NaN and −0 included). */
function comparable(r: IngestResult) {
  if (!r.ok) return r;
  const bytes = (a: Float64Array | null) => (a === null ? null : Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString("base64"));
  return { ...r, columns: Object.fromEntries(Object.entries(r.columns).map(([k, v]) => [k, bytes(v)])) };
}

async function both(name: string, text: string, mapping: ColumnMapping, maxRows = 10_000) {
  const file = path.join(dir, name);
  await writeFile(file, text);
  const options: IngestOptions = { mapping, quantity: THETA_NB, limits: { maxRows } };
  return { here: await ingestCsv(file, options), there: await ingestCsvOffThread(file, options) };
}

describe("ingestCsvOffThread", () => {
  it("returns the same hash and the same column bytes for a file of 5,000 rows", async () => {
    const lines = ["lo,hi,theta,y,stat,sm,sp"];
    for (let i = 0; i < 5000; i++) {
      const lo = (i * 180) / 5000;
      lines.push(`${lo},${lo + 0.036},${lo + 0.018},${(1 / (1 + i)).toPrecision(9)},${0.01 * (1 + (i % 7))},0.002,0.003`);
    }
    const { here, there } = await both("full.csv", lines.join("\r\n") + "\r\n", FULL);
    expect(here.ok).toBe(true);
    expect(comparable(there)).toEqual(comparable(here));
    if (!there.ok) return;
    // A symmetric error is still one array for both fields after the transfer.
    expect(there.columns.statPlus).toBe(there.columns.statMinus);
    expect(there.rowCount).toBe(5000);
  });

  it("returns the same problems, and the same row limit, as on the calling thread", async () => {
    const bad = await both("bad.csv", "theta,y,stat\n30,1.5,0.1\n30,abc,0.1\n;;\n60,-1,0.05\n", SYMMETRIC);
    expect(bad.here.ok).toBe(false);
    expect(bad.there).toEqual(bad.here);
    const long = await both("long.csv", "theta,y,stat\n" + Array.from({ length: 20 }, (_, i) => `${i},1,0.1`).join("\n"), SYMMETRIC, 10);
    expect(long.here).toEqual({ ok: false, reason: "limit", limit: { kind: "rows", max: 10 } });
    expect(long.there).toEqual(long.here);
  });

  it("rejects when the file cannot be read, like ingestCsv", async () => {
    const missing = path.join(dir, "no-such-file.csv");
    const options: IngestOptions = { mapping: SYMMETRIC, quantity: THETA_NB, limits: { maxRows: 10 } };
    await expect(ingestCsv(missing, options)).rejects.toThrow(/ENOENT/);
    await expect(ingestCsvOffThread(missing, options)).rejects.toThrow(/ENOENT/);
  });
});

import { createHash } from "node:crypto";
import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { ColumnMapping } from "~/datasets/column-mapping";
import { normalFormHeader, normalFormRow, SLOT } from "~/datasets/normal-form";
import type { QuantityDescription } from "~/datasets/quantity";
import { resolveQuantityScales } from "~/datasets/quantity-scales";
import { ingestCsv, type IngestResult } from "./ingest-csv.server";

let dir: string;
let n = 0;
beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), "steradian-prop-"));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

const QUANTITY: QuantityDescription = { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } };
const MAPPING: ColumnMapping = {
  x: "theta",
  xLow: "lo",
  xHigh: "hi",
  y: "y",
  stat: { kind: "symmetric", column: "stat" },
  syst: { kind: "asymmetric", minus: "sm", plus: "sp" },
};
const GOOD = [
  "theta,lo,hi,y,stat,sm,sp,note",
  '15,10,20,2.5,0.1,0.05,0.07,"first, with comma"',
  "25,20,30,1.9,0.09,0.04,0.05,",
  "35,30,40,1.41,0.08,0.04,0.05,plain",
  '45,40,50,1.02,0.07,0.03,0.04,"two',
  'lines"',
  "55,50,60,0.83,0.06,0.03,0.03,x",
  "65,60,70,0.7,0.06,0.02,0.03,y",
  "",
].join("\n");

async function ingestBytes(bytes: Uint8Array): Promise<IngestResult> {
  const file = path.join(dir, `p${n++}.csv`);
  await writeFile(file, bytes);
  return ingestCsv(file, { mapping: MAPPING, quantity: QUANTITY, limits: { maxRows: 10_000 } });
}

/** Everything a result must satisfy, whatever the input. */
function checkInvariants(r: IngestResult): void {
  if (!r.ok) {
    expect(r.reason).toBe("problems");
    if (r.reason !== "problems") return;
    expect(Object.keys(r).sort()).toEqual(["ok", "problemCount", "problems", "reason", "refused"]);
    // The refused lines are read only when asked for (the page asks; these calls do not).
    expect(r.refused).toBeNull();
    expect(r.problems.length).toBeGreaterThan(0);
    expect(r.problems.length).toBeLessThanOrEqual(100);
    expect(r.problemCount).toBeGreaterThanOrEqual(r.problems.length);
    for (const p of r.problems) {
      expect(p.message.length).toBeGreaterThan(0);
      if (p.row !== null) expect(Number.isInteger(p.row) && p.row >= 1).toBe(true);
      if (p.column !== null) expect(Number.isInteger(p.column) && p.column >= 1).toBe(true);
    }
    return;
  }
  const c = r.columns;
  expect(r.rowCount).toBeGreaterThan(0);
  const arrays = [c.x, c.xLow, c.xHigh, c.y, c.statMinus, c.statPlus, c.systMinus, c.systPlus];
  for (const a of arrays) {
    expect(a).not.toBeNull();
    expect(a?.length).toBe(r.rowCount);
    for (const v of a ?? []) expect(Number.isFinite(v)).toBe(true);
  }
  const seen = new Set<string>();
  for (let i = 0; i < r.rowCount; i++) {
    const lo = c.xLow?.[i] ?? NaN;
    const hi = c.xHigh?.[i] ?? NaN;
    expect(c.x[i] >= 0 && c.x[i] <= 180).toBe(true);
    expect(lo <= c.x[i] && c.x[i] <= hi).toBe(true);
    for (const e of [c.statMinus, c.statPlus, c.systMinus, c.systPlus]) expect(e?.[i]).toBeGreaterThanOrEqual(0);
    const key = `${lo}|${hi}`;
    expect(seen.has(key)).toBe(false);
    seen.add(key);
  }
  // The hash must be the documented normal form of exactly the returned columns.
  let text = normalFormHeader(MAPPING, QUANTITY, resolveQuantityScales(QUANTITY));
  const slots = [SLOT.x, SLOT.xLow, SLOT.xHigh, SLOT.y, SLOT.statMinus, SLOT.systMinus, SLOT.systPlus];
  const values = new Float64Array(8);
  for (let i = 0; i < r.rowCount; i++) {
    arrays.forEach((a, s) => (values[s] = a?.[i] ?? NaN));
    text += normalFormRow(values, slots);
  }
  expect(r.hash).toBe(createHash("sha256").update(text).digest("hex"));
}

const INTERESTING = [",", ";", "\t", '"', "\n", "\r", "\r\n", "-", ".", "e", "1,5", "NaN", "", " ", "é", "\ufeff", "0", "999"];

type Mutation =
  | { kind: "delete"; at: number; length: number }
  | { kind: "insert"; at: number; text: string }
  | { kind: "bytes"; at: number; bytes: Uint8Array }
  | { kind: "duplicate-line"; line: number }
  | { kind: "drop-line"; line: number }
  | { kind: "truncate"; at: number };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant("delete" as const), at: fc.nat(), length: fc.integer({ min: 1, max: 4 }) }),
  fc.record({ kind: fc.constant("insert" as const), at: fc.nat(), text: fc.oneof(fc.constantFrom(...INTERESTING), fc.string({ maxLength: 3 })) }),
  fc.record({ kind: fc.constant("bytes" as const), at: fc.nat(), bytes: fc.uint8Array({ minLength: 1, maxLength: 3 }) }),
  fc.record({ kind: fc.constant("duplicate-line" as const), line: fc.nat() }),
  fc.record({ kind: fc.constant("drop-line" as const), line: fc.nat() }),
  fc.record({ kind: fc.constant("truncate" as const), at: fc.nat() }),
);

function applyMutations(base: string, mutations: Mutation[]): Uint8Array {
  let bytes = Buffer.from(base, "utf8");
  for (const m of mutations) {
    const at = (k: number) => (bytes.length === 0 ? 0 : k % (bytes.length + 1));
    if (m.kind === "delete") bytes = Buffer.concat([bytes.subarray(0, at(m.at)), bytes.subarray(at(m.at) + m.length)]);
    else if (m.kind === "insert") bytes = Buffer.concat([bytes.subarray(0, at(m.at)), Buffer.from(m.text), bytes.subarray(at(m.at))]);
    else if (m.kind === "bytes") bytes = Buffer.concat([bytes.subarray(0, at(m.at)), m.bytes, bytes.subarray(at(m.at))]);
    else if (m.kind === "truncate") bytes = bytes.subarray(0, at(m.at));
    else {
      const lines = bytes.toString("latin1").split("\n");
      const i = m.line % lines.length;
      if (m.kind === "duplicate-line") lines.splice(i, 0, lines[i]);
      else lines.splice(i, 1);
      bytes = Buffer.from(lines.join("\n"), "latin1");
    }
  }
  return bytes;
}

// Hundreds of files per property: generous time, so a loaded machine does not fail them.
const PROPERTY_TIMEOUT_MS = 60_000;

describe("ingestCsv on arbitrary input", () => {
  it("accepts the unmutated file (the mutations start from a good one)", async () => {
    const r = await ingestBytes(Buffer.from(GOOD));
    expect(r.ok && r.rowCount).toBe(6);
    checkInvariants(r);
  });

  it("random bytes give a consistent revision or a non-empty problem list, never an exception", async () => {
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ maxLength: 300 }), async (bytes) => {
        checkInvariants(await ingestBytes(bytes));
      }),
      { numRuns: 150 },
    );
  }, PROPERTY_TIMEOUT_MS);

  it("random text made of CSV-ish pieces behaves the same", async () => {
    const piece = fc.oneof(fc.constantFrom(...INTERESTING, "theta", "lo", "hi", "y", "stat", "sm", "sp"), fc.string({ maxLength: 4 }));
    await fc.assert(
      fc.asyncProperty(fc.array(piece, { maxLength: 60 }), async (pieces) => {
        checkInvariants(await ingestBytes(Buffer.from(pieces.join(""))));
      }),
      { numRuns: 150 },
    );
  }, PROPERTY_TIMEOUT_MS);

  it("mutations of a good file give a consistent revision or problems, never a partial result", async () => {
    let accepted = 0;
    let refused = 0;
    await fc.assert(
      fc.asyncProperty(fc.array(mutation, { minLength: 1, maxLength: 4 }), async (mutations) => {
        const r = await ingestBytes(applyMutations(GOOD, mutations));
        checkInvariants(r);
        if (r.ok) accepted++;
        else refused++;
      }),
      { numRuns: 500 },
    );
    // Both outcomes must actually occur, or the property says little.
    expect(accepted).toBeGreaterThan(0);
    expect(refused).toBeGreaterThan(0);
  }, PROPERTY_TIMEOUT_MS);

  it("reads the refused lines of a mutated file when asked: only lines problems point at, within the caps, never an exception", async () => {
    let shown = 0;
    await fc.assert(
      fc.asyncProperty(fc.array(mutation, { minLength: 1, maxLength: 4 }), async (mutations) => {
        const file = path.join(dir, `p${n++}.csv`);
        await writeFile(file, applyMutations(GOOD, mutations));
        const r = await ingestCsv(file, { mapping: MAPPING, quantity: QUANTITY, limits: { maxRows: 10_000 }, refusedLines: true });
        if (r.ok || r.reason !== "problems" || r.refused === null) return;
        shown++;
        const pointed = new Set(r.problems.flatMap((p) => (p.row !== null && p.column !== null ? [p.row] : [])));
        expect(r.refused.rows.length).toBeGreaterThan(0);
        expect(r.refused.rows.length).toBeLessThanOrEqual(20);
        expect(r.refused.headers.length).toBe(r.refused.columns.length);
        for (const row of r.refused.rows) {
          expect(pointed.has(row.line)).toBe(true);
          expect(row.fields.length).toBe(r.refused.columns.length);
          for (const f of row.fields) expect(f.length).toBeLessThanOrEqual(41);
        }
      }),
      { numRuns: 300 },
    );
    expect(shown).toBeGreaterThan(0);
  }, PROPERTY_TIMEOUT_MS);
});

import { createHash } from "node:crypto";
import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { ColumnMapping } from "~/datasets/column-mapping";
import type { DatasetProblem } from "~/datasets/dataset-problem";
import type { QuantityDescription } from "~/datasets/quantity";
import { ingestCsv, type IngestResult } from "./ingest-csv.server";

const FIXTURES = path.resolve(import.meta.dirname, "../../../../tests/fixtures/csv");
let dir: string;
let fileNo = 0;
beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), "steradian-ingest-"));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

const THETA_NB: QuantityDescription = { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "nb/sr" } };
const SIMPLE: ColumnMapping = { x: "theta", y: "y", stat: { kind: "symmetric", column: "stat" } };
const LIMITS = { maxRows: 1000 };

async function ingestText(
  content: string | Uint8Array,
  mapping: ColumnMapping = SIMPLE,
  quantity: QuantityDescription = THETA_NB,
  limits = LIMITS,
): Promise<IngestResult> {
  const file = path.join(dir, `f${fileNo++}.csv`);
  await writeFile(file, content);
  return ingestCsv(file, { mapping, quantity, limits });
}

function problemsOf(r: IngestResult): DatasetProblem[] {
  if (r.ok || r.reason !== "problems") throw new Error(`expected problems, got ${JSON.stringify(r)}`);
  return r.problems;
}

function hashOf(r: IngestResult): string {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r)}`);
  return r.hash;
}

/** The only problem of a result, checked to be the only one. */
function onlyProblem(r: IngestResult): DatasetProblem {
  const list = problemsOf(r);
  expect(list, JSON.stringify(list)).toHaveLength(1);
  return list[0];
}

describe("ingestCsv: good files", () => {
  it("normalises y and errors into GeV^-2/sr and hashes the documented normal form", async () => {
    const r = await ingestText("theta,y,stat\n30,1.5,0.1\n60,0.75,0.05\n");
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.rowCount).toBe(2);
    expect(Array.from(r.columns.x)).toEqual([30, 60]);
    // 1 nb = 1e-6 mb and (ħc)² = 0.3893793721 GeV² mb: values worked out independently.
    expect(Array.from(r.columns.y)).toEqual([3.85228419243e-6, 1.92614209622e-6]);
    expect(Array.from(r.columns.statMinus ?? [])).toEqual([2.56818946162e-7, 1.28409473081e-7]);
    expect(r.columns.statPlus).toBe(r.columns.statMinus);
    expect(r.columns.xLow).toBeNull();
    expect(r.columns.systMinus).toBeNull();
    const normalForm =
      "steradian-dataset-normal-form/1\n" +
      "x=theta_cm_deg [deg]\n" +
      "y=dsigma_domega [GeV^-2/sr]\n" +
      "columns=x,y,stat\n" +
      "30,0.00000385228419243,2.56818946162e-7\n" +
      "60,0.00000192614209622,1.28409473081e-7\n";
    expect(r.hash).toBe(createHash("sha256").update(normalForm).digest("hex"));
    expect(r.delimiter).toBe(",");
    expect(r.headers).toEqual(["theta", "y", "stat"]);
  });

  it("reads the same points written with BOM, semicolons, CRLF, quotes, other spellings and column order alike", async () => {
    const mapping: ColumnMapping = {
      x: "theta_cm",
      xLow: "theta_lo",
      xHigh: "theta_hi",
      y: "dsigma",
      stat: { kind: "symmetric", column: "stat" },
      syst: { kind: "asymmetric", minus: "syst_minus", plus: "syst_plus" },
    };
    const plain = await ingestCsv(path.join(FIXTURES, "synthetic-angular-comma.csv"), { mapping, quantity: THETA_NB, limits: LIMITS });
    const other = await ingestCsv(path.join(FIXTURES, "synthetic-angular-semicolon-bom-crlf.csv"), {
      mapping: {
        x: "θ (CM)",
        xLow: "θ low",
        xHigh: "θ high",
        y: "dσ/dΩ",
        stat: { kind: "symmetric", column: "stat. err" },
        syst: { kind: "asymmetric", minus: "syst −", plus: "syst +" },
      },
      quantity: THETA_NB,
      limits: LIMITS,
    });
    const inPb = await ingestCsv(path.join(FIXTURES, "synthetic-angular-tab-pb.csv"), {
      mapping: {
        x: "theta",
        xLow: "low",
        xHigh: "high",
        y: "y_pb",
        stat: { kind: "symmetric", column: "stat_pb" },
        syst: { kind: "asymmetric", minus: "sm_pb", plus: "sp_pb" },
      },
      quantity: { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "pb/sr" } },
      limits: LIMITS,
    });
    expect(plain.ok && plain.rowCount).toBe(8);
    expect(other.ok && other.delimiter).toBe(";");
    expect(inPb.ok && inPb.delimiter).toBe("\t");
    expect(hashOf(other)).toBe(hashOf(plain));
    expect(hashOf(inPb)).toBe(hashOf(plain));
    if (plain.ok && other.ok) expect(Array.from(other.columns.systPlus ?? [])).toEqual(Array.from(plain.columns.systPlus ?? []));
  });

  it("gives a different hash for a changed value, a changed x kind, a changed y kind and a dropped column", async () => {
    const base = hashOf(await ingestText("theta,y,stat\n30,1.5,0.1\n60,0.75,0.05\n"));
    expect(hashOf(await ingestText("theta,y,stat\n30,1.5,0.1\n60,0.76,0.05\n"))).not.toBe(base);
    expect(hashOf(await ingestText("theta,y,stat\n60,0.75,0.05\n30,1.5,0.1\n"))).not.toBe(base);
    const lab: QuantityDescription = { ...THETA_NB, x: { kind: "theta_lab_deg" } };
    expect(hashOf(await ingestText("theta,y,stat\n30,1.5,0.1\n60,0.75,0.05\n", SIMPLE, lab))).not.toBe(base);
    const perCos: QuantityDescription = { ...THETA_NB, y: { kind: "dsigma_dcos", unit: "nb" } };
    expect(hashOf(await ingestText("theta,y,stat\n30,1.5,0.1\n60,0.75,0.05\n", SIMPLE, perCos))).not.toBe(base);
    expect(hashOf(await ingestText("theta,y,stat\n30,1.5,0.1\n60,0.75,0.05\n", { x: "theta", y: "y" }))).not.toBe(base);
  });

  it("keeps the hash when a column is renamed or an unmapped column is added", async () => {
    const base = hashOf(await ingestText("theta,y,stat\n30,1.5,0.1\n60,0.75,0.05\n"));
    const renamed = await ingestText("angle,xs,err\n30,1.5,0.1\n60,0.75,0.05\n", {
      x: "angle",
      y: "xs",
      stat: { kind: "symmetric", column: "err" },
    });
    expect(hashOf(renamed)).toBe(base);
    expect(hashOf(await ingestText('note,theta,y,stat\n"first, point",30,1.5,0.1\nsecond,60,0.75,0.05\n'))).toBe(base);
  });

  it("converts energies and t into GeV and GeV^2", async () => {
    const r = await ingestText("E,y\n500,1\n1500,2\n", { x: "E", y: "y" }, { x: { kind: "beam_energy", unit: "MeV" }, y: { kind: "sigma", unit: "GeV^-2" } });
    expect(r.ok && Array.from(r.columns.x)).toEqual([0.5, 1.5]);
    const t = await ingestText("t,y\n-250000,1\n0,2\n", { x: "t", y: "y" }, { x: { kind: "t", unit: "MeV^2" }, y: { kind: "dsigma_dt", unit: "GeV^-4" } });
    expect(t.ok && Array.from(t.columns.x)).toEqual([-0.25, 0]);
  });

  it("skips blank lines, including a missing or doubled final line end", async () => {
    const a = await ingestText("theta,y,stat\n30,1.5,0.1\n\n60,0.75,0.05");
    const b = await ingestText("theta,y,stat\r\n30,1.5,0.1\r\n60,0.75,0.05\r\n\r\n");
    expect(hashOf(a)).toBe(hashOf(b));
    expect(a.ok && a.rowCount).toBe(2);
  });
});

describe("ingestCsv: problems, each on its line and column", () => {
  it("not a number", async () => {
    const p = onlyProblem(await ingestText("theta,y,stat\n30,1.5,0.1\n45,abc,0.1\n"));
    expect(p).toMatchObject({ code: "not-a-number", row: 3, column: 2, header: "y" });
    expect(p.message).toContain('"abc" is not a number');
  });

  it("not a number in a unit that shifts the exponent up (\"0x\" must not read as hexadecimal)", async () => {
    const cm2: QuantityDescription = { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "cm^2/sr" } };
    const p = onlyProblem(await ingestText("theta,y\n30,1e-33\n45,0x\n", { x: "theta", y: "y" }, cm2));
    expect(p).toMatchObject({ code: "not-a-number", row: 3, column: 2 });
  });

  it("a decimal comma in a semicolon file, saying a decimal point is expected", async () => {
    const p = onlyProblem(await ingestText("theta;y;stat\n30;1.5;0.1\n45;1,2;0.1\n"));
    expect(p).toMatchObject({ code: "decimal-comma", row: 3, column: 2, header: "y" });
    expect(p.message).toContain("decimal point");
    expect(p.message).toContain("1.2");
  });

  it("a decimal comma in a comma file is a ragged row that hints at the comma", async () => {
    const p = onlyProblem(await ingestText("theta,y,stat\n30,1,5,0.1\n"));
    expect(p).toMatchObject({ code: "ragged-row", row: 2, column: null });
    expect(p.message).toContain("4 fields, the header has 3");
    expect(p.message).toContain("decimal comma");
  });

  it("NaN and infinity", async () => {
    const list = problemsOf(await ingestText("theta,y,stat\n30,NaN,0.1\n45,1.2,inf\n"));
    expect(list.map((p) => [p.code, p.row, p.column])).toEqual([
      ["not-finite", 2, 2],
      ["not-finite", 3, 3],
    ]);
  });

  it("an empty field, with the advice to write 0 for an error", async () => {
    const list = problemsOf(await ingestText("theta,y,stat\n30,,0.1\n45,1.2,\n"));
    expect(list.map((p) => [p.code, p.row, p.column])).toEqual([
      ["empty-value", 2, 2],
      ["empty-value", 3, 3],
    ]);
    expect(list[1].message).toContain("write 0");
  });

  it("a negative error, symmetric or on the minus side", async () => {
    const mapping: ColumnMapping = { x: "theta", y: "y", stat: { kind: "asymmetric", minus: "sm", plus: "sp" }, syst: { kind: "symmetric", column: "sys" } };
    const list = problemsOf(await ingestText("theta,y,sm,sp,sys\n30,1.5,-0.1,0.1,0.02\n45,1.2,0.1,0.1,-0.03\n", mapping));
    expect(list.map((p) => [p.code, p.row, p.column, p.header])).toEqual([
      ["negative-error", 2, 3, "sm"],
      ["negative-error", 3, 5, "sys"],
    ]);
    expect(list[0].message).toContain("write its size, 0.1");
    expect(list[0].message).toContain("minus column holds a magnitude");
  });

  it("a bin whose low edge is above its high edge", async () => {
    const mapping: ColumnMapping = { x: "theta", xLow: "lo", xHigh: "hi", y: "y" };
    const p = onlyProblem(await ingestText("theta,lo,hi,y\n30,25,35,1\n45,50,40,1\n", mapping));
    expect(p).toMatchObject({ code: "bin-order", row: 3, column: 2, header: "lo" });
    expect(p.message).toContain("swap");
  });

  it("x outside its bin", async () => {
    const mapping: ColumnMapping = { x: "theta", xLow: "lo", xHigh: "hi", y: "y" };
    const p = onlyProblem(await ingestText("theta,lo,hi,y\n30,25,35,1\n36,40,50,1\n", mapping));
    expect(p).toMatchObject({ code: "x-outside-bin", row: 3, column: 1 });
  });

  it.each([
    ["θ above 180°", { kind: "theta_cm_deg" }, "190", "outside [0°, 180°]"],
    ["θ below 0°", { kind: "theta_lab_deg" }, "-1", "outside [0°, 180°]"],
    ["|cosθ| > 1", { kind: "cos_theta" }, "1.2", "outside [−1, 1]"],
    ["t > 0", { kind: "t", unit: "GeV^2" }, "0.1", "positive"],
    ["√s = 0", { kind: "sqrt_s", unit: "GeV" }, "0", "must be positive"],
    ["a negative beam energy", { kind: "beam_energy", unit: "MeV" }, "-5", "must be positive"],
    ["a zero kinetic energy", { kind: "beam_kinetic", unit: "keV" }, "0", "must be positive"],
  ] as const)("x outside its domain: %s", async (_name, x, value, words) => {
    const quantity: QuantityDescription = { x, y: { kind: "sigma", unit: "nb" } };
    const p = onlyProblem(await ingestText(`x,y\n${value},1\n`, { x: "x", y: "y" }, quantity));
    expect(p).toMatchObject({ code: "out-of-domain", row: 2, column: 1, header: "x" });
    expect(p.message).toContain(words);
  });

  it("accepts the domain's edges", async () => {
    const r = await ingestText("x,y\n0,1\n180,1\n", { x: "x", y: "y" });
    expect(r.ok).toBe(true);
    const c = await ingestText("x,y\n-1,1\n1,1\n", { x: "x", y: "y" }, { x: { kind: "cos_theta" }, y: { kind: "dsigma_dcos", unit: "nb" } });
    expect(c.ok).toBe(true);
  });

  it("a duplicate x, written differently, pointing at the first line", async () => {
    const p = onlyProblem(await ingestText("theta,y,stat\n30,1.5,0.1\n45,1.2,0.1\n30.0,1.4,0.1\n"));
    expect(p).toMatchObject({ code: "duplicate-x", row: 4, column: 1, header: "theta" });
    expect(p.message).toContain("already appears on line 2");
  });

  it("a duplicate bin, though x differs", async () => {
    const mapping: ColumnMapping = { x: "theta", xLow: "lo", xHigh: "hi", y: "y" };
    const p = onlyProblem(await ingestText("theta,lo,hi,y\n30,25,35,1\n31,25,35,1\n", mapping));
    expect(p).toMatchObject({ code: "duplicate-x", row: 3, column: 2, header: "lo" });
    expect(p.message).toContain("the bin [25°, 35°]");
  });

  it("an empty file, and one that holds only a byte order mark and blank lines", async () => {
    expect(onlyProblem(await ingestText(""))).toMatchObject({ code: "empty-file", row: null });
    expect(onlyProblem(await ingestText("\ufeff\n\n"))).toMatchObject({ code: "empty-file", row: null });
  });

  it("a header without data rows", async () => {
    expect(onlyProblem(await ingestText("theta,y,stat\n"))).toMatchObject({ code: "no-data-rows" });
  });

  it("a mapped column missing from the header", async () => {
    const p = onlyProblem(await ingestText("theta,dsigma,stat\n30,1.5,0.1\n"));
    expect(p).toMatchObject({ code: "header-missing", row: 1, column: null, header: "y" });
    expect(p.message).toContain('"theta", "dsigma", "stat"');
  });

  it("a header line that is data", async () => {
    const p = onlyProblem(await ingestText("30,1.5,0.1\n45,1.2,0.1\n"));
    expect(p).toMatchObject({ code: "header-numeric", row: 1 });
    expect(p.message).toContain("looks like data");
  });

  it("a mapped column name that appears twice", async () => {
    const p = onlyProblem(await ingestText("theta,y,y,stat\n30,1.5,1.5,0.1\n"));
    expect(p).toMatchObject({ code: "header-duplicate", row: 1, column: 3, header: "y" });
  });

  it("a ragged row with fewer fields", async () => {
    const p = onlyProblem(await ingestText("theta,y,stat\n30,1.5,0.1\n45,1.2\n60,1,0.1\n"));
    expect(p).toMatchObject({ code: "ragged-row", row: 3 });
    expect(p.message).toContain("2 fields, the header has 3");
  });

  it("a file that is not UTF-8, on the line of the first bad byte", async () => {
    const p = onlyProblem(await ingestCsv(path.join(FIXTURES, "synthetic-latin1.csv"), { mapping: SIMPLE, quantity: THETA_NB, limits: LIMITS }));
    expect(p).toMatchObject({ code: "not-utf8", row: 1 });
    const later = Buffer.concat([Buffer.from("theta,y,stat\n30,1.5,0.1\n45,1.2,0.1\n60,0.9,0.1 "), Buffer.from([0xe9]), Buffer.from("\n")]);
    expect(onlyProblem(await ingestText(later))).toMatchObject({ code: "not-utf8", row: 4 });
  });

  it("a UTF-8 sequence cut off by the end of the file", async () => {
    const cut = Buffer.concat([Buffer.from("theta,y,stat\n30,1.5,0.1\nnote "), Buffer.from([0xe2, 0x82])]);
    expect(onlyProblem(await ingestText(cut))).toMatchObject({ code: "not-utf8", row: 3 });
  });

  it("counts the lines of quoted fields that span lines, with LF and with CRLF", async () => {
    const mapping: ColumnMapping = { x: "theta", y: "y" };
    for (const eol of ["\n", "\r\n"]) {
      const text = ["note,theta,y", '"two', 'lines",30,1', '"three', "", 'lines",45,x', "ok,60,1", ""].join(eol);
      const p = onlyProblem(await ingestText(text, mapping));
      expect(p, JSON.stringify(eol)).toMatchObject({ code: "not-a-number", row: 4, column: 3 });
      const after = onlyProblem(await ingestText(text.replace(",x", ",1").replace("ok,60,1", "ok,60,y"), mapping));
      expect(after, JSON.stringify(eol)).toMatchObject({ row: 7 });
    }
  });

  it("a quoted field that is never closed", async () => {
    const p = onlyProblem(await ingestText('theta,y,stat\n30,1.5,0.1\n45,"1.2,0.1\n'));
    expect(p).toMatchObject({ code: "csv-syntax" });
    expect(p.message).toContain("never closed");
  });

  it("lists the first 100 problems in file order with the total count", async () => {
    const lines = ["theta,y,stat"];
    for (let i = 0; i < 250; i++) lines.push(`${i * 0.5},bad,0.1`);
    const r = await ingestText(lines.join("\n"));
    expect(r.ok).toBe(false);
    if (r.ok || r.reason !== "problems") return;
    expect(r.problemCount).toBe(250);
    expect(r.problems).toHaveLength(100);
    expect(r.problems[0].row).toBe(2);
    expect(r.problems[99].row).toBe(101);
  });

  it("stops at the row limit with a distinct result naming it", async () => {
    const lines = ["theta,y,stat"];
    for (let i = 0; i < 11; i++) lines.push(`${i},1,0.1`);
    expect(await ingestText(lines.join("\n"), SIMPLE, THETA_NB, { maxRows: 10 })).toEqual({
      ok: false,
      reason: "limit",
      limit: { kind: "rows", max: 10 },
    });
    expect((await ingestText(lines.slice(0, 11).join("\n"), SIMPLE, THETA_NB, { maxRows: 10 })).ok).toBe(true);
  });
});

describe("ingestCsv: the same numbers in another unit of the same family", () => {
  it("give the same hash for thousands of rows, in nb/sr and pb/sr, in GeV and MeV", async () => {
    // Seeded invented values with 6 significant digits; the pb/sr file writes the same digits
    // with the decimal exponent raised by 3, the MeV file likewise for x.
    let seed = 7;
    const random = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const nb = ["E,y,stat"];
    const pb = ["E,y,stat"];
    for (let i = 0; i < 5000; i++) {
      const e = (1 + i) * 0.001 + Math.floor(random() * 1000) * 1e-7;
      const m = Math.floor(100000 + random() * 900000);
      const s = Math.floor(100 + random() * 900);
      const p = -Math.floor(random() * 8);
      nb.push(`${+e.toFixed(7)},${m}e${p},${s}e${p - 3}`);
      pb.push(`${+e.toFixed(7)}e3,${m}e${p + 3},${s}e${p}`);
    }
    const mapping: ColumnMapping = { x: "E", y: "y", stat: { kind: "symmetric", column: "stat" } };
    const inNb = await ingestText(nb.join("\n"), mapping, { x: { kind: "sqrt_s", unit: "GeV" }, y: { kind: "sigma", unit: "nb" } }, { maxRows: 10_000 });
    const inPb = await ingestText(pb.join("\n"), mapping, { x: { kind: "sqrt_s", unit: "MeV" }, y: { kind: "sigma", unit: "pb" } }, { maxRows: 10_000 });
    if (inNb.ok && inPb.ok) {
      const differing = inNb.columns.y.filter((v, i) => v !== inPb.columns.y[i]).length;
      const differingX = inNb.columns.x.filter((v, i) => v !== inPb.columns.x[i]).length;
      expect({ differing, differingX }).toEqual({ differing: 0, differingX: 0 });
    }
    expect(hashOf(inPb)).toBe(hashOf(inNb));
  });
});

describe("ingestCsv: bins without a centre column (docs/decisions/0013-bins-without-a-centre.md)", () => {
  const EDGES: ColumnMapping = { xLow: "lo", xHigh: "hi", y: "y" };

  it("stores each bin's centre as x and hashes only what the file gives", async () => {
    const r = await ingestText("lo,hi,y\n20,30,1.5\n30,45,0.75\n", EDGES);
    if (!r.ok) throw new Error(JSON.stringify(r));
    // Midpoints worked by hand: (20 + 30)/2 and (30 + 45)/2.
    expect(Array.from(r.columns.x)).toEqual([25, 37.5]);
    expect(Array.from(r.columns.xLow ?? [])).toEqual([20, 30]);
    expect(Array.from(r.columns.xHigh ?? [])).toEqual([30, 45]);
    // The y values of the first test above (1.5 and 0.75 nb/sr); no x column in the normal form.
    const normalForm =
      "steradian-dataset-normal-form/1\n" +
      "x=theta_cm_deg [deg]\n" +
      "y=dsigma_domega [GeV^-2/sr]\n" +
      "columns=x_low,x_high,y\n" +
      "20,30,0.00000385228419243\n" +
      "30,45,0.00000192614209622\n";
    expect(r.hash).toBe(createHash("sha256").update(normalForm).digest("hex"));
  });

  it("is another revision than the same bins with their centres written out", async () => {
    const derived = await ingestText("lo,hi,y\n20,30,1.5\n", EDGES);
    const given = await ingestText("x,lo,hi,y\n25,20,30,1.5\n", { x: "x", ...EDGES });
    if (!derived.ok || !given.ok) throw new Error("expected both to be stored");
    expect(Array.from(derived.columns.x)).toEqual(Array.from(given.columns.x));
    expect(derived.hash).not.toBe(given.hash);
  });

  it("takes the centre in the file's variable after its unit: t bins in MeV² give centres in GeV²", async () => {
    const r = await ingestText("t_lo,t_hi,y\n-250000,-90000,1\n-90000,-10000,2\n", { xLow: "t_lo", xHigh: "t_hi", y: "y" }, { x: { kind: "t", unit: "MeV^2" }, y: { kind: "dsigma_dt", unit: "GeV^-4" } });
    if (!r.ok) throw new Error(JSON.stringify(r));
    // −0.25 and −0.09 GeV² → −0.17; −0.09 and −0.01 → −0.05 (worked by hand).
    expect(Array.from(r.columns.x)).toEqual([-0.17, -0.05]);
  });

  it("still refuses swapped edges and repeated bins, at the edge's column", async () => {
    const swapped = onlyProblem(await ingestText("lo,hi,y\n30,20,1\n", EDGES));
    expect(swapped).toMatchObject({ code: "bin-order", row: 2, column: 1, header: "lo" });
    const repeated = onlyProblem(await ingestText("lo,hi,y\n20,30,1\n20,30,2\n", EDGES));
    expect(repeated).toMatchObject({ code: "duplicate-x", row: 3, column: 1 });
    expect(repeated.message).toContain("the bin [20°, 30°] already appears on line 2");
  });
});

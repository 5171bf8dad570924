import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { previewCsv, readRefusedLines } from "./preview-csv.server";

const FIXTURES = path.resolve(import.meta.dirname, "../../../../tests/fixtures/csv");
let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), "steradian-preview-"));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe("previewCsv", () => {
  it("shows delimiter, header, first rows with their lines and a guess of the mapping", async () => {
    const p = await previewCsv(path.join(FIXTURES, "synthetic-angular-semicolon-bom-crlf.csv"), { rows: 3 });
    expect(p.ok).toBe(true);
    if (!p.ok) return;
    expect(p.delimiter).toBe(";");
    expect(p.headers).toEqual(["dσ/dΩ", "θ low", "θ high", "θ (CM)", "stat. err", "syst −", "syst +"]);
    expect(p.rows).toEqual([
      { line: 2, fields: ["1.5e0", "25.0", "35.0", "30.0", "0.100", "0.050", "0.060"] },
      { line: 3, fields: ["12e-1", "40.0", "50.0", "45.0", "0.080", "0.040", "0.050"] },
      { line: 4, fields: [".95", "55.0", "65.0", "60.0", "0.070", "0.030", "0.040"] },
    ]);
    expect(p.more).toBe(true);
    expect(p.guess.mapping.y).toBe("dσ/dΩ");
    expect(p.guess.mapping.x).toBe("θ (CM)");
    expect(p.guess.xKind).toBe("theta_cm_deg");
  });

  it("says there is no more when every row is shown", async () => {
    const file = path.join(dir, "small.csv");
    await writeFile(file, "x\ty\n1\t2\n");
    const p = await previewCsv(file, { rows: 20 });
    expect(p).toMatchObject({ ok: true, delimiter: "\t", headers: ["x", "y"], rows: [{ line: 2, fields: ["1", "2"] }], more: false });
  });

  it("reports an empty file and a file that is not UTF-8", async () => {
    const empty = path.join(dir, "empty.csv");
    await writeFile(empty, "");
    expect(await previewCsv(empty)).toMatchObject({ ok: false, problems: [{ code: "empty-file" }] });
    expect(await previewCsv(path.join(FIXTURES, "synthetic-latin1.csv"))).toMatchObject({
      ok: false,
      problems: [{ code: "not-utf8", row: 1 }],
    });
  });
});

describe("readRefusedLines", () => {
  const write = async (name: string, text: string) => {
    const file = path.join(dir, name);
    await writeFile(file, text);
    return file;
  };
  const at = (row: number | null, column: number | null) => ({ row, column });

  it("reads the lines problems point at, once each and in file order, with the line numbers an editor shows", async () => {
    // Line 3's quoted field spans lines 3–4, so the next record starts on line 5.
    const file = await write("quoted.csv", 'x,y,note\n1,2,a\n2,3,"two\nlines"\n3,4O,c\n4,5,d\n');
    const r = await readRefusedLines(file, [at(5, 2), at(2, 1), at(5, 1), at(null, null), at(1, null), at(3, null)]);
    expect(r).toEqual({
      columns: [1, 2, 3],
      headers: ["x", "y", "note"],
      columnCount: 3,
      rows: [
        { line: 2, fields: ["1", "2", "a"] },
        { line: 5, fields: ["3", "4O", "c"] },
      ],
    });
  });

  it("is null when no problem points at a data line's cell", async () => {
    const file = await write("plain.csv", "x,y\n1,2\n");
    expect(await readRefusedLines(file, [at(null, null), at(1, 2), at(2, null)])).toBeNull();
  });

  it("shows at most 20 lines, cuts fields at 40 characters, and of a wide file the first 12 columns and the bad ones", async () => {
    const headers = Array.from({ length: 30 }, (_, i) => `c${i + 1}`);
    const long = "9".repeat(50);
    const rows = Array.from({ length: 30 }, (_, i) => headers.map((_, c) => (c === 24 ? long : `${i}.${c}`)).join(","));
    const file = await write("wide.csv", [headers.join(","), ...rows].join("\n") + "\n");
    const problems = Array.from({ length: 30 }, (_, i) => at(i + 2, 25));
    const r = (await readRefusedLines(file, problems))!;
    expect(r.rows.map((x) => x.line)).toEqual(Array.from({ length: 20 }, (_, i) => i + 2));
    expect(r.columns).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 25]);
    expect(r.headers.at(-1)).toBe("c25");
    expect(r.columnCount).toBe(30);
    expect(r.rows[0].fields.at(-1)).toBe("9".repeat(40) + "…");
    expect(r.rows[0].fields[0]).toBe("0.0");
  });
});

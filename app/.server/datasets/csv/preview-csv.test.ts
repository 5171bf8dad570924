import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { previewCsv } from "./preview-csv.server";

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

// The header-line and column-count limits of the CSV reader (docs/decisions/0012-hardening.md).
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { MAX_COLUMNS, readCsvRecords } from "./read-csv-records.server";

const dir = mkdtempSync(path.join(tmpdir(), "steradian-csv-limits-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const file = (name: string, text: string) => {
  const p = path.join(dir, name);
  writeFileSync(p, text);
  return p;
};

describe("CSV reader limits", () => {
  it("refuses a header line of 4·10⁶ characters at the record limit, naming it", async () => {
    let records = 0;
    const outcome = await readCsvRecords(file("long.csv", `${"h".repeat(4_000_000)}\n1,2\n`), () => void records++);
    expect(records).toBe(0);
    expect(outcome.fatal?.code).toBe("csv-syntax");
    expect(outcome.fatal?.message).toContain("longer than 128,000 characters");
  });

  it("refuses a line with more than the column limit, and takes one with exactly the limit", async () => {
    const header = (n: number) => Array.from({ length: n }, (_, i) => `c${i}`).join(",");
    const over = await readCsvRecords(file("wide.csv", `${header(MAX_COLUMNS + 1)}\n`), () => undefined);
    expect(over.fatal).toMatchObject({ code: "too-many-columns", row: 1 });
    expect(over.fatal?.message).toContain(`${(MAX_COLUMNS + 1).toLocaleString("en")} columns`);
    const atLimit = await readCsvRecords(file("limit.csv", `${header(MAX_COLUMNS)}\n`), () => undefined);
    expect(atLimit.fatal).toBeNull();
  });
});

import { describe, expect, it } from "vitest";
import { diffRevisions, type RevisionRow } from "./diff-revisions";

const row = (x: number, y: number, stat: number | null = 0.1, bin?: [number, number]): RevisionRow => ({
  x,
  xLow: bin?.[0] ?? null,
  xHigh: bin?.[1] ?? null,
  y,
  statMinus: stat,
  statPlus: stat,
  systMinus: null,
  systPlus: null,
});

describe("diffRevisions", () => {
  it("finds added, removed, changed and unchanged rows keyed by x", () => {
    const r1 = [row(10, 1), row(20, 2), row(30, 3), row(40, 4)];
    const r2 = [row(10, 1), row(20, 2.5), row(40, 4, 0.2), row(50, 5)];
    const d = diffRevisions({ label: "r1", rows: r1 }, { label: "r2", rows: r2 });
    expect(d.keyedBy).toBe("x");
    expect(d.added).toEqual([row(50, 5)]);
    expect(d.removed).toEqual([row(30, 3)]);
    expect(d.changed).toEqual([
      { old: row(20, 2), new: row(20, 2.5), changes: [{ field: "y", old: 2, new: 2.5 }] },
      {
        old: row(40, 4),
        new: row(40, 4, 0.2),
        changes: [
          { field: "statMinus", old: 0.1, new: 0.2 },
          { field: "statPlus", old: 0.1, new: 0.2 },
        ],
      },
    ]);
    expect(d.unchangedCount).toBe(1);
    expect(d.summary).toBe("r1 → r2: 1 added, 1 removed, 2 changed, 1 unchanged");
  });

  it("keys by bin when both revisions have bins, so a moved x is a change", () => {
    const r1 = [row(15, 1, 0.1, [10, 20]), row(25, 2, 0.1, [20, 30])];
    const r2 = [row(14, 1, 0.1, [10, 20]), row(25, 2, 0.1, [20, 30])];
    const d = diffRevisions({ label: "r3", rows: r1 }, { label: "r4", rows: r2 });
    expect(d.keyedBy).toBe("bin");
    expect(d.changed).toHaveLength(1);
    expect(d.changed[0].changes).toEqual([{ field: "x", old: 15, new: 14 }]);
    expect(d.summary).toBe("r3 → r4: 0 added, 0 removed, 1 changed, 1 unchanged");
  });

  it("sees a removed column as a change of every row", () => {
    const d = diffRevisions({ label: "r1", rows: [row(1, 1, 0.1)] }, { label: "r2", rows: [row(1, 1, null)] });
    expect(d.changed[0].changes.map((c) => c.field)).toEqual(["statMinus", "statPlus"]);
  });

  it("compares identical revisions as all unchanged, and empty against full as all added", () => {
    const rows = [row(1, 1), row(2, 2)];
    expect(diffRevisions({ label: "r1", rows }, { label: "r2", rows }).summary).toBe(
      "r1 → r2: 0 added, 0 removed, 0 changed, 2 unchanged",
    );
    expect(diffRevisions({ label: "r0", rows: [] }, { label: "r1", rows }).summary).toBe(
      "r0 → r1: 2 added, 0 removed, 0 changed, 0 unchanged",
    );
  });

  it("matches repeated keys in order and bounds the listed rows but not the counts", () => {
    const r1 = [row(1, 1), row(1, 2), row(2, 3), row(3, 4)];
    const r2 = [row(1, 1), row(5, 5), row(6, 6), row(7, 7)];
    const d = diffRevisions({ label: "a", rows: r1 }, { label: "b", rows: r2 }, { maxListed: 1 });
    expect(d.addedCount).toBe(3);
    expect(d.added).toEqual([row(5, 5)]);
    expect(d.removedCount).toBe(3);
    expect(d.removed).toEqual([row(1, 2)]);
    expect(d.unchangedCount).toBe(1);
  });
});

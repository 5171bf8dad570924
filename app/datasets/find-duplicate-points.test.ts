import { describe, expect, it } from "vitest";
import { findDuplicatePoints } from "./find-duplicate-points";

describe("findDuplicatePoints", () => {
  it("finds repeated x in file order, pointing at the first occurrence", () => {
    const x = Float64Array.from([30, 40, 30, 50, 40, 30]);
    expect(findDuplicatePoints(x, null, x.length)).toEqual([
      { first: 0, duplicate: 2 },
      { first: 1, duplicate: 4 },
      { first: 0, duplicate: 5 },
    ]);
  });

  it("finds nothing in distinct values and ignores NaN rows", () => {
    const x = Float64Array.from([1, NaN, 2, NaN, 3]);
    expect(findDuplicatePoints(x, null, x.length)).toEqual([]);
  });

  it("treats bins as pairs: the same low edge with another high edge is no duplicate", () => {
    const lo = Float64Array.from([0, 0, 10, 0]);
    const hi = Float64Array.from([10, 20, 20, 10]);
    expect(findDuplicatePoints(lo, hi, 4)).toEqual([{ first: 0, duplicate: 3 }]);
  });

  it("only looks at the first `count` entries", () => {
    const x = Float64Array.from([1, 2, 1]);
    expect(findDuplicatePoints(x, null, 2)).toEqual([]);
  });
});

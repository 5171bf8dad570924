import { describe, expect, it } from "vitest";
import { columnMappingSchema, mappedColumnEntries } from "./column-mapping";

const issues = (input: unknown) => {
  const r = columnMappingSchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
};

describe("columnMappingSchema", () => {
  it("takes bins without an x column: the point is the bin", () => {
    expect(issues({ xLow: "lo", xHigh: "hi", y: "y" })).toEqual([]);
    expect(mappedColumnEntries({ xLow: "lo", xHigh: "hi", y: "y" })).toEqual([["xLow", "lo"], ["xHigh", "hi"], ["y", "y"]]);
  });

  it("asks for x, in words, when there is neither an x column nor a whole bin", () => {
    expect(issues({ y: "y" })).toEqual([{ path: "x", message: "choose the column that holds x, or map both edges of the bin (each point is then plotted at its bin's centre)" }]);
    const half = issues({ xLow: "lo", y: "y" });
    expect(half.map((i) => i.path).sort()).toEqual(["x", "xHigh"]);
    expect(half.find((i) => i.path === "xHigh")?.message).toBe("a bin needs both its low and its high edge: map both columns or neither");
  });

  it("names an empty choice rather than a type", () => {
    expect(issues({ x: "", y: "y" })).toEqual([{ path: "x", message: "choose a column" }]);
    expect(issues({ x: "theta" })).toEqual([{ path: "y", message: "choose a column" }]);
  });
});

import { describe, expect, it } from "vitest";
import { axisPosition, axisTicks, logMinorTicks } from "./axis-ticks";

describe("axis ticks", () => {
  it("takes 1-2-5 steps on a linear axis and labels with the decimals the step needs", () => {
    expect(axisTicks([0, 180], "linear", 6).map((t) => t.tex)).toEqual(["0", "20", "40", "60", "80", "100", "120", "140", "160", "180"]);
    expect(axisTicks([-1, 1], "linear", 5).map((t) => t.tex)).toEqual(["-1.0", "-0.5", "0.0", "0.5", "1.0"]);
    expect(axisTicks([0.8, 1.2], "linear", 3).map((t) => t.tex)).toEqual(["0.8", "0.9", "1.0", "1.1", "1.2"]);
  });

  it("writes very large or small linear values as powers of ten", () => {
    expect(axisTicks([0, 3e6], "linear", 3).map((t) => t.tex)).toEqual(["0", "1 \\times 10^{6}", "2 \\times 10^{6}", "3 \\times 10^{6}"]);
  });

  it("labels whole decades as 10^{n} on a log axis", () => {
    expect(axisTicks([3e-3, 2e2], "log", 5).map((t) => t.tex)).toEqual(["10^{-2}", "10^{-1}", "10^{0}", "10^{1}", "10^{2}"]);
    expect(logMinorTicks([1, 10])).toEqual([2, 3, 4, 5, 6, 7, 8, 9]);
  });

  it("adds 2 and 5 times a decade when the log range is short", () => {
    expect(axisTicks([1, 30], "log", 5).map((t) => t.value)).toEqual([1, 2, 5, 10, 20]);
  });

  it("keeps one label style on a short log axis: plain numbers in 0.01…5000, powers of ten beyond", () => {
    expect(axisTicks([1, 30], "log", 5).map((t) => t.tex)).toEqual(["1", "2", "5", "10", "20"]);
    expect(axisTicks([7e3, 8e4], "log", 5).map((t) => t.tex)).toEqual(["10^{4}", "2 \\times 10^{4}", "5 \\times 10^{4}"]);
  });

  it("places values linearly or logarithmically along the axis", () => {
    expect(axisPosition(90, [0, 180], "linear", 100)).toBe(50);
    expect(axisPosition(10, [1, 100], "log", 100)).toBeCloseTo(50, 12);
  });
});

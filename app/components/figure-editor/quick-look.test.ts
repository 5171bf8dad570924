import { describe, expect, it } from "vitest";
import type { DatasetInputs } from "~/figures/figure-inputs";
import { initialYScale } from "./quick-look";

const inputs = (...ys: number[]): DatasetInputs => ({
  "d/r1": {
    datasetId: "d", datasetName: "d", revisionNumber: 1, revisionId: "r", contentHash: "0", latestRevisionNumber: 1,
    quantity: { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } },
    rows: ys.map((y, i) => ({ x: i, xLow: null, xHigh: null, y, statMinus: null, statPlus: null, systMinus: null, systPlus: null })),
  },
});

describe("the quick look's first y axis", () => {
  it("is log where the values span a decade or more", () => {
    expect(initialYScale("log", inputs(441, 16190))).toBe("log");
    expect(initialYScale("log", inputs(1, 10))).toBe("log");
  });

  it("is linear where a log axis would show one tick at most, or cannot show the values", () => {
    expect(initialYScale("log", inputs(0.81, 1.5))).toBe("linear");
    expect(initialYScale("log", inputs(0, 5, 100))).toBe("linear");
    expect(initialYScale("log", inputs(-1, 5))).toBe("linear");
  });

  it("keeps a linear choice", () => {
    expect(initialYScale("linear", inputs(1, 1000))).toBe("linear");
  });
});

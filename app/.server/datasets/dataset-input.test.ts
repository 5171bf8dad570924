import { describe, expect, it } from "vitest";
import { MappingField, uploadMapping } from "./dataset-input.server";

const MAPPING = { x: "theta", y: "dsigma", stat: { kind: "symmetric", column: "stat" } };

describe("the mapping field of an API upload", () => {
  it("reads a column mapping from JSON text", () => {
    expect(MappingField.parse(JSON.stringify(MAPPING))).toEqual(MAPPING);
  });

  it("takes an absent, blank or non-text field as not sent", () => {
    for (const field of [undefined, null, "", "  \n", new File(["x"], "mapping.json")]) expect(MappingField.parse(field)).toBeUndefined();
  });

  it("uses the sent mapping over the saved one, and the saved one when none is sent", () => {
    const saved = { x: "angle", y: "xs" };
    expect(uploadMapping(JSON.stringify(MAPPING), saved)).toEqual({ ok: true, mapping: MAPPING });
    expect(uploadMapping(null, saved)).toEqual({ ok: true, mapping: saved });
  });

  it("takes a bin's two edges without an x column", () => {
    const edges = { xLow: "theta_lo", xHigh: "theta_hi", y: "dsdo_ub_sr" };
    expect(uploadMapping(JSON.stringify(edges), null)).toEqual({ ok: true, mapping: edges });
  });

  it("names the field of each refusal", () => {
    expect(uploadMapping("{not json", null)).toEqual({ ok: false, code: "invalid-mapping", message: "The “mapping” field is not valid JSON.", field: "mapping" });
    expect(uploadMapping(null, null)).toMatchObject({ ok: false, code: "missing-mapping", field: "mapping" });
    expect(uploadMapping(JSON.stringify({ x: "a", y: "a" }), null)).toMatchObject({ ok: false, code: "invalid-mapping", field: "mapping.y" });
    expect(uploadMapping(JSON.stringify({ x: "a", y: "b", xLow: "lo" }), null)).toMatchObject({ ok: false, code: "invalid-mapping", field: "mapping.xHigh" });
    expect(uploadMapping(null, { x: "" })).toMatchObject({ ok: false, code: "invalid-mapping", field: "mapping.x" });
    // Written for a person, naming the field (not the schema library's "expected string, received undefined").
    expect(uploadMapping(JSON.stringify({ y: "dsdo" }), null)).toEqual({
      ok: false,
      code: "invalid-mapping",
      field: "mapping.x",
      message: "The mapping of x (“x”): choose the column that holds x, or map both edges of the bin (each point is then plotted at its bin's centre).",
    });
    expect(uploadMapping(JSON.stringify({ x: "a", y: "b", stat: { column: "s" } }), null)).toMatchObject({ field: "mapping.stat.kind", message: expect.stringContaining("The mapping of the statistical error") });
  });
});

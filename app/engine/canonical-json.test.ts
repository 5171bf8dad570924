import { describe, expect, it } from "vitest";
import { canonicalJson } from "./canonical-json";

describe("canonicalJson", () => {
  it("sorts keys at every level and writes no whitespace", () => {
    expect(canonicalJson({ b: 1, a: { d: [1, { z: 0, y: 1 }], c: "x" } })).toBe('{"a":{"c":"x","d":[1,{"y":1,"z":0}]},"b":1}');
  });

  it("normalises number spellings: 1, 1.0 and 1e0 give the same text; −0 gives 0", () => {
    const spellings = ['{"x":1}', '{"x":1.0}', '{"x":1e0}', '{"x":10e-1}'].map((t) => canonicalJson(JSON.parse(t)));
    expect(new Set(spellings).size).toBe(1);
    expect(spellings[0]).toBe('{"x":1}');
    expect(canonicalJson({ x: -0 })).toBe('{"x":0}');
    expect(canonicalJson([0.1 + 0.2, 1e21, 5e-324])).toBe("[0.30000000000000004,1e+21,5e-324]");
  });

  it.each([Number.NaN, Infinity, -Infinity, undefined, () => 1, 10n])("rejects %s", (bad) => {
    expect(() => canonicalJson({ a: bad })).toThrow(TypeError);
  });
});

import { describe, expect, it } from "vitest";
import { compose, flattenToPaths, fmt, IDENTITY, parsePath, parseTransform, UnsupportedSvgError, formatPath, type SvgNode } from "./svg-geometry";

const el = (kind: string, attributes: Record<string, string> = {}, children: SvgNode[] = []): SvgNode => ({ kind, attributes, children });

describe("numbers and transforms", () => {
  it("prints at most three decimals and never -0", () => {
    expect([fmt(1.23449), fmt(1.2346), fmt(-0.0004), fmt(0), fmt(-2.5), fmt(1e-9)]).toEqual(["1.234", "1.235", "0", "0", "-2.5", "0"]);
  });

  it("prints the same text as the rounded number printed by JavaScript itself", () => {
    // The independent, slower formulation: round to thousandths, let String() print it.
    const reference = (v: number) => {
      const r = Math.round(v * 1000) / 1000;
      return r === 0 ? "0" : String(r);
    };
    let seed = 12345;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    for (let i = 0; i < 20000; i++) {
      const v = (random() - 0.5) * 10 ** Math.floor(random() * 8 - 3);
      expect(fmt(v), String(v)).toBe(reference(v));
    }
  });

  it("composes a transform list left to right, as SVG applies it (outer first)", () => {
    // translate(10,20) scale(2): the point (1,1) goes to (2,2), then to (12,22) — worked by hand.
    const m = parseTransform("translate(10,20) scale(2)");
    expect(m).toEqual([2, 0, 0, 2, 10, 20]);
    expect(compose(parseTransform("scale(1,-1)"), parseTransform("translate(0, 5)"))).toEqual([1, 0, 0, -1, 0, -5]);
  });

  it("refuses transforms that MathJax's output never has", () => {
    expect(() => parseTransform("rotate(30)")).toThrow(UnsupportedSvgError);
  });
});

describe("path data", () => {
  it("resolves relative, H, V, S and T commands to absolute points", () => {
    // Each expected point worked by hand from the SVG 1.1 path grammar.
    const d = "m10 10h5v5l-5 0zM0 0c1 0 2 1 3 1s4 2 5 0Q6 3 7 4t2 0";
    expect(formatPath(parsePath(d), IDENTITY)).toBe(
      "M10 10L15 10L15 15L10 15ZM0 0C1 0 2 1 3 1C4 1 7 3 8 1Q6 3 7 4Q8 5 9 4",
    );
  });

  it("treats extra pairs after a moveto as linetos", () => {
    expect(formatPath(parsePath("M0 0 1 1 2 0"), IDENTITY)).toBe("M0 0L1 1L2 0");
  });

  it("maps every point through the transform", () => {
    expect(formatPath(parsePath("M1 2L3 4"), [0.01, 0, 0, -0.01, 5, 0])).toBe("M5.01 -0.02L5.03 -0.04");
  });

  it("refuses arcs", () => {
    expect(() => parsePath("M0 0A1 1 0 0 1 2 2")).toThrow(UnsupportedSvgError);
  });
});

describe("flattening", () => {
  it("draws a rule, a frame as a ring with opposite windings, and a table line as its quadrilateral", () => {
    const tree = el("svg", {}, [
      el("rect", { x: "0", y: "0", width: "10", height: "2", fill: "black" }),
      el("rect", { x: "0", y: "0", width: "10", height: "10", fill: "none", "stroke-width": "2" }),
      el("line", { class: "mjx-solid", x1: "0", y1: "0", x2: "100", y2: "0" }),
    ]);
    expect(flattenToPaths(tree, IDENTITY)).toBe(
      '<path d="M0 0L10 0L10 2L0 2Z"/>' +
        '<path d="M-1 -1L11 -1L11 11L-1 11ZM1 1L1 9L9 9L9 1Z"/>' +
        // MathJax's stylesheet draws table lines 70 units (0.07 em) wide.
        '<path d="M0 35L100 35L100 -35L0 -35Z"/>',
    );
  });

  it("fits a stretched piece that overflows its nested viewport to the viewport", () => {
    // A bar 0..150 long drawn in a viewport that shows 25..125 (MathJax's 1.5× extender).
    const tree = el("svg", {}, [
      el("svg", { x: "0", y: "0", width: "100", height: "10", viewBox: "25 0 100 10" }, [el("path", { d: "M0 2L150 2L150 8L0 8Z" })]),
    ]);
    expect(flattenToPaths(tree, IDENTITY)).toBe('<path d="M0 2L100 2L100 8L0 8Z"/>');
  });

  it("keeps content that fits its nested viewport where it is", () => {
    const tree = el("svg", {}, [el("svg", { x: "5", y: "0", width: "100", height: "10", viewBox: "0 0 100 10" }, [el("path", { d: "M10 2L20 2L20 8Z" })])]);
    expect(flattenToPaths(tree, IDENTITY)).toBe('<path d="M15 2L25 2L25 8Z"/>');
  });

  it("turns a <text> fallback (a character missing from the font) into an error naming it", () => {
    const tree = el("svg", {}, [el("g", {}, [{ kind: "text", attributes: {}, children: [{ kind: "#text", attributes: {}, children: [], text: "中" }] }])]);
    expect(() => flattenToPaths(tree, IDENTITY)).toThrow('The character "中" is not in the figure font');
  });

  it("drops empty paths and keeps no attribute but d", () => {
    const tree = el("svg", {}, [el("g", { fill: "red", id: "x" }, [el("path", { d: "", "data-c": "A0" }), el("path", { d: "M0 0L1 1Z", id: "p", fill: "blue" })])]);
    expect(flattenToPaths(tree, IDENTITY)).toBe('<path d="M0 0L1 1Z"/>');
  });
});

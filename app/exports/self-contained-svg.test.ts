import { describe, expect, it } from "vitest";
import { assertTextAsOutlines, selfContainedSvgProblems } from "./self-contained-svg";

const wrap = (inner: string) => `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 10">${inner}</svg>`;

describe("selfContainedSvgProblems", () => {
  it("accepts internal references (clip paths, gradients, use of a local id)", () => {
    expect(selfContainedSvgProblems(wrap('<defs><clipPath id="c1"><rect width="5" height="5"/></clipPath></defs><g clip-path="url(#c1)"><use href="#c1"/></g>'))).toEqual([]);
  });

  it("names each way an SVG can run code or reach outside the file", () => {
    const cases: [string, string][] = [
      ["<script>alert(1)</script>", "a <script> element"],
      ['<foreignObject width="5" height="5"><div/></foreignObject>', "a <foreignObject> element"],
      ['<image href="/etc/passwd" width="5" height="5"/>', "an embedded or linked image"],
      ['<a href="https://example.invalid"><rect width="1" height="1"/></a>', "a link to something outside the file (href not starting with #)"],
      ['<use xlink:href="other.svg#x"/>', "a link to something outside the file (href not starting with #)"],
      ['<rect fill="url(https://example.invalid/p.svg#g)" width="1" height="1"/>', "a url() outside the file"],
      ['<rect onload="alert(1)" width="1" height="1"/>', "an event handler attribute"],
      ["<style>@import url(https://example.invalid/a.css);</style>", "a CSS @import"],
    ];
    for (const [inner, problem] of cases) expect(selfContainedSvgProblems(wrap(inner)), inner).toContain(problem);
    expect(selfContainedSvgProblems('<!DOCTYPE svg [<!ENTITY x SYSTEM "file:///etc/passwd">]>' + wrap(""))).toContain("a DOCTYPE or entity declaration");
  });

  it("finds a link hidden after a > inside an attribute value", () => {
    expect(selfContainedSvgProblems(wrap('<a title="a > b" href="https://example.invalid"/>'))).toContain("a link to something outside the file (href not starting with #)");
  });

  it("does not mistake words in the alt text for markup", () => {
    expect(selfContainedSvgProblems(wrap("<desc>ratio only = 1; see url(page) and href='x'</desc>"))).toEqual([]);
  });
});

describe("assertTextAsOutlines", () => {
  it("refuses <text> elements, accepts glyph paths", () => {
    expect(() => assertTextAsOutlines(wrap('<text x="1" y="1">σ</text>'))).toThrow(/glyph paths/);
    expect(() => assertTextAsOutlines(wrap('<path d="M0 0h1"/><desc>some text here</desc>'))).not.toThrow();
  });
});

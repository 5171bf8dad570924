import { describe, expect, it } from "vitest";
import { svgForPage } from "./svg-for-page";

describe("svgForPage", () => {
  it("drops the marks' roles inside the figure and keeps the root's description", () => {
    const svg = '<svg role="graphics-document" aria-label="dσ/dΩ against θ"><g role="graphics-object" aria-roledescription="line mark container"><path role="graphics-symbol" aria-label="x: 1" d="M0,0"/></g></svg>';
    expect(svgForPage(svg)).toBe('<svg role="graphics-document" aria-label="dσ/dΩ against θ"><g><path d="M0,0"/></g></svg>');
  });
});

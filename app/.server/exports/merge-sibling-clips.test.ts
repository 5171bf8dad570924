import { Resvg } from "@resvg/resvg-js";
import { beforeAll, describe, expect, it } from "vitest";
import { renderFigure } from "~/figures/render-figure";
import { referenceInputs, referenceModel } from "~/figures/testing/reference-figure";
import { mergeSiblingClips } from "./merge-sibling-clips.server";

const RECT = '<clipPath id="a"><rect x="0" y="0" width="10" height="10"/></clipPath><clipPath id="b"><rect x="0" y="0" width="10" height="10"/></clipPath>';
const svgOf = (body: string, defs = RECT) => `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 20 20"><defs>${defs}</defs><g>${body}</g></svg>`;
const clipUses = (svg: string) => (svg.match(/clip-path=/g) ?? []).length;

describe("mergeSiblingClips", () => {
  it("wraps consecutive sibling groups whose clips have the same content in one clipped group", () => {
    const out = mergeSiblingClips(svgOf('<g clip-path="url(#a)" class="m1"><path d="M0,0h5"/></g><g clip-path="url(#b)" class="m2"><path d="M0,0v5"/></g>'));
    expect(out).toBe(svgOf('<g clip-path="url(#a)"><g class="m1"><path d="M0,0h5"/></g><g class="m2"><path d="M0,0v5"/></g></g>'));
  });

  it("leaves alone what would change the clip's geometry or the drawing order", () => {
    const cases = [
      // a group with its own transform: its clip is in the transformed space
      '<g clip-path="url(#a)"><path d="M0,0h5"/></g><g clip-path="url(#b)" transform="translate(3,0)"><path d="M0,0v5"/></g>',
      // something between the two groups
      '<g clip-path="url(#a)"><path d="M0,0h5"/></g><path d="M1,1h1"/><g clip-path="url(#b)"><path d="M0,0v5"/></g>',
      // clips of different content
      '<g clip-path="url(#a)"><path d="M0,0h5"/></g><g clip-path="url(#c)"><path d="M0,0v5"/></g>',
      // a clip that is not a plain clipPath: its units are the group's bounding box
      '<g clip-path="url(#a)"><path d="M0,0h5"/></g><g clip-path="url(#d)"><path d="M0,0v5"/></g>',
      // one clipped group alone
      '<g clip-path="url(#a)"><path d="M0,0h5"/></g>',
    ];
    const defs = RECT + '<clipPath id="c"><rect x="0" y="0" width="9" height="10"/></clipPath><clipPath id="d" clipPathUnits="objectBoundingBox"><rect x="0" y="0" width="10" height="10"/></clipPath>';
    for (const body of cases) expect(mergeSiblingClips(svgOf(body, defs))).toBe(svgOf(body, defs));
  });

  it("refuses an SVG whose elements are not closed in order", () => {
    expect(() => mergeSiblingClips('<svg xmlns="http://www.w3.org/2000/svg"><g><path d="M0,0"/></svg>')).toThrow(/not closed|ends inside/);
  });
});

describe("mergeSiblingClips on the reference figure", () => {
  let svg: string;
  let merged: string;
  beforeAll(async () => {
    svg = (await renderFigure(referenceModel(), referenceInputs(), { title: "Reference figure", description: "", notes: [] })).svg;
    merged = mergeSiblingClips(svg);
  }, 60_000);

  const pixels = (s: string) => new Resvg(s, { font: { loadSystemFonts: false }, background: "#ffffff", logLevel: "off", fitTo: { mode: "width", value: 2032 } }).render().pixels;

  /** Per-pixel largest channel difference, as counts: identical, within 2 of 255, and the largest. */
  function compare(a: Buffer, b: Buffer) {
    let identical = 0;
    let withinTwo = 0;
    let largest = 0;
    for (let i = 0; i < a.length; i += 4) {
      let d = 0;
      for (let c = 0; c < 4; c++) d = Math.max(d, Math.abs(a[i + c] - b[i + c]));
      if (d === 0) identical++;
      if (d <= 2) withinTwo++;
      largest = Math.max(largest, d);
    }
    return { identical: identical / (a.length / 4), withinTwo: withinTwo / (a.length / 4), largest };
  }

  it("clips each panel once: one clip for the main plot's marks, one for the ratio strip's", () => {
    // The figure has two panels (the plot and its ratio strip); every mark group of a panel clips
    // to that panel's plot area.
    expect(clipUses(svg)).toBeGreaterThan(10);
    expect(clipUses(merged)).toBe(2);
  });

  it("draws the same picture at 600 dpi, up to rounding in the compositing", () => {
    const before = pixels(svg);
    const after = compare(before, pixels(merged));
    // Measured when written: 99.66 % identical, all but 5 of 3.9 million pixels within 2/255, the
    // largest difference 34/255 (antialiased pixels where overlapping marks meet).
    expect(after.identical).toBeGreaterThan(0.995);
    expect(after.withinTwo).toBeGreaterThan(0.99999);
    expect(after.largest).toBeLessThan(64);
    // The control: the same figure without its first prediction's curve fails these bounds, so
    // they tell a changed picture from rounding.
    const withoutCurve = svg.replace(/(<g class="mark-line role-mark layer_0_marks"[^>]*>)<path [^>]*\/>/, "$1");
    expect(withoutCurve).not.toBe(svg);
    const changed = compare(before, pixels(withoutCurve));
    expect(changed.identical > 0.995 && changed.withinTwo > 0.99999 && changed.largest < 64).toBe(false);
  }, 60_000);
});

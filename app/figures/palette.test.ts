import * as vega from "vega";
import { describe, expect, it } from "vitest";
import { contrastWcag21, contrastWithCulori, differenceSeenAs, VISIONS } from "./testing/colour-vision";
import { colourFor, FIGURE_COLOURS, MARKER_SHAPES, markerFor, MIN_CONTRAST_ON_WHITE, MIN_DIFFERENCE_CIEDE2000 } from "./palette";

const WHITE = "#ffffff";
const INK = "#1b1a17"; // the figures' ink (text, frames, ticks)

describe("figure colours", () => {
  it("has eight colours with unique ids and hex values in the figure model's #rrggbb form", () => {
    expect(FIGURE_COLOURS).toHaveLength(8);
    expect(new Set(FIGURE_COLOURS.map((c) => c.id)).size).toBe(8);
    expect(new Set(FIGURE_COLOURS.map((c) => c.hex)).size).toBe(8);
    for (const c of FIGURE_COLOURS) expect(c.hex).toMatch(/^#[0-9a-f]{6}$/);
  });

  it("states bounds no weaker than asked: CIEDE2000 ≥ 10 (issue 8), contrast ≥ 3:1 (WCAG 2.1, 1.4.11)", () => {
    expect(MIN_DIFFERENCE_CIEDE2000).toBeGreaterThanOrEqual(10);
    expect(MIN_CONTRAST_ON_WHITE).toBeGreaterThanOrEqual(3);
  });

  // WCAG 2.1 success criterion 1.4.11 (non-text contrast): graphical objects ≥ 3:1 against
  // adjacent colours. The ratio is computed twice: from the recommendation's own definition and
  // by culori.
  it.each(FIGURE_COLOURS.map((c) => [c.name, c.hex]))("%s (%s) has contrast ≥ 3:1 against the white figure ground", (_, hex) => {
    const wcag = contrastWcag21(hex, WHITE);
    const culori = contrastWithCulori(hex, WHITE);
    expect(Math.abs(wcag - culori), `WCAG 2.1 reading ${wcag}, culori ${culori}`).toBeLessThan(0.01);
    expect(wcag, `${hex}: contrast ${wcag.toFixed(3)}, bound ${MIN_CONTRAST_ON_WHITE}`).toBeGreaterThanOrEqual(MIN_CONTRAST_ON_WHITE);
  });

  // CIEDE2000 (CIE 142-2001) as computed by culori; deficiencies simulated with the matrices of
  // Machado, Oliveira and Fernandes, IEEE TVCG 15 (2009) 1291, at full severity.
  it.each(VISIONS.map((v) => [v]))("keeps every pair, and every colour against the ink, apart under %s vision", (vision) => {
    const hexes = [...FIGURE_COLOURS.map((c) => c.hex), INK];
    const failures: string[] = [];
    for (let i = 0; i < hexes.length; i++) {
      for (let j = i + 1; j < hexes.length; j++) {
        const d = differenceSeenAs(hexes[i], hexes[j], vision);
        if (!(d >= MIN_DIFFERENCE_CIEDE2000)) failures.push(`${hexes[i]} vs ${hexes[j]}: ΔE00 ${d.toFixed(2)} < ${MIN_DIFFERENCE_CIEDE2000}`);
      }
    }
    expect(failures).toEqual([]);
  });

  it("the simulation separates what a dichromat confuses (control: a red and a green of equal lightness)", () => {
    // A check that the simulation is live: this brick red and olive green differ strongly in
    // normal vision (ΔE00 ≈ 43) but collapse for a deuteranope (≈ 2), so the pair test above can fail.
    expect(differenceSeenAs("#b5452b", "#6f7f20", "normal")).toBeGreaterThan(25);
    expect(differenceSeenAs("#b5452b", "#6f7f20", "deuteranopia")).toBeLessThan(5);
  });

  it("colourFor cycles through the palette", () => {
    expect(colourFor(0)).toBe(FIGURE_COLOURS[0].hex);
    expect(colourFor(7)).toBe(FIGURE_COLOURS[7].hex);
    expect(colourFor(8)).toBe(FIGURE_COLOURS[0].hex);
    expect(colourFor(19)).toBe(FIGURE_COLOURS[3].hex);
    expect(colourFor(-1)).toBe(FIGURE_COLOURS[7].hex);
  });
});

// vega's own path parser and bounds, the code that draws a custom `shape` (vega-scenegraph's
// customSymbol scales the unit box by √size / 2). They are not in vega's type declarations.
const vg = vega as unknown as {
  pathParse(path: string): (string | number)[][];
  pathRender(context: unknown, path: (string | number)[][], l: number, t: number, scale?: number): void;
  boundContext(bounds: vega.Bounds): unknown;
  Bounds: new () => vega.Bounds & { x1: number; y1: number; x2: number; y2: number };
};

/** Area enclosed by a path (absolute M, L, C, Z only), Béziers flattened into 64 chords each. */
function enclosedArea(path: string): number {
  const points: [number, number][] = [];
  for (const [cmd, ...n] of vg.pathParse(path) as [string, ...number[]][]) {
    if (cmd === "M" || cmd === "L") points.push([n[0], n[1]]);
    else if (cmd === "C") {
      const [x0, y0] = points[points.length - 1];
      for (let k = 1; k <= 64; k++) {
        const t = k / 64;
        const b = [(1 - t) ** 3, 3 * (1 - t) ** 2 * t, 3 * (1 - t) * t ** 2, t ** 3];
        points.push([b[0] * x0 + b[1] * n[0] + b[2] * n[2] + b[3] * n[4], b[0] * y0 + b[1] * n[1] + b[2] * n[3] + b[3] * n[5]]);
      }
    } else if (cmd !== "Z") throw new Error(`unexpected command ${cmd} in ${path}`);
  }
  let twice = 0;
  for (let i = 0; i < points.length; i++) {
    const [x1, y1] = points[i];
    const [x2, y2] = points[(i + 1) % points.length];
    twice += x1 * y2 - x2 * y1;
  }
  return Math.abs(twice) / 2;
}

describe("marker shapes", () => {
  it("has eight shapes with unique ids of lowercase words joined by dashes", () => {
    expect(MARKER_SHAPES).toHaveLength(8);
    expect(new Set(MARKER_SHAPES.map((s) => s.id)).size).toBe(8);
    expect(new Set(MARKER_SHAPES.map((s) => `${s.path} ${s.filled}`)).size).toBe(8);
    for (const s of MARKER_SHAPES) expect(s.id).toMatch(/^[a-z]+(-[a-z]+)*$/);
  });

  it.each(MARKER_SHAPES.map((s) => [s.id, s.path]))("%s parses with vega and stays inside the unit box [-1, 1]²", (_, path) => {
    const parsed = vg.pathParse(path);
    expect(parsed.length).toBeGreaterThan(2);
    for (const [cmd, ...numbers] of parsed) {
      expect("MLCZ", `command ${cmd}: only absolute M, L, C, Z are used`).toContain(cmd);
      for (const v of numbers as number[]) expect(Math.abs(v), `${cmd} ${numbers.join(",")}`).toBeLessThanOrEqual(1);
    }
    const bounds = new vg.Bounds();
    vg.pathRender(vg.boundContext(bounds), parsed, 0, 0, 1);
    expect([bounds.x1, bounds.y1, bounds.x2, bounds.y2].every(Number.isFinite)).toBe(true);
    expect(Math.min(bounds.x1, bounds.y1)).toBeGreaterThanOrEqual(-1);
    expect(Math.max(bounds.x2, bounds.y2)).toBeLessThanOrEqual(1);
    // centred: the drawn box straddles the origin on both axes
    expect(bounds.x1 < 0 && bounds.x2 > 0 && bounds.y1 < 0 && bounds.y2 > 0).toBe(true);
  });

  it("all shapes enclose about the same area (within 3 % of 1.25)", () => {
    // Control of the area measure: π r² for a circle of radius 0.631 is 1.2509, and four cubic
    // Bézier arcs with rounded control points (0.349 = 0.553 r) stay within 0.1 % of it.
    expect(Math.abs(enclosedArea(MARKER_SHAPES[0].path) / (Math.PI * 0.631 ** 2) - 1)).toBeLessThan(0.001);
    for (const s of MARKER_SHAPES) {
      const area = enclosedArea(s.path);
      expect(Math.abs(area / 1.25 - 1), `${s.id}: area ${area.toFixed(4)}`).toBeLessThan(0.03);
    }
  });

  it("markerFor cycles through the shapes", () => {
    expect(markerFor(0)).toBe(MARKER_SHAPES[0]);
    expect(markerFor(9)).toBe(MARKER_SHAPES[1]);
    expect(markerFor(-8)).toBe(MARKER_SHAPES[0]);
  });
});

import { execFileSync } from "node:child_process";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { checkTex, FIGURE_INK, placeTex, renderTex, TexError, type RenderedTex } from "./render-tex";
import { TYPICAL_LABELS } from "./testing/typical-labels";
import { advanceWidthsEm } from "./testing/ttf-advance-widths";

const render = (tex: string, fontSizePt = 10) => renderTex(tex, { fontSizePt });

async function renderAll(labels: readonly string[], fontSizePt = 10): Promise<Record<string, RenderedTex>> {
  const out: Record<string, RenderedTex> = {};
  for (const tex of labels) out[tex] = await render(tex, fontSizePt);
  return out;
}

/** Every coordinate pair in a body's path data. */
function points(body: string): [number, number][] {
  const values = [...body.matchAll(/-?\d+(?:\.\d+)?/g)].map((m) => Number(m[0]));
  const out: [number, number][] = [];
  for (let i = 0; i + 1 < values.length; i += 2) out.push([values[i], values[i + 1]]);
  return out;
}

// Labels that exercise stretched pieces (nested viewports), rules, frames and table lines.
const STRETCHED = [
  "\\overline{ab}",
  "\\xrightarrow{\\text{long arrow}}",
  "\\left(\\rule{1pt}{5em}\\right)",
  "\\left(\\frac{\\frac{a}{b}}{c}\\right)",
  "\\widehat{abcdef}",
  "\\boxed{x}",
  "\\begin{array}{c|c}a&b\\\\\\hline c&d\\end{array}",
];

describe("renderTex: the same bytes every time", () => {
  it("gives the same output for the same TeX, whatever was drawn before it", async () => {
    const labels = [...TYPICAL_LABELS, ...STRETCHED];
    const forward = await renderAll(labels, 9);
    const backward = await renderAll([...labels].reverse(), 9);
    for (const tex of labels) expect(backward[tex], tex).toEqual(forward[tex]);
  });

  it("gives the same bytes in a fresh process that draws the labels in the opposite order", async () => {
    const labels = [...TYPICAL_LABELS, ...STRETCHED];
    const here = await renderAll(labels, 9);
    const tsx = path.resolve("node_modules/.bin/tsx");
    const script = path.resolve("app/figures/tex/testing/render-labels.ts");
    const there = JSON.parse(execFileSync(tsx, [script, JSON.stringify([...labels].reverse()), "9"], { encoding: "utf8", maxBuffer: 64 << 20 }));
    expect(JSON.stringify(there, labels)).toBe(JSON.stringify(here, labels));
    for (const tex of labels) expect(JSON.stringify(there[tex]), tex).toBe(JSON.stringify(here[tex]));
  });

  it("gives the same error message on every call, also after other characters of the same missing range", async () => {
    const first = await checkTex("\\text{Ж}");
    await checkTex("\\text{Я}");
    expect(await checkTex("\\text{Ж}")).toBe(first);
    expect(first).toBe('The character "Ж" is not in the figure font');
  });
});

describe("renderTex: sizes", () => {
  it("scales every size and every coordinate with the font size", async () => {
    for (const tex of ["\\mathrm{d}\\sigma/\\mathrm{d}\\Omega\\ [\\mu\\mathrm{b/sr}]", "10^{-3}", "\\overline{ab}"]) {
      const small = await render(tex, 8);
      const large = await render(tex, 16);
      // Each number is rounded to 0.001 pt: doubling one can be off by 0.0015.
      for (const key of ["widthPt", "heightPt", "depthPt"] as const) expect(Math.abs(large[key] - 2 * small[key]), `${tex} ${key}`).toBeLessThanOrEqual(0.0015);
      const a = points(small.body);
      const b = points(large.body);
      expect(b.length).toBe(a.length);
      const worst = Math.max(...a.map(([x, y], i) => Math.max(Math.abs(b[i][0] - 2 * x), Math.abs(b[i][1] - 2 * y))));
      expect(worst, tex).toBeLessThanOrEqual(0.0015);
    }
  });

  it("makes upright text as wide as Computer Modern's advance widths say", async () => {
    // Independent source: the advance widths in the CMU Serif TrueType file (computer-modern
    // package), read from its hmtx table. CMU stores them to 0.001 em, truncated (0.555 for
    // cmr10's 0.5556), hence 0.001 em per character of tolerance, plus the 0.001 pt rounding.
    for (const word of ["deg", "1000", "lab", "sr", "GeV", "mb", "Born", "pull"]) {
      const expected = advanceWidthsEm("cmu-serif-500-roman.ttf", word).reduce((s, w) => s + w, 0) * 10;
      const got = (await render(`\\mathrm{${word}}`)).widthPt;
      const tolerance = [...word].length * 0.001 * 10 + 0.001;
      expect(Math.abs(got - expected), `${word}: got ${got} pt, expected ${expected} pt, tolerance ${tolerance}`).toBeLessThanOrEqual(tolerance);
    }
  });

  it("makes longer text wider", async () => {
    const widths = await Promise.all(["x", "xx", "xxx", "\\theta_\\mathrm{lab}", "\\theta_\\mathrm{lab}\\ [\\mathrm{deg}]"].map(async (t) => (await render(t)).widthPt));
    expect(widths[0]).toBeLessThan(widths[1]);
    expect(widths[1]).toBeLessThan(widths[2]);
    expect(widths[3]).toBeLessThan(widths[4]);
  });

  it("raises superscripts, lowers subscripts and stacks fractions", async () => {
    const x = await render("x");
    const sup = await render("x^{2}");
    const sub = await render("x_{2}");
    const frac = await render("\\frac{a}{b}");
    const a = await render("a");
    expect(sup.heightPt).toBeGreaterThan(x.heightPt);
    expect(sub.depthPt).toBeGreaterThan(x.depthPt);
    expect(frac.heightPt).toBeGreaterThan(a.heightPt);
    expect(frac.depthPt).toBeGreaterThan(a.depthPt);
    // The superscript's ink reaches above the x-height of the base letter.
    const top = Math.min(...points(sup.body).map(([, y]) => y));
    expect(top).toBeLessThan(-x.heightPt);
  });

  it("keeps the ink of stretched pieces, rules and frames inside the label's box", async () => {
    for (const tex of STRETCHED) {
      const r = await render(tex);
      const p = points(r.body);
      // Glyph ink may pass its box by a hair (the arrowhead of \xrightarrow is 0.01 em below
      // the baseline of a box with no depth); an unclipped extender would overshoot by a
      // quarter of its length (MathJax draws it 1.5 times too long).
      const slack = 0.02 * 10;
      const xs = p.map(([x]) => x);
      const ys = p.map(([, y]) => y);
      const box = `${tex}: x ${Math.min(...xs)}..${Math.max(...xs)} in 0..${r.widthPt}, y ${Math.min(...ys)}..${Math.max(...ys)} in ${-r.heightPt}..${r.depthPt}`;
      expect(Math.min(...xs), box).toBeGreaterThanOrEqual(-slack);
      expect(Math.max(...xs), box).toBeLessThanOrEqual(r.widthPt + slack);
      expect(Math.min(...ys), box).toBeGreaterThanOrEqual(-r.heightPt - slack);
      expect(Math.max(...ys), box).toBeLessThanOrEqual(r.depthPt + slack);
    }
  });

  it("draws nothing for an empty label and refuses a font size that is not positive", async () => {
    expect(await render("  ")).toEqual({ widthPt: 0, heightPt: 0, depthPt: 0, body: "" });
    await expect(renderTex("x", { fontSizePt: 0 })).rejects.toThrow(RangeError);
    await expect(renderTex("x", { fontSizePt: Number.NaN })).rejects.toThrow(RangeError);
  });
});

describe("renderTex: output form", () => {
  it("is plain paths: no text, ids, references, colours or transforms, three decimals at most", async () => {
    for (const tex of [...TYPICAL_LABELS, ...STRETCHED]) {
      const { body } = await render(tex);
      expect(body, tex).toMatch(/^(<path d="[MLCQZ0-9. -]+"\/>)+$/);
      expect(body, tex).not.toMatch(/\d\.\d{4}/);
    }
  });

  it("places a label with a translation", async () => {
    const r = await render("x");
    expect(placeTex(r, 1.23456, -2)).toBe(`<g transform="translate(1.235 -2)">${r.body}</g>`);
    expect(FIGURE_INK).toMatch(/^#[0-9a-f]{6}$/);
  });
});

describe("renderTex: errors", () => {
  it("throws a TexError naming an undefined control sequence", async () => {
    const error = await render("\\alpha + \\foo").catch((e: unknown) => e);
    expect(error).toBeInstanceOf(TexError);
    expect((error as TexError).message).toBe("Undefined control sequence \\foo");
  });

  it("throws TexErrors for unbalanced braces, a missing character and macros that labels do not offer", async () => {
    await expect(render("\\frac{1}{2")).rejects.toThrow(TexError);
    await expect(render("\\text{中}")).rejects.toThrow(new TexError('The character "中" is not in the figure font'));
    // Colour comes from the figure and macros cannot be defined in a label.
    await expect(render("\\color{red}{x}")).rejects.toThrow("Undefined control sequence \\color");
    await expect(render("\\newcommand{\\a}{b}\\a")).rejects.toThrow("Undefined control sequence \\newcommand");
  });

  it("checkTex returns the message, or null for good TeX", async () => {
    expect(await checkTex("\\theta_\\mathrm{lab}\\ [\\mathrm{deg}]")).toBeNull();
    expect(await checkTex("\\foo")).toBe("Undefined control sequence \\foo");
  });
});

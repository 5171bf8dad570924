/**
 * TeX labels of a figure as glyph outlines: MathJax 4 (TeX in, SVG out, New Computer Modern
 * font) through the lite DOM adaptor, flattened to plain filled paths in pt. The same code runs
 * in the browser and on the server, and one label gives the same bytes wherever and whenever
 * it is drawn, so that the preview is the export and no font is needed to show the figure.
 */
import type { MathJaxEngine } from "./mathjax-engine";
import { flattenToPaths, fmt, UnsupportedSvgError, type SvgNode } from "./svg-geometry";

/** The ink colour of a figure's text and frames. */
export const FIGURE_INK = "#1b1a17";

/** One rendered label; sizes in pt at the font size asked for. */
export interface RenderedTex {
  widthPt: number;
  /** Height above the baseline. */
  heightPt: number;
  /** Depth below the baseline. */
  depthPt: number;
  /**
   * `<path d="…"/>` elements only, baseline at y = 0 and left edge at x = 0, y downwards, in
   * pt. No fill of their own: the colour comes from the enclosing element's `fill`.
   */
  body: string;
}

/** TeX that cannot be drawn, with a message for the person who typed it. */
export class TexError extends Error {
  override name = "TexError";
}

let engine: Promise<MathJaxEngine> | null = null;

/** MathJax is loaded on first use and kept; a failed load is retried on the next call. */
function loadEngine(): Promise<MathJaxEngine> {
  engine ??= import("./mathjax-engine").then((m) => m.createMathJaxEngine());
  engine.catch(() => {
    engine = null;
  });
  return engine;
}

function findError(node: SvgNode): string | null {
  const message = node.attributes["data-mjx-error"];
  if (message !== undefined) return message;
  for (const child of node.children) {
    const found = findError(child);
    if (found !== null) return found;
  }
  return null;
}

const round3 = (v: number) => Number(fmt(v));

/**
 * Renders `tex` as inline math (text through `\text{…}`) at `fontSizePt`. Throws TexError for
 * TeX that MathJax rejects (the message names the cause, e.g. "Undefined control sequence
 * \foo") or that needs a character the figure font lacks.
 */
export async function renderTex(tex: string, options: { fontSizePt: number }): Promise<RenderedTex> {
  const size = options.fontSizePt;
  if (!(Number.isFinite(size) && size > 0)) throw new RangeError(`font size must be a positive number of pt, got ${size}`);
  if (tex.trim() === "") return { widthPt: 0, heightPt: 0, depthPt: 0, body: "" };
  const mathjax = await loadEngine();
  const svg = await mathjax.convert(tex, size);
  const message = findError(svg);
  if (message !== null) throw new TexError(message);

  // MathJax's viewBox is in thousandths of an em: x from 0, y from −height (y down).
  const viewBox = (svg.attributes.viewBox ?? "").split(/\s+/).map(Number);
  if (viewBox.length !== 4 || viewBox.some((v) => !Number.isFinite(v))) throw new TexError("This formula has no fixed width and cannot be a figure label");
  const [minX, minY, width, height] = viewBox;
  const k = size / 1000;
  let body: string;
  try {
    body = flattenToPaths(svg, [k, 0, 0, k, -minX * k, 0]);
  } catch (error) {
    if (error instanceof UnsupportedSvgError) throw new TexError(error.message);
    throw error;
  }
  return { widthPt: round3(width * k), heightPt: round3(-minY * k), depthPt: round3((height + minY) * k), body };
}

/** The label's paths moved by (dx, dy) pt. */
export function placeTex(r: RenderedTex, dx: number, dy: number): string {
  return `<g transform="translate(${fmt(dx)} ${fmt(dy)})">${r.body}</g>`;
}

/** Why `tex` cannot be a figure label, or null when it can. */
export async function checkTex(tex: string): Promise<string | null> {
  try {
    await renderTex(tex, { fontSizePt: 10 });
    return null;
  } catch (error) {
    if (error instanceof TexError) return error.message;
    throw error;
  }
}

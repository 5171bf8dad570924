import * as vega from "vega";
import { expressionInterpreter } from "vega-interpreter";
import { compile, type TopLevelSpec } from "vega-lite";
import type { BuiltFigure, MeasureTex, PlacedTex } from "./build-figure";
import { FIGURE_BACKGROUND } from "./build-figure";
import { placeTex, renderTex, type RenderedTex } from "./tex/render-tex";

/**
 * TeX labels rendered once and kept: the layout asks for sizes synchronously, the renderer for
 * glyphs. A label missing on the first layout pass is rendered, then the layout runs again
 * (see renderFigure), so that both passes see the same sizes.
 */
export class TexCache {
  private readonly rendered = new Map<string, RenderedTex>();
  private readonly missing = new Map<string, { tex: string; sizePt: number }>();
  private readonly failures = new Map<string, string>();

  private static key(tex: string, sizePt: number) {
    return `${sizePt}|${tex}`;
  }

  readonly measure: MeasureTex = (tex, sizePt) => {
    const hit = this.rendered.get(TexCache.key(tex, sizePt));
    if (hit) return hit;
    if (!this.failures.has(tex)) this.missing.set(TexCache.key(tex, sizePt), { tex, sizePt });
    return { widthPt: 0, heightPt: 0, depthPt: 0 };
  };

  get(tex: string, sizePt: number): RenderedTex | undefined {
    return this.rendered.get(TexCache.key(tex, sizePt));
  }

  /** TeX that failed to render, with MathJax's message (shown beside the field). */
  failure(tex: string): string | undefined {
    return this.failures.get(tex);
  }

  get hasMissing() {
    return this.missing.size > 0;
  }

  /** Renders every label asked for and not yet known. Invalid TeX is remembered, not thrown. */
  async fill(): Promise<void> {
    const pending = [...this.missing.values()];
    this.missing.clear();
    for (const { tex, sizePt } of pending) {
      try {
        this.rendered.set(TexCache.key(tex, sizePt), await renderTex(tex, { fontSizePt: sizePt }));
      } catch (error) {
        this.failures.set(tex, error instanceof Error ? error.message : String(error));
      }
    }
  }
}

const fmt = (v: number) => {
  const r = Math.round(v * 1000) / 1000;
  return Object.is(r, -0) ? "0" : String(r);
};

/**
 * Renames the ids of one vega drawing to `${prefix}-1`, `${prefix}-2`, … in order of first
 * appearance. vega numbers its clip paths with a counter that lives as long as the process, so
 * the same figure drawn twice would otherwise differ in its ids.
 */
export function canonicaliseIds(svg: string, prefix: string): string {
  const names = new Map<string, string>();
  svg.replace(/\bid="([^"]+)"/g, (_, id: string) => {
    if (!names.has(id)) names.set(id, `${prefix}-${names.size + 1}`);
    return "";
  });
  return svg.replace(/\bid="([^"]+)"|url\(#([^)]+)\)|href="#([^"]+)"/g, (whole, a?: string, b?: string, c?: string) => {
    if (a !== undefined) return `id="${names.get(a) ?? a}"`;
    if (b !== undefined) return `url(#${names.get(b) ?? b})`;
    return `href="#${names.get(c!) ?? c}"`;
  });
}

/**
 * Compiled and parsed plot specifications by their shape (the spec with each layer's rows taken
 * out): an edit that changes numbers only (an energy, a revision) skips vega-lite's compiler and
 * vega's parser, and the rows go into the view's named data sources. Bounded, oldest out first.
 */
const parsedSpecs = new Map<string, vega.Runtime>();
const PARSED_SPECS_KEPT = 64;

function parsedPlot(spec: Record<string, unknown>): { runtime: vega.Runtime; rows: [string, unknown[]][] } {
  const rows: [string, unknown[]][] = [];
  const layers = (spec.layer as { data?: { values?: unknown[] } }[]).map((layer, i) => {
    if (!layer.data?.values) return layer;
    const name = `rows_${i}`;
    rows.push([name, layer.data.values]);
    return { ...layer, data: { name } };
  });
  const shape = { ...spec, layer: layers, config: { ...(spec.config as object), aria: false } };
  const key = JSON.stringify(shape);
  let runtime = parsedSpecs.get(key);
  if (runtime === undefined) {
    // An expression tree, run by vega's interpreter rather than compiled with Function(): the
    // page's Content-Security-Policy has no 'unsafe-eval' (docs/decisions/0012-hardening.md).
    runtime = vega.parse(compile(shape as TopLevelSpec).spec, undefined, { ast: true });
    if (parsedSpecs.size >= PARSED_SPECS_KEPT) parsedSpecs.delete(parsedSpecs.keys().next().value!);
    parsedSpecs.set(key, runtime);
  }
  return { runtime, rows };
}

async function plotSvg(spec: Record<string, unknown>, prefix: string): Promise<string> {
  const { runtime, rows } = parsedPlot(spec);
  const view = new vega.View(runtime, { renderer: "none", expr: expressionInterpreter });
  try {
    for (const [name, values] of rows) view.data(name, values);
    return canonicaliseIds(await view.toSVG(), prefix);
  } finally {
    view.finalize();
  }
}

function placed(t: PlacedTex, cache: TexCache): string {
  const r = cache.get(t.tex, t.sizePt);
  if (r === undefined) return "";
  const shift = t.anchor === "start" ? 0 : t.anchor === "middle" ? -r.widthPt / 2 : -r.widthPt;
  const inner = placeTex(r, shift, 0);
  const colour = t.colour === "#1b1a17" ? "" : ` fill="${t.colour}"`;
  return `<g transform="translate(${fmt(t.x)} ${fmt(t.y)})${t.rotate ? ` rotate(${t.rotate})` : ""}"${colour}>${inner}</g>`;
}

export interface SvgMetadata {
  title: string;
  description: string;
  /** Lines for the <metadata> element, e.g. that this is an unsealed draft. */
  notes: string[];
}

const escapeXml = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

/**
 * The figure as one SVG document in pt: each plotting area drawn by vega (nested, clipped),
 * then frames and ticks, then every label as glyph paths. No text elements, no fonts, no
 * external references: the same bytes in the browser and on the server.
 */
export async function renderFigureSvg(built: BuiltFigure, cache: TexCache, metadata: SvgMetadata): Promise<string> {
  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${fmt(built.widthPt)}pt" height="${fmt(built.heightPt)}pt" viewBox="0 0 ${fmt(built.widthPt)} ${fmt(built.heightPt)}">`,
    `<title>${escapeXml(metadata.title)}</title>`,
    `<desc>${escapeXml(metadata.description)}</desc>`,
  );
  if (metadata.notes.length > 0) parts.push(`<metadata>${metadata.notes.map((n) => `<note>${escapeXml(n)}</note>`).join("")}</metadata>`);
  parts.push(`<rect width="${fmt(built.widthPt)}" height="${fmt(built.heightPt)}" fill="${FIGURE_BACKGROUND}"/>`);
  for (let i = 0; i < built.plots.length; i++) {
    const plot = built.plots[i];
    const svg = await plotSvg(plot.spec, `p${i}`);
    parts.push(svg.replace(/^<svg /, `<svg x="${fmt(plot.x)}" y="${fmt(plot.y)}" `).replace(/ xmlns:xlink="[^"]*"| class="marks"/g, ""));
  }
  parts.push(...built.overlay);
  parts.push(`<g fill="#1b1a17" stroke="none">`, ...built.texts.map((t) => placed(t, cache)), `</g>`);
  parts.push(`</svg>`);
  return parts.join("\n");
}

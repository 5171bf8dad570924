/**
 * One MathJax 4 instance: TeX input, SVG output with the New Computer Modern font, the lite DOM
 * adaptor (no browser DOM needed, so Node and the browser run the same code). Loaded through a
 * dynamic import by render-tex.ts only when the first label is drawn.
 */
import { mathjax } from "@mathjax/src/js/mathjax.js";
import { TeX } from "@mathjax/src/js/input/tex.js";
import { SVG } from "@mathjax/src/js/output/svg.js";
import { liteAdaptor, type LiteAdaptor } from "@mathjax/src/js/adaptors/liteAdaptor.js";
import type { LiteElement, LiteNode } from "@mathjax/src/js/adaptors/lite/Element.js";
import { RegisterHTMLHandler } from "@mathjax/src/js/handlers/html.js";
import "@mathjax/src/js/input/tex/base/BaseConfiguration.js";
import "@mathjax/src/js/input/tex/ams/AmsConfiguration.js";
import "@mathjax/src/js/input/tex/boldsymbol/BoldsymbolConfiguration.js";
import "@mathjax/src/js/input/tex/upgreek/UpgreekConfiguration.js";
import "@mathjax/src/js/input/tex/gensymb/GensymbConfiguration.js";
import "@mathjax/src/js/input/tex/textmacros/TextMacrosConfiguration.js";
import { MathJaxNewcmFont } from "@mathjax/mathjax-newcm-font/js/svg.js";
import type { SvgNode } from "./svg-geometry";

/**
 * TeX packages of figure labels: base and AMS math, \boldsymbol, upright Greek (\upmu),
 * unit symbols (\degree, \micro), and text-mode accents inside \text{…}. Packages that define
 * macros (\newcommand), load others (\require) or colour text are left out: a label is one
 * self-contained expression whose colour the figure sets.
 */
const PACKAGES = ["base", "ams", "boldsymbol", "upgreek", "gensymb", "textmacros"];

const DYNAMIC_PREFIX = "@mathjax/mathjax-newcm-font/js/svg/dynamic/";

/**
 * The font's optional character ranges, each a literal import so that a bundler splits them
 * into chunks loaded on first use. Scripts no physics label uses (Arabic, Hebrew, Cyrillic,
 * Devanagari, Cherokee, Braille, phonetics) are not offered.
 */
const FONT_RANGES: Record<string, () => Promise<unknown>> = {
  "PUA": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/PUA.js"),
  "accents": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/accents.js"),
  "accents-b-i": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/accents-b-i.js"),
  "arrows": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/arrows.js"),
  "calligraphic": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/calligraphic.js"),
  "double-struck": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/double-struck.js"),
  "fraktur": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/fraktur.js"),
  "greek": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/greek.js"),
  "greek-ss": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/greek-ss.js"),
  "latin": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/latin.js"),
  "latin-b": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/latin-b.js"),
  "latin-bi": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/latin-bi.js"),
  "latin-i": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/latin-i.js"),
  "marrows": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/marrows.js"),
  "math": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/math.js"),
  "monospace": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/monospace.js"),
  "monospace-ex": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/monospace-ex.js"),
  "monospace-l": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/monospace-l.js"),
  "mshapes": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/mshapes.js"),
  "sans-serif": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/sans-serif.js"),
  "sans-serif-b": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/sans-serif-b.js"),
  "sans-serif-bi": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/sans-serif-bi.js"),
  "sans-serif-ex": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/sans-serif-ex.js"),
  "sans-serif-i": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/sans-serif-i.js"),
  "sans-serif-r": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/sans-serif-r.js"),
  "script": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/script.js"),
  "shapes": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/shapes.js"),
  "symbols": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/symbols.js"),
  "symbols-b-i": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/symbols-b-i.js"),
  "variants": () => import("@mathjax/mathjax-newcm-font/js/svg/dynamic/variants.js"),
};

/** The font's table of optional ranges (a protected static of MathJax's font classes). */
const fontRangeList = () => (MathJaxNewcmFont as unknown as { dynamicFiles: Record<string, unknown> }).dynamicFiles;

/**
 * MathJax asks for a range by its module name. A range that labels do not offer is answered as
 * loaded and empty, so that its characters come out as missing (a TeX error naming the
 * character), the same way on every call.
 */
function loadFontRange(file: string): Promise<unknown> {
  const name = file.startsWith(DYNAMIC_PREFIX) ? file.slice(DYNAMIC_PREFIX.length).replace(/\.js$/, "") : null;
  if (name !== null && Object.hasOwn(FONT_RANGES, name)) return FONT_RANGES[name]();
  if (name !== null && Object.hasOwn(fontRangeList(), name)) {
    MathJaxNewcmFont.dynamicSetup("", name, {});
    return Promise.resolve();
  }
  return Promise.reject(new Error(`MathJax asked for an unknown file ${file}`));
}

export interface MathJaxEngine {
  /** The SVG of one inline formula, as a plain tree (see toSvgNode). */
  convert(tex: string, fontSizePt: number): Promise<SvgNode>;
}

function toSvgNode(adaptor: LiteAdaptor, node: LiteNode): SvgNode {
  if (adaptor.kind(node) === "#text") return { kind: "#text", attributes: {}, children: [], text: adaptor.value(node) };
  const element = node as LiteElement;
  const attributes: Record<string, string | undefined> = {};
  for (const { name, value } of adaptor.allAttributes(element)) attributes[name] = String(value);
  return { kind: adaptor.kind(element), attributes, children: adaptor.childNodes(element).map((c) => toSvgNode(adaptor, c)), text: undefined };
}

export function createMathJaxEngine(): MathJaxEngine {
  // The font's optional ranges load through mathjax.asyncLoad; this app sets it once, here.
  mathjax.asyncLoad = loadFontRange;
  const adaptor = liteAdaptor();
  RegisterHTMLHandler(adaptor);
  const tex = new TeX({ packages: PACKAGES });
  // One <svg> per label: inline breaking would split the formula into one <svg> per line piece.
  const svg = new SVG({ fontData: MathJaxNewcmFont, fontCache: "none", linebreaks: { inline: false } });
  const document = mathjax.document("", { InputJax: tex, OutputJax: svg });

  // One conversion at a time: labels (\label, \tag) are counted per document and reset before
  // each formula, so that no label depends on the ones converted before it.
  let queue: Promise<unknown> = Promise.resolve();
  return {
    convert(source, fontSizePt) {
      const run = async () => {
        tex.reset();
        const container = (await document.convertPromise(source, { display: false, em: fontSizePt, ex: fontSizePt / 2, containerWidth: 80 * fontSizePt })) as LiteElement;
        const pieces = adaptor.childNodes(container);
        if (pieces.length !== 1 || adaptor.kind(pieces[0]) !== "svg") throw new Error(`MathJax drew ${JSON.stringify(source)} as ${pieces.length} pieces, not one <svg>`);
        return toSvgNode(adaptor, pieces[0]);
      };
      const result = queue.then(run, run);
      queue = result.catch(() => undefined);
      return result;
    },
  };
}

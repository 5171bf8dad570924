// The figure's SVG as a PNG at the preset's resolution (docs/decisions/0009-export-rendering.md).
import { crc32 } from "node:zlib";
import { Resvg } from "@resvg/resvg-js";
import { assertSelfContainedSvg, assertTextAsOutlines } from "~/exports/self-contained-svg";
import { mergeSiblingClips } from "./merge-sibling-clips.server";
import { pngChunks } from "./png-chunks.server";

export interface PngOptions {
  /** The figure's size, pt. */
  widthPt: number;
  heightPt: number;
  /** Dots per inch at final size (the preset's; 600 by default). */
  dpi?: number;
}

export const DEFAULT_PNG_DPI = 600;
const METRES_PER_INCH = 0.0254;

/** Pixels for a length in pt at `dpi`: round(pt / 72 × dpi). */
export function pixelsFor(lengthPt: number, dpi: number): number {
  return Math.round((lengthPt / 72) * dpi);
}

/** The first <svg> tag with its width and height set to whole pixels (the viewBox keeps the drawing in pt). */
function withPixelSize(svg: string, widthPx: number, heightPx: number): string {
  const open = /<svg\b(?:[^>"']|"[^"]*"|'[^']*')*>/.exec(svg);
  if (open === null) throw new Error("no <svg> element");
  if (!/\sviewBox\s*=/.test(open[0])) throw new Error("the figure SVG has no viewBox");
  const tag = open[0]
    .replace(/\s(width|height)\s*=\s*("[^"]*"|'[^']*')/g, "")
    .replace(/^<svg\b/, `<svg width="${widthPx}" height="${heightPx}"`);
  return svg.slice(0, open.index) + tag + svg.slice(open.index + open[0].length);
}

/** A PNG chunk: length, type, data, CRC-32 of type and data (PNG specification, section 5.3). */
function pngChunk(type: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, "latin1");
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), data])) >>> 0, 0);
  return Buffer.concat([head, data, crc]);
}

/**
 * Adds the pHYs chunk (pixels per metre, PNG specification 11.3.5.3) after IHDR, so that an
 * editor's software reads the intended print size. resvg writes none.
 */
export function withPhysicalDpi(png: Buffer, dpi: number): Buffer {
  const chunks = pngChunks(png);
  if (chunks.some((c) => c.type === "pHYs")) throw new Error("the PNG already has a pHYs chunk");
  const ihdrEnd = chunks[1].offset;
  const perMetre = Math.round(dpi / METRES_PER_INCH);
  const data = Buffer.alloc(9);
  data.writeUInt32BE(perMetre, 0);
  data.writeUInt32BE(perMetre, 4);
  data.writeUInt8(1, 8); // unit: metre
  return Buffer.concat([png.subarray(0, ihdrEnd), pngChunk("pHYs", data), png.subarray(ihdrEnd)]);
}

/**
 * The figure as a PNG of round(widthPt / 72 × dpi) × round(heightPt / 72 × dpi) pixels on
 * white, with its dpi in pHYs. No system font is loaded: the figure's text is already glyph
 * paths, so the picture cannot depend on the host. Deterministic: the same SVG gives the same bytes.
 * Runs of mark groups with the same clip are clipped once (mergeSiblingClips), which halves the
 * time of a 600 dpi figure.
 */
export function svgToPng(svg: string, options: PngOptions): Buffer {
  assertSelfContainedSvg(svg);
  assertTextAsOutlines(svg);
  const dpi = options.dpi ?? DEFAULT_PNG_DPI;
  if (!(dpi > 0 && dpi <= 2400)) throw new Error(`a PNG at ${dpi} dpi: choose between 1 and 2400`);
  const widthPx = pixelsFor(options.widthPt, dpi);
  const heightPx = pixelsFor(options.heightPt, dpi);
  if (widthPx < 1 || heightPx < 1) throw new Error(`a PNG of ${widthPx} × ${heightPx} pixels is empty`);
  const resvg = new Resvg(mergeSiblingClips(withPixelSize(svg, widthPx, heightPx)), {
    font: { loadSystemFonts: false },
    background: "#ffffff",
    logLevel: "off",
  });
  const image = resvg.render();
  if (image.width !== widthPx || image.height !== heightPx) throw new Error(`resvg drew ${image.width} × ${image.height} pixels, not ${widthPx} × ${heightPx}`);
  return withPhysicalDpi(image.asPng(), dpi);
}

import { readFileSync } from "node:fs";
import { createRequire } from "node:module";

/**
 * Advance widths of characters in a TrueType font file, in em, read straight from its tables
 * (cmap format 4 for Unicode → glyph, hmtx for widths, head for units per em; OpenType spec).
 * An independent source of Computer Modern's metrics for the TeX tests: the CMU fonts of the
 * computer-modern package are a separate digitisation of Knuth's design from MathJax's font.
 */
export function advanceWidthsEm(fontFile: string, text: string): number[] {
  const buffer = readFileSync(createRequire(import.meta.url).resolve(`computer-modern/fonts/${fontFile}`));
  const view = new DataView(buffer.buffer, buffer.byteOffset, buffer.byteLength);
  const tables = new Map<string, number>();
  const count = view.getUint16(4);
  for (let i = 0; i < count; i++) {
    const at = 12 + 16 * i;
    tables.set(buffer.toString("latin1", at, at + 4), view.getUint32(at + 8));
  }
  const table = (tag: string) => {
    const at = tables.get(tag);
    if (at === undefined) throw new Error(`${fontFile} has no ${tag} table`);
    return at;
  };
  const unitsPerEm = view.getUint16(table("head") + 18);
  const metricsCount = view.getUint16(table("hhea") + 34);
  const cmap = table("cmap");
  let format4 = -1;
  for (let i = 0; i < view.getUint16(cmap + 2); i++) {
    const platform = view.getUint16(cmap + 4 + 8 * i);
    const encoding = view.getUint16(cmap + 6 + 8 * i);
    const at = cmap + view.getUint32(cmap + 8 + 8 * i);
    if (platform === 3 && encoding === 1 && view.getUint16(at) === 4) format4 = at;
  }
  if (format4 < 0) throw new Error(`${fontFile} has no Unicode BMP cmap`);
  const segments = view.getUint16(format4 + 6) / 2;
  const ends = format4 + 14;
  const starts = ends + 2 * segments + 2;
  const deltas = starts + 2 * segments;
  const offsets = deltas + 2 * segments;
  const glyphOf = (code: number) => {
    for (let s = 0; s < segments; s++) {
      if (code > view.getUint16(ends + 2 * s)) continue;
      const start = view.getUint16(starts + 2 * s);
      if (code < start) return 0;
      const delta = view.getInt16(deltas + 2 * s);
      const offset = view.getUint16(offsets + 2 * s);
      if (offset === 0) return (code + delta) & 0xffff;
      const glyph = view.getUint16(offsets + 2 * s + offset + 2 * (code - start));
      return glyph === 0 ? 0 : (glyph + delta) & 0xffff;
    }
    return 0;
  };
  const hmtx = table("hmtx");
  return [...text].map((ch) => {
    const glyph = glyphOf(ch.codePointAt(0)!);
    if (glyph === 0) throw new Error(`${fontFile} has no glyph for ${ch}`);
    return view.getUint16(hmtx + 4 * Math.min(glyph, metricsCount - 1)) / unitsPerEm;
  });
}

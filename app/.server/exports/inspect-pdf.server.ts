// What the preflight needs to know about an exported PDF: its fonts and its colour spaces, read
// from the file itself, so that the server needs no PDF tool installed. It reads PDFs as pdfkit
// writes them (every object at top level, no object streams, stream lengths given directly);
// tests compare it with poppler's pdffonts.
import { inflateSync } from "node:zlib";
import type { PdfFont } from "~/exports/preflight";

interface PdfObject {
  id: number;
  dict: string;
  stream: Buffer | null;
}

/** Every `N 0 obj … endobj` of the file, with its dictionary text and its stream, decompressed. */
function pdfObjects(pdf: Buffer): Map<number, PdfObject> {
  const text = pdf.toString("latin1");
  const objects = new Map<number, PdfObject>();
  const start = /(\d+) 0 obj\s*/g;
  let match: RegExpExecArray | null;
  while ((match = start.exec(text)) !== null) {
    const id = Number(match[1]);
    const bodyStart = start.lastIndex;
    const endAt = text.indexOf("endobj", bodyStart);
    if (endAt < 0) throw new Error(`PDF object ${id} has no endobj`);
    const streamKeyword = />>\s*stream\r?\n/g;
    streamKeyword.lastIndex = bodyStart;
    const streamMatch = streamKeyword.exec(text);
    if (streamMatch !== null && streamMatch.index < endAt) {
      const dict = text.slice(bodyStart, streamMatch.index + 2);
      const length = /\/Length\s+(\d+)(?!\s+\d+\s+R)/.exec(dict);
      if (length === null) throw new Error(`PDF object ${id}: a stream whose /Length is not given directly`);
      const dataStart = streamMatch.index + streamMatch[0].length;
      const raw = pdf.subarray(dataStart, dataStart + Number(length[1]));
      const stream = /\/Filter\s*\/FlateDecode/.test(dict) ? inflateSync(raw) : /\/Filter/.test(dict) ? null : raw;
      objects.set(id, { id, dict, stream });
      const after = text.indexOf("endobj", dataStart + raw.length);
      if (after < 0) throw new Error(`PDF object ${id}: no endobj after its stream`);
      start.lastIndex = after + "endobj".length;
    } else {
      objects.set(id, { id, dict: text.slice(bodyStart, endAt), stream: null });
      start.lastIndex = endAt + "endobj".length;
    }
  }
  return objects;
}

const ref = (dict: string, key: string): number | null => {
  const m = new RegExp(`/${key}\\s+(\\d+)\\s+0\\s+R`).exec(dict);
  return m ? Number(m[1]) : null;
};
const name = (dict: string, key: string): string | null => {
  const m = new RegExp(`/${key}\\s*/([^\\s/<>\\[\\]()]+)`).exec(dict);
  return m ? m[1] : null;
};

/**
 * The fonts of a PDF with pdffonts' type names (Type 1, Type 1C, Type 3, TrueType, CID TrueType,
 * CID Type 0, CID Type 0C) and whether each is embedded (a FontFile, FontFile2 or FontFile3 in its
 * descriptor; a Type 3 font is drawn by the file itself).
 */
export function pdfFonts(pdf: Buffer): PdfFont[] {
  const objects = pdfObjects(pdf);
  const fonts: PdfFont[] = [];
  const embeddedAs = (descriptorId: number | null): string | null => {
    const d = descriptorId === null ? undefined : objects.get(descriptorId);
    if (d === undefined) return null;
    if (/\/FontFile2\s/.test(d.dict)) return "FontFile2";
    if (/\/FontFile3\s/.test(d.dict)) return "FontFile3";
    if (/\/FontFile\s/.test(d.dict)) return "FontFile";
    return null;
  };
  for (const o of objects.values()) {
    if (!/\/Type\s*\/Font\b/.test(o.dict)) continue;
    const subtype = name(o.dict, "Subtype");
    const baseFont = name(o.dict, "BaseFont") ?? "[none]";
    if (subtype === "Type3") {
      fonts.push({ name: baseFont, type: "Type 3", embedded: true });
    } else if (subtype === "Type1" || subtype === "MMType1" || subtype === "TrueType") {
      const file = embeddedAs(ref(o.dict, "FontDescriptor"));
      const type = subtype === "TrueType" ? "TrueType" : file === "FontFile3" ? "Type 1C" : "Type 1";
      fonts.push({ name: baseFont, type, embedded: file !== null });
    } else if (subtype === "Type0") {
      const descendants = /\/DescendantFonts\s*\[\s*(\d+)\s+0\s+R/.exec(o.dict);
      const cid = descendants ? objects.get(Number(descendants[1])) : undefined;
      const cidType = cid ? name(cid.dict, "Subtype") : null;
      const file = cid ? embeddedAs(ref(cid.dict, "FontDescriptor")) : null;
      const type = cidType === "CIDFontType2" ? "CID TrueType" : file === "FontFile3" ? "CID Type 0C" : "CID Type 0";
      fonts.push({ name: baseFont, type, embedded: file !== null });
    }
  }
  return fonts;
}

/**
 * The colour spaces a PDF draws in: the device colour spaces named in content streams and
 * dictionaries, and those set by the rg/RG, k/K and g/G operators. ICC-based and other named
 * colour spaces are reported by name.
 */
export function pdfColourSpaces(pdf: Buffer): string[] {
  const found = new Set<string>();
  const device: Record<string, string> = { DeviceRGB: "RGB", DeviceCMYK: "CMYK", DeviceGray: "Gray", CalRGB: "RGB", CalGray: "Gray" };
  const scan = (text: string) => {
    for (const [, space] of text.matchAll(/\/(DeviceRGB|DeviceCMYK|DeviceGray|CalRGB|CalGray|ICCBased|Lab|Separation|DeviceN|Indexed)\b/g)) {
      found.add(device[space] ?? space);
    }
  };
  const num = String.raw`[-+]?(?:\d+\.?\d*|\.\d+)`;
  const operators: [RegExp, string][] = [
    [new RegExp(String.raw`(?:^|\s)(?:${num}\s+){3}(?:rg|RG)(?=\s|$)`, "m"), "RGB"],
    [new RegExp(String.raw`(?:^|\s)(?:${num}\s+){4}(?:k|K)(?=\s|$)`, "m"), "CMYK"],
    [new RegExp(String.raw`(?:^|\s)${num}\s+(?:g|G)(?=\s|$)`, "m"), "Gray"],
  ];
  for (const o of pdfObjects(pdf).values()) {
    scan(o.dict);
    const isContent = o.stream !== null && !/\/Subtype\s*\/(Image|XML|Type1C|CIDFontType0C|OpenType)|\/Type\s*\/(Metadata|XRef)|\/Length1\s/.test(o.dict);
    if (!isContent) continue;
    const content = o.stream!.toString("latin1");
    scan(content);
    for (const [pattern, space] of operators) if (pattern.test(content)) found.add(space);
  }
  return [...found].sort();
}

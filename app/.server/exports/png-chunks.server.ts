// Reading a PNG's chunks (PNG specification, third edition, section 5), for the pHYs chunk and
// the preflight's colour check.

const SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

export interface PngChunk {
  type: string;
  /** Offset of the chunk's length field in the file. */
  offset: number;
  data: Buffer;
}

export function pngChunks(png: Buffer): PngChunk[] {
  if (png.length < 8 || !png.subarray(0, 8).equals(SIGNATURE)) throw new Error("not a PNG file");
  const chunks: PngChunk[] = [];
  let at = 8;
  while (at + 12 <= png.length) {
    const length = png.readUInt32BE(at);
    const type = png.toString("latin1", at + 4, at + 8);
    if (at + 12 + length > png.length) throw new Error(`PNG chunk ${type} runs past the end of the file`);
    chunks.push({ type, offset: at, data: png.subarray(at + 8, at + 8 + length) });
    at += 12 + length;
    if (type === "IEND") break;
  }
  if (chunks[0]?.type !== "IHDR" || chunks.at(-1)?.type !== "IEND") throw new Error("a PNG must start with IHDR and end with IEND");
  return chunks;
}

export interface PngHeader {
  width: number;
  height: number;
  bitDepth: number;
  /** "Gray", "RGB", "Indexed", "Gray+alpha", "RGB+alpha" (IHDR colour types 0, 2, 3, 4, 6). */
  colourType: string;
  /** Dots per inch from pHYs when it is given per metre; null without pHYs. */
  dpi: number | null;
}

const COLOUR_TYPES: Record<number, string> = { 0: "Gray", 2: "RGB", 3: "Indexed", 4: "Gray+alpha", 6: "RGB+alpha" };

export function pngHeader(png: Buffer): PngHeader {
  const chunks = pngChunks(png);
  const ihdr = chunks[0].data;
  const phys = chunks.find((c) => c.type === "pHYs");
  const perMetre = phys && phys.data.readUInt8(8) === 1 ? phys.data.readUInt32BE(0) : null;
  return {
    width: ihdr.readUInt32BE(0),
    height: ihdr.readUInt32BE(4),
    bitDepth: ihdr.readUInt8(8),
    colourType: COLOUR_TYPES[ihdr.readUInt8(9)] ?? `unknown (${ihdr.readUInt8(9)})`,
    dpi: perMetre === null ? null : perMetre * 0.0254,
  };
}

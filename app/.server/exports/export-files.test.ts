// The export files of the reference figure (two datasets of 500 points, three predictions of 1000
// points, a ratio strip), checked with tools that are not ours: poppler's pdfinfo, pdffonts and
// pdftoppm (Debian's poppler-utils, installed by scripts/test.sh) and pngjs as PNG decoder.
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import path from "node:path";
import PDFDocument from "pdfkit";
import { PNG } from "pngjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { preflight } from "~/exports/preflight";
import { PT_PER_MM } from "~/figures/build-figure";
import { findPreset } from "~/figures/journal-presets";
import { renderFigure, type RenderedFigure } from "~/figures/render-figure";
import { referenceInputs, referenceModel } from "~/figures/testing/reference-figure";
import { pdfColourSpaces, pdfFonts } from "./inspect-pdf.server";
import { pngHeader } from "./png-chunks.server";
import { preflightInput } from "./preflight-input.server";
import { svgToPdf, type PdfOptions } from "./svg-to-pdf.server";
import { svgToPng } from "./svg-to-png.server";

let dir: string;
let figure: RenderedFigure;
let options: PdfOptions;
let pdf: Buffer;

const SEALED_AT = new Date("2026-12-03T10:11:12Z");

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "steradian-export-"));
  figure = await renderFigure(referenceModel(), referenceInputs(), { title: "Reference figure", description: "", notes: [] });
  options = {
    widthPt: figure.built.widthPt,
    heightPt: figure.built.heightPt,
    title: "Reference figure & <friends>: dσ/dΩ",
    author: "A. Author; B. Coauthor",
    subject: "fingerprint 3f2a9c0b7d1e",
    keywords: "e+e- annihilation, Born level",
    creationDate: SEALED_AT,
    documentId: "version-1f0c",
  };
  pdf = await svgToPdf(figure.svg, options);
}, 60_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

function tool(command: string, args: string[]): string {
  return execFileSync(command, args, { encoding: "utf8" });
}
function saved(name: string, bytes: Buffer): string {
  const file = path.join(dir, name);
  writeFileSync(file, bytes);
  return file;
}
const info = (file: string) =>
  Object.fromEntries(
    tool("pdfinfo", ["-isodates", file])
      .split("\n")
      .map((l) => /^([^:]+):\s*(.*)$/.exec(l))
      .filter((m) => m !== null)
      .map((m) => [m![1], m![2]]),
  );

/** pdffonts' table as rows: name, type, embedded (the columns are cut at the header's dashes). */
function pdffontsRows(file: string) {
  const lines = tool("pdffonts", [file]).trimEnd().split("\n");
  const dashes = lines[1];
  const cuts = [...dashes.matchAll(/-+/g)].map((m) => [m.index!, m.index! + m[0].length] as const);
  return lines.slice(2).map((line) => {
    const [name, type, , emb] = cuts.map(([a, b]) => line.slice(a, b + 1).trim());
    return { name, type, embedded: emb === "yes" };
  });
}

/** Grey levels (0 black … 255 white) of a PNG decoded by pngjs, composited on white. */
function grey(png: Buffer) {
  const image = PNG.sync.read(png);
  const g = new Float64Array(image.width * image.height);
  const d = image.data;
  for (let i = 0; i < g.length; i++) {
    const alpha = d[4 * i + 3] / 255;
    g[i] = (0.299 * d[4 * i] + 0.587 * d[4 * i + 1] + 0.114 * d[4 * i + 2]) * alpha + 255 * (1 - alpha);
  }
  return { width: image.width, height: image.height, g };
}
const inkFraction = (img: ReturnType<typeof grey>) => img.g.filter((v) => v < 200).length / img.g.length;

/** Mean darkness of each cell of a coarse grid: the picture's layout, insensitive to anti-aliasing. */
function blocks(img: ReturnType<typeof grey>, n: number): number[] {
  const out: number[] = [];
  for (let by = 0; by < n; by++) {
    for (let bx = 0; bx < n; bx++) {
      let sum = 0;
      let count = 0;
      for (let y = Math.floor((by * img.height) / n); y < Math.floor(((by + 1) * img.height) / n); y++) {
        for (let x = Math.floor((bx * img.width) / n); x < Math.floor(((bx + 1) * img.width) / n); x++) {
          sum += 255 - img.g[y * img.width + x];
          count++;
        }
      }
      out.push(sum / count);
    }
  }
  return out;
}
function correlation(a: number[], b: number[]): number {
  const mean = (v: number[]) => v.reduce((s, x) => s + x, 0) / v.length;
  const ma = mean(a);
  const mb = mean(b);
  let num = 0;
  let da = 0;
  let db = 0;
  for (let i = 0; i < a.length; i++) {
    num += (a[i] - ma) * (b[i] - mb);
    da += (a[i] - ma) ** 2;
    db += (b[i] - mb) ** 2;
  }
  return num / Math.sqrt(da * db);
}

describe("svgToPdf on the reference figure", () => {
  it("makes one page of exactly the figure's size, 86 mm wide (pdfinfo)", () => {
    const i = info(saved("figure.pdf", pdf));
    const size = /^([\d.]+) x ([\d.]+) pts/.exec(i["Page size"])!;
    // 86 mm = 86 / 25.4 × 72 pt = 243.78 pt; pdfinfo prints to 0.001 pt.
    expect(Math.abs(Number(size[1]) - (86 / 25.4) * 72)).toBeLessThan(0.002);
    expect(Math.abs(Number(size[2]) - figure.built.heightPt)).toBeLessThan(0.002);
    expect(i.Pages).toBe("1");
    expect(i["PDF version"]).toBe("1.4");
  });

  it("carries title, authors, the fingerprint as subject, keywords and the seal time as both dates (pdfinfo)", () => {
    const i = info(saved("figure.pdf", pdf));
    expect(i.Title).toBe(options.title);
    expect(i.Author).toBe(options.author);
    expect(i.Subject).toBe(options.subject);
    expect(i.Keywords).toBe(options.keywords);
    expect(i.CreationDate).toBe("2026-12-03T10:11:12Z");
    expect(i.ModDate).toBe("2026-12-03T10:11:12Z");
    // The XMP packet holds the same title, escaped, so that it stays well-formed XML.
    const xmp = tool("pdfinfo", ["-meta", saved("figure.pdf", pdf)]);
    expect(xmp).toContain("Reference figure &amp; &lt;friends&gt;: dσ/dΩ");
    expect(xmp).toContain("<xmp:CreateDate>2026-12-03T10:11:12Z</xmp:CreateDate>");
  });

  it("has no font at all, so none of Type 3 and none to substitute (pdffonts), and our reader agrees", () => {
    expect(pdffontsRows(saved("figure.pdf", pdf))).toEqual([]);
    expect(tool("pdffonts", [saved("figure.pdf", pdf)])).not.toMatch(/Type 3/);
    expect(pdfFonts(pdf)).toEqual([]);
    expect(pdfColourSpaces(pdf)).toEqual(["RGB"]);
  });

  it("is byte-identical when made twice, with the file identifier fixed by documentId", async () => {
    const again = await svgToPdf(figure.svg, options);
    expect(again.equals(pdf)).toBe(true);
    const id = createHash("sha256").update("version-1f0c").digest().subarray(0, 16).toString("hex");
    expect(pdf.toString("latin1")).toContain(`/ID [<${id}> <${id}>]`);
    // Another documentId changes the identifier and nothing else (a small drawing keeps this quick).
    const small = '<svg xmlns="http://www.w3.org/2000/svg" width="20pt" height="10pt" viewBox="0 0 20 10"><path d="M1 1h18v8z" fill="#336699"/></svg>';
    const one = await svgToPdf(small, { ...options, widthPt: 20, heightPt: 10 });
    const two = await svgToPdf(small, { ...options, widthPt: 20, heightPt: 10, documentId: "version-2" });
    const idOf = (b: Buffer) => /\/ID \[<([0-9a-f]{32})>/.exec(b.toString("latin1"))![1];
    expect(idOf(one)).toBe(id);
    expect(idOf(two)).toBe(createHash("sha256").update("version-2").digest().subarray(0, 16).toString("hex"));
    expect(two.toString("latin1").replaceAll(idOf(two), id)).toBe(one.toString("latin1"));
  });

  it("draws the picture that resvg draws: pdftoppm at 150 dpi against the PNG at 150 dpi", () => {
    const file = saved("figure.pdf", pdf);
    tool("pdftoppm", ["-r", "150", "-png", "-singlefile", file, path.join(dir, "from-pdf")]);
    const fromPdf = grey(readFileSync(path.join(dir, "from-pdf.png")));
    const fromSvg = grey(svgToPng(figure.svg, { widthPt: options.widthPt, heightPt: options.heightPt, dpi: 150 }));
    // 243.78 pt at 150 dpi = 507.9 px; poppler and we may round differently by one pixel.
    expect(Math.abs(fromPdf.width - (options.widthPt / 72) * 150)).toBeLessThan(1);
    expect(Math.abs(fromPdf.height - (options.heightPt / 72) * 150)).toBeLessThan(1);
    expect(Math.abs(fromPdf.width - fromSvg.width)).toBeLessThanOrEqual(1);
    // Not blank, not black: the reference figure inks about a tenth of its area (10.1 % through
    // the PDF, 11.4 % through resvg when this test was written), in both renderings alike.
    const inkPdf = inkFraction(fromPdf);
    const inkSvg = inkFraction(fromSvg);

    expect(inkPdf).toBeGreaterThan(0.03);
    expect(inkPdf).toBeLessThan(0.4);
    expect(Math.abs(inkPdf - inkSvg)).toBeLessThan(0.25 * inkSvg);
    // The same layout: darkness on a 12 × 12 grid correlates almost perfectly (0.998 measured).
    // The control: the same picture moved right by a tenth of its width scores about 0.75.
    expect(correlation(blocks(fromPdf, 12), blocks(fromSvg, 12))).toBeGreaterThan(0.95);
    const shift = Math.round(fromSvg.width / 10);
    const moved = { ...fromSvg, g: fromSvg.g.map((_, i) => (i % fromSvg.width >= shift ? fromSvg.g[i - shift] : 255)) };
    expect(correlation(blocks(fromPdf, 12), blocks(moved, 12))).toBeLessThan(0.9);
  });

  it("refuses an SVG that links an image or still holds text elements", async () => {
    await expect(svgToPdf(figure.svg.replace("</svg>", '<image href="/etc/hostname" width="9" height="9"/></svg>'), options)).rejects.toThrow(/not self-contained/);
    await expect(svgToPdf(figure.svg.replace("</svg>", '<text x="9" y="9">σ</text></svg>'), options)).rejects.toThrow(/glyph paths/);
  });
});

describe("svgToPng on the reference figure", () => {
  let png: Buffer;
  beforeAll(() => {
    png = svgToPng(figure.svg, { widthPt: options.widthPt, heightPt: options.heightPt });
    saved("figure-600dpi.png", png);
  }, 60_000);

  it("is 600 dpi by default: 86 mm → 2031 pixels wide, with pHYs saying 600 dpi", () => {
    const decoded = PNG.sync.read(png);
    // 86 mm / 25.4 mm per inch × 600 = 2031.5 → 2031 (the width is 243.7795 pt, not 243.78).
    expect(decoded.width).toBe(Math.round((86 / 25.4) * 600));
    expect(decoded.width).toBe(2031);
    expect(decoded.height).toBe(Math.round(((figure.built.heightPt / PT_PER_MM) / 25.4) * 600));
    const header = pngHeader(png);
    // 600 dpi = 600 / 0.0254 m = 23622.05 px/m, stored as the whole number 23622.
    expect(header.dpi).toBeCloseTo(23622 * 0.0254, 6);
    expect(header.colourType).toBe("RGB+alpha");
  });

  it("is white at the corners and inked inside", () => {
    const img = grey(png);
    expect([img.g[0], img.g[img.width - 1], img.g[img.g.length - 1]]).toEqual([255, 255, 255]);
    expect(inkFraction(img)).toBeGreaterThan(0.03);
  });

  it("is byte-identical when made twice", () => {
    expect(svgToPng(figure.svg, { widthPt: options.widthPt, heightPt: options.heightPt }).equals(png)).toBe(true);
  });

  it("passes every preflight check of the single-column preset, measured from the files themselves", () => {
    const input = preflightInput(figure.built, { pdf, svg: figure.svg, png });
    expect(input.colourSpaces).toEqual(["RGB"]);
    expect(input.pdfFonts).toEqual([]);
    expect(input.fileBytes).toEqual({ pdf: pdf.length, svg: Buffer.byteLength(figure.svg), png: png.length });
    const checks = preflight(input, findPreset("single-column")!);
    expect(checks.filter((c) => !c.pass)).toEqual([]);
  });

  it("follows the preset's dpi (300 dpi → 1016 pixels for 86 mm)", () => {
    const small = svgToPng(figure.svg, { widthPt: options.widthPt, heightPt: options.heightPt, dpi: 300 });
    expect(PNG.sync.read(small).width).toBe(1016);
    expect(pngHeader(small).dpi).toBeCloseTo(Math.round(300 / 0.0254) * 0.0254, 6);
  });
});

describe("reading a PDF", () => {
  async function pdfWithText(setUp: (doc: PDFKit.PDFDocument) => void): Promise<Buffer> {
    const doc = new PDFDocument({ size: [200, 100], info: { CreationDate: SEALED_AT } });
    const chunks: Buffer[] = [];
    doc.on("data", (c: Buffer) => chunks.push(c));
    const done = new Promise((resolve) => doc.on("end", resolve));
    setUp(doc);
    doc.end();
    await done;
    return Buffer.concat(chunks);
  }

  it("reads a standard font that is not embedded, and an embedded TrueType subset, as pdffonts does", async () => {
    const ttf = createRequire(import.meta.url).resolve("computer-modern/fonts/cmu-serif-500-roman.ttf");
    const mixed = await pdfWithText((doc) => {
      doc.font("Helvetica").text("Helvetica, not embedded", 10, 10);
      doc.font(ttf).text("CMU Serif, embedded", 10, 40);
    });
    const expected = pdffontsRows(saved("mixed.pdf", mixed));
    expect(expected.map((f) => [f.type, f.embedded])).toEqual([
      ["Type 1", false],
      ["CID TrueType", true],
    ]);
    expect(pdfFonts(mixed)).toEqual(expected);
  });

  it("finds CMYK colours as well as RGB", async () => {
    const cmyk = await pdfWithText((doc) => doc.rect(10, 10, 50, 50).fill([0, 60, 100, 0]));
    expect(pdfColourSpaces(cmyk)).toEqual(["CMYK"]);
    const both = await pdfWithText((doc) => {
      doc.rect(10, 10, 50, 50).fill("#336699");
      doc.rect(70, 10, 50, 50).fill([0, 0, 0, 100]);
    });
    expect(pdfColourSpaces(both)).toEqual(["CMYK", "RGB"]);
  });
});

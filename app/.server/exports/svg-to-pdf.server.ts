// The figure's SVG as a vector PDF page of the same size (docs/decisions/0009-export-rendering.md).
import { createHash } from "node:crypto";
import PDFDocument from "pdfkit";
import SVGtoPDF from "svg-to-pdfkit";
import { assertSelfContainedSvg, assertTextAsOutlines } from "~/exports/self-contained-svg";

export interface PdfOptions {
  /** Page size, pt: the figure's own size, so the page is the figure. */
  widthPt: number;
  heightPt: number;
  title: string;
  author: string;
  /** The version's fingerprint goes here, so that the file names the version it shows. */
  subject: string;
  keywords: string;
  /** CreationDate and ModDate: the seal time, so that the same version gives the same bytes. */
  creationDate: Date;
  /** The file identifier (trailer /ID) is derived from this, e.g. the version's id. */
  documentId: string;
}

const xml = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

interface PdfKitInternals {
  info: { Title?: string; Author?: string; Subject?: string; Keywords?: string; Creator: string; Producer: string; CreationDate: Date };
  appendXML(xml: string, newline?: boolean): void;
  _id: Uint8Array;
}

/**
 * pdfkit 0.20.2 with two changes, both tested in svg-to-pdf.test.ts:
 * - its XMP metadata writes title, author, subject and keywords into XML unescaped (a title with
 *   "&" or "<" would break the packet): this writes the same packet, escaped;
 * - its file identifier is an MD5 of the info dictionary; this one is fixed by `documentId`.
 */
class FigurePdfDocument extends PDFDocument {
  _addInfo(): void {
    const self = this as unknown as PdfKitInternals;
    const i = self.info;
    const lines = [
      `<rdf:Description rdf:about="" xmlns:xmp="http://ns.adobe.com/xap/1.0/">`,
      `<xmp:CreateDate>${i.CreationDate.toISOString().split(".")[0]}Z</xmp:CreateDate>`,
      `<xmp:CreatorTool>${xml(i.Creator)}</xmp:CreatorTool>`,
      `</rdf:Description>`,
      `<rdf:Description rdf:about="" xmlns:dc="http://purl.org/dc/elements/1.1/">`,
      ...(i.Title ? [`<dc:title><rdf:Alt><rdf:li xml:lang="x-default">${xml(i.Title)}</rdf:li></rdf:Alt></dc:title>`] : []),
      ...(i.Author ? [`<dc:creator><rdf:Seq><rdf:li>${xml(i.Author)}</rdf:li></rdf:Seq></dc:creator>`] : []),
      ...(i.Subject ? [`<dc:description><rdf:Alt><rdf:li xml:lang="x-default">${xml(i.Subject)}</rdf:li></rdf:Alt></dc:description>`] : []),
      `</rdf:Description>`,
      `<rdf:Description rdf:about="" xmlns:pdf="http://ns.adobe.com/pdf/1.3/">`,
      `<pdf:Producer>${xml(i.Producer)}</pdf:Producer>`,
      ...(i.Keywords ? [`<pdf:Keywords>${xml(i.Keywords)}</pdf:Keywords>`] : []),
      `</rdf:Description>`,
    ];
    self.appendXML(lines.join("\n"));
  }
}

/** The 16-byte file identifier of a document: the first half of SHA-256(documentId). */
export function pdfFileId(documentId: string): Buffer {
  return createHash("sha256").update(documentId, "utf8").digest().subarray(0, 16);
}

/**
 * One PDF page at exactly widthPt × heightPt holding the SVG as vector paths. The figure's text
 * is already glyph outlines, so the PDF has no fonts at all. Deterministic: the dates and the
 * file identifier come from the options and pdfkit compresses with zlib at a fixed level, so the
 * same SVG and options give the same bytes.
 */
export async function svgToPdf(svg: string, options: PdfOptions): Promise<Buffer> {
  assertSelfContainedSvg(svg);
  assertTextAsOutlines(svg);
  if (!(options.widthPt > 0 && options.heightPt > 0)) throw new Error(`a PDF page of ${options.widthPt} × ${options.heightPt} pt is not a page`);
  if (Number.isNaN(options.creationDate.getTime())) throw new Error("the PDF needs a valid creation date");
  const doc = new FigurePdfDocument({
    size: [options.widthPt, options.heightPt],
    margin: 0,
    // 1.4: the first version with transparency, which the figure's markers and bands use.
    pdfVersion: "1.4",
    compress: true,
    info: {
      Title: options.title,
      Author: options.author,
      Subject: options.subject,
      Keywords: options.keywords,
      Creator: "Steradian",
      Producer: "Steradian (PDFKit, SVG-to-PDFKit)",
      CreationDate: options.creationDate,
      ModDate: options.creationDate,
    },
  });
  (doc as unknown as PdfKitInternals)._id = pdfFileId(options.documentId);
  const chunks: Buffer[] = [];
  doc.on("data", (chunk: Buffer) => chunks.push(chunk));
  const ended = new Promise<void>((resolve, reject) => {
    doc.on("end", () => resolve());
    doc.on("error", reject);
  });
  const warnings: string[] = [];
  // The root element's size is in pt: svg-to-pdfkit turns it into its px (1 pt = 4/3 px) and
  // back with 72/96, so the figure lands at exactly the page size.
  SVGtoPDF(doc, svg, 0, 0, {
    width: options.widthPt,
    height: options.heightPt,
    warningCallback: (w) => warnings.push(w),
    imageCallback: () => {
      throw new Error("the figure SVG links an image");
    },
  });
  doc.end();
  await ended;
  if (warnings.length > 0) throw new Error(`svg-to-pdfkit could not draw part of the figure: ${warnings.join("; ")}`);
  return Buffer.concat(chunks);
}

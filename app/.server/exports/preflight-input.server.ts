// The preflight's measurements of one export, read from the built figure and the files made.
import type { PreflightInput } from "~/exports/preflight";
import type { BuiltFigure } from "~/figures/build-figure";
import { PT_PER_MM } from "~/figures/build-figure";
import { pdfColourSpaces, pdfFonts } from "./inspect-pdf.server";
import { pngHeader } from "./png-chunks.server";

/** A PNG's colour type as a colour space: its palette of an indexed PNG is RGB. */
const PNG_SPACES: Record<string, string> = { Gray: "Gray", "Gray+alpha": "Gray", RGB: "RGB", "RGB+alpha": "RGB", Indexed: "RGB" };

export function preflightInput(built: Pick<BuiltFigure, "widthPt" | "heightPt" | "smallestTextPt" | "thinnestLinePt">, files: { pdf: Buffer; svg: string; png: Buffer }): PreflightInput {
  const png = pngHeader(files.png);
  return {
    widthMm: built.widthPt / PT_PER_MM,
    heightMm: built.heightPt / PT_PER_MM,
    smallestTextPt: built.smallestTextPt,
    thinnestLinePt: built.thinnestLinePt,
    fileBytes: { pdf: files.pdf.length, svg: Buffer.byteLength(files.svg, "utf8"), png: files.png.length },
    pdfFonts: pdfFonts(files.pdf),
    colourSpaces: [...new Set([...pdfColourSpaces(files.pdf), PNG_SPACES[png.colourType] ?? png.colourType])].sort(),
  };
}

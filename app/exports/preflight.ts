// Preflight: a version's export files checked against its journal size preset before they go to
// the journal. Pure: the measurements come in (app/.server/exports/inspect-export.server.ts
// reads them from the files), so the same report can be shown in the browser.
import type { SizePreset } from "~/figures/journal-presets";

/** How far the width may be from the preset's: half a millimetre, below what a journal would rescale for. */
export const WIDTH_TOLERANCE_MM = 0.5;
/**
 * Largest file accepted per format: 10 MB (10 000 000 bytes). Common practice of journal
 * submission systems for a single figure file, not one journal's rule (no guideline was looked up;
 * check the journal's instructions).
 */
export const MAX_FILE_BYTES = 10_000_000;
/**
 * Colour spaces accepted: RGB (sRGB) and grey. RGB is what journals publish online; a journal
 * that prints in colour converts to CMYK itself or asks for it, so CMYK is flagged for a look.
 */
export const ACCEPTED_COLOUR_SPACES = ["RGB", "Gray"] as const;

/** One font as `pdffonts` lists it (or as read from the PDF's font dictionaries). */
export interface PdfFont {
  name: string;
  /** e.g. "Type 1", "Type 1C", "Type 3", "TrueType", "CID TrueType", "CID Type 0C". */
  type: string;
  embedded: boolean;
}

export interface PreflightInput {
  /** Final printed size of the figure, mm. */
  widthMm: number;
  heightMm: number;
  /** Smallest text size and thinnest line drawn at final size, pt (BuiltFigure has both). */
  smallestTextPt: number;
  thinnestLinePt: number;
  fileBytes: { pdf: number; svg: number; png: number };
  /** Fonts of the PDF; [] when every text is drawn as outlines. */
  pdfFonts: PdfFont[];
  /** Colour spaces used by the PDF and the PNG, e.g. ["RGB"]. */
  colourSpaces: string[];
}

export type PreflightPreset = Pick<SizePreset, "widthMm" | "maxHeightMm" | "minTextPt" | "minLineWidthPt">;

export interface PreflightCheck {
  id: "width" | "height" | "text-size" | "line-width" | "fonts" | "colour-space" | "file-size-pdf" | "file-size-svg" | "file-size-png";
  label: string;
  pass: boolean;
  /** What was measured, with its unit. */
  measured: string;
  /** What the check accepts, with its unit. */
  limit: string;
}

// Sizes are printed to the precision a reader of the report can act on; the comparisons use the
// exact numbers, with a margin far below any printed digit for values computed in floating point.
const EPS = 1e-9;
const mm = (v: number) => `${v.toFixed(1)} mm`;
const pt = (v: number) => `${Number(v.toFixed(2))} pt`;
const megabytes = (bytes: number) => `${(bytes / 1e6).toFixed(2)} MB (${bytes} bytes)`;

/**
 * Every check of the export against the preset, each with pass or fail and the measured value.
 * The caller decides what a failure does (the export is blocked unless overridden with a reason).
 */
export function preflight(input: PreflightInput, preset: PreflightPreset): PreflightCheck[] {
  const fonts = input.pdfFonts;
  const badFonts = fonts.filter((f) => !f.embedded || /type\s*3/i.test(f.type));
  const foreignColours = input.colourSpaces.filter((c) => !(ACCEPTED_COLOUR_SPACES as readonly string[]).includes(c));
  const sizeCheck = (format: "pdf" | "svg" | "png"): PreflightCheck => ({
    id: `file-size-${format}`,
    label: `${format.toUpperCase()} file size`,
    pass: input.fileBytes[format] <= MAX_FILE_BYTES,
    measured: megabytes(input.fileBytes[format]),
    limit: `at most ${megabytes(MAX_FILE_BYTES)}, common practice of submission systems`,
  });
  return [
    {
      id: "width",
      label: "Width",
      pass: Math.abs(input.widthMm - preset.widthMm) <= WIDTH_TOLERANCE_MM + EPS,
      measured: mm(input.widthMm),
      limit: `${preset.widthMm} mm ± ${WIDTH_TOLERANCE_MM} mm`,
    },
    {
      id: "height",
      label: "Height",
      pass: input.heightMm <= preset.maxHeightMm + EPS,
      measured: mm(input.heightMm),
      limit: `at most ${preset.maxHeightMm} mm`,
    },
    {
      id: "text-size",
      label: "Smallest text",
      pass: input.smallestTextPt >= preset.minTextPt - EPS,
      measured: pt(input.smallestTextPt),
      limit: `at least ${preset.minTextPt} pt`,
    },
    {
      id: "line-width",
      label: "Thinnest line",
      pass: input.thinnestLinePt >= preset.minLineWidthPt - EPS,
      measured: pt(input.thinnestLinePt),
      limit: `at least ${preset.minLineWidthPt} pt`,
    },
    {
      id: "fonts",
      label: "Fonts embedded, none Type 3",
      pass: badFonts.length === 0,
      measured:
        fonts.length === 0
          ? "no fonts: all text is drawn as outlines"
          : badFonts.length === 0
            ? `${fonts.length} font(s), all embedded, none Type 3`
            : `not embedded or Type 3: ${badFonts.map((f) => `${f.name} (${f.type}${f.embedded ? "" : ", not embedded"})`).join("; ")}`,
      limit: "every font embedded, none of Type 3",
    },
    {
      id: "colour-space",
      label: "Colour space",
      pass: input.colourSpaces.length > 0 && foreignColours.length === 0,
      measured: input.colourSpaces.length === 0 ? "none found" : [...new Set(input.colourSpaces)].join(", "),
      limit: "RGB (sRGB) or grey, for screen and online publication; a journal printing in colour may ask for CMYK",
    },
    sizeCheck("pdf"),
    sizeCheck("svg"),
    sizeCheck("png"),
  ];
}

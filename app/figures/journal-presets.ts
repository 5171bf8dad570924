// Figure sizes for journals. The three generic sizes follow common journal practice; the others
// carry the column widths and minimum sizes of widely used physics journals, written from memory
// of the journal's author guidelines; check the journal's current instructions. No guideline was
// looked up when these were written, and each preset's note says so to the author: the journal's
// own rules prevail over any number here.

export interface SizePreset {
  id: string;
  name: string;
  /** Width of the figure at final printed size, mm. */
  widthMm: number;
  /** Tallest figure the page allows (text height less a caption line), mm. */
  maxHeightMm: number;
  /** Smallest text allowed at final size, pt (1 pt = 1/72 in). */
  minTextPt: number;
  /** Thinnest line allowed at final size, pt. */
  minLineWidthPt: number;
  /** Text size a new figure starts with, pt. */
  fontSizePt: number;
  /** Line width a new figure starts with, pt. */
  lineWidthPt: number;
  /** Resolution of the PNG export, dots per inch. */
  dpi: number;
  /** Where the numbers come from, shown with the preset. */
  note: string;
}

export const DEFAULT_PRESET_ID = "single-column";

const GENERIC_NOTE = "Common journal practice, not one journal's rule: check the journal's current instructions for authors.";
const memoryNote = (journal: string, extra = "") =>
  `From memory of the author guidelines of ${journal}${extra}; check the journal's current instructions for authors, whose rules prevail.`;

// Start-up text and line sizes stay at 8 pt and 0.5 pt everywhere: at or above every minimum below,
// so a new figure passes preflight for any preset.
const START = { fontSizePt: 8, lineWidthPt: 0.5 } as const;

export const SIZE_PRESETS: readonly SizePreset[] = [
  // Generic sizes (common practice).
  { id: "single-column", name: "Single column (86 mm)", widthMm: 86, maxHeightMm: 230, minTextPt: 7, minLineWidthPt: 0.3, ...START, dpi: 600, note: GENERIC_NOTE },
  { id: "one-and-a-half-column", name: "One and a half columns (140 mm)", widthMm: 140, maxHeightMm: 230, minTextPt: 7, minLineWidthPt: 0.3, ...START, dpi: 600, note: GENERIC_NOTE },
  { id: "double-column", name: "Double column (178 mm)", widthMm: 178, maxHeightMm: 230, minTextPt: 7, minLineWidthPt: 0.3, ...START, dpi: 600, note: GENERIC_NOTE },

  // American Physical Society, Physical Review family: 8.6 cm column, about 17.8 cm page width.
  // From memory of the journal's author guidelines; check the journal's current instructions.
  { id: "physical-review-single", name: "Physical Review, one column (86 mm)", widthMm: 86, maxHeightMm: 235, minTextPt: 7, minLineWidthPt: 0.5, ...START, dpi: 600, note: memoryNote("the Physical Review journals (American Physical Society)", ": column 8.6 cm (246 pt)") },
  { id: "physical-review-double", name: "Physical Review, two columns (178 mm)", widthMm: 178, maxHeightMm: 235, minTextPt: 7, minLineWidthPt: 0.5, ...START, dpi: 600, note: memoryNote("the Physical Review journals (American Physical Society)", ": page width about 17.8 cm") },

  // AIP Publishing (e.g. Journal of Mathematical Physics, Physics of Plasmas): 8.5 cm and 17 cm,
  // text at least 8 pt, lines at least 0.5 pt. From memory of the journal's author guidelines;
  // check the journal's current instructions.
  { id: "aip-single", name: "AIP Publishing, one column (85 mm)", widthMm: 85, maxHeightMm: 230, minTextPt: 8, minLineWidthPt: 0.5, ...START, dpi: 600, note: memoryNote("AIP Publishing", ": 8.5 cm (3.37 in), text ≥ 8 pt, lines ≥ 0.5 pt") },
  { id: "aip-double", name: "AIP Publishing, two columns (170 mm)", widthMm: 170, maxHeightMm: 230, minTextPt: 8, minLineWidthPt: 0.5, ...START, dpi: 600, note: memoryNote("AIP Publishing", ": 17 cm (6.69 in), text ≥ 8 pt, lines ≥ 0.5 pt") },

  // The European Physical Journal family (Springer): 84 mm and 174 mm, text 8–12 pt, lines at
  // least 0.3 pt, line art at 1200 dpi. From memory of the journal's author guidelines; check the
  // journal's current instructions.
  { id: "epj-single", name: "European Physical Journal, one column (84 mm)", widthMm: 84, maxHeightMm: 234, minTextPt: 8, minLineWidthPt: 0.3, ...START, dpi: 1200, note: memoryNote("the European Physical Journal (Springer)", ": 84 mm, text 8–12 pt, lines ≥ 0.3 pt, line art 1200 dpi") },
  { id: "epj-double", name: "European Physical Journal, two columns (174 mm)", widthMm: 174, maxHeightMm: 234, minTextPt: 8, minLineWidthPt: 0.3, ...START, dpi: 1200, note: memoryNote("the European Physical Journal (Springer)", ": 174 mm, text 8–12 pt, lines ≥ 0.3 pt, line art 1200 dpi") },

  // Journal of High Energy Physics (SISSA, Springer): a one-column page; figures are usually set
  // at most the text width of about 150 mm, often narrower. From memory of the journal's author
  // guidelines; check the journal's current instructions.
  { id: "jhep-text-width", name: "Journal of High Energy Physics, text width (150 mm)", widthMm: 150, maxHeightMm: 220, minTextPt: 8, minLineWidthPt: 0.3, ...START, dpi: 1200, note: memoryNote("the Journal of High Energy Physics", ": one-column page, text width about 150 mm; no fixed figure widths") },
  { id: "jhep-half-width", name: "Journal of High Energy Physics, half text width (75 mm)", widthMm: 75, maxHeightMm: 220, minTextPt: 8, minLineWidthPt: 0.3, ...START, dpi: 1200, note: memoryNote("the Journal of High Energy Physics", ": two figures side by side across a text width of about 150 mm") },

  // Elsevier physics journals (Nuclear Physics A and B, Physics Letters B, Nuclear Instruments and
  // Methods A): 90, 140 and 190 mm, at most 240 mm high, text at least 7 pt, lines 0.10–1.5 pt,
  // line art at 1000 dpi. From memory of the journal's author guidelines; check the journal's
  // current instructions.
  { id: "elsevier-single", name: "Nuclear Physics / Physics Letters, one column (90 mm)", widthMm: 90, maxHeightMm: 240, minTextPt: 7, minLineWidthPt: 0.1, ...START, dpi: 1000, note: memoryNote("Elsevier's physics journals (Nuclear Physics, Physics Letters)", ": 90 mm, height ≤ 240 mm, text ≥ 7 pt, lines 0.10–1.5 pt, line art 1000 dpi") },
  { id: "elsevier-one-and-a-half", name: "Nuclear Physics / Physics Letters, 1.5 columns (140 mm)", widthMm: 140, maxHeightMm: 240, minTextPt: 7, minLineWidthPt: 0.1, ...START, dpi: 1000, note: memoryNote("Elsevier's physics journals (Nuclear Physics, Physics Letters)", ": 140 mm, height ≤ 240 mm, text ≥ 7 pt, lines 0.10–1.5 pt, line art 1000 dpi") },
  { id: "elsevier-double", name: "Nuclear Physics / Physics Letters, two columns (190 mm)", widthMm: 190, maxHeightMm: 240, minTextPt: 7, minLineWidthPt: 0.1, ...START, dpi: 1000, note: memoryNote("Elsevier's physics journals (Nuclear Physics, Physics Letters)", ": 190 mm, height ≤ 240 mm, text ≥ 7 pt, lines 0.10–1.5 pt, line art 1000 dpi") },

  // IOP Publishing (e.g. Journal of Physics G, New Journal of Physics): 8.5 cm and 15 cm, text
  // 8–12 pt. From memory of the journal's author guidelines; check the journal's current instructions.
  { id: "iop-single", name: "IOP Publishing, one column (85 mm)", widthMm: 85, maxHeightMm: 230, minTextPt: 8, minLineWidthPt: 0.3, ...START, dpi: 600, note: memoryNote("IOP Publishing", ": 8.5 cm, text 8–12 pt; do not rely on colour alone") },
  { id: "iop-wide", name: "IOP Publishing, full width (150 mm)", widthMm: 150, maxHeightMm: 230, minTextPt: 8, minLineWidthPt: 0.3, ...START, dpi: 600, note: memoryNote("IOP Publishing", ": 15 cm, text 8–12 pt; do not rely on colour alone") },

  // American Journal of Physics (AAPT): 8.6 cm column, text at least 8 pt, bitmaps of graphs at
  // least 600 ppi. From memory of the journal's author guidelines; check the journal's current instructions.
  { id: "ajp-single", name: "American Journal of Physics, one column (86 mm)", widthMm: 86, maxHeightMm: 230, minTextPt: 8, minLineWidthPt: 0.5, ...START, dpi: 600, note: memoryNote("the American Journal of Physics (AAPT)", ": 8.6 cm, text ≥ 8 pt, graphs ≥ 600 ppi, no JPEG") },
];

/** The preset with this id, or undefined (a draft may name a preset that no longer exists). */
export function findPreset(id: string): SizePreset | undefined {
  return SIZE_PRESETS.find((p) => p.id === id);
}

import { describe, expect, it } from "vitest";
import { buildFigure, PT_PER_MM } from "~/figures/build-figure";
import { computeFigureData } from "~/figures/compute-figure-data";
import { figureModelSchema } from "~/figures/figure-model";
import { findPreset } from "~/figures/journal-presets";
import { referenceInputs, referenceModelInput } from "~/figures/testing/reference-figure";
import { MAX_FILE_BYTES, preflight, type PreflightCheck, type PreflightInput } from "./preflight";

// Label sizes do not matter for these checks: a fixed box stands in for MathJax's measure.
const measure = () => ({ widthPt: 20, heightPt: 6, depthPt: 1.5 });
const inputs = referenceInputs();

function builtInput(overrides: Record<string, unknown> = {}): PreflightInput {
  const model = figureModelSchema.parse({ ...referenceModelInput(), ...overrides });
  const built = buildFigure(model, computeFigureData(model, inputs), findPreset(model.preset)!, measure);
  return {
    widthMm: built.widthPt / PT_PER_MM,
    heightMm: built.heightPt / PT_PER_MM,
    smallestTextPt: built.smallestTextPt,
    thinnestLinePt: built.thinnestLinePt,
    fileBytes: { pdf: 200_000, svg: 1_500_000, png: 320_000 },
    pdfFonts: [],
    colourSpaces: ["RGB"],
  };
}

const byId = (checks: PreflightCheck[], id: PreflightCheck["id"]) => checks.find((c) => c.id === id)!;
const failing = (checks: PreflightCheck[]) => checks.filter((c) => !c.pass).map((c) => c.id);

describe("preflight", () => {
  it("passes the reference figure (8 pt text, 0.6 pt lines) for the 86 mm single-column preset, every check with a measured value", () => {
    const checks = preflight(builtInput(), findPreset("single-column")!);
    expect(checks.map((c) => c.id)).toEqual(["width", "height", "text-size", "line-width", "fonts", "colour-space", "file-size-pdf", "file-size-svg", "file-size-png"]);
    expect(failing(checks)).toEqual([]);
    expect(byId(checks, "width").measured).toBe("86.0 mm");
    expect(byId(checks, "fonts").measured).toMatch(/no fonts/);
    for (const c of checks) expect(c.measured.length > 0 && c.limit.length > 0).toBe(true);
  });

  it("flags a figure whose text is below the preset's minimum (6 pt text against 7 pt)", () => {
    const checks = preflight(builtInput({ fontSizePt: 6 }), findPreset("single-column")!);
    expect(failing(checks)).toEqual(["text-size"]);
    expect(byId(checks, "text-size")).toMatchObject({ pass: false, measured: "6 pt", limit: "at least 7 pt" });
  });

  it("flags lines thinner than the preset allows: 0.6 pt lines draw error bars at 0.36 pt, below Physical Review's 0.5 pt", () => {
    const checks = preflight(builtInput(), findPreset("physical-review-single")!);
    expect(failing(checks)).toEqual(["line-width"]);
    expect(byId(checks, "line-width").measured).toBe("0.36 pt");
  });

  it("flags a width that is not the preset's: an 86 mm figure against AIP's 85 mm column (and its 0.5 pt lines)", () => {
    // 86 − 85 = 1 mm, more than the 0.5 mm allowed; 8 pt text meets AIP's 8 pt.
    const checks = preflight(builtInput(), findPreset("aip-single")!);
    expect(failing(checks)).toEqual(["width", "line-width"]);
    expect(byId(checks, "width")).toMatchObject({ measured: "86.0 mm", limit: "85 mm ± 0.5 mm" });
  });

  it("accepts a width within 0.5 mm and refuses one beyond", () => {
    const preset = { widthMm: 86, maxHeightMm: 230, minTextPt: 7, minLineWidthPt: 0.3 };
    const at = (widthMm: number) => byId(preflight({ ...builtInput(), widthMm }, preset), "width").pass;
    expect([at(85.5), at(86.49), at(86.5), at(86.51), at(85.4)]).toEqual([true, true, true, false, false]);
  });

  it("flags a figure taller than the page allows", () => {
    // A 200 mm panel with its ratio strip (30 % of the panel) and axis labels: over 260 mm.
    const checks = preflight(builtInput({ panelHeightMm: 200 }), findPreset("single-column")!);
    expect(byId(checks, "height").pass).toBe(false);
    expect(Number.parseFloat(byId(checks, "height").measured)).toBeGreaterThan(230);
  });

  it("refuses Type 3 and fonts not embedded, accepts embedded TrueType and CID fonts", () => {
    const preset = findPreset("single-column")!;
    const fonts = (pdfFonts: PreflightInput["pdfFonts"]) => byId(preflight({ ...builtInput(), pdfFonts }, preset), "fonts");
    expect(fonts([{ name: "ABCDEF+CMUSerif-Roman", type: "CID TrueType", embedded: true }]).pass).toBe(true);
    expect(fonts([{ name: "T3Font_0", type: "Type 3", embedded: true }])).toMatchObject({ pass: false, measured: expect.stringContaining("T3Font_0 (Type 3)") });
    expect(fonts([{ name: "Helvetica", type: "Type 1", embedded: false }])).toMatchObject({ pass: false, measured: expect.stringContaining("Helvetica (Type 1, not embedded)") });
  });

  it("accepts RGB and grey, flags CMYK and an unknown colour space", () => {
    const preset = findPreset("single-column")!;
    const colour = (colourSpaces: string[]) => byId(preflight({ ...builtInput(), colourSpaces }, preset), "colour-space").pass;
    expect([colour(["RGB"]), colour(["Gray", "RGB"]), colour(["RGB", "CMYK"]), colour(["ICCBased"]), colour([])]).toEqual([true, true, false, false, false]);
  });

  it("limits each file to 10 MB (10 000 000 bytes)", () => {
    const preset = findPreset("single-column")!;
    const sizes = (png: number) => preflight({ ...builtInput(), fileBytes: { pdf: 1, svg: 1, png } }, preset);
    expect(byId(sizes(MAX_FILE_BYTES), "file-size-png").pass).toBe(true);
    expect(byId(sizes(10_000_001), "file-size-png")).toMatchObject({ pass: false, measured: "10.00 MB (10000001 bytes)" });
  });
});

import { describe, expect, it } from "vitest";
import { DEFAULT_PRESET_ID, findPreset, SIZE_PRESETS } from "./journal-presets";

describe("size presets", () => {
  it("have unique ids of lowercase words joined by dashes", () => {
    expect(new Set(SIZE_PRESETS.map((p) => p.id)).size).toBe(SIZE_PRESETS.length);
    for (const p of SIZE_PRESETS) expect(p.id).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
  });

  it("include the default and the three generic sizes (86, 140, 178 mm; 8 pt, 0.5 pt, 600 dpi)", () => {
    expect(findPreset(DEFAULT_PRESET_ID)?.id).toBe("single-column");
    const generic = ["single-column", "one-and-a-half-column", "double-column"].map((id) => findPreset(id));
    expect(generic.map((p) => p?.widthMm)).toEqual([86, 140, 178]);
    for (const p of generic) expect([p?.fontSizePt, p?.lineWidthPt, p?.dpi]).toEqual([8, 0.5, 600]);
  });

  it("return undefined for an unknown id", () => {
    expect(findPreset("generic-single")).toBeUndefined();
    expect(findPreset("")).toBeUndefined();
  });

  it.each(SIZE_PRESETS.map((p) => [p.id, p]))("%s has sizes that fit a printed page", (_, p) => {
    // Widest journal figures are about 190 mm (a two-column A4 or letter page); tallest about 240 mm.
    expect(p.widthMm).toBeGreaterThan(0);
    expect(p.widthMm).toBeLessThanOrEqual(190);
    expect(p.maxHeightMm).toBeGreaterThanOrEqual(p.widthMm > 150 ? 150 : p.widthMm);
    expect(p.maxHeightMm).toBeLessThanOrEqual(250);
    // Minimums journals ask for lie between 6 and 8 pt for text and 0.1 and 0.5 pt for lines.
    expect(p.minTextPt).toBeGreaterThanOrEqual(6);
    expect(p.minTextPt).toBeLessThanOrEqual(8);
    expect(p.minLineWidthPt).toBeGreaterThanOrEqual(0.1);
    expect(p.minLineWidthPt).toBeLessThanOrEqual(0.5);
    // A new figure starts within the preset's own minimums.
    expect(p.fontSizePt).toBeGreaterThanOrEqual(p.minTextPt);
    expect(p.lineWidthPt).toBeGreaterThanOrEqual(p.minLineWidthPt);
    expect(p.dpi).toBeGreaterThanOrEqual(300);
    expect(p.dpi).toBeLessThanOrEqual(2400);
    expect(p.name.length).toBeGreaterThan(0);
  });

  it("every journal preset tells the author to check the journal's current instructions", () => {
    for (const p of SIZE_PRESETS) expect(p.note, p.id).toMatch(/check the journal's current instructions/);
    for (const p of SIZE_PRESETS.filter((q) => !["single-column", "one-and-a-half-column", "double-column"].includes(q.id))) {
      expect(p.note, p.id).toMatch(/^From memory of the author guidelines of /);
    }
  });
});

// Measures used to choose and to check the figure palette (scripts/choose-palette.ts and
// palette.test.ts). All colour science comes from culori, an independent general colour library:
// CIEDE2000 (CIE 142-2001) and the colour-vision-deficiency matrices of G. M. Machado,
// M. M. Oliveira and L. A. F. Fernandes, "A Physiologically-based Model for Simulation of Color
// Vision Deficiency", IEEE TVCG 15 (2009) 1291, at full severity (dichromacy).
import {
  converter,
  differenceCiede2000,
  filterDeficiencyDeuter,
  filterDeficiencyProt,
  filterDeficiencyTrit,
  wcagContrast,
  type Lab65,
  type Lrgb,
  type Rgb,
} from "culori";

export const VISIONS = ["normal", "protanopia", "deuteranopia", "tritanopia"] as const;
export type Vision = (typeof VISIONS)[number];

const toLab = converter("lab65");
const toRgb = converter("rgb");
const toLinear = converter("lrgb");
const ciede2000 = differenceCiede2000();
const FILTERS = {
  protanopia: filterDeficiencyProt(1),
  deuteranopia: filterDeficiencyDeuter(1),
  tritanopia: filterDeficiencyTrit(1),
};

/**
 * The colour as seen with the given vision, in CIELAB (D65), clamped to the display's gamut.
 * culori applies Machado's matrices to gamma-encoded sRGB; the paper defines them on linear RGB.
 * Both readings are returned for a deficiency, and the checks take the worse of the two, so the
 * palette does not depend on which one a reader's simulator uses.
 */
export function seenAs(hex: string, vision: Vision): Lab65[] {
  const rgb = toRgb(hex);
  if (rgb === undefined) throw new Error(`not a colour: ${hex}`);
  if (vision === "normal") return [toLab(rgb)];
  const filter = FILTERS[vision];
  const clamp = (v: number) => Math.min(1, Math.max(0, v));
  const encoded = filter(rgb);
  const fromEncoded: Rgb = { mode: "rgb", r: clamp(encoded.r), g: clamp(encoded.g), b: clamp(encoded.b) };
  // Linear reading: feed linear values through the same matrix, then read them back as linear.
  const linear = toLinear(rgb);
  const simulated = filter<Rgb>({ mode: "rgb", r: linear.r, g: linear.g, b: linear.b });
  const fromLinear: Lrgb = { mode: "lrgb", r: clamp(simulated.r), g: clamp(simulated.g), b: clamp(simulated.b) };
  return [toLab(fromEncoded), toLab(fromLinear)];
}

/** The smallest CIEDE2000 difference between two colours as seen with `vision` (both readings). */
export function differenceSeenAs(a: string, b: string, vision: Vision): number {
  const sa = seenAs(a, vision);
  const sb = seenAs(b, vision);
  return Math.min(...sa.map((la, i) => ciede2000(la, sb[i])));
}

/** The smallest CIEDE2000 difference of two colours over all four visions. */
export function worstDifference(a: string, b: string): number {
  return Math.min(...VISIONS.map((v) => differenceSeenAs(a, b, v)));
}

/** Contrast ratio by culori (luminance from IEC 61966-2-1 sRGB decoding). */
export function contrastWithCulori(a: string, b: string): number {
  return wcagContrast(a, b);
}

/**
 * Contrast ratio as WCAG 2.1 defines it (W3C Recommendation, 2018, glossary entries "contrast
 * ratio" and "relative luminance"): (L1 + 0.05) / (L2 + 0.05) with L = 0.2126 R + 0.7152 G +
 * 0.0722 B, each channel c/12.92 if c ≤ 0.03928, else ((c + 0.055)/1.055)^2.4. Written out here
 * from the recommendation's text as a second, independent reading beside culori's.
 */
export function contrastWcag21(a: string, b: string): number {
  const luminance = (hex: string) => {
    const [r, g, bl] = [1, 3, 5].map((i) => {
      const c = parseInt(hex.slice(i, i + 2), 16) / 255;
      return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
    });
    return 0.2126 * r + 0.7152 * g + 0.0722 * bl;
  };
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

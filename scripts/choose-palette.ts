// `npm run choose:palette`: documents and checks the figure palette of app/figures/palette.ts.
// Prints, for each colour, its contrast against the white figure background (WCAG 2.1) and its
// nearest neighbour in the palette under normal vision and simulated protanopia, deuteranopia and
// tritanopia (CIEDE2000, Machado et al. 2009 at full severity), then exits non-zero if a bound of
// palette.ts is broken.
//
// `npm run choose:palette -- --search [#seed …]` repeats the search that proposed the colours:
// a grid of OKLCH colours (lightness 0.38–0.70, chroma 0.08–0.18: the figures sit beside the
// product's muted paper-and-ink interface) at least 3.2:1 on white, the seeds kept, the other
// places filled by a farthest-point choice, then the best single swaps while the smallest
// worst-case difference grows. palette.ts holds the result of
//   npm run choose:palette -- --search '#1f4e8c' '#c27c12' '#b3301f' '#2a8c80'
// (four hues picked by hand: indigo, ochre, vermilion, teal), reordered so that each next colour
// is the farthest from those before it, and named by hand.
import { converter, displayable, formatHex, parseHex } from "culori";
import { FIGURE_BACKGROUND as FIGURE_BACKGROUND_HEX } from "../app/figures/build-figure";
import { FIGURE_COLOURS, MIN_CONTRAST_ON_WHITE, MIN_DIFFERENCE_CIEDE2000 } from "../app/figures/palette";
import { contrastWcag21, contrastWithCulori, differenceSeenAs, VISIONS, worstDifference } from "../app/figures/testing/colour-vision";

const FIGURE_INK_HEX = "#1b1a17"; // the figures' ink: text, frames and ticks are drawn in it
const fromOklch = converter("rgb");

function report(): boolean {
  const hexes = FIGURE_COLOURS.map((c) => c.hex);
  let ok = true;
  const rows = FIGURE_COLOURS.map((colour, i) => {
    const contrast = Math.min(contrastWcag21(colour.hex, FIGURE_BACKGROUND_HEX), contrastWithCulori(colour.hex, FIGURE_BACKGROUND_HEX));
    if (contrast < MIN_CONTRAST_ON_WHITE) ok = false;
    const nearest = VISIONS.map((vision) => {
      const others = [FIGURE_INK_HEX, ...hexes.filter((_, j) => j !== i)];
      const d = Math.min(...others.map((h) => differenceSeenAs(colour.hex, h, vision)));
      if (d < MIN_DIFFERENCE_CIEDE2000) ok = false;
      return d.toFixed(1).padStart(13);
    });
    return `${colour.hex}  ${colour.name.padEnd(14)} ${contrast.toFixed(2).padStart(8)} ${nearest.join("")}`;
  });
  console.log(`bounds: contrast on ${FIGURE_BACKGROUND_HEX} ≥ ${MIN_CONTRAST_ON_WHITE}:1, CIEDE2000 to every other colour and to the ink ≥ ${MIN_DIFFERENCE_CIEDE2000}`);
  console.log(`hex      name           contrast ${VISIONS.map((v) => v.padStart(13)).join("")}`);
  for (const row of rows) console.log(row);
  let worst = Math.min(...hexes.map((h) => worstDifference(h, FIGURE_INK_HEX)));
  for (let i = 0; i < hexes.length; i++) for (let j = i + 1; j < hexes.length; j++) worst = Math.min(worst, worstDifference(hexes[i], hexes[j]));
  console.log(`smallest difference of any pair (ink included) under any vision: ${worst.toFixed(2)}`);
  console.log(ok ? "palette meets its bounds" : "palette BREAKS its bounds");
  return ok;
}

function candidates(): string[] {
  const out = new Set<string>();
  for (let l = 0.38; l <= 0.7001; l += 0.02) {
    for (let c = 0.08; c <= 0.1801; c += 0.02) {
      for (let h = 0; h < 360; h += 6) {
        const rgb = fromOklch({ mode: "oklch", l, c, h });
        if (!displayable(rgb)) continue;
        const hex = formatHex(rgb);
        if (contrastWcag21(hex, FIGURE_BACKGROUND_HEX) >= MIN_CONTRAST_ON_WHITE + 0.2) out.add(hex);
      }
    }
  }
  return [...out].sort();
}

function search(seeds: string[], size: number): string[] {
  const pool = candidates();
  console.log(`${pool.length} candidate colours`);
  const memo = new Map<string, number>();
  const d = (a: string, b: string) => {
    const key = a < b ? a + b : b + a;
    let v = memo.get(key);
    if (v === undefined) memo.set(key, (v = worstDifference(a, b)));
    return v;
  };
  const chosen = [...seeds];
  while (chosen.length < size) {
    let best = "";
    let bestScore = -1;
    for (const c of pool) {
      const score = Math.min(...chosen.map((x) => d(c, x)));
      if (score > bestScore) [best, bestScore] = [c, score];
    }
    chosen.push(best);
  }
  const minPair = (set: string[]) => {
    let m = Infinity;
    for (let i = 0; i < set.length; i++) for (let j = i + 1; j < set.length; j++) m = Math.min(m, d(set[i], set[j]));
    return m;
  };
  // Best swap per slot, repeated until no slot improves; the ink of the figure's text and frames
  // takes part as a fixed neighbour, so that no palette colour is mistaken for it.
  for (let improved = true; improved; ) {
    improved = false;
    for (let slot = seeds.length; slot < size; slot++) {
      const others = [FIGURE_INK_HEX, ...chosen.filter((_, k) => k !== slot)];
      const floor = minPair(others.slice(1));
      const score = (c: string) => Math.min(floor, ...others.map((x) => d(c, x)));
      let best = chosen[slot];
      for (const c of pool) if (score(c) > score(best) + 0.01) best = c;
      if (best !== chosen[slot]) {
        chosen[slot] = best;
        improved = true;
      }
    }
    console.log(`smallest worst-case difference so far: ${Math.min(minPair(chosen), ...chosen.map((c) => d(c, FIGURE_INK_HEX))).toFixed(2)}`);
  }
  return chosen;
}

if (process.argv.includes("--search")) {
  const seeds = process.argv.slice(process.argv.indexOf("--search") + 1).filter((a) => /^#[0-9a-f]{6}$/.test(a));
  const found = search(seeds.length > 0 ? seeds : ["#1f4e8c"], FIGURE_COLOURS.length);
  const lch = converter("oklch");
  for (const hex of found) {
    const c = lch(parseHex(hex));
    if (c === undefined) continue;
    console.log(`${hex}  oklch(${c.l.toFixed(2)} ${c.c.toFixed(3)} ${(c.h ?? 0).toFixed(0)})  contrast ${contrastWcag21(hex, FIGURE_BACKGROUND_HEX).toFixed(2)}`);
  }
} else if (!report()) {
  process.exitCode = 1;
}

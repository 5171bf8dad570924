// `npm run bench:tex`: the cost of drawing TeX labels as glyph paths (renderTex, the path every
// figure label takes in the preview and in the export). Cold: in fresh processes, the time to
// load MathJax and draw a first label, and to draw 50 typical labels from a cold start (font
// ranges loaded on first use). Warm: per-label times in one process after a warm-up pass.
// Prints a table, then one JSON line of figures (units in the key names) as the very last line.
import { execFileSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { TYPICAL_LABELS } from "../app/figures/tex/testing/typical-labels";

const FONT_SIZE_PT = 9;
const COLD_RUNS = 5;
const WARM_ROUNDS = 20;
const now = () => performance.now();
const quantile = (xs: number[], q: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(q * xs.length))];
const median = (xs: number[]) => quantile(xs, 0.5);
const round = (v: number, digits = 2) => Number(v.toFixed(digits));

async function coldRun(): Promise<{ firstLabelMs: number; allLabelsMs: number }> {
  const t0 = now();
  const { renderTex } = await import("../app/figures/tex/render-tex");
  await renderTex("x", { fontSizePt: FONT_SIZE_PT });
  const firstLabelMs = now() - t0;
  const t1 = now();
  for (const tex of TYPICAL_LABELS) await renderTex(tex, { fontSizePt: FONT_SIZE_PT });
  return { firstLabelMs, allLabelsMs: now() - t1 };
}

if (process.argv[2] === "--cold") {
  process.stdout.write(JSON.stringify(await coldRun()));
  process.exit(0);
}

const self = fileURLToPath(import.meta.url);
const cold: { firstLabelMs: number; allLabelsMs: number }[] = [];
for (let i = 0; i < COLD_RUNS; i++) {
  cold.push(JSON.parse(execFileSync(process.execPath, ["--import", "tsx", self, "--cold"], { encoding: "utf8" })));
}

const { renderTex } = await import("../app/figures/tex/render-tex");
for (const tex of TYPICAL_LABELS) await renderTex(tex, { fontSizePt: FONT_SIZE_PT });
const perLabel = new Map<string, number[]>(TYPICAL_LABELS.map((t) => [t, []]));
const rounds: number[] = [];
for (let r = 0; r < WARM_ROUNDS; r++) {
  const t0 = now();
  for (const tex of TYPICAL_LABELS) {
    const t = now();
    await renderTex(tex, { fontSizePt: FONT_SIZE_PT });
    perLabel.get(tex)!.push(now() - t);
  }
  rounds.push(now() - t0);
}
const all = [...perLabel.values()].flat();
const slowest = [...perLabel.entries()].map(([tex, ts]) => ({ tex, ms: median(ts) })).sort((a, b) => b.ms - a.ms);

const figures = {
  labels: TYPICAL_LABELS.length,
  load_and_first_label_ms_median: round(median(cold.map((c) => c.firstLabelMs)), 1),
  cold_50_labels_ms_median: round(median(cold.map((c) => c.allLabelsMs)), 1),
  warm_label_ms_median: round(median(all), 3),
  warm_label_ms_p95: round(quantile(all, 0.95), 3),
  warm_50_labels_ms_median: round(median(rounds), 1),
  slowest_label_ms_median: round(slowest[0].ms, 3),
};

console.log(`TeX labels as glyph paths (MathJax 4, ${FONT_SIZE_PT} pt, ${TYPICAL_LABELS.length} typical labels)`);
console.log(`  load MathJax + first label (fresh process, median of ${COLD_RUNS})  ${figures.load_and_first_label_ms_median} ms`);
console.log(`  then all ${TYPICAL_LABELS.length} labels cold (font ranges load on first use)   ${figures.cold_50_labels_ms_median} ms`);
console.log(`  warm, per label: median ${figures.warm_label_ms_median} ms, p95 ${figures.warm_label_ms_p95} ms (${WARM_ROUNDS} rounds)`);
console.log(`  warm, all ${TYPICAL_LABELS.length} labels: median ${figures.warm_50_labels_ms_median} ms`);
console.log("  slowest labels (warm median):");
for (const { tex, ms } of slowest.slice(0, 3)) console.log(`    ${ms.toFixed(3).padStart(7)} ms  ${tex}`);
console.log(JSON.stringify(figures));

// `npm run bench:export`: the reference figure (two synthetic datasets of 500 bins, three
// predictions of 1000 points, a ratio strip, the single-column preset) made into each export file
// by the functions an export job runs (app/.server/exports/version-export.server.ts): the SVG
// (renderFigure with a fresh label cache, as rerenderVersion draws it for every job), the PDF
// (svgToPdf), the PNG at the preset's 600 dpi (svgToPng), the preflight's measurements, the CSV
// tables, the zip bundle (buildBundle, hashing included) and its verification (verifyBundle).
// In the same run, alternating round by round, Debian's matplotlib (python3-matplotlib, installed
// here if missing) builds the same numbers into a figure of the same size and saves it to SVG,
// PDF and PNG at the same dpi (scripts/bench-export.py; only its build and save are timed, not the
// interpreter's start). Prints a table with each ratio ours/matplotlib (goal ≤ 1), then one JSON
// line as the very last line. BENCH_EXPORT_OUT=dir also writes both sides' last files there.
import { execFileSync, spawn } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import { createInterface } from "node:readline";
import { strToU8 } from "fflate";
import { buildBundle } from "../app/.server/exports/bundle.server";
import { preflightInput } from "../app/.server/exports/preflight-input.server";
import { svgToPdf } from "../app/.server/exports/svg-to-pdf.server";
import { svgToPng } from "../app/.server/exports/svg-to-png.server";
import { verifyBundle } from "../app/.server/exports/verify-bundle.server";
import { figureCsvFiles } from "../app/exports/figure-tables";
import { findPreset } from "../app/figures/journal-presets";
import { renderFigure } from "../app/figures/render-figure";
import { TexCache } from "../app/figures/render-figure-svg";
import { referenceInputs, referenceModel } from "../app/figures/testing/reference-figure";

const REPEATS = 7;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const round = (v: number) => Math.round(v * 10) / 10;
const round2 = (v: number) => Math.round(v * 100) / 100;

function ensureMatplotlib(): void {
  try {
    execFileSync("/usr/bin/python3", ["-c", "import matplotlib"], { stdio: "ignore" });
  } catch {
    console.log("installing python3-matplotlib (Debian) for the peer benchmark …");
    execFileSync("apt-get", ["install", "-y", "python3-matplotlib"], { stdio: "inherit" });
  }
}

async function timed<T>(fn: () => Promise<T> | T): Promise<{ ms: number; value: T }> {
  const t = performance.now();
  const value = await fn();
  return { ms: performance.now() - t, value };
}

const loadAtStart = loadavg()[0];
const model = referenceModel();
const inputs = referenceInputs();
const preset = findPreset(model.preset)!;
const dpi = preset.dpi;
const metadata = { title: "Reference figure", description: "", notes: [] };
const sealedAt = new Date("2026-12-03T10:11:12Z");
// MathJax and the other modules loaded once, as in a running server; each export job then draws
// with a fresh label cache (rerenderVersion), so every timed render below typesets its labels.
const first = await renderFigure(model, inputs, metadata, new TexCache());

// The peer's input: the numbers this figure plots, with its size and layout.
const { built, data } = first;
const [mainArea, stripArea] = built.plots;
const panel = data.panels[0];
const stripValues = panel.datasets.flatMap((d) => d.ratio.flatMap((p) => [p.value - p.error[0], p.value + p.error[1]])).filter(Number.isFinite);
const statsTex = (d: (typeof panel.datasets)[number]) =>
  d.statistics === null ? null : `\\chi^2/\\mathrm{ndf} = ${d.statistics.chi2.toFixed(1)}/${d.statistics.ndf},\\ p = ${d.statistics.pValue >= 0.001 ? d.statistics.pValue.toFixed(3) : d.statistics.pValue.toExponential(1)}`;
const peerSpec = {
  widthPt: built.widthPt,
  heightPt: built.heightPt,
  dpi,
  fontSizePt: model.fontSizePt,
  lineWidthPt: model.lineWidthPt,
  mainHeightPt: mainArea.height,
  stripHeightPt: stripArea.height,
  leftFraction: mainArea.x / built.widthPt,
  rightFraction: (mainArea.x + mainArea.width) / built.widthPt,
  topFraction: 1 - mainArea.y / built.heightPt,
  bottomFraction: 1 - (stripArea.y + stripArea.height) / built.heightPt,
  xDomain: data.xDomain,
  yDomain: data.yDomain,
  yScale: model.y.scale,
  stripDomain: [Math.min(...stripValues), Math.max(...stripValues)],
  xLabel: model.x.label,
  yLabel: model.y.label,
  stripLabel: "\\mathrm{data}/\\mathrm{prediction}",
  predictions: panel.predictions.map((p) => ({ label: p.layer.label, colour: p.layer.colour, dash: p.layer.dash, x: p.curve.map((c) => c.x), y: p.curve.map((c) => c.y) })),
  datasets: panel.datasets.map((d) => ({
    label: d.layer.label,
    stats: statsTex(d),
    colour: d.layer.colour,
    marker: d.layer.marker,
    x: d.points.map((p) => p.x),
    binLow: d.points.map((p) => p.bin?.[0] ?? p.x),
    binHigh: d.points.map((p) => p.bin?.[1] ?? p.x),
    y: d.points.map((p) => p.y),
    statDown: d.points.map((p) => p.stat[0]),
    statUp: d.points.map((p) => p.stat[1]),
    totalDown: d.points.map((p) => p.total[0]),
    totalUp: d.points.map((p) => p.total[1]),
    ratio: d.ratio.map((p) => p.value),
    ratioDown: d.ratio.map((p) => p.error[0]),
    ratioUp: d.ratio.map((p) => p.error[1]),
  })),
};

ensureMatplotlib();
const dir = mkdtempSync(join(tmpdir(), "bench-export-"));
const specFile = join(dir, "reference-figure.json");
writeFileSync(specFile, JSON.stringify(peerSpec));
const python = spawn("/usr/bin/python3", [join(import.meta.dirname, "bench-export.py"), specFile], { stdio: ["pipe", "pipe", "inherit"] });
const lines = createInterface({ input: python.stdout })[Symbol.asyncIterator]();
const nextLine = async () => {
  const next = await lines.next();
  if (next.done) throw new Error("the matplotlib peer stopped (see its error above)");
  return JSON.parse(next.value as string) as Record<string, unknown>;
};
const peerVersion = (await nextLine()).matplotlib as string;
const peer = async (format: "svg" | "pdf" | "png") => {
  python.stdin.write(`${format}\n`);
  return (await nextLine()) as { ms: number; bytes: number };
};

type Format = "svg" | "pdf" | "png";
const FORMATS: Format[] = ["svg", "pdf", "png"];
const ours = { svg: [] as number[], pdf: [] as number[], png: [] as number[], preflight: [] as number[], csv: [] as number[], bundle: [] as number[], verify: [] as number[] };
const theirs = { svg: [] as number[], pdf: [] as number[], png: [] as number[] };
// Per format, the whole job of making that one file from the numbers: ours draws the SVG, then
// converts it; matplotlib builds its figure, then saves it.
const oursFile = { svg: [] as number[], pdf: [] as number[], png: [] as number[] };
let sizes = { svg: 0, pdf: 0, png: 0, bundle: 0 };
const peerSizes = { svg: 0, pdf: 0, png: 0 };

for (const f of FORMATS) await peer(f); // the peer's warm-up round (font cache, backends), not timed
for (let i = 0; i < REPEATS; i++) {
  const svg = await timed(() => renderFigure(model, inputs, metadata, new TexCache()));
  const figure = svg.value;
  const size = { widthPt: figure.built.widthPt, heightPt: figure.built.heightPt };
  const pdf = await timed(() => svgToPdf(figure.svg, { ...size, title: "Reference figure", author: "A. Author", subject: "fingerprint", keywords: "", creationDate: sealedAt, documentId: "bench" }));
  const png = await timed(() => svgToPng(figure.svg, { ...size, dpi }));
  const pre = await timed(() => preflightInput(figure.built, { pdf: pdf.value, svg: figure.svg, png: png.value }));
  const csv = await timed(() => figureCsvFiles(model, figure.data));
  const bundle = await timed(() =>
    buildBundle(
      [
        { name: "figure.pdf", bytes: pdf.value, description: "PDF" },
        { name: "figure.svg", bytes: strToU8(figure.svg), description: "SVG" },
        { name: "figure.png", bytes: png.value, description: "PNG" },
        ...csv.value.map((f) => ({ name: f.name, bytes: strToU8(f.text), description: f.description })),
      ],
      { fingerprint: "bench" },
      { title: "Reference figure", modifiedAt: sealedAt },
    ),
  );
  const verify = await timed(() => verifyBundle(bundle.value));
  if (!verify.value.ok) throw new Error("the benchmark's own bundle does not verify");
  ours.svg.push(svg.ms);
  ours.pdf.push(pdf.ms);
  ours.png.push(png.ms);
  ours.preflight.push(pre.ms);
  ours.csv.push(csv.ms);
  ours.bundle.push(bundle.ms);
  ours.verify.push(verify.ms);
  oursFile.svg.push(svg.ms);
  oursFile.pdf.push(svg.ms + pdf.ms);
  oursFile.png.push(svg.ms + png.ms);
  sizes = { svg: Buffer.byteLength(figure.svg), pdf: pdf.value.length, png: png.value.length, bundle: bundle.value.length };
  if (process.env.BENCH_EXPORT_OUT && i === REPEATS - 1) {
    for (const [name, bytes] of [["ours.svg", figure.svg], ["ours.pdf", pdf.value], ["ours.png", png.value]] as const) writeFileSync(join(process.env.BENCH_EXPORT_OUT, name), bytes);
  }
  for (const f of FORMATS) {
    const r = await peer(f);
    theirs[f].push(r.ms);
    peerSizes[f] = r.bytes;
  }
}
python.stdin.end();
rmSync(dir, { recursive: true, force: true });

const figures = {
  svg_ms_median: round(median(ours.svg)),
  pdf_ms_median: round(median(ours.pdf)),
  png_ms_median: round(median(ours.png)),
  png_dpi: dpi,
  preflight_ms_median: round(median(ours.preflight)),
  csv_ms_median: round(median(ours.csv)),
  bundle_ms_median: round(median(ours.bundle)),
  verify_ms_median: round(median(ours.verify)),
  svg_file_ms_median: round(median(oursFile.svg)),
  pdf_file_ms_median: round(median(oursFile.pdf)),
  png_file_ms_median: round(median(oursFile.png)),
  matplotlib_version: peerVersion,
  matplotlib_svg_ms_median: round(median(theirs.svg)),
  matplotlib_pdf_ms_median: round(median(theirs.pdf)),
  matplotlib_png_ms_median: round(median(theirs.png)),
  ratio_svg: round2(median(oursFile.svg) / median(theirs.svg)),
  ratio_pdf: round2(median(oursFile.pdf) / median(theirs.pdf)),
  ratio_png: round2(median(oursFile.png) / median(theirs.png)),
  svg_bytes: sizes.svg,
  pdf_bytes: sizes.pdf,
  png_bytes: sizes.png,
  bundle_bytes: sizes.bundle,
  matplotlib_svg_bytes: peerSizes.svg,
  matplotlib_pdf_bytes: peerSizes.pdf,
  matplotlib_png_bytes: peerSizes.png,
  repeats: REPEATS,
  load_average_1min_start: round2(loadAtStart),
  load_average_1min_end: round2(loadavg()[0]),
};

const mb = (bytes: number) => `${(bytes / 1e6).toFixed(2)} MB`;
const row = (label: string, ms: number, bytes?: number) => console.log(`  ${label.padEnd(40)}${`${ms} ms`.padStart(10)}${bytes === undefined ? "" : `   ${mb(bytes)}`}`);
console.log(`Export of the reference figure (${preset.name}, ${round(built.widthPt)} × ${round(built.heightPt)} pt, 2 × 500 points, 3 × 1000-point predictions, ratio strip), median of ${REPEATS}`);
console.log("Steps as an export job runs them:");
row("SVG (renderFigure, fresh label cache)", figures.svg_ms_median, sizes.svg);
row("PDF from the SVG (pdfkit + svg-to-pdfkit)", figures.pdf_ms_median, sizes.pdf);
row(`PNG from the SVG at ${dpi} dpi (resvg)`, figures.png_ms_median, sizes.png);
row("preflight measurements", figures.preflight_ms_median);
row("CSV tables", figures.csv_ms_median);
row("bundle (zip, SHA-256, manifest)", figures.bundle_ms_median, sizes.bundle);
row("verify the bundle", figures.verify_ms_median);
console.log(`Against matplotlib ${peerVersion} (Debian python3-matplotlib), same numbers, same size, ${dpi} dpi PNG, rounds alternating.`);
console.log("matplotlib is timed from building the figure to the saved bytes in memory, without the interpreter's start or its imports;");
console.log("its text is its default mathtext of the same TeX (DejaVu; SVG text as paths, PDF with Type 3 fonts), ours is MathJax TeX drawn as glyph paths.");
console.log("Ours per file: drawing the SVG, plus converting it for PDF and PNG.");
for (const f of FORMATS) {
  const o = figures[`${f}_file_ms_median`];
  const t = figures[`matplotlib_${f}_ms_median`];
  const r = figures[`ratio_${f}`];
  console.log(
    `  ${f.toUpperCase().padEnd(5)} ours ${`${o} ms`.padStart(10)} ${mb(sizes[f]).padStart(9)}   matplotlib ${`${t} ms`.padStart(10)} ${mb(peerSizes[f]).padStart(9)}   ratio ${r.toFixed(2)}${r > 1 ? "  (> 1: matplotlib is faster)" : ""}`,
  );
}
console.log(`load average (1 min): ${figures.load_average_1min_start} at the start, ${figures.load_average_1min_end} at the end`);
console.log(JSON.stringify(figures));

// `npm run bench:export`: for the reference figure (two synthetic datasets of 500 bins, three
// predictions of 1000 points, a ratio strip, 86 mm wide), the median time of each export step as
// an export runs it: the SVG (renderFigure, labels cached as between renders), the PDF
// (svgToPdf), the PNG at the preset's 600 dpi (svgToPng), the CSV tables, the zip bundle
// (buildBundle, hashing included) and its verification (verifyBundle). Prints a table, then one
// JSON line as the very last line.
import { strToU8 } from "fflate";
import { buildBundle } from "../app/.server/exports/bundle.server";
import { svgToPdf } from "../app/.server/exports/svg-to-pdf.server";
import { svgToPng } from "../app/.server/exports/svg-to-png.server";
import { verifyBundle } from "../app/.server/exports/verify-bundle.server";
import { figureCsvFiles } from "../app/exports/figure-tables";
import { findPreset } from "../app/figures/journal-presets";
import { renderFigure } from "../app/figures/render-figure";
import { TexCache } from "../app/figures/render-figure-svg";
import { referenceInputs, referenceModel } from "../app/figures/testing/reference-figure";

const REPEATS = 5;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const round = (v: number) => Math.round(v * 10) / 10;

async function timed<T>(fn: () => Promise<T> | T): Promise<{ ms: number; value: T }> {
  const t = performance.now();
  const value = await fn();
  return { ms: performance.now() - t, value };
}

const model = referenceModel();
const inputs = referenceInputs();
const dpi = findPreset(model.preset)!.dpi;
const cache = new TexCache();
const metadata = { title: "Reference figure", description: "", notes: [] };
const sealedAt = new Date("2026-12-03T10:11:12Z");
await renderFigure(model, inputs, metadata, cache); // labels and modules loaded once, as in a running server

const times = { svg: [] as number[], pdf: [] as number[], png: [] as number[], csv: [] as number[], bundle: [] as number[], verify: [] as number[] };
let sizes = { svg: 0, pdf: 0, png: 0, bundle: 0 };
for (let i = 0; i < REPEATS; i++) {
  const svg = await timed(() => renderFigure(model, inputs, metadata, cache));
  const figure = svg.value;
  const size = { widthPt: figure.built.widthPt, heightPt: figure.built.heightPt };
  const pdf = await timed(() => svgToPdf(figure.svg, { ...size, title: "Reference figure", author: "A. Author", subject: "fingerprint", keywords: "", creationDate: sealedAt, documentId: "bench" }));
  const png = await timed(() => svgToPng(figure.svg, { ...size, dpi }));
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
  times.svg.push(svg.ms);
  times.pdf.push(pdf.ms);
  times.png.push(png.ms);
  times.csv.push(csv.ms);
  times.bundle.push(bundle.ms);
  times.verify.push(verify.ms);
  sizes = { svg: Buffer.byteLength(figure.svg), pdf: pdf.value.length, png: png.value.length, bundle: bundle.value.length };
}

const figures = {
  svg_ms_median: round(median(times.svg)),
  pdf_ms_median: round(median(times.pdf)),
  png_ms_median: round(median(times.png)),
  png_dpi: dpi,
  csv_ms_median: round(median(times.csv)),
  bundle_ms_median: round(median(times.bundle)),
  verify_ms_median: round(median(times.verify)),
  svg_bytes: sizes.svg,
  pdf_bytes: sizes.pdf,
  png_bytes: sizes.png,
  bundle_bytes: sizes.bundle,
};

const row = (label: string, ms: number, bytes?: number) => console.log(`  ${label.padEnd(36)}${`${ms} ms`.padStart(10)}${bytes === undefined ? "" : `   ${(bytes / 1e6).toFixed(2)} MB`}`);
console.log(`Export of the reference figure (86 mm, 2 × 500 points, 3 × 1000-point predictions, ratio strip), median of ${REPEATS}`);
row("SVG (renderFigure, labels cached)", figures.svg_ms_median, sizes.svg);
row("PDF (pdfkit + svg-to-pdfkit)", figures.pdf_ms_median, sizes.pdf);
row(`PNG at ${dpi} dpi (resvg)`, figures.png_ms_median, sizes.png);
row("CSV tables", figures.csv_ms_median);
row("bundle (zip, SHA-256, manifest)", figures.bundle_ms_median, sizes.bundle);
row("verify the bundle", figures.verify_ms_median);
console.log(JSON.stringify(figures));

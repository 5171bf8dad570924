// `npm run bench:figures`: for the reference figure (two synthetic datasets of 500 bins, three
// predictions of 1000 points, a ratio strip), the median time of the spec build (data matching
// and layout: computeFigureData + buildFigure), of the server's SVG render (renderFigure, the
// function draft.svg and the preview call), and of an edit → updated preview in Debian's
// chromium (renderFigure in the browser with the preview's label cache, SVG put into the page).
// Prints a table, then one JSON line as the very last line.
import { createServer } from "node:http";
import { mkdirSync, readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { build } from "esbuild";
import { chromium } from "playwright-core";
import { buildFigure } from "../app/figures/build-figure";
import { computeFigureData } from "../app/figures/compute-figure-data";
import { DEFAULT_PRESET_ID, findPreset } from "../app/figures/journal-presets";
import { renderFigure } from "../app/figures/render-figure";
import { TexCache } from "../app/figures/render-figure-svg";
import { referenceInputs, referenceModel } from "../app/figures/testing/reference-figure";

const REPEATS = 15;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const round = (v: number) => Math.round(v * 10) / 10;

async function nodeFigures() {
  const model = referenceModel();
  const inputs = referenceInputs();
  const metadata = { title: "reference figure", description: "", notes: ["benchmark"] };
  const cache = new TexCache();
  let t = performance.now();
  await renderFigure(model, inputs, metadata, cache);
  const coldMs = performance.now() - t;
  const preset = findPreset(model.preset) ?? findPreset(DEFAULT_PRESET_ID)!;
  const specMs: number[] = [];
  const renderMs: number[] = [];
  for (let i = 0; i < REPEATS; i++) {
    const edited = structuredClone(model);
    const layer = edited.panels[0].layers[0];
    if (layer.kind === "prediction") layer.energy.value = 0.5 + 0.01 * (i + 1);
    t = performance.now();
    buildFigure(edited, computeFigureData(edited, inputs), preset, cache.measure);
    specMs.push(performance.now() - t);
    t = performance.now();
    await renderFigure(edited, inputs, metadata, cache);
    renderMs.push(performance.now() - t);
  }
  return { coldMs, specMs: median(specMs), renderMs: median(renderMs) };
}

async function browserFigures() {
  const dir = resolve(".data/bench-figures");
  mkdirSync(dir, { recursive: true });
  await build({
    entryPoints: ["scripts/bench/figure-preview-entry.ts"], bundle: true, format: "esm", platform: "browser", target: "es2022",
    outfile: join(dir, "entry.js"), minify: true, logLevel: "error", tsconfig: "tsconfig.json",
  });
  const server = createServer((req, res) => {
    if (req.url === "/entry.js") {
      res.writeHead(200, { "content-type": "text/javascript" }).end(readFileSync(join(dir, "entry.js")));
      return;
    }
    res.writeHead(200, { "content-type": "text/html" }).end(`<!doctype html><html><body><div id="preview" style="width:900px"></div><script type="module" src="/entry.js"></script></body></html>`);
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const port = (server.address() as { port: number }).port;
  const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", headless: true, args: ["--no-sandbox", "--disable-gpu"] });
  try {
    const page = await browser.newPage();
    await page.goto(`http://127.0.0.1:${port}/`);
    await page.waitForFunction(() => typeof window.benchFigure === "function");
    const out = await page.evaluate((n) => window.benchFigure(n), REPEATS);
    return { firstMs: out.firstMs, editMs: median(out.editMs) };
  } finally {
    await browser.close();
    server.close();
  }
}

const node = await nodeFigures();
const browser = await browserFigures();
console.log("reference figure: 2 datasets × 500 bins, 3 predictions × 1000 points, ratio strip");
console.log(`  spec build (data matching + layout), median of ${REPEATS}:  ${round(node.specMs)} ms`);
console.log(`  server SVG render (renderFigure), warm, median:      ${round(node.renderMs)} ms   (first, cold: ${round(node.coldMs)} ms)`);
console.log(`  chromium: edit → SVG in the page, median:            ${round(browser.editMs)} ms   (first, cold: ${round(browser.firstMs)} ms)   goal ≤ 200 ms`);
console.log(JSON.stringify({ spec_build_ms: round(node.specMs), server_svg_ms: round(node.renderMs), server_svg_cold_ms: round(node.coldMs), browser_edit_to_preview_ms: round(browser.editMs), browser_first_ms: round(browser.firstMs), goal_edit_to_preview_ms: 200 }));

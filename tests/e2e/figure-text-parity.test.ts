// The preview is the export: the TeX label module, bundled by Vite as the browser gets it and run
// in Debian's chromium, draws the same bytes as the same module in Node.
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { gzipSync } from "node:zlib";
import { build } from "vite";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { checkTex, renderTex } from "../../app/figures/tex/render-tex";
import { launchBrowser } from "../support/browser";

const LABELS = [
  "\\mathrm{d}\\sigma/\\mathrm{d}\\Omega\\ [\\mu\\mathrm{b/sr}]",
  "\\theta_\\mathrm{lab}\\ [\\mathrm{deg}]",
  "10^{-3}",
  "2\\times 10^{4}",
  "\\frac{\\mathrm{d}\\sigma}{\\mathrm{d}\\Omega}\\,[\\mathrm{nb/sr}]",
  "e^{+}e^{-}\\to\\gamma\\gamma",
  "\\text{Born, } \\Lambda = 0.77 \\pm 0.05\\,\\mathrm{GeV}",
  "\\chi^{2}/\\mathrm{ndf} = 12.3/14",
  "\\left(\\frac{\\mathrm{d}\\sigma}{\\mathrm{d}\\Omega}\\right)_{\\mathrm{lab}}",
  // Font ranges loaded on first use (upright Greek, Latin accents), a stretched accent, a frame.
  "\\upmu\\mathrm{b}\\ \\text{événement}",
  "\\overline{p}\\,\\widehat{abc}\\,\\boxed{x}",
];
const BAD = ["\\foo", "\\frac{1}{2", "\\text{中}"];
const ORIGIN = "http://figure-text.test";

let bundleDir = "";
let browser: Awaited<ReturnType<typeof launchBrowser>>;

beforeAll(async () => {
  bundleDir = mkdtempSync(path.join(tmpdir(), "steradian-tex-bundle-"));
  // Built like the app's client bundle (minified, MathJax and each font range a chunk of its own).
  await build({
    configFile: false,
    logLevel: "silent",
    root: path.resolve("."),
    publicDir: false,
    build: {
      outDir: bundleDir,
      emptyOutDir: true,
      rolldownOptions: {
        input: { "render-tex": path.resolve("app/figures/tex/render-tex.ts") },
        preserveEntrySignatures: "strict",
        output: { entryFileNames: "[name].js" },
      },
    },
  });
  const files = readdirSync(bundleDir, { recursive: true, encoding: "utf8" }).filter((f) => f.endsWith(".js"));
  const size = (f: string) => statSync(path.join(bundleDir, f)).size;
  const gzip = (f: string) => gzipSync(readFileSync(path.join(bundleDir, f))).length;
  const core = files.filter((f) => /^render-tex\.js$|mathjax-engine|preload-helper/.test(f));
  const ranges = files.filter((f) => !core.includes(f));
  const kib = (n: number) => `${(n / 1024).toFixed(0)} KiB`;
  console.log(
    `TeX bundle: ${core.join(", ")}: ${kib(core.reduce((s, f) => s + size(f), 0))} (${kib(core.reduce((s, f) => s + gzip(f), 0))} gzip); ` +
      `${ranges.length} font-range chunks loaded on first use: ${kib(ranges.reduce((s, f) => s + size(f), 0))} (${kib(ranges.reduce((s, f) => s + gzip(f), 0))} gzip)`,
  );
  browser = await launchBrowser();
  // The bundle is served from memory under a made-up origin: no server, nothing from outside.
  await browser.context.route(`${ORIGIN}/**`, (route) => {
    const name = new URL(route.request().url()).pathname.slice(1);
    if (name === "") return route.fulfill({ contentType: "text/html", body: "<!doctype html><title>TeX parity</title>" });
    if (!files.includes(name)) return route.fulfill({ status: 404, body: "" });
    return route.fulfill({ contentType: "text/javascript", body: readFileSync(path.join(bundleDir, name), "utf8") });
  });
});

afterAll(async () => {
  await browser?.close();
  if (bundleDir) rmSync(bundleDir, { recursive: true, force: true });
});

describe("TeX labels in the browser", () => {
  it("draws the same bytes in chromium as in Node, and the same errors", async () => {
    const page = await browser.context.newPage();
    const pageErrors: string[] = [];
    page.on("pageerror", (e) => pageErrors.push(e.message));
    await page.goto(`${ORIGIN}/`);
    // A string, not a function: the test runner would rewrite a function's import().
    const inBrowser = await page.evaluate<string>(`(async () => {
      const tex = await import(${JSON.stringify(`${ORIGIN}/render-tex.js`)});
      const rendered = {};
      for (const label of ${JSON.stringify(LABELS)}) rendered[label] = await tex.renderTex(label, { fontSizePt: 9 });
      const errors = {};
      for (const label of ${JSON.stringify(BAD)}) errors[label] = await tex.checkTex(label);
      return JSON.stringify({ rendered, errors });
    })()`);
    await page.close();

    const rendered: Record<string, unknown> = {};
    for (const label of LABELS) rendered[label] = await renderTex(label, { fontSizePt: 9 });
    const errors: Record<string, string | null> = {};
    for (const label of BAD) errors[label] = await checkTex(label);

    const browserResult = JSON.parse(inBrowser) as { rendered: Record<string, unknown>; errors: Record<string, string | null> };
    for (const label of LABELS) expect(JSON.stringify(browserResult.rendered[label]), label).toBe(JSON.stringify(rendered[label]));
    expect(browserResult.errors).toEqual(errors);
    expect(Object.values(errors).every((e) => typeof e === "string" && e.length > 0)).toBe(true);
    // The whole answer, byte for byte.
    expect(inBrowser).toBe(JSON.stringify({ rendered, errors }));
    expect(pageErrors).toEqual([]);
  });
});

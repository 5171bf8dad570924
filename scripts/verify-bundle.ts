// `npm run --silent verify-bundle -- bundle.zip`: checks a submission bundle against its
// manifest.json, one line per file (ok, differs, missing, not listed), draws the figure again
// from the bundled figure.json and compares its SVG, then a summary line.
// Exit status 0 when every file matches, 1 when any does not or the bundle cannot be read,
// 2 when called wrongly or the file cannot be opened.
import { readFileSync } from "node:fs";
import { verifyBundleAndFigure } from "../app/.server/exports/verify-bundle-figure.server";

const args = process.argv.slice(2);
if (args.length !== 1 || args[0].startsWith("-")) {
  process.stderr.write("usage: npm run --silent verify-bundle -- <bundle.zip>\n");
  process.exit(2);
}
let zip: Buffer;
try {
  zip = readFileSync(args[0]);
} catch (error) {
  process.stderr.write(`cannot read ${args[0]}: ${(error as Error).message}\n`);
  process.exit(2);
}

const result = await verifyBundleAndFigure(zip);
const width = Math.max(10, ...result.files.map((f) => f.status.length));
const nameWidth = Math.max(0, ...result.files.map((f) => f.name.length));
for (const f of result.files) {
  const detail =
    f.status === "ok" ? `sha256 ${f.actual}`
    : f.status === "differs" ? `sha256 ${f.actual}, manifest says ${f.expected}`
    : f.status === "missing" ? `listed in manifest.json (sha256 ${f.expected}) but not in the zip`
    : `in the zip (sha256 ${f.actual}) but not listed in manifest.json`;
  process.stdout.write(`${f.status.padEnd(width)}  ${f.name.padEnd(nameWidth)}  ${detail}\n`);
}
for (const p of result.problems) process.stdout.write(`${"problem".padEnd(width)}  ${p}\n`);
process.stdout.write(`${(result.figure.ok ? "ok" : "differs").padEnd(width)}  ${"figure".padEnd(nameWidth)}  ${result.figure.message}\n`);
const bad = result.files.filter((f) => f.status !== "ok").length;
process.stdout.write(
  result.ok
    ? `verified: all ${result.files.length} files match manifest.json, and the figure drawn again is the signed-off one\n`
    : `NOT verified: ${bad} of ${result.files.length} files do not match manifest.json${result.figure.ok ? "" : ", the figure drawn again is not the signed-off one"}${result.problems.length > 0 ? `, ${result.problems.length} problem(s)` : ""}\n`,
);
process.exit(result.ok ? 0 : 1);

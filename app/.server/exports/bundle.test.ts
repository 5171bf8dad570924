// The submission bundle of the reference figure: built twice (byte-identical), read back by
// fflate and by Python's zipfile (an independent reader), verified, then tampered with.
import { execFileSync, spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { strToU8, unzipSync, zipSync } from "fflate";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { figureCsvFiles } from "~/exports/figure-tables";
import { renderFigure } from "~/figures/render-figure";
import { referenceInputs, referenceModel } from "~/figures/testing/reference-figure";
import { buildBundle, type BundleFile } from "./bundle.server";
import { svgToPdf } from "./svg-to-pdf.server";
import { svgToPng } from "./svg-to-png.server";
import { verifyBundle } from "./verify-bundle.server";
import { verifyBundleAndFigure } from "./verify-bundle-figure.server";
import { figureJson } from "./version-export.server";
import { sealedMetadata, sha256Hex as textSha256, type VersionSnapshot } from "~/figures/version-snapshot";

const SEALED_AT = "2026-12-03T10:11:12Z";
const EXTRA: Record<string, unknown> = {
  fingerprint: "3f2a9c0b7d1e",
  sealedAt: SEALED_AT,
  sealer: { name: "A. Author" },
  signers: [{ name: "B. Coauthor", signedOffAt: "2026-12-04T08:00:00Z" }],
  engineVersion: "0.1.0",
  datasetRevisions: [{ datasetId: "6f1c2a9e-0d4b-4c3a-9b7e-2a1f3c4d5e60", revisionNumber: 1, contentHash: "0".repeat(64) }],
};

let dir: string;
let files: BundleFile[];
let zip: Uint8Array;

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "steradian-bundle-"));
  const model = referenceModel();
  // A snapshot as sealing writes one, so that verification can draw the figure again from figure.json.
  const snapshot: VersionSnapshot = { format: 1, figure: { id: "6f1c2a9e-0d4b-4c3a-9b7e-2a1f3c4d5e61", title: "Reference figure", draftRevision: 3 }, number: 1, model, engineVersion: "0.1.0", predictions: [], problems: [],
    datasets: Object.values(referenceInputs()).map((d) => ({ datasetId: d.datasetId, datasetName: d.datasetName, revisionNumber: d.revisionNumber, revisionId: d.revisionId, contentHash: d.contentHash, rowCount: d.rows.length })) };
  const figure = await renderFigure(model, referenceInputs(), sealedMetadata(snapshot));
  EXTRA.svgSha256 = textSha256(figure.svg);
  const size = { widthPt: figure.built.widthPt, heightPt: figure.built.heightPt };
  const pdf = await svgToPdf(figure.svg, { ...size, title: "Reference figure", author: "A. Author", subject: EXTRA.fingerprint, keywords: "", creationDate: new Date(SEALED_AT), documentId: "v1" });
  files = [
    { name: "figure.pdf", bytes: pdf, description: "the figure, vector PDF at final size" },
    { name: "figure.svg", bytes: strToU8(figure.svg), description: "the figure, SVG" },
    { name: "figure.png", bytes: svgToPng(figure.svg, { ...size, dpi: 150 }), description: "the figure, PNG" },
    { name: "figure.json", bytes: strToU8(figureJson(snapshot, textSha256(figure.svg), { ...referenceInputs() })), description: "the figure model" },
    { name: "alt-text.txt", bytes: strToU8("A falling cross section.\n"), description: "the figure's alt text" },
    ...figureCsvFiles(model, figure.data).map((f) => ({ name: f.name, bytes: strToU8(f.text), description: f.description })),
  ];
  zip = buildBundle(files, EXTRA as Parameters<typeof buildBundle>[1], { title: "Reference figure, version 1", modifiedAt: new Date(SEALED_AT) });
}, 60_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");
const unzipList = (file: string) => execFileSync("python3", ["-c", "import sys, zipfile; [print(i.filename, i.date_time, i.file_size, i.CRC) for i in zipfile.ZipFile(sys.argv[1]).infolist()]", file], { encoding: "utf8" });

describe("buildBundle", () => {
  it("holds README.txt, manifest.json and every file; the manifest has the SHA-256 of each and the extra fields", () => {
    const entries = unzipSync(zip);
    expect(Object.keys(entries)).toEqual(["README.txt", "manifest.json", ...files.map((f) => f.name).sort()]);
    const manifest = JSON.parse(new TextDecoder().decode(entries["manifest.json"]));
    expect(manifest.files.map((f: { name: string }) => f.name)).toEqual(["README.txt", ...files.map((f) => f.name).sort()]);
    for (const f of files) {
      expect(manifest.files.find((m: { name: string }) => m.name === f.name)).toEqual({ name: f.name, bytes: f.bytes.length, sha256: sha256(f.bytes) });
    }
    expect(manifest).toMatchObject(EXTRA);
    const readme = new TextDecoder().decode(entries["README.txt"]);
    for (const f of files) expect(readme).toContain(f.name);
  });

  it("is byte-identical when built twice, and whatever order the files come in", () => {
    const again = buildBundle([...files].reverse(), { ...EXTRA }, { title: "Reference figure, version 1", modifiedAt: new Date(SEALED_AT) });
    expect(Buffer.from(again).equals(Buffer.from(zip))).toBe(true);
  });

  it("does not depend on the server's time zone", () => {
    // The same build in a child process with another zone (Python's zipfile reads the entries).
    const script = `
      import { createHash } from "node:crypto";
      import { buildBundle } from "./app/.server/exports/bundle.server";
      const zip = buildBundle([{ name: "a.txt", bytes: new TextEncoder().encode("a"), description: "a" }], {}, { title: "t", modifiedAt: new Date("${SEALED_AT}") });
      process.stdout.write(createHash("sha256").update(zip).digest("hex"));`;
    const run = (tz: string) => execFileSync("node_modules/.bin/tsx", ["--eval", script], { encoding: "utf8", env: { ...process.env, TZ: tz } });
    expect(run("Pacific/Auckland")).toBe(run("UTC"));
  });

  it("writes the seal time as every entry's time, readable by Python's zipfile (an independent reader)", () => {
    const file = path.join(dir, "bundle.zip");
    writeFileSync(file, zip);
    const lines = unzipList(file).trim().split("\n");
    expect(lines).toHaveLength(files.length + 2);
    // Zip times have two-second steps: 10:11:12 is kept exactly.
    for (const line of lines) expect(line).toContain("(2026, 12, 3, 10, 11, 12)");
    const figurePdf = lines.find((l) => l.startsWith("figure.pdf "))!;
    expect(figurePdf.split(" ")[7]).toBe(String(files[0].bytes.length));
  });

  it("refuses names that could escape the folder, duplicates and the bundle's own files", () => {
    const one = (name: string) => () => buildBundle([{ name, bytes: strToU8("x"), description: "x" }], {}, { title: "t" });
    expect(one("../figure.pdf")).toThrow(/cannot be a file name/);
    expect(one("manifest.json")).toThrow(/written by the bundle itself/);
    expect(one("2026")).toThrow(/needs an extension/);
    expect(() => buildBundle([{ name: "a.csv", bytes: strToU8("x"), description: "x" }, { name: "a.csv", bytes: strToU8("y"), description: "y" }], {}, { title: "t" })).toThrow(/twice/);
  });
});

/** The bundle unpacked, changed by `edit`, packed again (as someone tampering with it would). */
function repacked(edit: (entries: Record<string, Uint8Array>) => void): Uint8Array {
  const entries = unzipSync(zip);
  edit(entries);
  return zipSync(entries);
}

describe("verifyBundle", () => {
  it("passes an intact bundle, every file ok", () => {
    const result = verifyBundle(zip);
    expect(result.problems).toEqual([]);
    expect(result.files.map((f) => f.status)).toEqual(Array(files.length + 1).fill("ok"));
    expect(result.ok).toBe(true);
  });

  it("names a CSV with one byte changed", () => {
    const tampered = repacked((e) => {
      const csv = e["data-synthetic-a-r1.csv"];
      const at = csv.length - 5;
      csv[at] = csv[at] === 0x31 ? 0x32 : 0x31;
    });
    const result = verifyBundle(tampered);
    expect(result.ok).toBe(false);
    expect(result.files.filter((f) => f.status !== "ok")).toEqual([expect.objectContaining({ name: "data-synthetic-a-r1.csv", status: "differs" })]);
  });

  it("names a file removed and a file added", () => {
    const result = verifyBundle(
      repacked((e) => {
        delete e["figure.png"];
        e["extra.txt"] = strToU8("not from the sealer");
      }),
    );
    expect(result.ok).toBe(false);
    expect(result.files.filter((f) => f.status !== "ok").map((f) => [f.name, f.status])).toEqual([
      ["figure.png", "missing"],
      ["extra.txt", "not listed"],
    ]);
  });

  it("names the file whose hash was edited in the manifest", () => {
    // Changing a hash in the manifest alone makes that file differ from it.
    const result = verifyBundle(
      repacked((e) => {
        const text = new TextDecoder().decode(e["manifest.json"]);
        const m = JSON.parse(text);
        m.files[1].sha256 = "0".repeat(64);
        e["manifest.json"] = strToU8(JSON.stringify(m));
      }),
    );
    expect(result.files.filter((f) => f.status !== "ok").map((f) => f.name)).toEqual([files.map((f) => f.name).sort()[0]]);
  });

  it("refuses what is not a bundle: random bytes, a zip without manifest, a manifest that is not one", () => {
    expect(verifyBundle(strToU8("not a zip")).problems[0]).toMatch(/not a readable zip file/);
    expect(verifyBundle(zipSync({ "a.txt": strToU8("a") })).problems).toEqual(["no manifest.json in the zip"]);
    expect(verifyBundle(zipSync({ "manifest.json": strToU8("{}") })).problems[0]).toMatch(/not a steradian-submission-bundle manifest/);
  });
});

/** One measured value changed in figure.json, and the manifest's hash of figure.json updated to match. */
function forgedData(): Uint8Array {
  return repacked((e) => {
    const doc = JSON.parse(new TextDecoder().decode(e["figure.json"]));
    doc.datasetInputs[0].rows[3].y *= 1.5;
    e["figure.json"] = strToU8(JSON.stringify(doc));
    const m = JSON.parse(new TextDecoder().decode(e["manifest.json"]));
    const entry = m.files.find((f: { name: string }) => f.name === "figure.json");
    entry.sha256 = createHash("sha256").update(e["figure.json"]).digest("hex");
    entry.bytes = e["figure.json"].length;
    e["manifest.json"] = strToU8(JSON.stringify(m));
  });
}

describe("verifyBundleAndFigure", () => {
  it("draws the intact bundle's figure again and finds the signed-off SVG", async () => {
    const result = await verifyBundleAndFigure(zip);
    expect(result.figure).toEqual(expect.objectContaining({ ok: true, redrawnSha256: EXTRA.svgSha256 }));
    expect(result.ok).toBe(true);
  }, 60_000);

  it("catches changed data whose hash was also changed in the manifest", async () => {
    const result = await verifyBundleAndFigure(forgedData());
    expect(result.files.every((f) => f.status === "ok")).toBe(true);
    expect(result.figure.ok).toBe(false);
    expect(result.figure.redrawnSha256).not.toBe(EXTRA.svgSha256);
    expect(result.ok).toBe(false);
  }, 60_000);
});

describe("npm run verify-bundle", () => {
  const cli = (file: string) => spawnSync("node_modules/.bin/tsx", ["scripts/verify-bundle.ts", file], { encoding: "utf8" });

  it("prints one line per file and exits 0 for an intact bundle, 1 for a tampered one, 2 without a file", () => {
    const good = path.join(dir, "good.zip");
    writeFileSync(good, zip);
    const ok = cli(good);
    expect(ok.status).toBe(0);
    const lines = ok.stdout.trim().split("\n");
    expect(lines).toHaveLength(files.length + 3);
    expect(lines[0]).toMatch(/^ok +README\.txt +sha256 [0-9a-f]{64}$/);
    expect(lines.at(-2)).toMatch(/^ok +figure +Drawn again from figure\.json .* byte for byte the signed-off one/);
    expect(lines.at(-1)).toBe(`verified: all ${files.length + 1} files match manifest.json, and the figure drawn again is the signed-off one`);

    const bad = path.join(dir, "bad.zip");
    writeFileSync(bad, repacked((e) => void (e["prediction-qed.csv"][200] ^= 1)));
    const failed = cli(bad);
    expect(failed.status).toBe(1);
    expect(failed.stdout).toMatch(/^differs +prediction-qed\.csv +sha256 [0-9a-f]{64}, manifest says [0-9a-f]{64}$/m);
    expect(failed.stdout.trim().split("\n").at(-1)).toBe(`NOT verified: 1 of ${files.length + 1} files do not match manifest.json`);

    // Data changed in figure.json and its hash put into the manifest: every hash agrees, yet the
    // figure drawn from the changed data is not the signed-off picture.
    const forged = path.join(dir, "forged.zip");
    writeFileSync(forged, forgedData());
    const caught = cli(forged);
    expect(caught.status).toBe(1);
    expect(caught.stdout).toMatch(/^differs +figure +Drawn again from figure\.json the figure's SVG is [0-9a-f]{12}…, but manifest\.json names the signed-off SVG/m);
    expect(caught.stdout.trim().split("\n").at(-1)).toBe(`NOT verified: 0 of ${files.length + 1} files do not match manifest.json, the figure drawn again is not the signed-off one`);

    expect(cli(path.join(dir, "absent.zip")).status).toBe(2);
  });
});

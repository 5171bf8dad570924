import { describe, expect, it } from "vitest";
import { buildManifest, checkBundleName, parseManifest, readmeText } from "./manifest";

const HASH_A = "a".repeat(64);
const HASH_B = "b".repeat(64);

describe("buildManifest", () => {
  it("lists every file with size and SHA-256 and adds the extra fields, keys sorted at every level", () => {
    const text = buildManifest(
      [{ name: "figure.pdf", bytes: 10, sha256: HASH_A }, { name: "data-a.csv", bytes: 3, sha256: HASH_B }],
      { sealedAt: "2026-12-03T10:11:12Z", fingerprint: "fp", signers: [{ signedOffAt: "2026-12-04T08:00:00Z", name: "B. Coauthor" }], engineVersion: "0.1.0" },
    );
    const m = JSON.parse(text);
    expect(m.files).toEqual([{ name: "figure.pdf", bytes: 10, sha256: HASH_A }, { name: "data-a.csv", bytes: 3, sha256: HASH_B }]);
    expect(Object.keys(m)).toEqual(["format", "formatVersion", "hashAlgorithm", "files", "engineVersion", "fingerprint", "sealedAt", "signers"]);
    expect(Object.keys(m.signers[0])).toEqual(["name", "signedOffAt"]);
    expect(text.endsWith("}\n")).toBe(true);
    expect(parseManifest(text).files).toHaveLength(2);
  });

  it("gives the same text for the same content, whatever the order of the extra fields' keys", () => {
    const files = [{ name: "figure.pdf", bytes: 10, sha256: HASH_A }];
    expect(buildManifest(files, { b: 1, a: { y: 2, x: 3 } })).toBe(buildManifest(files, { a: { x: 3, y: 2 }, b: 1 }));
  });

  it("refuses what would make the manifest ambiguous or unreadable", () => {
    const file = { name: "figure.pdf", bytes: 1, sha256: HASH_A };
    expect(() => buildManifest([file, file], {})).toThrow(/listed twice/);
    expect(() => buildManifest([{ ...file, name: "manifest.json" }], {})).toThrow(/itself/);
    expect(() => buildManifest([{ ...file, sha256: "ABC" }], {})).toThrow(/SHA-256/);
    expect(() => buildManifest([file], { files: [] })).toThrow(/written by the bundle/);
    expect(() => buildManifest([file], { n: Number.NaN })).toThrow(/not a finite number/);
    expect(() => buildManifest([file], { when: new Date() as unknown as string })).toThrow(/not plain JSON/);
  });
});

describe("checkBundleName", () => {
  it("accepts plain relative names and refuses any that could escape the folder it is unpacked in", () => {
    for (const ok of ["figure.pdf", "data/data-a.csv", "alt-text.txt"]) expect(() => checkBundleName(ok)).not.toThrow();
    for (const bad of ["", "/etc/passwd", "../x.csv", "a/../../x", "a//b", "a\\b.csv", "./a.csv", "a\u0000.csv", "a\n.csv"]) {
      expect(() => checkBundleName(bad), JSON.stringify(bad)).toThrow(/cannot be a file name/);
    }
  });
});

describe("parseManifest", () => {
  it("names what is wrong with a manifest that cannot be trusted", () => {
    expect(() => parseManifest("{")).toThrow(/not JSON/);
    expect(() => parseManifest('{"format":"other"}')).toThrow(/not a steradian-submission-bundle manifest/);
    expect(() => parseManifest('{"format":"steradian-submission-bundle","formatVersion":2,"hashAlgorithm":"SHA-256","files":[]}')).toThrow(/format version 2/);
    expect(() => parseManifest('{"format":"steradian-submission-bundle","formatVersion":1,"hashAlgorithm":"MD5","files":[]}')).toThrow(/MD5/);
    expect(() => parseManifest('{"format":"steradian-submission-bundle","formatVersion":1,"hashAlgorithm":"SHA-256","files":[{"name":"a"}]}')).toThrow(/without a name, a size and a SHA-256/);
  });
});

describe("readmeText", () => {
  it("names every file with its description, the manifest and how to check the hashes", () => {
    const text = readmeText("Manuscript X, figure 2, version 3", [
      { name: "figure.pdf", description: "the figure, vector PDF" },
      { name: "data-a.csv", description: "dataset A\nas plotted" },
    ]);
    const lines = text.split("\r\n");
    expect(lines[0]).toBe("Submission bundle: Manuscript X, figure 2, version 3");
    expect(lines).toContain("  figure.pdf     the figure, vector PDF");
    expect(lines).toContain("  data-a.csv     dataset A as plotted");
    expect(text).toMatch(/manifest\.json +SHA-256 of every other file/);
    expect(text).toMatch(/sha256sum/);
  });
});

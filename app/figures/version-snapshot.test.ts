import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { canonicalJson } from "~/engine";
import { sha256Hex, shortFingerprint, versionFingerprint, type FingerprintInput, type VersionSnapshot } from "./version-snapshot";
import { emptyFigureModel } from "./starter-model";

const snapshot: VersionSnapshot = {
  format: 1, figure: { id: "f", title: "T", draftRevision: 3 }, number: 2, model: emptyFigureModel(), engineVersion: "0.1.0",
  datasets: [{ datasetId: "d", datasetName: "D", revisionNumber: 1, revisionId: "r", contentHash: "c".repeat(64), rowCount: 5 }],
  predictions: [{ panelId: "main", layerId: "p", label: "QED", process: "compton", engineVersion: "0.1.0", parametersHash: "h", request: { process: "compton" }, table: { x: [1, 2], y: [0.5, null] }, band: null }],
  problems: [],
};
const input: FingerprintInput = { figureId: "f", number: 2, snapshot, svgSha256: "s".repeat(64), sealedBy: "u", sealedAt: "2026-12-03T09:00:00.000Z" };

describe("the version fingerprint", () => {
  it("is SHA-256 of the canonical JSON of everything it covers (checked with node:crypto)", () => {
    const expected = createHash("sha256").update(canonicalJson({ fingerprintFormat: 1, ...input }), "utf8").digest("hex");
    expect(versionFingerprint(input)).toBe(expected);
    // FIPS 180-4 test vector "abc".
    expect(sha256Hex("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });

  it("changes when any covered part changes, and not when keys are reordered", () => {
    const base = versionFingerprint(input);
    const variants: FingerprintInput[] = [
      { ...input, number: 3 },
      { ...input, svgSha256: "t".repeat(64) },
      { ...input, sealedBy: "v" },
      { ...input, sealedAt: "2026-12-03T09:00:00.001Z" },
      { ...input, snapshot: { ...snapshot, engineVersion: "0.1.1" } },
      { ...input, snapshot: { ...snapshot, predictions: [{ ...snapshot.predictions[0], table: { x: [1, 2], y: [0.5000000000000001, null] } }] } },
      { ...input, snapshot: { ...snapshot, datasets: [{ ...snapshot.datasets[0], contentHash: "d".repeat(64) }] } },
      { ...input, snapshot: { ...snapshot, model: { ...snapshot.model, fontSizePt: snapshot.model.fontSizePt + 0.5 } } },
    ];
    for (const v of variants) expect(versionFingerprint(v)).not.toBe(base);
    const reordered = JSON.parse(JSON.stringify({ sealedAt: input.sealedAt, sealedBy: input.sealedBy, svgSha256: input.svgSha256, snapshot, number: 2, figureId: "f" })) as FingerprintInput;
    expect(versionFingerprint(reordered)).toBe(base);
  });

  it("is shown as twelve hex digits in groups of four", () => {
    expect(shortFingerprint("0123456789abcdef".repeat(4))).toBe("0123 4567 89ab");
  });
});

import { sha256 } from "@noble/hashes/sha2.js";
import { bytesToHex, utf8ToBytes } from "@noble/hashes/utils.js";
import { canonicalJson, ENGINE_VERSION } from "~/engine";
import type { FigureData } from "./compute-figure-data";
import type { DatasetInputs, FigureProblem } from "./figure-inputs";
import type { FigureModel } from "./figure-model";
import type { SvgMetadata } from "./render-figure-svg";

/**
 * What a sealed version freezes (docs/decisions/0010-sealed-versions.md): the figure model, the
 * dataset revisions it was drawn from (ids and content hashes), the engine version, every
 * prediction's request, parameter hash and computed table, and what the renderer reported.
 * The SVG itself is stored beside the snapshot and enters the fingerprint through its SHA-256.
 */
export interface VersionSnapshot {
  format: 1;
  figure: { id: string; title: string; draftRevision: number };
  number: number;
  model: FigureModel;
  engineVersion: string;
  datasets: SnapshotDataset[];
  predictions: SnapshotPrediction[];
  problems: FigureProblem[];
}

export interface SnapshotDataset {
  datasetId: string;
  datasetName: string;
  revisionNumber: number;
  revisionId: string;
  contentHash: string;
  rowCount: number;
}

/** A prediction layer as drawn: its request and the table of the curve (y null where not finite). */
export interface SnapshotPrediction {
  panelId: string;
  layerId: string;
  label: string;
  process: string;
  engineVersion: string | null;
  parametersHash: string | null;
  request: Record<string, unknown> | null;
  table: { x: number[]; y: (number | null)[] };
  band: { low: (number | null)[]; high: (number | null)[] } | null;
}

const finiteOrNull = (v: number) => (Number.isFinite(v) ? v : null);

/** The snapshot of a draft rendered for sealing. */
export function buildVersionSnapshot(args: {
  figure: { id: string; title: string; draftRevision: number };
  number: number;
  model: FigureModel;
  inputs: DatasetInputs;
  data: FigureData;
  problems: FigureProblem[];
}): VersionSnapshot {
  const datasets: SnapshotDataset[] = Object.values(args.inputs)
    .map((i) => ({ datasetId: i.datasetId, datasetName: i.datasetName, revisionNumber: i.revisionNumber, revisionId: i.revisionId, contentHash: i.contentHash, rowCount: i.rows.length }))
    .sort((a, b) => (a.datasetId === b.datasetId ? a.revisionNumber - b.revisionNumber : a.datasetId < b.datasetId ? -1 : 1));
  const predictions: SnapshotPrediction[] = args.data.panels.flatMap((panel) =>
    panel.predictions.map((p) => ({
      panelId: panel.panel.id,
      layerId: p.layer.id,
      label: p.layer.label,
      process: p.layer.process,
      engineVersion: p.engineVersion,
      parametersHash: p.parametersHash,
      request: p.request,
      table: { x: p.curve.map((c) => c.x), y: p.curve.map((c) => finiteOrNull(c.y)) },
      band: p.band === null ? null : { low: p.band.map((b) => finiteOrNull(b.low)), high: p.band.map((b) => finiteOrNull(b.high)) },
    })),
  );
  return {
    format: 1,
    figure: args.figure,
    number: args.number,
    model: args.model,
    engineVersion: ENGINE_VERSION,
    datasets,
    predictions,
    problems: args.problems,
  };
}

/** What a sealed version's SVG says about itself; re-rendering a snapshot uses the same words. */
export function sealedMetadata(snapshot: Pick<VersionSnapshot, "figure" | "number" | "model">): SvgMetadata {
  return {
    title: snapshot.figure.title,
    description: snapshot.model.altText,
    notes: [
      `Sealed version v${snapshot.number} of figure ${snapshot.figure.id}, from draft revision ${snapshot.figure.draftRevision}.`,
      "Its fingerprint and review are recorded with the version in Steradian.",
    ],
  };
}

/** SHA-256 (FIPS 180-4), lowercase hex, of a string's UTF-8 bytes. */
export function sha256Hex(text: string): string {
  return bytesToHex(sha256(utf8ToBytes(text)));
}

/** Everything the fingerprint covers, in one object. */
export interface FingerprintInput {
  figureId: string;
  number: number;
  snapshot: VersionSnapshot;
  svgSha256: string;
  sealedBy: string;
  /** ISO 8601 with milliseconds, UTC ("2026-12-03T09:00:00.000Z"). */
  sealedAt: string;
}

/**
 * The version's fingerprint: SHA-256 of the canonical JSON (sorted keys, shortest numbers; the
 * engine's canonicalJson) of the figure id, the number, the snapshot, the SVG's SHA-256, the
 * sealer and the time of sealing. Any change to any of them changes it.
 */
export function versionFingerprint(input: FingerprintInput): string {
  return sha256Hex(canonicalJson({ fingerprintFormat: 1, ...input }));
}

/** The short form shown in lists: the first twelve hex digits in groups of four. */
export function shortFingerprint(fingerprint: string): string {
  return (fingerprint.slice(0, 12).match(/.{1,4}/g) ?? []).join(" ");
}

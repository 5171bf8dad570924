// Every file of one signed-off version's export, drawn again from its sealed snapshot
// (docs/decisions/0009-export-rendering.md, 0011-export-jobs.md): PDF, SVG, PNG, the CSV tables,
// figure.json, the alt text and the bundle, with the preflight report of the files made.
import { strToU8 } from "fflate";
import { figureCsvFiles } from "~/exports/figure-tables";
import type { JsonValue } from "~/exports/manifest";
import { preflight, type PreflightCheck } from "~/exports/preflight";
import { datasetInputKey, type DatasetInput } from "~/figures/figure-inputs";
import { findPreset } from "~/figures/journal-presets";
import type { VersionSnapshot } from "~/figures/version-snapshot";
import type { Db } from "../platform/db.server";
import { rerenderVersion } from "../versions/rerender-version.server";
import { listEvents, snapshotOf, type VersionRow } from "../versions/version-repository.server";
import { buildBundle, sha256Hex, type BundleFile } from "./bundle.server";
import { preflightInput } from "./preflight-input.server";
import { svgToPdf } from "./svg-to-pdf.server";
import { svgToPng } from "./svg-to-png.server";

/** Why an export is refused for good (retrying cannot help): the reason is shown to the author. */
export class ExportRefused extends Error {
  constructor(
    message: string,
    readonly preflight: PreflightCheck[] | null = null,
  ) {
    super(message);
    this.name = "ExportRefused";
  }
}

export const FIGURE_JSON_FORMAT = "steradian-figure-snapshot";

/**
 * figure.json: the sealed snapshot and the dataset revisions it was drawn from, as the renderer
 * reads them, so that anyone can draw the figure again from the bundle alone (verify-bundle).
 * `latestRevisionNumber` only tells the editor that a newer revision exists; it is pinned to the
 * revision itself so that a later upload does not change the bundle.
 */
export function figureJson(snapshot: VersionSnapshot, svgSha256: string, inputs: Record<string, DatasetInput>): string {
  const datasetInputs = snapshot.datasets.map((d) => {
    const input = inputs[datasetInputKey(d.datasetId, d.revisionNumber)];
    if (input === undefined) throw new ExportRefused(`the dataset revision "${d.datasetName}" r${d.revisionNumber} named by the snapshot is no longer readable`);
    return { ...input, latestRevisionNumber: input.revisionNumber };
  });
  return `${JSON.stringify({ format: FIGURE_JSON_FORMAT, formatVersion: 1, svgSha256, snapshot, datasetInputs }, null, 1)}\n`;
}

export interface VersionExportFiles {
  pdf: Buffer;
  svg: string;
  png: Buffer;
  bundle: Uint8Array;
  preflight: PreflightCheck[];
}

const plain = (v: unknown) => JSON.parse(JSON.stringify(v)) as JsonValue;

/**
 * Draws the version again from its snapshot; refuses (ExportRefused) when the picture is not
 * byte for byte the signed-off one. Then makes every file. Deterministic: the same version
 * gives the same bytes (dates are the seal time, ids derive from the version).
 */
export async function renderVersionExport(db: Db, version: VersionRow): Promise<VersionExportFiles> {
  const snapshot = snapshotOf(version);
  const again = await rerenderVersion(db, version);
  if (!again.inputsMatch) throw new ExportRefused("A dataset revision behind this version no longer has the content hash recorded when it was sealed; nothing was exported.");
  if (!again.matches) {
    throw new ExportRefused(
      `Drawn again from its sealed snapshot, v${version.number} gives a picture with SVG SHA-256 ${again.svgSha256.slice(0, 12)}…, not the signed-off ${version.svg_sha256.slice(0, 12)}…; nothing was exported. The snapshot or the drawing code has changed since sign-off: seal and sign off a new version.`,
    );
  }
  const built = again.rendered.built;
  const svg = version.svg;
  const preset = findPreset(snapshot.model.preset);
  if (!preset) throw new ExportRefused(`the size preset "${snapshot.model.preset}" is not known to this Steradian`);

  const [events, people] = await Promise.all([
    listEvents(db, [version.id]),
    db.selectFrom("app_user").select(["id", "name"]).where("id", "=", version.sealed_by).executeTakeFirstOrThrow(),
  ]);
  const signers = events.filter((e) => e.kind === "signed-off").map((e) => ({ name: e.actorName, signedOffAt: new Date(e.at).toISOString() }));
  const sealedAt = new Date(version.sealed_at);
  const title = snapshot.figure.title;
  const authors = [people.name, ...signers.map((s) => s.name).filter((n) => n !== people.name)];

  const size = { widthPt: built.widthPt, heightPt: built.heightPt };
  const pdf = await svgToPdf(svg, {
    ...size,
    title: `${title} (v${version.number})`,
    author: authors.join("; "),
    subject: `Steradian sealed version v${version.number}, fingerprint ${version.fingerprint}`,
    keywords: `fingerprint ${version.fingerprint}`,
    creationDate: sealedAt,
    documentId: version.id,
  });
  const png = svgToPng(svg, { ...size, dpi: preset.dpi });
  const report = preflight(preflightInput(built, { pdf, svg, png }), preset);

  const csv = figureCsvFiles(snapshot.model, again.rendered.data);
  const files: BundleFile[] = [
    { name: "figure.pdf", bytes: pdf, description: `vector PDF, ${preset.name}, no fonts (text drawn as outlines)` },
    { name: "figure.svg", bytes: strToU8(svg), description: "the signed-off SVG, self-contained" },
    { name: "figure.png", bytes: png, description: `PNG at ${preset.dpi} dpi` },
    { name: "figure.json", bytes: strToU8(figureJson(snapshot, version.svg_sha256, again.inputs)), description: "the sealed figure model and snapshot, with the dataset revisions as drawn" },
    { name: "alt-text.txt", bytes: strToU8(`${snapshot.model.altText.trim()}\n`), description: "the figure's alternative text" },
    ...csv.map((f) => ({ name: f.name, bytes: strToU8(f.text), description: f.description })),
  ];
  const extra = plain({
    figure: { id: snapshot.figure.id, title, version: version.number },
    fingerprint: version.fingerprint,
    svgSha256: version.svg_sha256,
    sealedAt: sealedAt.toISOString(),
    sealer: people.name,
    signers,
    engineVersion: snapshot.engineVersion,
    preset: { id: preset.id, name: preset.name, dpi: preset.dpi },
    datasetRevisions: snapshot.datasets.map((d) => ({ datasetId: d.datasetId, dataset: d.datasetName, revision: d.revisionNumber, revisionId: d.revisionId, contentHash: d.contentHash, rows: d.rowCount })),
    predictions: snapshot.predictions.map((p) => ({ layerId: p.layerId, process: p.process, engineVersion: p.engineVersion, parametersHash: p.parametersHash, request: p.request })),
  }) as { [key: string]: JsonValue };
  const bundle = buildBundle(files, extra, { title: `${title}, sealed version v${version.number}, fingerprint ${version.fingerprint}`, modifiedAt: sealedAt });
  return { pdf, svg, png, bundle, preflight: report };
}

export { sha256Hex };

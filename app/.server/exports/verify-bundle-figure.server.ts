// The second half of verifying a bundle: draw the figure again from the bundle's own figure.json
// (the sealed model and the dataset revisions as drawn; the predictions are computed again by the
// engine from their parameters) and check that the SVG is byte for byte the signed-off one — the
// figure.svg in the zip and the svgSha256 of the manifest. Needs no account and no database.
import { unzipSync } from "fflate";
import { datasetInputKey, type DatasetInput } from "~/figures/figure-inputs";
import { renderFigure } from "~/figures/render-figure";
import { sealedMetadata, sha256Hex, type VersionSnapshot } from "~/figures/version-snapshot";
import { FIGURE_JSON_FORMAT } from "./version-export.server";
import { verifyBundle, type BundleVerification } from "./verify-bundle.server";

export interface FigureCheck {
  ok: boolean;
  /** One sentence for a referee: what was drawn again and what it matched or did not. */
  message: string;
  /** SHA-256 of the SVG drawn again from figure.json, when it could be drawn. */
  redrawnSha256: string | null;
}

export interface FullVerification extends BundleVerification {
  figure: FigureCheck;
}

export async function verifyBundleAndFigure(zip: Uint8Array): Promise<FullVerification> {
  const base = verifyBundle(zip);
  const figure = await redrawFigure(zip, base);
  return { ...base, figure, ok: base.ok && figure.ok };
}

async function redrawFigure(zip: Uint8Array, base: BundleVerification): Promise<FigureCheck> {
  let entries: Record<string, Uint8Array>;
  try {
    entries = unzipSync(zip, { filter: (f) => f.name === "figure.json" || f.name === "figure.svg" });
  } catch {
    return { ok: false, message: "The figure could not be drawn again: the zip is not readable.", redrawnSha256: null };
  }
  if (!entries["figure.json"]) return { ok: false, message: "The figure could not be drawn again: the bundle has no figure.json.", redrawnSha256: null };
  let parsed: { format?: string; svgSha256?: string; snapshot?: VersionSnapshot; datasetInputs?: DatasetInput[] };
  try {
    parsed = JSON.parse(new TextDecoder("utf-8", { fatal: true }).decode(entries["figure.json"])) as typeof parsed;
  } catch (e) {
    return { ok: false, message: `The figure could not be drawn again: figure.json is not JSON (${(e as Error).message}).`, redrawnSha256: null };
  }
  if (parsed.format !== FIGURE_JSON_FORMAT || !parsed.snapshot || !Array.isArray(parsed.datasetInputs)) {
    return { ok: false, message: `The figure could not be drawn again: figure.json is not a ${FIGURE_JSON_FORMAT} file.`, redrawnSha256: null };
  }
  const snapshot = parsed.snapshot;
  const inputs: Record<string, DatasetInput> = {};
  for (const input of parsed.datasetInputs) inputs[datasetInputKey(input.datasetId, input.revisionNumber)] = input;
  let svg: string;
  try {
    svg = (await renderFigure(snapshot.model, inputs, sealedMetadata(snapshot))).svg;
  } catch (e) {
    return { ok: false, message: `The figure could not be drawn again from figure.json: ${(e as Error).message}`, redrawnSha256: null };
  }
  const redrawn = sha256Hex(svg);
  const manifestSvg = typeof base.manifest?.svgSha256 === "string" ? base.manifest.svgSha256 : null;
  const zipSvg = entries["figure.svg"] ? sha256Hex(new TextDecoder().decode(entries["figure.svg"])) : null;
  const problems = [
    ...(manifestSvg === null ? ["manifest.json names no svgSha256"] : manifestSvg !== redrawn ? [`manifest.json names the signed-off SVG ${manifestSvg.slice(0, 12)}…`] : []),
    ...(zipSvg === null ? ["the zip has no figure.svg"] : zipSvg !== redrawn ? [`figure.svg in the zip is ${zipSvg.slice(0, 12)}…`] : []),
    ...(parsed.svgSha256 !== redrawn ? ["figure.json names a different SVG"] : []),
  ];
  if (problems.length > 0) return { ok: false, message: `Drawn again from figure.json the figure's SVG is ${redrawn.slice(0, 12)}…, but ${problems.join("; ")}.`, redrawnSha256: redrawn };
  return { ok: true, message: `Drawn again from figure.json (the sealed model, the data and the prediction parameters), the SVG is byte for byte the signed-off one (SHA-256 ${redrawn}).`, redrawnSha256: redrawn };
}

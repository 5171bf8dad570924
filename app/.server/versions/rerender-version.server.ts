import { datasetInputKey } from "~/figures/figure-inputs";
import { renderFigure } from "~/figures/render-figure";
import { sealedMetadata, sha256Hex } from "~/figures/version-snapshot";
import { loadDatasetInputs } from "../figures/figure-inputs.server";
import type { Db } from "../platform/db.server";
import { snapshotOf, type VersionRow } from "./version-repository.server";

/**
 * Draws a sealed version again from its snapshot alone — the model, the revisions it names, the
 * words of sealedMetadata — and says whether the bytes are the stored ones
 * (docs/decisions/0010-sealed-versions.md). An export uses this to refuse a version whose
 * picture the current code no longer reproduces.
 */
export async function rerenderVersion(db: Db, version: Pick<VersionRow, "manuscript_id" | "snapshot" | "svg_sha256">) {
  const snapshot = snapshotOf(version);
  const inputs = await loadDatasetInputs(db, version.manuscript_id, snapshot.model);
  const inputsMatch = snapshot.datasets.every((d) => inputs[datasetInputKey(d.datasetId, d.revisionNumber)]?.contentHash === d.contentHash);
  const rendered = await renderFigure(snapshot.model, inputs, sealedMetadata(snapshot));
  const svgSha256 = sha256Hex(rendered.svg);
  return { svg: rendered.svg, svgSha256, inputsMatch, matches: inputsMatch && svgSha256 === version.svg_sha256, rendered, inputs };
}

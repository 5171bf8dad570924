import { figureModelIssues, figureModelSchema, type FigureModel } from "~/figures/figure-model";
import { draftMetadata } from "~/figures/draft-metadata";
import { renderFigure, type RenderedFigure } from "~/figures/render-figure";
import type { Db } from "../platform/db.server";
import { loadDatasetInputs } from "./figure-inputs.server";
import type { FigureRow } from "./figure-repository.server";

/** A stored draft read back through the schema; a draft that no longer parses says why. */
export function parseStoredDraft(figure: FigureRow): { ok: true; model: FigureModel } | { ok: false; issues: { path: string; message: string }[] } {
  const parsed = figureModelSchema.safeParse(figure.draft);
  return parsed.success ? { ok: true, model: parsed.data } : { ok: false, issues: figureModelIssues(parsed.error) };
}

/**
 * The draft rendered on the server by the same function the browser preview calls
 * (renderFigure), from the revisions it pins.
 */
export async function renderDraft(db: Db, figure: FigureRow, model: FigureModel): Promise<RenderedFigure> {
  const inputs = await loadDatasetInputs(db, figure.manuscript_id, model);
  return renderFigure(model, inputs, draftMetadata({ id: figure.id, title: figure.title, draftRevision: figure.draft_revision }, model));
}


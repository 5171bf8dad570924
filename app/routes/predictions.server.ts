import { z } from "zod";
import { db } from "~/.server/platform/db.server";
import { accessFigure } from "~/.server/figures/figure-access.server";
import { saveDraft } from "~/.server/figures/figure-repository.server";
import { colourFor } from "~/figures/palette";
import { figureModelIssues, figureModelSchema, predictionLayerSchema } from "~/figures/figure-model";
import { can } from "~/permissions";

/** The drafts a user may add a prediction to: figures of manuscripts where the user is an author. */
export async function editableFigures(userId: string) {
  const rows = await db
    .selectFrom("figure")
    .innerJoin("manuscript", "manuscript.id", "figure.manuscript_id")
    .innerJoin("membership", (j) => j.onRef("membership.manuscript_id", "=", "manuscript.id").on("membership.user_id", "=", userId))
    .select(["figure.id", "figure.title", "figure.manuscript_id as manuscriptId", "manuscript.title as manuscriptTitle", "membership.role"])
    .orderBy("manuscript.title")
    .orderBy("figure.title")
    .execute();
  return rows.filter((r) => can(r.role, "edit:figure")).map(({ role: _role, ...r }) => r);
}

const AddSchema = z.object({ figureId: z.uuid(), layer: z.string().max(10_000) });

export type AddResult = { ok: true; figureTitle: string; figureUrl: string; draftRevision: number } | { ok: false; message: string };

/**
 * Appends the page's prediction as a layer of the main panel of a figure's draft, as the next
 * draft revision (audited like every save, docs/decisions/0008-figure-model.md). The layer's id
 * and colour are the next free ones of the figure.
 */
export async function addPredictionToFigure(request: Request, form: FormData, ip: string | null): Promise<AddResult> {
  const input = AddSchema.safeParse({ figureId: form.get("figureId"), layer: form.get("layer") });
  if (!input.success) return { ok: false, message: "Choose a figure to add the prediction to." };
  const { user, figure } = await accessFigure("page", request, input.data.figureId, "edit:figure");
  const draft = figureModelSchema.safeParse(figure.draft);
  if (!draft.success) return { ok: false, message: "That figure's draft cannot be read; open it and save it once first." };
  const model = draft.data;
  const layers = model.panels.flatMap((p) => p.layers);
  const ids = new Set(layers.map((l) => l.id));
  let n = 1;
  while (ids.has(`prediction-${n}`)) n++;
  let parsedLayer: unknown;
  try {
    parsedLayer = { ...JSON.parse(input.data.layer), kind: "prediction", id: `prediction-${n}`, colour: colourFor(layers.length) };
  } catch {
    return { ok: false, message: "The prediction could not be read." };
  }
  const layer = predictionLayerSchema.safeParse(parsedLayer);
  if (!layer.success) return { ok: false, message: `The prediction does not fit a figure: ${figureModelIssues(layer.error)[0].message}.` };
  const next = { ...model, panels: model.panels.map((p, i) => (i === 0 ? { ...p, layers: [...p.layers, layer.data] } : p)) };
  const checked = figureModelSchema.safeParse(next);
  if (!checked.success) return { ok: false, message: `The figure would not be valid: ${figureModelIssues(checked.error)[0].message}.` };
  const saved = await saveDraft(db, { figureId: figure.id, manuscriptId: figure.manuscript_id, baseRevision: figure.draft_revision, model: checked.data, userId: user.id, ip });
  if (saved.kind === "conflict") return { ok: false, message: `${saved.updatedByName} saved the figure at this moment: try again.` };
  return { ok: true, figureTitle: figure.title, figureUrl: `/manuscripts/${figure.manuscript_id}/figures/${figure.id}`, draftRevision: saved.draftRevision };
}

import { z } from "zod";
import type { QuantityDescription } from "~/datasets";
import { figureModelIssues, figureModelSchema, type FigureModel } from "~/figures/figure-model";
import { emptyFigureModel, figureModelFromDataset } from "~/figures/starter-model";
import { findDataset, findRevision } from "../datasets/dataset-repository.server";
import type { Db } from "../platform/db.server";
import { createFigure, type FigureRow } from "./figure-repository.server";

/** How a new figure starts: empty, from a dataset revision (the latest if none is named), or from a full model. */
export const newFigureSchema = z.object({
  title: z.string().trim().min(1, "Give the figure a title.").max(200, "A title is at most 200 characters."),
  from: z
    .object({ datasetId: z.uuid("Choose a dataset of this manuscript."), revisionNumber: z.number().int().min(1).optional() })
    .optional(),
  model: z.unknown().optional(),
});
export type NewFigure = z.infer<typeof newFigureSchema>;

export class FigureStartError extends Error {
  constructor(message: string, readonly field: string, readonly issues: { path: string; message: string }[] = []) {
    super(message);
  }
}

/** Creates a figure (audited) and returns its id; a bad start is a FigureStartError naming the field. */
export async function startFigure(db: Db, args: { manuscriptId: string; userId: string; ip: string | null; input: NewFigure; isDemo?: boolean }) {
  let model: FigureModel;
  let startedFrom: { datasetId: string; revisionNumber: number } | undefined;
  if (args.input.model !== undefined) {
    const parsed = figureModelSchema.safeParse(args.input.model);
    if (!parsed.success) {
      const issues = figureModelIssues(parsed.error);
      throw new FigureStartError(`The figure model is not valid at ${issues[0].path || "its top level"}: ${issues[0].message}`, `model.${issues[0].path}`, issues);
    }
    model = parsed.data;
  } else if (args.input.from !== undefined) {
    const dataset = await findDataset(db, args.manuscriptId, args.input.from.datasetId);
    if (!dataset) throw new FigureStartError("No dataset with that id in this manuscript.", "from.datasetId");
    const latest = await db.selectFrom("dataset_revision").select((eb) => eb.fn.max("number").as("n")).where("dataset_id", "=", dataset.id).executeTakeFirst();
    const revisionNumber = args.input.from.revisionNumber ?? (latest?.n == null ? null : Number(latest.n));
    if (revisionNumber === null) throw new FigureStartError(`The dataset "${dataset.name}" has no revision yet: upload its data first.`, "from.datasetId");
    if (!(await findRevision(db, dataset.id, revisionNumber))) throw new FigureStartError(`The dataset "${dataset.name}" has no revision r${revisionNumber}.`, "from.revisionNumber");
    model = figureModelFromDataset({
      id: dataset.id, name: dataset.name, quantity: dataset.quantity as unknown as QuantityDescription,
      process: dataset.process, beamEnergyGeV: dataset.beam_energy_gev, revisionNumber,
    });
    startedFrom = { datasetId: dataset.id, revisionNumber };
  } else {
    model = emptyFigureModel();
  }
  return createFigure(db, { manuscriptId: args.manuscriptId, userId: args.userId, title: args.input.title, model, ip: args.ip, isDemo: args.isDemo, startedFrom });
}

export function figureJson(f: Pick<FigureRow, "id" | "manuscript_id" | "title" | "draft_revision" | "created_at" | "updated_at">) {
  return { id: f.id, manuscriptId: f.manuscript_id, title: f.title, draftRevision: f.draft_revision, createdAt: f.created_at, updatedAt: f.updated_at };
}

/** A draft save as the API and the page receive it. */
export const draftSaveSchema = z.object({
  baseRevision: z.number({ message: "Send the draft revision your edit is based on as baseRevision." }).int().min(1),
  title: z.string().trim().min(1, "Give the figure a title.").max(200, "A title is at most 200 characters.").optional(),
  model: z.unknown(),
});

import type { QuantityDescription } from "~/datasets";
import { datasetInputKey, type DatasetInput, type DatasetInputs } from "~/figures/figure-inputs";
import type { FigureModel } from "~/figures/figure-model";
import type { Db } from "../platform/db.server";

/**
 * The pinned revisions that a figure's dataset layers name, read from the database in
 * canonical units. A layer whose dataset is not in the manuscript or whose revision does not
 * exist is simply absent: the figure reports it beside the layer.
 */
export async function loadDatasetInputs(db: Db, manuscriptId: string, model: FigureModel): Promise<DatasetInputs> {
  const wanted = new Map<string, { datasetId: string; revisionNumber: number }>();
  for (const panel of model.panels) {
    for (const layer of panel.layers) {
      if (layer.kind === "dataset") wanted.set(datasetInputKey(layer.datasetId, layer.revisionNumber), { datasetId: layer.datasetId, revisionNumber: layer.revisionNumber });
    }
  }
  const out: Record<string, DatasetInput> = {};
  for (const [key, { datasetId, revisionNumber }] of wanted) {
    const revision = await db
      .selectFrom("dataset_revision")
      .innerJoin("dataset", "dataset.id", "dataset_revision.dataset_id")
      .select((eb) => [
        "dataset_revision.id", "dataset_revision.content_hash", "dataset_revision.quantity", "dataset.name",
        eb.selectFrom("dataset_revision as newest").select((e2) => e2.fn.max("newest.number").as("n")).whereRef("newest.dataset_id", "=", "dataset.id").as("latest"),
      ])
      .where("dataset.id", "=", datasetId)
      .where("dataset.manuscript_id", "=", manuscriptId)
      .where("dataset_revision.number", "=", revisionNumber)
      .executeTakeFirst();
    if (!revision) continue;
    const rows = await db
      .selectFrom("dataset_row")
      .select(["x", "x_low", "x_high", "y", "stat_minus", "stat_plus", "syst_minus", "syst_plus"])
      .where("revision_id", "=", revision.id)
      .orderBy("idx")
      .execute();
    out[key] = {
      datasetId,
      datasetName: revision.name,
      revisionNumber,
      revisionId: revision.id,
      contentHash: revision.content_hash,
      latestRevisionNumber: Number(revision.latest ?? revisionNumber),
      quantity: revision.quantity as unknown as QuantityDescription,
      rows: rows.map((r) => ({ x: r.x, xLow: r.x_low, xHigh: r.x_high, y: r.y, statMinus: r.stat_minus, statPlus: r.stat_plus, systMinus: r.syst_minus, systPlus: r.syst_plus })),
    };
  }
  return out;
}

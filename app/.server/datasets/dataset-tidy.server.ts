import { z } from "zod";
import { type MemberRole, can } from "~/permissions";
import type { Dataset } from "../../../db/types";
import { recordAudit } from "../platform/audit.server";
import type { Db } from "../platform/db.server";
import { DatasetNameTaken } from "./dataset-create.server";

/**
 * Who may rename or retire a dataset: the manuscript's corresponding author, and the member who
 * created the dataset while they may still create datasets (docs/product.md, Datasets).
 */
export function canTidyDataset(role: MemberRole | null, userId: string, dataset: Pick<Dataset, "created_by">): boolean {
  return role === "corresponding" || (dataset.created_by === userId && can(role, "create:dataset"));
}

export const TIDY_REFUSAL = "Only the manuscript's corresponding author and the dataset's creator may rename or retire a dataset.";

export const datasetNameSchema = z.string().trim().min(1, "Name the dataset, e.g. “dσ/dΩ at 0.5 GeV”.").max(200, "At most 200 characters.");

/** Renames a dataset, audited with the old and new names; a name the manuscript already uses is refused. */
export async function renameDataset(db: Db, args: { dataset: Pick<Dataset, "id" | "manuscript_id" | "name">; userId: string; ip: string | null; name: string }) {
  if (args.name === args.dataset.name) return { changed: false };
  try {
    await db.transaction().execute(async (tx) => {
      await tx.updateTable("dataset").set({ name: args.name }).where("id", "=", args.dataset.id).execute();
      await recordAudit(tx, { action: "dataset-renamed", actorId: args.userId, manuscriptId: args.dataset.manuscript_id, ip: args.ip, detail: { datasetId: args.dataset.id, from: args.dataset.name, to: args.name } });
    });
  } catch (e) {
    if ((e as { constraint?: string }).constraint === "dataset_manuscript_name_key") throw new DatasetNameTaken(args.name);
    throw e;
  }
  return { changed: true };
}

/** Retires a dataset once, audited; retiring a retired dataset changes nothing. */
export async function retireDataset(db: Db, args: { dataset: Pick<Dataset, "id" | "manuscript_id" | "name">; userId: string; ip: string | null }) {
  return db.transaction().execute(async (tx) => {
    const row = await tx.updateTable("dataset").set({ retired_at: new Date(), retired_by: args.userId }).where("id", "=", args.dataset.id).where("retired_at", "is", null).returning("retired_at").executeTakeFirst();
    if (!row) return { changed: false };
    await recordAudit(tx, { action: "dataset-retired", actorId: args.userId, manuscriptId: args.dataset.manuscript_id, ip: args.ip, detail: { datasetId: args.dataset.id, name: args.dataset.name } });
    return { changed: true };
  });
}

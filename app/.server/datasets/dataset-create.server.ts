import { recordAudit } from "../platform/audit.server";
import type { DatasetInputValue } from "./dataset-input.server";
import { createDataset } from "./dataset-repository.server";
import type { Db } from "../platform/db.server";

export class DatasetNameTaken extends Error {
  constructor(name: string) {
    super(`This manuscript already has a dataset named “${name}”.`);
  }
}

/** Creates a dataset and records it; a name already used in the manuscript is refused (also under a race, by the unique key). */
export async function createDatasetAudited(db: Db, args: { manuscriptId: string; userId: string; ip: string | null; input: DatasetInputValue }) {
  const v = args.input;
  try {
    return await db.transaction().execute(async (tx) => {
      const created = await createDataset(tx, {
        manuscriptId: args.manuscriptId, userId: args.userId, name: v.name, quantity: v.quantity, mapping: v.mapping ?? null,
        metadata: { process: v.metadata.process ?? null, beamEnergyGeV: v.metadata.beamEnergyGeV ?? null, target: v.metadata.target ?? null, description: v.metadata.description ?? "" },
      });
      await recordAudit(tx, { action: "dataset-created", actorId: args.userId, manuscriptId: args.manuscriptId, ip: args.ip, detail: { datasetId: created.id, name: v.name } });
      return created;
    });
  } catch (e) {
    if ((e as { code?: string; constraint?: string }).constraint === "dataset_manuscript_name_key") throw new DatasetNameTaken(v.name);
    throw e;
  }
}

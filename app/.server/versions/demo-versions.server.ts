// The demo scenario's sealed figure (docs/product.md, "Demo scenario"): a figure of the synthetic
// annihilation data with a signed-off v1 and a v2 in review, made by the same functions a user's
// requests call (start, save, seal, request, sign off), with e-mail skipped. Each step checks
// whether it was done, so that a second run changes nothing and an interrupted run resumes.
import { figureModelSchema, type FigureModel } from "~/figures/figure-model";
import { deriveVersionState } from "~/figures/version-state";
import { findFigure, saveDraft } from "../figures/figure-repository.server";
import { startFigure } from "../figures/figure-service.server";
import type { Db } from "../platform/db.server";
import { decideVersion, requestSignoff } from "./review.server";
import { sealVersion } from "./seal-version.server";
import { asStateInput, findVersion, listEvents } from "./version-repository.server";

export const DEMO_FIGURE_TITLE = "Fig. 1: annihilation photons in the lab frame (synthetic demo)";
const DEMO_DATASET_NAME = "e⁺e⁻ → γγ photon angular distribution, T = 0.5 GeV (synthetic)";

interface DemoPeople { contributor: string; coauthor: string; corresponding: string }

async function editDraft(db: Db, figureId: string, userId: string, change: (m: FigureModel) => void) {
  const figure = (await findFigure(db, figureId))!;
  const model = figureModelSchema.parse(figure.draft);
  change(model);
  const saved = await saveDraft(db, { figureId, manuscriptId: figure.manuscript_id, baseRevision: figure.draft_revision, model, userId, ip: null });
  if (saved.kind !== "saved") throw new Error("demo figure: the draft changed while seeding");
  return saved.draftRevision;
}

async function stateOf(db: Db, versionId: string) {
  return deriveVersionState((await listEvents(db, [versionId])).map(asStateInput));
}

/** Returns how many steps it performed (0 when the demo figure is complete). */
export async function seedDemoVersions(db: Db, manuscriptId: string, people: DemoPeople): Promise<number> {
  let steps = 0;
  const dataset = await db.selectFrom("dataset").select("id").where("manuscript_id", "=", manuscriptId).where("name", "=", DEMO_DATASET_NAME).executeTakeFirst();
  if (!dataset) throw new Error("demo figure: the synthetic annihilation dataset is missing; seed the datasets first");
  let figure = await db.selectFrom("figure").select("id").where("manuscript_id", "=", manuscriptId).where("title", "=", DEMO_FIGURE_TITLE).executeTakeFirst();
  if (!figure) {
    figure = await startFigure(db, { manuscriptId, userId: people.contributor, ip: null, input: { title: DEMO_FIGURE_TITLE, from: { datasetId: dataset.id } }, isDemo: true });
    steps++;
  }
  const figureId = figure.id;

  let v1 = await findVersion(db, figureId, 1);
  if (!v1) {
    // A short legend entry, and alt text that says the data are synthetic.
    const revision = await editDraft(db, figureId, people.contributor, (m) => {
      for (const layer of m.panels[0].layers) if (layer.kind === "dataset") layer.label = "\\text{synthetic data}";
      m.altText = "Synthetic demo data: photon angular distribution of e+e- annihilation in flight at T = 0.5 GeV against the QED Born prediction, with a data/prediction ratio strip.";
    });
    await sealVersion(db, { figureId, userId: people.contributor, draftRevision: revision, ip: null, mail: "skip" });
    v1 = (await findVersion(db, figureId, 1))!;
    steps++;
  }
  if ((await stateOf(db, v1.id)).state === "sealed") {
    await requestSignoff(db, { version: v1, requesterId: people.contributor, reviewerIds: [people.coauthor], ip: null, mail: "skip" });
    steps++;
  }
  if ((await stateOf(db, v1.id)).state === "in review") {
    await decideVersion(db, { version: v1, reviewerId: people.coauthor, decision: "signed-off", comment: "The points match the run log; the curve is the Born prediction at the beam energy of the run.", ip: null, mail: "skip" });
    steps++;
  }

  let v2 = await findVersion(db, figureId, 2);
  if (!v2) {
    // v2 profiles a 3 % normalisation uncertainty in χ² (an invented luminosity uncertainty).
    const revision = await editDraft(db, figureId, people.contributor, (m) => {
      for (const layer of m.panels[0].layers) if (layer.kind === "dataset") layer.normalisationUncertainty = 0.03;
    });
    await sealVersion(db, { figureId, userId: people.contributor, draftRevision: revision, ip: null, mail: "skip" });
    v2 = (await findVersion(db, figureId, 2))!;
    steps++;
  }
  if ((await stateOf(db, v2.id)).state === "sealed") {
    await requestSignoff(db, { version: v2, requesterId: people.contributor, reviewerIds: [people.coauthor, people.corresponding], ip: null, mail: "skip" });
    steps++;
  }
  return steps;
}

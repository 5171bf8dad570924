import { sql } from "kysely";
import { datasetInputKey } from "~/figures/figure-inputs";
import { renderFigure } from "~/figures/render-figure";
import { buildVersionSnapshot, sealedMetadata, sha256Hex, versionFingerprint, type VersionSnapshot } from "~/figures/version-snapshot";
import { deriveVersionState } from "~/figures/version-state";
import { loadDatasetInputs } from "../figures/figure-inputs.server";
import { findFigure } from "../figures/figure-repository.server";
import { parseStoredDraft } from "../figures/render-draft.server";
import { recordAudit } from "../platform/audit.server";
import type { Db } from "../platform/db.server";
import { deliver, notify, type PendingMail } from "./notifications.server";
import { conflictFromDatabase, VersionError } from "./version-error.server";
import { asStateInput, listEvents } from "./version-repository.server";

export interface SealArgs {
  figureId: string;
  userId: string;
  /** The draft revision the sealer looked at: a newer save since then is a 409, never sealed unseen. */
  draftRevision: number;
  ip: string | null;
  mail?: "send" | "skip";
}

/**
 * Seals a figure's draft into the next version (docs/decisions/0010-sealed-versions.md).
 *
 * The draft is rendered on the server by renderFigure — the function behind the preview and the
 * draft SVG — from the revisions it pins; then one transaction locks the figure row (a draft
 * save waits, or has already moved the revision and the seal is refused), writes the version,
 * its inputs and the supersession of any older version still waiting for review, the audit
 * entries and the notifications. E-mails go out after the commit.
 */
export async function sealVersion(db: Db, args: SealArgs) {
  const figure = await findFigure(db, args.figureId);
  if (!figure) throw new VersionError(404, "not-found", "The figure was not found.");
  if (figure.draft_revision !== args.draftRevision) {
    throw new VersionError(409, "stale-draft", `The draft is at revision ${figure.draft_revision}, not ${args.draftRevision}: someone saved it since you looked. Look at the current draft and seal again.`, "draftRevision", { currentRevision: figure.draft_revision });
  }
  const already = await db.selectFrom("figure_version").select("number").where("figure_id", "=", figure.id).where("draft_revision", "=", figure.draft_revision).executeTakeFirst();
  if (already) throw new VersionError(409, "already-sealed", `Draft revision ${figure.draft_revision} is sealed already as v${already.number}. Change the draft to seal a new version.`, "draftRevision", { number: already.number });

  const draft = parseStoredDraft(figure);
  if (!draft.ok) throw new VersionError(422, "invalid-figure", `The draft is not a valid figure at ${draft.issues[0].path || "its top level"}: ${draft.issues[0].message}`, `model.${draft.issues[0].path}`);
  const model = draft.model;
  const inputs = await loadDatasetInputs(db, figure.manuscript_id, model);
  const missing = model.panels.flatMap((p) => p.layers).flatMap((l) => (l.kind === "dataset" && !(datasetInputKey(l.datasetId, l.revisionNumber) in inputs) ? [l] : []));
  if (missing.length > 0) {
    const list = missing.map((l) => `layer “${l.id}” names revision r${l.revisionNumber} of dataset ${l.datasetId}`).join("; ");
    throw new VersionError(422, "missing-revision", `The draft cannot be sealed: ${list}, which this manuscript does not have or cannot read. Move the layer to an existing revision or remove it, then seal.`, "model", { layers: missing.map((l) => l.id) });
  }

  const latest = await db.selectFrom("figure_version").select((eb) => eb.fn.max("number").as("n")).where("figure_id", "=", figure.id).executeTakeFirst();
  const number = Number(latest?.n ?? 0) + 1;
  const figureRef = { id: figure.id, title: figure.title, draftRevision: figure.draft_revision };
  const rendered = await renderFigure(model, inputs, sealedMetadata({ figure: figureRef, number, model }));
  if (rendered.texErrors.length > 0) {
    const t = rendered.texErrors[0];
    throw new VersionError(422, "tex-error", `The draft cannot be sealed: the TeX at ${t.path} does not render (${t.message}).`, `model.${t.path}`);
  }
  // What jsonb will hold, so that the fingerprint can be recomputed from the stored row.
  const snapshot = JSON.parse(JSON.stringify(buildVersionSnapshot({ figure: figureRef, number, model, inputs, data: rendered.data, problems: rendered.problems }))) as VersionSnapshot;
  const svgSha256 = sha256Hex(rendered.svg);
  const sealedAt = new Date();
  const fingerprint = versionFingerprint({ figureId: figure.id, number, snapshot, svgSha256, sealedBy: args.userId, sealedAt: sealedAt.toISOString() });

  let mails: PendingMail[] = [];
  let result;
  try {
    result = await db.transaction().execute(async (tx) => {
      const locked = await sql<{ draft_revision: number; title: string }>`SELECT draft_revision, title FROM figure WHERE id = ${figure.id} FOR NO KEY UPDATE`.execute(tx);
      if (locked.rows[0]?.draft_revision !== figure.draft_revision) {
        throw new VersionError(409, "stale-draft", `The draft was saved while it was being sealed (it is now at revision ${locked.rows[0]?.draft_revision}): nothing was sealed. Look at the current draft and seal again.`, "draftRevision", { currentRevision: locked.rows[0]?.draft_revision });
      }
      const now = await tx.selectFrom("figure_version").select((eb) => eb.fn.max("number").as("n")).where("figure_id", "=", figure.id).executeTakeFirst();
      if (Number(now?.n ?? 0) + 1 !== number) throw new VersionError(409, "conflict", `Another seal of this figure finished first (v${Number(now?.n ?? 0)}): nothing was sealed. Reload and look again.`);

      const version = await tx
        .insertInto("figure_version")
        .values({
          figure_id: figure.id, manuscript_id: figure.manuscript_id, number, draft_revision: figure.draft_revision,
          snapshot: JSON.stringify(snapshot), svg: rendered.svg, svg_sha256: svgSha256, fingerprint, sealed_by: args.userId, sealed_at: sealedAt,
        })
        .returning(["id", "number", "fingerprint", "sealed_at"])
        .executeTakeFirstOrThrow();
      if (snapshot.datasets.length > 0) {
        await tx.insertInto("figure_version_input")
          .values(snapshot.datasets.map((d) => ({ version_id: version.id, revision_id: d.revisionId, dataset_id: d.datasetId, revision_number: d.revisionNumber, content_hash: d.contentHash })))
          .execute();
      }
      await recordAudit(tx, {
        action: "version-sealed", actorId: args.userId, manuscriptId: figure.manuscript_id, ip: args.ip,
        detail: { figureId: figure.id, versionId: version.id, number, fingerprint, draftRevision: figure.draft_revision, svgSha256 },
      });
      mails = await supersedeWaiting(tx, { figureId: figure.id, manuscriptId: figure.manuscript_id, figureTitle: figure.title, newer: { id: version.id, number }, actorId: args.userId, ip: args.ip });
      return version;
    });
  } catch (e) {
    const conflict = conflictFromDatabase(e, "Another seal of this figure finished at the same moment: nothing was sealed by this one. Reload and look again.");
    if (conflict) throw conflict;
    throw e;
  }
  await deliver(mails, args.mail);
  return { ...result, figureId: figure.id, manuscriptId: figure.manuscript_id, svgSha256, snapshot };
}

/**
 * A newer version makes the older ones that still wait (sealed, or in review) superseded, and
 * tells their reviewers. Versions already signed off stay so until a newer one is signed off;
 * returned ones stay returned.
 */
async function supersedeWaiting(tx: Db, args: { figureId: string; manuscriptId: string; figureTitle: string; newer: { id: string; number: number }; actorId: string; ip: string | null }): Promise<PendingMail[]> {
  const older = await tx.selectFrom("figure_version").select(["id", "number", "fingerprint"]).where("figure_id", "=", args.figureId).where("number", "<", args.newer.number).orderBy("number", "desc").execute();
  const events = await listEvents(tx, older.map((o) => o.id));
  const mails: PendingMail[] = [];
  const actor = await tx.selectFrom("app_user").select(["id", "name"]).where("id", "=", args.actorId).executeTakeFirstOrThrow();
  const manuscript = await tx.selectFrom("manuscript").select(["id", "title"]).where("id", "=", args.manuscriptId).executeTakeFirstOrThrow();
  for (const v of older) {
    const derived = deriveVersionState(events.filter((e) => e.version_id === v.id).map(asStateInput));
    if (derived.state !== "sealed" && derived.state !== "in review") continue;
    await tx.insertInto("version_event").values({ version_id: v.id, kind: "superseded", actor_id: args.actorId, superseded_by: args.newer.id }).execute();
    await recordAudit(tx, {
      action: "version-superseded", actorId: args.actorId, manuscriptId: args.manuscriptId, ip: args.ip,
      detail: { figureId: args.figureId, versionId: v.id, number: v.number, supersededBy: args.newer.number, wasState: derived.state },
    });
    if (derived.state === "in review") {
      mails.push(...(await notify(tx, {
        kind: "superseded", recipientIds: derived.reviewers.map((r) => r.reviewerId), actor,
        manuscript, figure: { id: args.figureId, title: args.figureTitle }, version: { id: v.id, number: v.number, fingerprint: v.fingerprint }, newerNumber: args.newer.number,
      })));
    }
  }
  return mails;
}

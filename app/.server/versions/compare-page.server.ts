import { z } from "zod";
import { compareVersions } from "~/figures/version-diff";
import { deriveVersionState } from "~/figures/version-state";
import { diffRevisionsInDatabase } from "../datasets/revision-diff.server";
import { loadFigurePage } from "../figures/figure-access.server";
import { db } from "../platform/db.server";
import { notFound } from "../platform/http/guards.server";
import { parseVersionNumber } from "./version-access.server";
import { asStateInput, findVersion, listEvents, snapshotOf } from "./version-repository.server";

const Query = z.object({ from: z.string().default(""), to: z.string().default("") });

/**
 * Two versions of a figure compared: the model, the predictions' parameters and engine, the
 * dataset revisions (with the row-by-row summary of the datasets' own comparison) and the two
 * pictures. Without a choice, the newest version against the one before it.
 */
export async function loadComparePage(request: Request, params: { manuscriptId: string; figureId: string }) {
  const page = await loadFigurePage(request, params);
  const all = await db.selectFrom("figure_version").select(["id", "number"]).where("figure_id", "=", page.figure.id).orderBy("number", "desc").execute();
  if (all.length === 0) notFound("page", "A sealed version of this figure");
  const q = Query.parse(Object.fromEntries(new URL(request.url).searchParams));
  const toNumber = q.to === "" ? all[0].number : parseVersionNumber(q.to);
  const fromNumber = q.from === "" ? Math.max(1, toNumber - 1) : parseVersionNumber(q.from);
  const [a, b] = await Promise.all([findVersion(db, page.figure.id, fromNumber), findVersion(db, page.figure.id, toNumber)]);
  if (!a || !b) notFound("page", "One of the versions");
  const events = await listEvents(db, [a.id, b.id]);
  const stateOf = (id: string) => deriveVersionState(events.filter((e) => e.version_id === id).map(asStateInput)).state;
  const comparison = compareVersions({ snapshot: snapshotOf(a), svgSha256: a.svg_sha256 }, { snapshot: snapshotOf(b), svgSha256: b.svg_sha256 });
  const rowDiffs = await Promise.all(
    comparison.datasets.map(async (d) => {
      if (d.status !== "changed" || d.before.length !== 1 || d.after.length !== 1) return null;
      const diff = await diffRevisionsInDatabase(db, { id: d.before[0].revisionId, label: `r${d.before[0].revisionNumber}` }, { id: d.after[0].revisionId, label: `r${d.after[0].revisionNumber}` }, 0);
      return { datasetId: d.datasetId, summary: diff.summary, from: d.before[0].revisionNumber, to: d.after[0].revisionNumber };
    }),
  );
  const side = (v: NonNullable<typeof a>) => ({ number: v.number, fingerprint: v.fingerprint, svgSha256: v.svg_sha256, sealedAt: v.sealed_at, draftRevision: v.draft_revision, state: stateOf(v.id) });
  return {
    manuscript: page.manuscript, role: page.role, can: page.can,
    figure: { id: page.figure.id, title: page.figure.title },
    numbers: all.map((v) => v.number),
    from: side(a),
    to: side(b),
    comparison,
    rowDiffs: rowDiffs.filter((r) => r !== null),
  };
}

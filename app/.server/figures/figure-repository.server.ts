import { sql } from "kysely";
import type { FigureModel } from "~/figures/figure-model";
import { recordAudit } from "../platform/audit.server";
import type { Db } from "../platform/db.server";

export class FigureTitleTaken extends Error {
  constructor(title: string) {
    super(`This manuscript already has a figure called "${title}": choose another title.`);
  }
}

/** The figures of a manuscript, newest edit first, with who edited last. */
export async function listFigures(db: Db, manuscriptId: string) {
  return db
    .selectFrom("figure")
    .innerJoin("app_user", "app_user.id", "figure.updated_by")
    .select([
      "figure.id", "figure.title", "figure.draft_revision", "figure.updated_at", "figure.created_at", "figure.is_demo",
      "app_user.name as updatedByName",
      sql<number>`jsonb_array_length(figure.draft->'panels')`.as("panelCount"),
    ])
    .where("figure.manuscript_id", "=", manuscriptId)
    .orderBy("figure.updated_at", "desc")
    .orderBy("figure.id")
    .execute();
}

export async function findFigure(db: Db, figureId: string) {
  if (!/^[0-9a-f-]{36}$/i.test(figureId)) return undefined;
  return db.selectFrom("figure").selectAll().where("id", "=", figureId).executeTakeFirst();
}

export type FigureRow = NonNullable<Awaited<ReturnType<typeof findFigure>>>;

const isUniqueViolation = (e: unknown) => (e as { code?: string })?.code === "23505";

export async function createFigure(
  db: Db,
  args: { manuscriptId: string; userId: string; title: string; model: FigureModel; ip: string | null; isDemo?: boolean; startedFrom?: { datasetId: string; revisionNumber: number } },
) {
  try {
    return await db.transaction().execute(async (tx) => {
      const row = await tx
        .insertInto("figure")
        .values({ manuscript_id: args.manuscriptId, title: args.title, draft: JSON.stringify(args.model), is_demo: args.isDemo ?? false, created_by: args.userId, updated_by: args.userId })
        .returning(["id", "title", "draft_revision"])
        .executeTakeFirstOrThrow();
      await recordAudit(tx, {
        action: "figure-created", actorId: args.userId, manuscriptId: args.manuscriptId, ip: args.ip,
        detail: { figureId: row.id, title: row.title, ...(args.startedFrom ? { startedFrom: args.startedFrom } : {}) },
      });
      return row;
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw new FigureTitleTaken(args.title);
    throw e;
  }
}

export type SaveDraftResult =
  | { kind: "saved"; draftRevision: number; updatedAt: Date }
  | { kind: "conflict"; currentRevision: number; updatedByName: string; updatedAt: Date };

/**
 * Saves a draft if nobody saved since `baseRevision`: one UPDATE guarded by the revision, so
 * that of two tabs saving on the same revision exactly one wins and the other is told (409).
 * Each save is in the audit log with the revision it made.
 */
export async function saveDraft(
  db: Db,
  args: { figureId: string; manuscriptId: string; baseRevision: number; model: FigureModel; title?: string; userId: string; ip: string | null },
): Promise<SaveDraftResult> {
  try {
    return await db.transaction().execute(async (tx) => {
      const updated = await tx
        .updateTable("figure")
        .set({
          draft: JSON.stringify(args.model),
          draft_revision: sql`draft_revision + 1`,
          updated_by: args.userId,
          updated_at: sql`now()`,
          ...(args.title !== undefined ? { title: args.title } : {}),
        })
        .where("id", "=", args.figureId)
        .where("draft_revision", "=", args.baseRevision)
        .returning(["draft_revision", "updated_at"])
        .executeTakeFirst();
      if (updated) {
        await recordAudit(tx, {
          action: "figure-draft-saved", actorId: args.userId, manuscriptId: args.manuscriptId, ip: args.ip,
          detail: { figureId: args.figureId, draftRevision: updated.draft_revision, ...(args.title !== undefined ? { title: args.title } : {}) },
        });
        return { kind: "saved" as const, draftRevision: updated.draft_revision, updatedAt: updated.updated_at };
      }
      const current = await tx
        .selectFrom("figure")
        .innerJoin("app_user", "app_user.id", "figure.updated_by")
        .select(["figure.draft_revision", "figure.updated_at", "app_user.name"])
        .where("figure.id", "=", args.figureId)
        .executeTakeFirstOrThrow();
      return { kind: "conflict" as const, currentRevision: current.draft_revision, updatedByName: current.name, updatedAt: current.updated_at };
    });
  } catch (e) {
    if (isUniqueViolation(e) && args.title !== undefined) throw new FigureTitleTaken(args.title);
    throw e;
  }
}

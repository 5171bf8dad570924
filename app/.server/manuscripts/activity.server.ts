import { z } from "zod";
import { ACTIVITY_KINDS, ACTIVITY_PAGE_SIZE, actionsOfKind, namedIds, type ActivityKind, type ActivityNames } from "~/activity/activity-sentence";
import { isUuid } from "~/is-uuid";
import type { Db } from "../platform/db.server";

/** The log's search params: ?person=<user id>&kind=<kind>&page=<n>; anything else is ignored. */
export const activityFilterSchema = z.object({
  person: z.string().refine(isUuid).optional().catch(undefined),
  kind: z.enum(ACTIVITY_KINDS).optional().catch(undefined),
  page: z.coerce.number().int().min(1).max(1_000_000).catch(1).default(1),
});
export type ActivityFilter = z.infer<typeof activityFilterSchema>;

export function parseActivityFilter(url: URL): ActivityFilter {
  const get = (k: string) => url.searchParams.get(k) || undefined;
  return activityFilterSchema.parse({ person: get("person"), kind: get("kind") as ActivityKind | undefined, page: get("page") });
}

function filtered(db: Db, manuscriptId: string, f: ActivityFilter) {
  let q = db.selectFrom("audit_event").where("audit_event.manuscript_id", "=", manuscriptId);
  if (f.person) q = q.where("audit_event.actor_id", "=", f.person);
  if (f.kind) q = q.where("audit_event.action", "in", actionsOfKind(f.kind));
  return q;
}

/** One page of the manuscript's log, newest first, with the total that matches the filter. */
export async function listActivity(db: Db, manuscriptId: string, f: ActivityFilter, pageSize: number | null = ACTIVITY_PAGE_SIZE) {
  const { total } = await filtered(db, manuscriptId, f).select((eb) => eb.fn.countAll<string>().as("total")).executeTakeFirstOrThrow();
  let q = filtered(db, manuscriptId, f)
    .leftJoin("app_user", "app_user.id", "audit_event.actor_id")
    .select(["audit_event.id", "audit_event.at", "audit_event.action", "audit_event.detail", "audit_event.manuscript_id as manuscriptId", "audit_event.actor_id as actorId", "app_user.name as actorName"])
    .orderBy("audit_event.id", "desc");
  if (pageSize !== null) q = q.limit(pageSize).offset((f.page - 1) * pageSize);
  const rows = await q.execute();
  return { rows, total: Number(total), names: await lookUpNames(db, manuscriptId, rows) };
}

/** The names of the people, datasets and figures a set of rows mentions (only this manuscript's). */
async function lookUpNames(db: Db, manuscriptId: string, rows: { detail: unknown }[]): Promise<ActivityNames> {
  const ids = namedIds(rows);
  const exports = ids.exports.filter(isUuid);
  const ex = exports.length
    ? await db.selectFrom("figure_export").innerJoin("figure_version", "figure_version.id", "figure_export.version_id")
      .select(["figure_export.id", "figure_version.figure_id", "figure_version.number"])
      .where("figure_export.manuscript_id", "=", manuscriptId).where("figure_export.id", "in", exports).execute()
    : [];
  for (const e of ex) if (!ids.figures.includes(e.figure_id)) ids.figures.push(e.figure_id);
  const people = ids.people.filter(isUuid);
  const datasets = ids.datasets.filter(isUuid);
  const figures = ids.figures.filter(isUuid);
  const [p, d, fg] = await Promise.all([
    people.length ? db.selectFrom("app_user").select(["id", "name"]).where("id", "in", people).execute() : [],
    datasets.length ? db.selectFrom("dataset").select(["id", "name"]).where("manuscript_id", "=", manuscriptId).where("id", "in", datasets).execute() : [],
    figures.length ? db.selectFrom("figure").select(["id", "title"]).where("manuscript_id", "=", manuscriptId).where("id", "in", figures).execute() : [],
  ]);
  return {
    people: Object.fromEntries(p.map((r) => [r.id, r.name])),
    datasets: Object.fromEntries(d.map((r) => [r.id, r.name])),
    figures: Object.fromEntries(fg.map((r) => [r.id, r.title])),
    exports: Object.fromEntries(ex.map((e) => [e.id, { figureId: e.figure_id, version: e.number }])),
  };
}

/** Everyone who appears as the actor in this manuscript's log, for the person filter. */
export async function activityPeople(db: Db, manuscriptId: string) {
  return db
    .selectFrom("audit_event")
    .innerJoin("app_user", "app_user.id", "audit_event.actor_id")
    .select(["app_user.id", "app_user.name"])
    .distinct()
    .where("audit_event.manuscript_id", "=", manuscriptId)
    .orderBy("app_user.name")
    .execute();
}

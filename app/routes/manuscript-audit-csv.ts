import type { Route } from "./+types/manuscript-audit-csv";
import { db } from "~/.server/platform/db.server";
import { loadManuscriptPage } from "~/.server/manuscripts/manuscript-context.server";
import { listActivity, parseActivityFilter } from "~/.server/manuscripts/activity.server";
import { KIND_LABEL, KIND_OF, activitySentence, sentenceText, type AuditAction } from "~/activity/activity-sentence";
import { csvDocument, csvRow, spreadsheetSafeJson } from "~/exports/csv";

/** The filtered log as CSV, every matching entry (no paging); the same access as the page. */
export async function loader({ request, params }: Route.LoaderArgs) {
  await loadManuscriptPage(request, params.manuscriptId, "read:audit");
  const filter = parseActivityFilter(new URL(request.url));
  const { rows, names } = await listActivity(db, params.manuscriptId, filter, null);
  const lines = [csvRow(["when_utc", "person", "kind", "action", "sentence", "detail_json"])];
  for (const r of rows) {
    const kind = KIND_OF[r.action as AuditAction];
    lines.push(csvRow([new Date(r.at).toISOString(), r.actorName, kind ? KIND_LABEL[kind] : null, r.action, sentenceText(activitySentence(r, names)), spreadsheetSafeJson(r.detail)]));
  }
  return new Response(csvDocument(lines), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="activity-${params.manuscriptId.slice(0, 8)}.csv"`,
      "Cache-Control": "private, no-store",
    },
  });
}

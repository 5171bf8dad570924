import { Form, Link, useLoaderData } from "react-router";
import type { Route } from "./+types/manuscript-audit";
import { db } from "~/.server/platform/db.server";
import { loadManuscriptPage } from "~/.server/manuscripts/manuscript-context.server";
import { activityPeople, listActivity, parseActivityFilter } from "~/.server/manuscripts/activity.server";
import { ACTIVITY_KINDS, ACTIVITY_PAGE_SIZE, KIND_LABEL, activitySentence, formatUtc, type SentencePart } from "~/activity/activity-sentence";
import { Fingerprint } from "~/components/fingerprint";
import { ManuscriptNav } from "~/components/manuscript-nav";

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadManuscriptPage(request, params.manuscriptId, "read:audit");
  const filter = parseActivityFilter(new URL(request.url));
  const { rows, total, names } = await listActivity(db, params.manuscriptId, filter);
  const events = rows.map((r) => ({ id: r.id, at: formatUtc(r.at), sentence: activitySentence(r, names) }));
  return { ...page, filter, events, total, people: await activityPeople(db, params.manuscriptId) };
}

export default function Audit() {
  const { manuscript, role, can, events, total, filter, people } = useLoaderData<typeof loader>();
  const pages = Math.max(1, Math.ceil(total / ACTIVITY_PAGE_SIZE));
  const first = total === 0 ? 0 : (filter.page - 1) * ACTIVITY_PAGE_SIZE + 1;
  const last = Math.min(total, filter.page * ACTIVITY_PAGE_SIZE);
  const query = (page: number) => {
    const q = new URLSearchParams();
    if (filter.person) q.set("person", filter.person);
    if (filter.kind) q.set("kind", filter.kind);
    if (page > 1) q.set("page", String(page));
    return q.toString();
  };
  const csv = `/manuscripts/${manuscript.id}/audit.csv${query(1) ? `?${query(1)}` : ""}`;
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      <h2 className="text-xl">Activity log</h2>
      <p className="mt-1 text-sm text-ink-soft">Append-only: entries cannot be edited or deleted, by anyone. Times are in UTC.</p>
      <Form method="get" className="mt-4 flex flex-wrap items-end gap-4 text-sm">
        <label className="flex flex-col gap-1">
          <span>Person</span>
          <select name="person" defaultValue={filter.person ?? ""} className="rounded border border-rule bg-paper px-2 py-1">
            <option value="">Everyone</option>
            {people.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span>Kind</span>
          <select name="kind" defaultValue={filter.kind ?? ""} className="rounded border border-rule bg-paper px-2 py-1">
            <option value="">Every kind</option>
            {ACTIVITY_KINDS.map((k) => <option key={k} value={k}>{KIND_LABEL[k]}</option>)}
          </select>
        </label>
        <button type="submit" className="rounded border border-ink px-3 py-1 hover:bg-ink hover:text-paper">Show</button>
        {(filter.person || filter.kind) && <Link to="." className="py-1 underline">Clear the filter</Link>}
        <a href={csv} download className="ml-auto py-1 underline">Download these entries as CSV</a>
      </Form>
      <p className="mt-3 text-sm text-ink-soft" role="status">
        {total === 0 ? "No entries match." : `Entries ${first}–${last} of ${total}${pages > 1 ? `, page ${filter.page} of ${pages}` : ""}.`}
      </p>
      <table className="mt-2 w-full text-sm">
        <thead className="border-b border-rule text-left text-ink-soft">
          <tr><th className="w-px py-2 pr-4 font-medium whitespace-nowrap">When (UTC)</th><th className="font-medium">What happened</th></tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {events.map((e) => (
            <tr key={e.id} className="align-baseline">
              <td className="num py-1.5 pr-4 font-mono text-xs whitespace-nowrap">{e.at}</td>
              <td className="py-1.5"><Sentence parts={e.sentence} /></td>
            </tr>
          ))}
        </tbody>
      </table>
      {pages > 1 && (
        <nav aria-label="Pages of the activity log" className="mt-4 flex items-center gap-4 text-sm">
          {filter.page > 1 ? <Link to={`?${query(filter.page - 1)}`} className="underline">← Newer entries</Link> : <span className="text-ink-soft">← Newer entries</span>}
          <span>Page {filter.page} of {pages}</span>
          {filter.page < pages ? <Link to={`?${query(filter.page + 1)}`} className="underline">Older entries →</Link> : <span className="text-ink-soft">Older entries →</span>}
        </nav>
      )}
    </>
  );
}

function Sentence({ parts }: { parts: SentencePart[] }) {
  return (
    <span>
      {parts.map((p, i) =>
        typeof p === "string" ? <span key={i}>{p}</span>
        : "fingerprint" in p ? <Fingerprint key={i} value={p.fingerprint} />
        : <Link key={i} to={p.href} className="underline decoration-rule underline-offset-2 hover:text-madder">{p.text}</Link>,
      )}
    </span>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Activity log · Steradian" }];

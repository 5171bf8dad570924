import { Link, useLoaderData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/revision-compare";
import { loadDatasetPage, parseRevisionNumber } from "~/.server/datasets/dataset-access.server";
import { findRevision } from "~/.server/datasets/dataset-repository.server";
import { diffRevisionsInDatabase } from "~/.server/datasets/revision-diff.server";
import { db } from "~/.server/platform/db.server";
import { notFound } from "~/.server/platform/http/guards.server";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { displayScale, formatValue } from "~/components/quantity-labels";
import type { RevisionRow } from "~/datasets/diff-revisions";

const Query = z.object({ from: z.string().default(""), to: z.string().default("") });
const LISTED = 500;

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadDatasetPage(request, params);
  const { dataset } = page;
  const q = Query.parse(Object.fromEntries(new URL(request.url).searchParams));
  const [a, b] = await Promise.all([findRevision(db, dataset.id, parseRevisionNumber("page", q.from)), findRevision(db, dataset.id, parseRevisionNumber("page", q.to))]);
  if (!a || !b) notFound("page", "One of the revisions");
  const diff = await diffRevisionsInDatabase(db, { id: a.id, label: `r${a.number}` }, { id: b.id, label: `r${b.number}` }, LISTED);
  return { ...page, dataset: { id: dataset.id, name: dataset.name, quantity: dataset.quantity }, from: a.number, to: b.number, diff };
}

const FIELD_LABELS: Record<string, string> = { x: "x", xLow: "bin low", xHigh: "bin high", y: "y", statMinus: "stat −", statPlus: "stat +", systMinus: "syst −", systPlus: "syst +" };
const fmt = formatValue;
type Scale = ReturnType<typeof displayScale>;
const rowText = (r: RevisionRow, s: Scale) => `x = ${fmt(r.x)}${s.xUnit}${r.xLow != null ? ` [${fmt(r.xLow)}, ${fmt(r.xHigh)}]` : ""}, y = ${fmt(r.y * s.yFactor)} ${s.yUnit}`;
const fieldValue = (field: string, v: number | null, s: Scale) => fmt(v == null || ["x", "xLow", "xHigh"].includes(field) ? v : v * s.yFactor);

export default function Compare() {
  const { manuscript, role, can, dataset, from, to, diff } = useLoaderData<typeof loader>();
  const scale = displayScale(dataset.quantity);
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      <p className="text-sm"><Link className="text-ink-soft underline underline-offset-4" to={`/manuscripts/${manuscript.id}/datasets/${dataset.id}`}>{dataset.name}</Link> /</p>
      <h2 className="mt-1 text-2xl">Comparing <span className="font-mono">r{from}</span> with <span className="font-mono">r{to}</span></h2>
      <p className="mt-2 font-mono text-sm" data-testid="diff-summary">{diff.summary}</p>
      <p className="text-xs text-ink-faint">Rows matched by {diff.keyedBy === "bin" ? "their bin" : "x"}; values in the dataset's units.</p>
      <section className="mt-6 space-y-6 text-sm">
        {diff.changedCount > 0 ? (
          <div>
            <h3 className="text-lg">~ Changed ({diff.changedCount})</h3>
            <table className="mt-2 w-full"><thead className="border-b border-rule text-left text-ink-soft"><tr><th className="py-1 font-medium">row</th><th className="font-medium">field</th><th className="font-medium">r{from}</th><th className="font-medium">r{to}</th></tr></thead>
              <tbody className="num divide-y divide-rule font-mono text-xs">
                {diff.changed.flatMap((c, i) => c.changes.map((ch, j) => (
                  <tr key={`${i}-${j}`}><td className="py-1">{j === 0 ? rowText(c.old, scale) : ""}</td><td>{FIELD_LABELS[ch.field]}</td><td>{fieldValue(ch.field, ch.old, scale)}</td><td>{fieldValue(ch.field, ch.new, scale)}</td></tr>
                )))}
              </tbody></table>
          </div>
        ) : null}
        {diff.addedCount > 0 ? <RowList title={`+ Added in r${to} (${diff.addedCount})`} rows={diff.added} scale={scale} /> : null}
        {diff.removedCount > 0 ? <RowList title={`− Removed since r${from} (${diff.removedCount})`} rows={diff.removed} scale={scale} /> : null}
        {diff.addedCount + diff.removedCount + diff.changedCount === 0 ? <p>The two revisions have the same rows.</p> : null}
        {Math.max(diff.addedCount, diff.removedCount, diff.changedCount) > LISTED ? <p className="text-ink-soft">Only the first {LISTED} rows of each kind are listed; the counts are exact.</p> : null}
      </section>
    </>
  );
}

function RowList({ title, rows, scale }: { title: string; rows: RevisionRow[]; scale: Scale }) {
  return (
    <div>
      <h3 className="text-lg">{title}</h3>
      <ul className="num mt-2 divide-y divide-rule font-mono text-xs">{rows.map((r, i) => <li key={i} className="py-1">{rowText(r, scale)}</li>)}</ul>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Compare revisions · Steradian" }];

import { Link, useLoaderData } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/revision-compare";
import { loadDatasetPage, parseRevisionNumber } from "~/.server/datasets/dataset-access.server";
import { findRevision } from "~/.server/datasets/dataset-repository.server";
import { diffRevisionsInDatabase } from "~/.server/datasets/revision-diff.server";
import { db } from "~/.server/platform/db.server";
import { notFound } from "~/.server/platform/http/guards.server";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { QuickLook } from "~/components/figure-editor/quick-look";
import { loadDatasetInputs } from "~/.server/figures/figure-inputs.server";
import { compareRevisionsModel } from "~/figures/starter-model";
import type { QuantityDescription } from "~/datasets";
import { displayScale, formatValue } from "~/components/quantity-labels";
import { type RevisionRow, rowDelta } from "~/datasets/diff-revisions";

const Query = z.object({ from: z.string().default(""), to: z.string().default("") });
const LISTED = 500;
/** As on the revision page: the plot draws every point in the browser. */
const QUICK_LOOK_MAX_ROWS = 5000;

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadDatasetPage(request, params);
  const { dataset } = page;
  const q = Query.parse(Object.fromEntries(new URL(request.url).searchParams));
  const [a, b] = await Promise.all([findRevision(db, dataset.id, parseRevisionNumber("page", q.from)), findRevision(db, dataset.id, parseRevisionNumber("page", q.to))]);
  if (!a || !b) notFound("page", "One of the revisions");
  const diff = await diffRevisionsInDatabase(db, { id: a.id, label: `r${a.number}` }, { id: b.id, label: `r${b.number}` }, LISTED);
  // Both revisions drawn by the figure renderer, as the revision page's quick look draws one.
  const look = compareRevisionsModel({ id: dataset.id, name: dataset.name, quantity: b.quantity as unknown as QuantityDescription }, a.number, b.number);
  const lookInputs = a.row_count + b.row_count <= QUICK_LOOK_MAX_ROWS ? await loadDatasetInputs(db, dataset.manuscript_id, look) : null;
  return { ...page, dataset: { id: dataset.id, name: dataset.name, quantity: dataset.quantity }, from: a.number, to: b.number, diff, look, lookInputs };
}

const FIELD_LABELS: Record<string, string> = { x: "x", xLow: "bin low", xHigh: "bin high", y: "y", statMinus: "stat −", statPlus: "stat +", systMinus: "syst −", systPlus: "syst +" };
const fmt = formatValue;
type Scale = ReturnType<typeof displayScale>;
/** Three significant digits, for Δ, relative Δ and Δ/σ. */
const short = (v: number | null) => (v == null ? "—" : Number(v.toPrecision(3)).toString().replace("-", "−"));
const signed = (v: number | null) => (v == null ? "—" : `${v > 0 ? "+" : ""}${short(v)}`);
const xText = (r: RevisionRow, s: Scale) => (r.xLow != null ? `[${fmt(r.xLow)}, ${fmt(r.xHigh)}]` : fmt(r.x)) + (s.xUnit ? ` ${s.xUnit}` : "");

/** An error pair written once when symmetric (± a), as +a −b otherwise; nothing when absent. */
function errText(minus: number | null, plus: number | null, f: number): string {
  if (minus == null && plus == null) return "";
  if (minus === plus) return ` ± ${fmt((plus ?? 0) * f)}`;
  return ` +${fmt((plus ?? 0) * f)} −${fmt((minus ?? 0) * f)}`;
}
const yText = (r: RevisionRow, s: Scale) => `${fmt(r.y * s.yFactor)}${errText(r.statMinus, r.statPlus, s.yFactor)}${errText(r.systMinus, r.systPlus, s.yFactor)}`;

const TH = "py-2 pr-4 font-medium";
const THN = "py-2 pr-4 text-right font-medium";
const TDN = "py-1.5 pr-4 text-right whitespace-nowrap";

export default function Compare() {
  const { manuscript, role, can, dataset, from, to, diff, look, lookInputs } = useLoaderData<typeof loader>();
  const scale = displayScale(dataset.quantity);
  const hasSyst = (rows: RevisionRow[]) => rows.some((r) => r.systMinus != null || r.systPlus != null);
  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      <p className="text-sm"><Link className="text-ink-soft underline underline-offset-4" to={`/manuscripts/${manuscript.id}/datasets/${dataset.id}`}>{dataset.name}</Link> /</p>
      <h2 className="mt-1 text-2xl">Comparing <span className="font-mono">r{from}</span> with <span className="font-mono">r{to}</span></h2>
      <p className="mt-2 text-sm" data-testid="diff-summary">{diff.summary}</p>
      <p className="text-sm text-ink-soft">Rows matched by {diff.keyedBy === "bin" ? "their bin" : "x"}; values in the dataset's units ({scale.yUnit}), y written as value ± stat ± syst (an error given once is symmetric).</p>
      <div className="mt-4">
        {lookInputs ? <QuickLook model={look} inputs={lookInputs} title={`${dataset.name}: r${from} and r${to}`} />
          : <p className="text-sm text-ink-soft">No plot: the two revisions have more than {QUICK_LOOK_MAX_ROWS.toLocaleString("en")} rows together.</p>}
      </div>
      <section className="mt-6 space-y-8 text-sm">
        {diff.changedCount > 0 ? (
          <div>
            <h3 className="text-lg">Changed ({diff.changedCount})</h3>
            <p className="mt-1 max-w-4xl text-sm text-ink-soft" data-testid="sigma-note">
              Δ = y(r{to}) − y(r{from}); relative Δ = Δ / |y(r{from})|. σ is the combined uncertainty of the two revisions,
              σ = √(σ<sub>r{from}</sub>² + σ<sub>r{to}</sub>²), each σ its stat and syst errors added in quadrature (with asymmetric errors, the ones that face the other value).
              It treats the two revisions as independent: where they share errors it is too large, and Δ/σ understates the change.
            </p>
            <table className="mt-2 w-full" aria-label={`Rows changed from r${from} to r${to}`}>
              <thead className="border-b border-rule text-left text-ink-soft">
                <tr><th className={TH} scope="col">{diff.keyedBy === "bin" ? "bin" : "x"}</th><th className={THN} scope="col">y in r{from}</th><th className={THN} scope="col">y in r{to}</th><th className={THN} scope="col">Δ</th><th className={THN} scope="col">relative Δ</th><th className={THN} scope="col">Δ/σ</th><th className={TH} scope="col">also changed</th></tr>
              </thead>
              <tbody className="num divide-y divide-rule">
                {diff.changed.map((c, i) => {
                  const d = rowDelta(c.old, c.new);
                  const other = c.changes.filter((ch) => ch.field !== "y" && !(diff.keyedBy === "bin" ? ["xLow", "xHigh"] : ["x"]).includes(ch.field));
                  return (
                    <tr key={i}>
                      <td className="py-1.5 pr-4 whitespace-nowrap">{xText(c.old, scale)}</td>
                      <td className={TDN}>{yText(c.old, scale)}</td>
                      <td className={TDN}>{yText(c.new, scale)}</td>
                      <td className={TDN}>{signed(d.delta * scale.yFactor)}</td>
                      <td className={TDN}>{d.relative == null ? "—" : `${signed(d.relative * 100)} %`}</td>
                      <td className={TDN}>{signed(d.pull)}</td>
                      <td className="py-1.5 text-ink-soft">{other.map((ch) => `${FIELD_LABELS[ch.field]} ${fieldValue(ch.field, ch.old, scale)} → ${fieldValue(ch.field, ch.new, scale)}`).join("; ")}</td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        ) : null}
        {diff.addedCount > 0 ? <RowTable title={`Added in r${to} (${diff.addedCount})`} rows={diff.added} scale={scale} syst={hasSyst(diff.added)} keyedBy={diff.keyedBy} /> : null}
        {diff.removedCount > 0 ? <RowTable title={`Removed since r${from} (${diff.removedCount})`} rows={diff.removed} scale={scale} syst={hasSyst(diff.removed)} keyedBy={diff.keyedBy} /> : null}
        {diff.addedCount + diff.removedCount + diff.changedCount === 0 ? <p>The two revisions have the same rows.</p> : null}
        {Math.max(diff.addedCount, diff.removedCount, diff.changedCount) > LISTED ? <p className="text-ink-soft">Only the first {LISTED} rows of each kind are listed; the counts are exact.</p> : null}
      </section>
    </>
  );
}

const fieldValue = (field: string, v: number | null, s: Scale) => fmt(v == null || ["x", "xLow", "xHigh"].includes(field) ? v : v * s.yFactor);

function RowTable({ title, rows, scale, syst, keyedBy }: { title: string; rows: RevisionRow[]; scale: Scale; syst: boolean; keyedBy: "bin" | "x" }) {
  return (
    <div>
      <h3 className="text-lg">{title}</h3>
      <table className="mt-2" aria-label={title}>
        <thead className="border-b border-rule text-left text-ink-soft">
          <tr><th className={TH} scope="col">{keyedBy === "bin" ? "bin" : "x"}</th><th className={THN} scope="col">y</th><th className={THN} scope="col">stat</th>{syst ? <th className={THN} scope="col">syst</th> : null}</tr>
        </thead>
        <tbody className="num divide-y divide-rule">
          {rows.map((r, i) => (
            <tr key={i}>
              <td className="py-1.5 pr-4 whitespace-nowrap">{xText(r, scale)}</td>
              <td className={TDN}>{fmt(r.y * scale.yFactor)}</td>
              <td className={TDN}>{errText(r.statMinus, r.statPlus, scale.yFactor).trim() || "—"}</td>
              {syst ? <td className={TDN}>{errText(r.systMinus, r.systPlus, scale.yFactor).trim() || "—"}</td> : null}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Compare revisions · Steradian" }];

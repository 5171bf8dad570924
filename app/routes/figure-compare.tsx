import { useState } from "react";
import { Form, Link, useLoaderData } from "react-router";
import type { Route } from "./+types/figure-compare";
import { loadComparePage } from "~/.server/versions/compare-page.server";
import { Fingerprint } from "~/components/fingerprint";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { Button } from "~/components/ui/button";
import { VersionStateTag } from "~/components/versions/version-state-tag";

export async function loader({ request, params }: Route.LoaderArgs) {
  return loadComparePage(request, params);
}

const show = (v: unknown) => (v === undefined ? "—" : typeof v === "string" ? v : JSON.stringify(v));
const percent = (x: number) => (Number.isFinite(x) ? `${(100 * x).toPrecision(3)} %` : "a point became undefined");

export default function CompareVersions() {
  const d = useLoaderData<typeof loader>();
  const c = d.comparison;
  const base = `/manuscripts/${d.manuscript.id}/figures/${d.figure.id}`;
  const svg = (n: number) => `/api/v1/figures/${d.figure.id}/versions/${n}/figure.svg`;
  const changedPredictions = c.predictions.filter((p) => p.status !== "unchanged");
  return (
    <>
      <ManuscriptNav manuscript={d.manuscript} role={d.role} can={d.can} />
      <p className="text-sm"><Link className="text-ink-soft underline underline-offset-4" to={base}>{d.figure.title}</Link> / compare</p>
      <h2 className="mt-1 text-2xl">Comparing <Link className="font-mono underline underline-offset-4" to={`${base}/versions/${d.from.number}`}>v{d.from.number}</Link> with <Link className="font-mono underline underline-offset-4" to={`${base}/versions/${d.to.number}`}>v{d.to.number}</Link></h2>
      <Form method="get" className="mt-3 flex flex-wrap items-end gap-3 text-sm">
        <label className="flex flex-col gap-1">From<select name="from" defaultValue={d.from.number} className="border border-rule-strong bg-sheet px-2 py-1">{d.numbers.map((n) => <option key={n} value={n}>v{n}</option>)}</select></label>
        <label className="flex flex-col gap-1">To<select name="to" defaultValue={d.to.number} className="border border-rule-strong bg-sheet px-2 py-1">{d.numbers.map((n) => <option key={n} value={n}>v{n}</option>)}</select></label>
        <Button type="submit">Compare</Button>
      </Form>
      <table className="mt-4 text-sm">
        <tbody>
          {[d.from, d.to].map((v) => (
            <tr key={v.number}><td className="pr-4 font-mono">v{v.number}</td><td className="pr-4"><VersionStateTag state={v.state} /></td><td className="pr-4"><Fingerprint value={v.fingerprint} /></td><td className="text-ink-soft">draft revision {v.draftRevision}</td></tr>
          ))}
        </tbody>
      </table>

      <section aria-labelledby="params-h" className="mt-6">
        <h3 id="params-h" className="text-lg">Theory: parameters and engine</h3>
        <p className="mt-1 text-sm" data-testid="engine-change">Engine {c.engineVersion.before === c.engineVersion.after ? <>version <span className="font-mono">{c.engineVersion.after}</span> in both</> : <>version changed: <span className="font-mono">{c.engineVersion.before} → {c.engineVersion.after}</span></>}.</p>
        {changedPredictions.length === 0 ? <p className="mt-1 text-sm text-ink-soft">No prediction changed.</p> : (
          <table className="mt-2 w-full text-sm" data-testid="prediction-changes">
            <thead className="border-b border-rule text-left text-ink-soft"><tr><th className="py-1 font-medium">Layer</th><th className="font-medium">What changed</th><th className="font-medium">Parameter hash</th><th className="font-medium">Curve</th></tr></thead>
            <tbody className="divide-y divide-rule align-top">
              {changedPredictions.map((p) => (
                <tr key={p.key}>
                  <td className="py-1.5"><span className="font-mono">{p.layerId}</span> <span className="text-xs text-ink-faint">({p.panelId})</span></td>
                  <td>
                    {p.status === "added" ? `added in v${d.to.number}` : p.status === "removed" ? `removed since v${d.from.number}` : (
                      <ul className="font-mono text-xs">
                        {p.parameters.map((x) => <li key={x.path}>{x.path}: {show(x.before)} → {show(x.after)}</li>)}
                        {p.engineVersion ? <li>engine: {p.engineVersion.before} → {p.engineVersion.after}</li> : null}
                        {p.gridChanged ? <li>sampled points changed</li> : null}
                      </ul>
                    )}
                  </td>
                  <td className="font-mono text-xs">{p.parametersHash ? `${p.parametersHash.before?.slice(0, 8) ?? "—"} → ${p.parametersHash.after?.slice(0, 8) ?? "—"}` : "same"}</td>
                  <td className="text-xs">{p.largestRelativeChange === null ? "—" : p.largestRelativeChange === 0 ? "same numbers" : `up to ${percent(p.largestRelativeChange)}`}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section aria-labelledby="data-h" className="mt-6">
        <h3 id="data-h" className="text-lg">Data: dataset revisions</h3>
        <ul className="mt-1 text-sm" data-testid="dataset-changes">
          {c.datasets.length === 0 ? <li className="text-ink-soft">No datasets in either version.</li> : c.datasets.map((ds) => {
            const rows = d.rowDiffs.find((r) => r.datasetId === ds.datasetId);
            const revs = (list: typeof ds.before) => list.map((r) => `r${r.revisionNumber}`).join(", ") || "—";
            return (
              <li key={ds.datasetId}>
                {ds.datasetName}: {ds.status === "unchanged" ? <>the same revision ({revs(ds.after)})</> : <><span className="font-mono">{revs(ds.before)} → {revs(ds.after)}</span>{rows ? <span className="ml-2 font-mono text-xs">{rows.summary}</span> : null}
                  {rows ? <Link className="ml-2 text-xs underline underline-offset-4" to={`/manuscripts/${d.manuscript.id}/datasets/${ds.datasetId}/compare?from=${rows.from}&to=${rows.to}`}>rows</Link> : null}</>}
              </li>
            );
          })}
        </ul>
      </section>

      <section aria-labelledby="model-h" className="mt-6">
        <h3 id="model-h" className="text-lg">Composition: the figure model</h3>
        {c.model.length === 0 ? <p className="mt-1 text-sm text-ink-soft">The models are the same.</p> : (
          <table className="mt-2 w-full text-sm" data-testid="model-changes">
            <thead className="border-b border-rule text-left text-ink-soft"><tr><th className="py-1 font-medium">Field</th><th className="font-medium">v{d.from.number}</th><th className="font-medium">v{d.to.number}</th></tr></thead>
            <tbody className="divide-y divide-rule font-mono text-xs">
              {c.model.map((x) => <tr key={x.path}><td className="py-1">{x.path}</td><td className="max-w-xs break-all">{show(x.before)}</td><td className="max-w-xs break-all">{show(x.after)}</td></tr>)}
            </tbody>
          </table>
        )}
      </section>

      <section aria-labelledby="pictures-h" className="mt-8">
        <h3 id="pictures-h" className="text-lg">The pictures</h3>
        <p className="mt-1 text-sm text-ink-soft">{c.svgChanged ? "The two SVGs differ." : "The two SVGs are the same bytes."}</p>
        <div className="mt-3 grid grid-cols-2 gap-4 max-md:grid-cols-1" data-testid="side-by-side">
          {[d.from, d.to].map((v) => (
            <figure key={v.number} className="border border-rule bg-white p-2">
              <img src={svg(v.number)} alt={`v${v.number}`} className="h-auto w-full" />
              <figcaption className="mt-1 text-center font-mono text-xs text-ink-soft">v{v.number}</figcaption>
            </figure>
          ))}
        </div>
        <Overlay from={{ number: d.from.number, src: svg(d.from.number) }} to={{ number: d.to.number, src: svg(d.to.number) }} />
      </section>
    </>
  );
}

/** The newer picture laid over the older one: a slider fades between them; "difference" shows only what moved. */
function Overlay({ from, to }: { from: { number: number; src: string }; to: { number: number; src: string } }) {
  const [mix, setMix] = useState(50);
  const [difference, setDifference] = useState(false);
  return (
    <div className="mt-6" data-testid="overlay">
      <div className="flex flex-wrap items-center gap-4 text-sm">
        <span className="font-medium">Overlaid</span>
        <label className="flex items-center gap-2">v{from.number}<input type="range" min={0} max={100} value={mix} onChange={(e) => setMix(Number(e.target.value))} aria-label={`How much of v${to.number} is shown over v${from.number}`} />v{to.number}</label>
        <label className="flex items-center gap-2"><input type="checkbox" checked={difference} onChange={(e) => setDifference(e.target.checked)} /> show only the differences</label>
      </div>
      <div className="relative mt-2 max-w-3xl border border-rule bg-white p-2">
        <img src={from.src} alt={`v${from.number}, underneath`} className="h-auto w-full" />
        <img src={to.src} alt={`v${to.number}, on top`} className="absolute inset-2 h-auto w-[calc(100%-1rem)]" style={{ opacity: difference ? 1 : mix / 100, mixBlendMode: difference ? "difference" : "normal" }} />
      </div>
    </div>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Compare v${data?.from.number ?? ""} and v${data?.to.number ?? ""} · ${data?.figure.title ?? "Figure"} · Steradian` }];

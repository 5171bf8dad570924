import { Suspense, useEffect, useState } from "react";
import { Await, Form, useFetcher } from "react-router";
import { EXPORT_STATE_WORDS, type ExportState } from "~/exports/export-state";
import type { PreflightCheck } from "~/exports/preflight";
import { Button } from "../ui/button";
import { Notice } from "../ui/notice";
import { Shape, type ShapeName } from "../ui/shape";

type VersionPreflight = { ok: true; checks: PreflightCheck[] } | { ok: false; message: string };

interface ExportView {
  id: string;
  state: ExportState;
  reason: string | null;
  overrideReason: string | null;
  requestedBy: string;
  requestedAt: string;
  finishedAt: string | null;
  attempts: number;
  files: { name: string; bytes: number; sha256: string; url: string }[] | null;
}

type Panel = { allowed: false; why: string } | { allowed: true; preflight: Promise<VersionPreflight>; exports: ExportView[] };

const STATE_SHAPES: Record<ExportState, ShapeName> = { queued: "dotted-ring", rendering: "ring", done: "check", failed: "cross" };
const when = (iso: string) => `${iso.slice(0, 16).replace("T", " ")} UTC`;
const size = (bytes: number) => (bytes >= 1e6 ? `${(bytes / 1e6).toFixed(2)} MB` : `${Math.max(1, Math.round(bytes / 1e3))} kB`);

/** Export for the journal: the preflight report, the request form and the newest exports, polled while they run. */
export function ExportPanelView({ panel, versionNumber, busy }: { panel: Panel; versionNumber: number; busy: boolean }) {
  return (
    <section aria-labelledby="export-h" className="mt-6 border-t border-rule pt-4 text-sm" data-testid="export-panel">
      <h3 id="export-h" className="font-serif text-lg">Export for the journal</h3>
      {!panel.allowed ? (
        <p className="mt-1 text-ink-soft" data-testid="export-why-not">{panel.why}</p>
      ) : (
        <>
          <Suspense fallback={<p className="mt-2 text-ink-soft" data-testid="preflight-pending">Measuring the files for the preflight…</p>}>
            <Await resolve={panel.preflight} errorElement={<Notice tone="caution">The preflight could not be run; the error has been logged.</Notice>}>
              {(report) => <PreflightAndForm report={report} versionNumber={versionNumber} busy={busy} />}
            </Await>
          </Suspense>
          {panel.exports.length > 0 ? (
            <ol className="mt-4 space-y-3" data-testid="exports">
              {panel.exports.map((e, i) => <ExportRow key={e.id} initial={e} newest={i === 0} />)}
            </ol>
          ) : null}
        </>
      )}
    </section>
  );
}

function PreflightAndForm({ report, versionNumber, busy }: { report: VersionPreflight; versionNumber: number; busy: boolean }) {
  if (!report.ok) return <div className="mt-2" data-testid="export-refused"><Notice tone="caution">{report.message}</Notice></div>;
  const failing = report.checks.filter((c) => !c.pass);
  return (
    <>
      <table className="mt-2 w-full" data-testid="preflight">
        <caption className="text-left text-ink-soft">Preflight against the size preset: {failing.length === 0 ? "every check passes." : `${failing.length} check(s) fail.`}</caption>
        <thead className="border-b border-rule text-left text-ink-soft"><tr><th className="py-1 font-medium">Check</th><th className="font-medium">Result</th><th className="font-medium">Measured</th><th className="font-medium">Needs</th></tr></thead>
        <tbody className="divide-y divide-rule">
          {report.checks.map((c) => (
            <tr key={c.id} data-testid={`preflight-${c.id}`} className="align-top">
              <td className="py-1">{c.label}</td>
              <td className={`whitespace-nowrap pr-2 ${c.pass ? "" : "font-semibold text-madder"}`}><Shape name={c.pass ? "check" : "cross"} /> {c.pass ? "passes" : "fails"}</td>
              <td className="num font-mono text-xs">{c.measured}</td>
              <td className="text-xs text-ink-soft">{c.limit}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <Form method="post" className="mt-3 flex flex-col gap-2" data-testid="export-form">
        {failing.length > 0 ? (
          <>
            <label htmlFor="override-reason" className="font-medium">Why export despite the failing check(s)? (recorded in the audit log)</label>
            <textarea id="override-reason" name="overrideReason" rows={2} maxLength={2000} required className="border border-rule-strong bg-sheet px-2 py-1.5" />
          </>
        ) : null}
        <div>
          <Button kind="primary" type="submit" name="intent" value="export" disabled={busy}>
            {failing.length > 0 ? `Export v${versionNumber} despite the preflight` : `Export v${versionNumber}`}
          </Button>
        </div>
        <p className="text-xs text-ink-faint">Drawn again from the sealed snapshot; refused if the picture is not byte for byte the signed-off one. PDF, SVG, PNG and the submission bundle, which anyone can check at <a className="underline underline-offset-4" href="/verify">/verify</a>.</p>
      </Form>
    </>
  );
}

/** One export; while it waits or runs, its state is fetched again every second. */
function ExportRow({ initial, newest }: { initial: ExportView; newest: boolean }) {
  const fetcher = useFetcher<{ export: ExportView }>();
  const [tick, setTick] = useState(0);
  const e = fetcher.data?.export ?? initial;
  const running = e.state === "queued" || e.state === "rendering";
  useEffect(() => {
    if (!running) return;
    const t = setTimeout(() => {
      if (fetcher.state === "idle") fetcher.load(`/api/v1/exports/${e.id}`);
      setTick((n) => n + 1);
    }, 1000);
    return () => clearTimeout(t);
  }, [running, tick, e.id, fetcher]);
  return (
    <li className={`border-l pl-3 ${newest ? "border-ink" : "border-rule"}`} data-testid="export" data-state={e.state}>
      <p className="flex flex-wrap items-baseline gap-x-3">
        <span className="font-medium" data-testid="export-state"><Shape name={STATE_SHAPES[e.state]} /> {EXPORT_STATE_WORDS[e.state]}</span>
        <span className="text-xs text-ink-faint">asked by {e.requestedBy} at {when(e.requestedAt)}{e.attempts > 1 ? ` · attempt ${e.attempts}` : ""}</span>
      </p>
      {e.overrideReason ? <p className="mt-1 text-xs">Preflight overridden: <span className="font-serif">{e.overrideReason}</span></p> : null}
      {e.state === "failed" && e.reason ? <p className="mt-1 text-madder" data-testid="export-reason">{e.reason}</p> : null}
      {e.state === "done" && e.files ? (
        <ul className="mt-1 flex flex-wrap gap-x-4 gap-y-1" data-testid="export-files">
          {e.files.map((f) => (
            <li key={f.name}><a className="underline underline-offset-4" href={f.url} download>{f.name === "bundle.zip" ? "submission bundle (zip)" : f.name}</a> <span className="text-xs text-ink-faint">{size(f.bytes)}</span></li>
          ))}
        </ul>
      ) : null}
    </li>
  );
}

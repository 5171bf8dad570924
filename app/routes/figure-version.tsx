import { Form, Link, useActionData, useLoaderData, useNavigation } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/figure-version";
import { loadFigurePage } from "~/.server/figures/figure-access.server";
import { db } from "~/.server/platform/db.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { parseForm } from "~/.server/platform/http/forms.server";
import { requirePermission } from "~/.server/platform/http/guards.server";
import { commentOnVersion, decideVersion, requestSignoff } from "~/.server/versions/review.server";
import { parseVersionNumber, versionPageError } from "~/.server/versions/version-access.server";
import { VersionError } from "~/.server/versions/version-error.server";
import { loadVersionPage } from "~/.server/versions/version-page.server";
import { findVersion } from "~/.server/versions/version-repository.server";
import { loadExportPanel } from "~/.server/exports/export-panel.server";
import { requestExport } from "~/.server/exports/export-jobs.server";
import { exportQueue } from "~/.server/exports/export-queue.server";
import { ExportPanelView } from "~/components/versions/export-panel";
import { Fingerprint } from "~/components/fingerprint";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { RoleTag } from "~/components/role-tag";
import { Button } from "~/components/ui/button";
import { Notice } from "~/components/ui/notice";
import { DecisionTag, VersionStateTag } from "~/components/versions/version-state-tag";
import { notFound } from "~/.server/platform/http/guards.server";
import type { ManuscriptAction } from "~/permissions";

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadVersionPage(request, params);
  return { ...page, exporting: await loadExportPanel(page) };
}

const VersionForm = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("request") }),
  z.object({ intent: z.literal("sign-off"), comment: z.string().max(5000, "A comment is at most 5000 characters.").default("") }),
  z.object({ intent: z.literal("return"), comment: z.string().max(5000, "A comment is at most 5000 characters.").default("") }),
  z.object({ intent: z.literal("comment"), comment: z.string().max(5000, "A comment is at most 5000 characters.") }),
  z.object({ intent: z.literal("export"), overrideReason: z.string().trim().max(2000, "A reason is at most 2000 characters.").default("") }),
]);
const NEEDS: Record<z.infer<typeof VersionForm>["intent"], ManuscriptAction> = { request: "request:signoff", "sign-off": "signoff:version", return: "signoff:version", comment: "comment:version", export: "export:version" };

/** Request sign-off, sign off, return, comment: the same services as the API's. */
export async function action({ request, params, context }: Route.ActionArgs) {
  const { user, figure } = await loadFigurePage(request, params);
  const parsed = await parseForm(request, VersionForm);
  if (!parsed.ok) return parsed.response;
  const form = parsed.value;
  await requirePermission("page", user, figure.manuscript_id, NEEDS[form.intent]);
  const version = await findVersion(db, figure.id, parseVersionNumber(params.number));
  if (!version) notFound("page", "The version");
  const ip = clientIp(context);
  try {
    if (form.intent === "request") {
      const reviewerIds = parsed.form.getAll("reviewer").map(String);
      await requestSignoff(db, { version, requesterId: user.id, reviewerIds, ip });
      return { ok: true as const, message: `Sign-off of v${version.number} requested; the reviewers have been told by e-mail and in their inbox.` };
    }
    if (form.intent === "export") {
      await requestExport(db, await exportQueue(), { version, userId: user.id, overrideReason: form.overrideReason || null, ip });
      return { ok: true as const, message: `Export of v${version.number} requested${form.overrideReason ? ", overriding the preflight with your reason" : ""}; its files appear below when they are ready.` };
    }
    if (form.intent === "comment") {
      await commentOnVersion(db, { version, userId: user.id, text: form.comment, ip });
      return { ok: true as const, message: "Comment added." };
    }
    const { state } = await decideVersion(db, { version, reviewerId: user.id, decision: form.intent === "sign-off" ? "signed-off" : "returned", comment: form.comment, ip });
    return { ok: true as const, message: form.intent === "sign-off" ? `You signed off v${version.number}; it is now ${state}.` : `You returned v${version.number} with your comment.` };
  } catch (e) {
    if (e instanceof VersionError) return versionPageError(e);
    throw e;
  }
}

const when = (d: Date | string) => new Date(d).toISOString().slice(0, 16).replace("T", " ") + " UTC";

export default function VersionPage() {
  const d = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  const navigation = useNavigation();
  const busy = navigation.state !== "idle";
  const base = `/manuscripts/${d.manuscript.id}/figures/${d.figure.id}`;
  const v = d.version;
  const errors: Record<string, string> = result && !result.ok && "fieldErrors" in result ? result.fieldErrors : {};
  const canDecide = d.can["signoff:version"] && d.state === "in review" && d.myDecision === "pending";
  const canRequest = d.can["request:signoff"] && (d.state === "sealed" || d.state === "in review");
  return (
    <>
      <ManuscriptNav manuscript={d.manuscript} role={d.role} can={d.can} />
      <p className="text-sm"><Link className="text-ink-soft underline underline-offset-4" to={base}>{d.figure.title}</Link> / versions</p>
      <div className="mt-1 flex flex-wrap items-baseline gap-x-5 gap-y-2">
        <h2 className="font-serif text-2xl">{v.title} <span className="font-mono">v{v.number}</span></h2>
        <VersionStateTag state={d.state} className="text-lg" />
        <span className="text-sm text-ink-soft">fingerprint <Fingerprint value={v.fingerprint} /></span>
      </div>
      <p className="mt-1 text-sm text-ink-soft">
        Sealed {when(v.sealedAt)} by {v.sealedByName} from draft revision {v.draftRevision}.
        {" "}<span data-testid="next-actor">Next: {d.next.names.length > 0 ? `${d.next.names.join(", ")} — sign off or return` : d.next.text}.</span>
      </p>
      {d.state === "superseded" && d.supersededByNumber ? (
        <div className="mt-3"><Notice>This version is superseded by <Link className="underline underline-offset-4" to={`${base}/versions/${d.supersededByNumber}`}>v{d.supersededByNumber}</Link>; its review is closed.</Notice></div>
      ) : d.latestNumber > v.number ? (
        <div className="mt-3"><Notice>A newer version exists: <Link className="underline underline-offset-4" to={`${base}/versions/${d.latestNumber}`}>v{d.latestNumber}</Link>.</Notice></div>
      ) : null}
      {/* The action's answer arrives before the page's data are reloaded: shown once both agree. */}
      {result && !busy ? <div className="mt-3" data-testid="action-result"><Notice tone={result.ok ? "ok" : "caution"}>{result.message}</Notice></div> : null}

      <div className="mt-6 grid grid-cols-[1fr_22rem] gap-8 max-lg:grid-cols-1">
        <section aria-labelledby="picture-h" className="min-w-0">
          <h3 id="picture-h" className="sr-only">The sealed figure</h3>
          <div className="border border-rule bg-white p-2">
            <img src={`/api/v1/figures/${d.figure.id}/versions/${v.number}/figure.svg`} alt={d.snapshot.altText || `Sealed version v${v.number} of ${v.title}`} className="h-auto w-full" data-testid="sealed-figure" />
          </div>
          <p className="mt-2 flex flex-wrap gap-4 text-xs">
            <a className="underline underline-offset-4" href={`/api/v1/figures/${d.figure.id}/versions/${v.number}/figure.svg?download`}>Download the sealed SVG</a>
            <a className="underline underline-offset-4" href={`/api/v1/figures/${d.figure.id}/versions/${v.number}`}>The snapshot as JSON</a>
            {v.number > 1 ? <Link className="underline underline-offset-4" to={`${base}/compare?from=${v.number - 1}&to=${v.number}`} data-testid="compare-previous">Compare with v{v.number - 1}</Link> : null}
            <span className="font-mono text-ink-faint">SVG SHA-256 {v.svgSha256.slice(0, 12)}…</span>
          </p>
          <ExportPanelView panel={d.exporting} versionNumber={v.number} busy={busy} />
          <SnapshotSummary snapshot={d.snapshot} />
        </section>

        <aside className="flex flex-col gap-6" aria-label="Review">
          <section aria-labelledby="reviewers-h">
            <h3 id="reviewers-h" className="font-serif text-lg">Sign-off</h3>
            {d.reviewers.length === 0 ? <p className="mt-1 text-sm text-ink-soft">Nobody has been asked yet.</p> : (
              <ul className="mt-2 space-y-1.5" data-testid="reviewers">
                {d.reviewers.map((r) => <li key={r.reviewerId} className="flex items-baseline justify-between gap-3 text-sm"><span>{r.name}</span><DecisionTag decision={r.decision} /></li>)}
              </ul>
            )}
            {canDecide ? (
              <Form method="post" className="mt-4 flex flex-col gap-2" data-testid="decision-form">
                <label htmlFor="decision-comment" className="text-sm font-medium">Your comment (needed to return it)</label>
                <textarea id="decision-comment" name="comment" rows={4} maxLength={5000} className={`border bg-sheet px-2 py-1.5 text-sm ${errors.comment ? "border-madder" : "border-rule-strong"}`} aria-invalid={errors.comment ? true : undefined} />
                {errors.comment ? <p className="text-sm text-madder" role="alert">{errors.comment}</p> : null}
                <div className="flex flex-wrap gap-2">
                  <Button kind="primary" type="submit" name="intent" value="sign-off" disabled={busy}>Sign off v{v.number}</Button>
                  <Button type="submit" name="intent" value="return" disabled={busy}>Return with comments</Button>
                </div>
                <p className="text-xs text-ink-faint">You sign off the picture and the numbers above as sealed, fingerprint {v.fingerprint.slice(0, 12)}…</p>
              </Form>
            ) : null}
            {canRequest ? (
              <Form method="post" className="mt-4 flex flex-col gap-2 border-t border-rule pt-3" data-testid="request-form">
                <p className="text-sm font-medium">{d.reviewers.length === 0 ? "Ask for sign-off" : "Ask someone else as well"}</p>
                {d.candidates.length === 0 ? <p className="text-sm text-ink-soft">No co-author or corresponding author is left to ask (the sealer does not review their own version).</p> : (
                  <fieldset className="flex flex-col gap-1">
                    <legend className="sr-only">Reviewers</legend>
                    {d.candidates.map((c) => (
                      <label key={c.userId} className="flex items-center gap-2 text-sm">
                        <input type="checkbox" name="reviewer" value={c.userId} /> {c.name} <RoleTag role={c.role} />
                      </label>
                    ))}
                  </fieldset>
                )}
                {errors.reviewerIds ? <p className="text-sm text-madder" role="alert">{errors.reviewerIds}</p> : null}
                <div><Button kind={canDecide ? "plain" : "primary"} type="submit" name="intent" value="request" disabled={busy || d.candidates.length === 0}>Request sign-off</Button></div>
                <p className="text-xs text-ink-faint">Only co-authors and corresponding authors sign off; observers read, contributors compose.</p>
              </Form>
            ) : null}
          </section>

          <section aria-labelledby="thread-h">
            <h3 id="thread-h" className="font-serif text-lg">Thread</h3>
            {d.events.length === 0 ? <p className="mt-1 text-sm text-ink-soft">Nothing yet.</p> : (
              <ol className="mt-2 space-y-3 text-sm" data-testid="thread">
                {d.events.map((e) => (
                  <li key={e.id} className="border-l border-rule pl-3">
                    <p className="text-xs text-ink-faint">{when(e.at)}</p>
                    <p>{describeEvent(e)}</p>
                    {e.comment ? <p className="mt-1 whitespace-pre-wrap font-serif">{e.comment}</p> : null}
                  </li>
                ))}
              </ol>
            )}
            {d.can["comment:version"] ? (
              <Form method="post" className="mt-3 flex flex-col gap-2" key={d.events.length}>
                <label htmlFor="thread-comment" className="text-sm font-medium">Add a comment</label>
                <textarea id="thread-comment" name="comment" rows={3} maxLength={5000} className="border border-rule-strong bg-sheet px-2 py-1.5 text-sm" />
                <div><Button type="submit" name="intent" value="comment" disabled={busy}>Comment</Button></div>
              </Form>
            ) : null}
          </section>
        </aside>
      </div>
    </>
  );
}

function describeEvent(e: { kind: string; actorName: string; reviewerName: string | null; supersededByNumber: number | null }): string {
  switch (e.kind) {
    case "requested": return `${e.actorName} asked ${e.reviewerName} to sign off.`;
    case "signed-off": return `${e.actorName} signed off.`;
    case "returned": return `${e.actorName} returned it:`;
    case "superseded": return `Superseded by v${e.supersededByNumber} (sealed by ${e.actorName}).`;
    default: return `${e.actorName}:`;
  }
}

/** A request's parameters as dotted keys and values, e.g. "energy.beam = 0.5". */
function flatten(value: unknown, prefix = ""): [string, string][] {
  if (typeof value === "object" && value !== null && !Array.isArray(value)) {
    return Object.entries(value).sort(([a], [b]) => (a < b ? -1 : 1)).flatMap(([k, v]) => flatten(v, prefix === "" ? k : `${prefix}.${k}`));
  }
  return [[prefix, typeof value === "string" ? value : JSON.stringify(value)]];
}

function SnapshotSummary({ snapshot }: { snapshot: Awaited<ReturnType<typeof loader>>["snapshot"] }) {
  return (
    <section aria-labelledby="sealed-h" className="mt-6 text-sm">
      <h3 id="sealed-h" className="font-serif text-lg">What was sealed</h3>
      <p className="mt-1 text-ink-soft">Engine <span className="font-mono">{snapshot.engineVersion}</span> · size preset <span className="font-mono">{snapshot.preset}</span></p>
      <table className="mt-2 w-full">
        <caption className="text-left text-ink-soft">Dataset revisions</caption>
        <thead className="border-b border-rule text-left text-ink-soft"><tr><th className="py-1 font-medium">Dataset</th><th className="font-medium">Revision</th><th className="font-medium">Rows</th><th className="font-medium">Content hash</th></tr></thead>
        <tbody className="divide-y divide-rule">
          {snapshot.datasets.length === 0 ? <tr><td colSpan={4} className="py-1 text-ink-soft">none</td></tr> : snapshot.datasets.map((ds) => (
            <tr key={ds.revisionId}><td className="py-1">{ds.datasetName}</td><td className="font-mono">r{ds.revisionNumber}</td><td className="num font-mono">{ds.rowCount}</td><td><Fingerprint value={ds.contentHash} /></td></tr>
          ))}
        </tbody>
      </table>
      <table className="mt-4 w-full">
        <caption className="text-left text-ink-soft">Predictions (each with its computed table of the drawn curve)</caption>
        <thead className="border-b border-rule text-left text-ink-soft"><tr><th className="py-1 font-medium">Layer</th><th className="font-medium">Parameters</th><th className="font-medium">Parameter hash</th></tr></thead>
        <tbody className="divide-y divide-rule">
          {snapshot.predictions.map((p) => (
            <tr key={`${p.panelId}/${p.layerId}`} className="align-top">
              <td className="py-1"><span className="font-mono">{p.layerId}</span><br /><span className="text-xs text-ink-faint">{p.process} · {p.points} points · engine {p.engineVersion ?? "—"}</span></td>
              <td className="font-mono text-xs" data-testid={`parameters-${p.layerId}`}>{p.parameters ? <ul>{flatten(p.parameters).map(([k, val]) => <li key={k}>{k} = {val}</li>)}</ul> : "not computed"}</td>
              <td>{p.parametersHash ? <Fingerprint value={p.parametersHash} /> : "—"}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {snapshot.problems.length > 0 ? (
        <div className="mt-3"><Notice tone="caution">The renderer reported, when this was sealed: {snapshot.problems.map((p) => `${p.layerId ? `${p.layerId}: ` : ""}${p.message}`).join("; ")}</Notice></div>
      ) : null}
    </section>
  );
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.version.title ?? "Figure"} v${data?.version.number ?? ""} · Steradian` }];

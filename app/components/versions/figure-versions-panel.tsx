import { Link, useFetcher } from "react-router";
import type { VersionState } from "~/figures/version-state";
import { Fingerprint } from "../fingerprint";
import { Button } from "../ui/button";
import { Notice } from "../ui/notice";
import { VersionStateTag } from "./version-state-tag";

export interface VersionListItem {
  number: number;
  state: VersionState;
  fingerprint: string;
  draftRevision: number;
  sealedAt: string | Date;
  sealedByName: string;
  next: { text: string; names: string[] };
  supersededByNumber: number | null;
}

const when = (d: Date | string) => new Date(d).toISOString().slice(0, 16).replace("T", " ") + " UTC";

/**
 * The figure page's step "seal → sign-off": the versions with their states, who acts next and
 * their fingerprints, and the seal button for the draft revision on screen.
 */
export function FigureVersionsPanel({ base, versions, draftRevision, canSeal, busy }: {
  base: string;
  versions: VersionListItem[];
  /** The draft revision on screen, saved. */
  draftRevision: number;
  canSeal: boolean;
  /** An edit is not saved yet: the seal waits for it. */
  busy: boolean;
}) {
  const fetcher = useFetcher<{ ok: false; message: string }>();
  const sealedAlready = versions.find((v) => v.draftRevision === draftRevision);
  const sealing = fetcher.state !== "idle";
  return (
    <section aria-labelledby="versions-h" className="mb-6 border-y border-rule py-4" data-testid="versions-panel">
      <div className="flex flex-wrap items-baseline gap-4">
        <h3 id="versions-h" className="flex-1 font-serif text-lg">Sealed versions</h3>
        {versions.length >= 2 ? <Link className="text-sm underline underline-offset-4" to={`${base}/compare?from=${versions[1].number}&to=${versions[0].number}`}>Compare v{versions[1].number} with v{versions[0].number}</Link> : null}
        {canSeal ? (
          <fetcher.Form method="post" action={`${base}/versions`} className="flex items-baseline gap-3">
            <input type="hidden" name="draftRevision" value={draftRevision} />
            {sealedAlready ? <span className="text-xs text-ink-soft" data-testid="sealed-already">Draft revision {draftRevision} is sealed as v{sealedAlready.number}; edit the draft to seal a new version.</span> : (
              <Button kind="primary" type="submit" disabled={busy || sealing} data-testid="seal-button">
                {sealing ? "Sealing…" : `Seal draft revision ${draftRevision} as v${(versions[0]?.number ?? 0) + 1}`}
              </Button>
            )}
          </fetcher.Form>
        ) : null}
      </div>
      {fetcher.data && !fetcher.data.ok ? <div className="mt-3" data-testid="seal-error"><Notice tone="caution">{fetcher.data.message}</Notice></div> : null}
      {versions.length === 0 ? (
        <p className="mt-2 text-sm text-ink-soft">No sealed version yet. Sealing freezes the draft as it is saved — the model, the dataset revisions, the engine's numbers and the picture — into v1, for co-authors to sign off.</p>
      ) : (
        <table className="mt-3 w-full text-sm" data-testid="versions-table">
          <thead className="border-b border-rule text-left text-ink-soft">
            <tr><th className="py-1.5 font-medium">Version</th><th className="font-medium">State</th><th className="font-medium">Who acts next</th><th className="font-medium">Fingerprint</th><th className="font-medium">Sealed</th></tr>
          </thead>
          <tbody className="divide-y divide-rule">
            {versions.map((v) => (
              <tr key={v.number} data-testid={`version-row-${v.number}`}>
                <td className="py-2"><Link className="font-mono underline underline-offset-4 hover:text-madder" to={`${base}/versions/${v.number}`}>v{v.number}</Link> <span className="text-xs text-ink-faint">from rev {v.draftRevision}</span></td>
                <td><VersionStateTag state={v.state} />{v.supersededByNumber ? <span className="text-xs text-ink-faint"> by v{v.supersededByNumber}</span> : null}</td>
                <td className="text-ink-soft">{v.next.names.length > 0 ? v.next.names.join(", ") : v.next.text}</td>
                <td><Fingerprint value={v.fingerprint} /></td>
                <td className="text-ink-soft">{when(v.sealedAt)} · {v.sealedByName}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}

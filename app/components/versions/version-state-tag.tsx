import type { VersionState } from "~/figures/version-state";
import { Shape, type ShapeName } from "../ui/shape";

// Each state has its own shape beside its word, so that nothing is told by colour alone.
const LOOK: Record<VersionState, { shape: ShapeName; tone: string }> = {
  sealed: { shape: "square", tone: "text-ink" },
  "in review": { shape: "dotted-ring", tone: "text-warn" },
  "signed off": { shape: "check", tone: "text-ok" },
  returned: { shape: "cross", tone: "text-madder" },
  superseded: { shape: "ring", tone: "text-ink-faint" },
};

export function VersionStateTag({ state, className }: { state: VersionState; className?: string }) {
  const look = LOOK[state];
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap ${look.tone} ${className ?? ""}`} data-testid="version-state" data-state={state}>
      <Shape name={look.shape} />
      {state}
    </span>
  );
}

/** A reviewer's decision, in words and a shape. */
export function DecisionTag({ decision }: { decision: "pending" | "signed-off" | "returned" }) {
  const look = { pending: { shape: "dotted-ring" as const, word: "not yet decided", tone: "text-ink-soft" }, "signed-off": { shape: "check" as const, word: "signed off", tone: "text-ok" }, returned: { shape: "cross" as const, word: "returned", tone: "text-madder" } }[decision];
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap text-sm ${look.tone}`}>
      <Shape name={look.shape} />
      {look.word}
    </span>
  );
}

/** The latest state of a figure in a list: "v2 · in review", or "draft only". */
export function LatestVersionCell({ latest }: { latest: { number: number; state: VersionState } | null | undefined }) {
  if (!latest) return <span className="text-ink-soft">draft only</span>;
  return (
    <span className="inline-flex items-center gap-2">
      <span className="font-mono">v{latest.number}</span>
      <VersionStateTag state={latest.state} />
    </span>
  );
}

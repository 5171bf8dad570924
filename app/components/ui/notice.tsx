import { Shape } from "./shape";

/** A quiet boxed note; `tone` changes the rule colour and the leading glyph, never colour alone. */
export function Notice({ tone = "info", children }: { tone?: "info" | "ok" | "caution"; children: React.ReactNode }) {
  const glyph = { info: <span className="font-mono font-semibold">i</span>, ok: <Shape name="check" />, caution: <span className="font-mono font-semibold">!</span> }[tone];
  const rule = { info: "border-rule-strong", ok: "border-ok", caution: "border-madder" }[tone];
  return (
    <div role={tone === "caution" ? "alert" : "status"} className={`flex gap-3 border-l-2 ${rule} bg-sheet px-3 py-2 text-sm`}>
      <span aria-hidden="true" className="flex w-3 justify-center pt-0.5">{glyph}</span>
      <div>{children}</div>
    </div>
  );
}

export function DemoBadge() {
  return (
    <span className="inline-flex items-center gap-1 border border-dashed border-ink-faint px-1.5 py-0.5 text-xs uppercase tracking-wider text-ink-soft" title="Invented demonstration data, not a real measurement">
      <Shape name="diamond" /> demo · synthetic
    </span>
  );
}

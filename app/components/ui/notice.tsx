/** A quiet boxed note; `tone` changes the rule colour and the leading glyph, never colour alone. */
export function Notice({ tone = "info", children }: { tone?: "info" | "ok" | "caution"; children: React.ReactNode }) {
  // Glyphs that the bundled UI font has (a circled i is not among them).
  const glyph = { info: "i", ok: "✓", caution: "!" }[tone];
  const rule = { info: "border-rule-strong", ok: "border-ok", caution: "border-madder" }[tone];
  return (
    <div role={tone === "caution" ? "alert" : "status"} className={`flex gap-3 border-l-2 ${rule} bg-sheet px-3 py-2 text-sm`}>
      <span aria-hidden="true" className="font-mono font-semibold">{glyph}</span>
      <div>{children}</div>
    </div>
  );
}

export function DemoBadge() {
  return (
    <span className="inline-flex items-center gap-1 border border-dashed border-ink-faint px-1.5 py-0.5 text-xs uppercase tracking-wider text-ink-soft" title="Invented demonstration data, not a real measurement">
      ◇ demo · synthetic
    </span>
  );
}

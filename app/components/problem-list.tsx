type Problem = { row: number | null; column: number | null; header?: string | null; message: string };

/** The reasons a file was refused, each with the line and column to look at in an editor. */
export function ProblemList({ problems, problemCount, refused }: { problems: Problem[]; problemCount: number; refused?: Refused | null }) {
  return (
    <section aria-labelledby="problems-h" className="border-l-2 border-madder bg-sheet px-4 py-3">
      <h3 id="problems-h" className="font-sans text-base font-medium">
        ! The file was not stored: {problemCount} problem{problemCount === 1 ? "" : "s"}
        {problemCount > problems.length ? ` (the first ${problems.length} are listed)` : ""}
      </h3>
      <table className="mt-2 w-full text-sm">
        <thead className="text-left text-ink-soft"><tr><th className="py-1 font-medium">Line</th><th className="font-medium">Column</th><th className="font-medium">What to change</th></tr></thead>
        <tbody className="divide-y divide-rule">
          {problems.map((p, i) => (
            <tr key={i}>
              <td className="num py-1 pr-4 font-mono">{p.row ?? "—"}</td>
              <td className="pr-4">{p.column != null ? <><span className="num font-mono">{p.column}</span>{p.header ? ` “${p.header}”` : ""}</> : p.header ? `“${p.header}”` : "—"}</td>
              <td>{p.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {refused ? <RefusedLines refused={refused} problems={problems} /> : null}
    </section>
  );
}

/** How a character that cannot be part of a number is named beside the cell. */
export function describeCharacter(ch: string): string {
  const code = `U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, "0")}`;
  if (ch === " ") return "a space";
  if (ch === "\u00a0") return `a no-break space (${code})`;
  if (ch === "\t") return "a tab";
  if (ch === ",") return "a comma";
  if (ch === "\u2212") return `a minus sign (${code}) where a hyphen-minus - is expected`;
  if (/^\p{L}$/u.test(ch)) return `the letter ${ch} (${code})`;
  return `the character ${ch} (${code})`;
}

// What a plain decimal number may contain (parse-number-field.ts reads nothing else).
const NUMBER_CHARACTER = /^[0-9.eE+-]$/;

/** A refused cell's text with every character that cannot be part of a number marked and named. */
export function MarkedField({ text }: { text: string }) {
  const chars = Array.from(text);
  if (chars.length === 0) return <span className="text-ink-faint">(empty)</span>;
  return (
    <>
      {chars.map((ch, i) =>
        NUMBER_CHARACTER.test(ch) ? <span key={i}>{ch}</span> : (
          <mark key={i} className="bg-madder px-px text-sheet" title={describeCharacter(ch)} data-testid="odd-character">
            {ch === " " || ch === "\u00a0" ? "␣" : ch === "\t" ? "⇥" : ch}
            <span className="sr-only"> ({describeCharacter(ch)})</span>
          </mark>
        ),
      )}
    </>
  );
}

type Refused = { columns: number[]; headers: string[]; columnCount: number; rows: { line: number; fields: string[] }[] };

/**
 * The lines a refused file's problems point at, as the file has them, with the cells that hold
 * a problem outlined and the characters that cannot be part of a number marked, and named in a
 * list below: "4O.2" shows its letter O, which reads as 40.2 in a plain table.
 */
export function RefusedLines({ refused, problems }: { refused: Refused; problems: Problem[] }) {
  const messages = problemsByCell(problems);
  const odd = refused.rows.flatMap((r) =>
    r.fields.flatMap((f, i) => {
      const column = refused.columns[i];
      if (!messages.has(`${r.line}:${column}`)) return [];
      const named = [...new Set(Array.from(f.trim()).filter((ch) => !NUMBER_CHARACTER.test(ch) && ch !== "…"))].map(describeCharacter);
      return named.length ? [`line ${r.line}, column ${column} “${refused.headers[i]}”: ${named.join(", ")}`] : [];
    }),
  );
  return (
    <section aria-labelledby="refused-h" className="mt-3">
      <h4 id="refused-h" className="font-sans text-sm font-medium">The refused lines, as the file has them</h4>
      <p className="text-sm text-ink-soft">
        Outlined cells hold a problem; characters that cannot be part of a number are marked and named below.
        {refused.columns.length < refused.columnCount ? ` Only ${refused.columns.length} of the file's ${refused.columnCount} columns are shown: the first ones and those with a problem.` : ""}
      </p>
      <div className="mt-2 overflow-x-auto">
        <table className="text-sm" aria-label="Refused lines of the file">
          <thead className="border-b border-rule text-left">
            <tr><th className="pr-4 font-normal text-ink-faint">line</th>{refused.headers.map((h, i) => <th key={i} className="pr-4 font-medium"><span className="font-mono text-xs text-ink-faint">{refused.columns[i]}</span> {h}</th>)}</tr>
          </thead>
          <tbody className="font-mono">
            {refused.rows.map((r) => (
              <tr key={r.line}>
                <td className="num pr-4 text-ink-faint">{r.line}</td>
                {r.fields.map((f, i) => <FileCell key={i} text={f} said={messages.get(`${r.line}:${refused.columns[i]}`)} className="pr-4" />)}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {odd.length ? <ul className="mt-2 list-disc pl-5 text-sm" data-testid="odd-characters">{odd.map((o) => <li key={o}>{o}</li>)}</ul> : null}
    </section>
  );
}

/** The messages of the problems that point at a cell, keyed "line:column". */
export function problemsByCell(problems: readonly Problem[]): Map<string, string[]> {
  const messages = new Map<string, string[]>();
  for (const p of problems) {
    if (p.row === null || p.column === null) continue;
    const key = `${p.row}:${p.column}`;
    messages.set(key, [...(messages.get(key) ?? []), p.message]);
  }
  return messages;
}

/** One cell of a file's text: outlined, with odd characters marked, when problems point at it. */
export function FileCell({ text, said, className = "" }: { text: string; said?: string[]; className?: string }) {
  if (!said) return <td className={`num ${className}`}>{text}</td>;
  return (
    <td className={`num ${className}`} data-problem={said.join(" ")}>
      <span className="px-0.5 outline-2 outline-madder outline">
        <MarkedField text={text.trim()} />
      </span>
      <span className="sr-only"> — refused: {said.join(" ")}</span>
    </td>
  );
}

type Problem = { row: number | null; column: number | null; header?: string | null; message: string };

/** The reasons a file was refused, each with the line and column to look at in an editor. */
export function ProblemList({ problems, problemCount }: { problems: Problem[]; problemCount: number }) {
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
    </section>
  );
}

import { useId, useState } from "react";
import { Form } from "react-router";
import { mappedColumnEntries, type ColumnMapping } from "~/datasets/column-mapping";
import type { MappingGuess } from "~/datasets/guess-mapping";
import { FileCell, problemsByCell } from "./problem-list";
import { Button } from "./ui/button";

type Preview = { headers: string[]; rows: { line: number; fields: string[] }[]; more: boolean; delimiter: string; guess: MappingGuess };
type ErrKind = "none" | "symmetric" | "asymmetric";

function errDefaults(e: ColumnMapping["stat"] | undefined): { kind: ErrKind; sym: string; minus: string; plus: string } {
  if (!e) return { kind: "none", sym: "", minus: "", plus: "" };
  return e.kind === "symmetric" ? { kind: "symmetric", sym: e.column, minus: "", plus: "" } : { kind: "asymmetric", sym: "", minus: e.minus, plus: e.plus };
}

/** The mapping step: the first rows of the file, and which column holds which quantity. */
export function MappingEditor({ pending, fileName, preview, saved, busy, errors = {}, problems = [] }: { pending: string; fileName: string; preview: Preview; saved: ColumnMapping | null; busy: boolean; errors?: Record<string, string>; problems?: { row: number | null; column: number | null; message: string }[] }) {
  const marked = problemsByCell(problems);
  // The saved mapping fills the form only when every column it names is in this file.
  const usedSaved = saved !== null && mappedColumnEntries(saved).every(([, name]) => preview.headers.includes(name));
  const start: Partial<ColumnMapping> = usedSaved ? saved : preview.guess.mapping;
  const [stat, setStat] = useState<ErrKind>(errDefaults(start.stat).kind);
  const [syst, setSyst] = useState<ErrKind>(errDefaults(start.syst).kind);
  const s = errDefaults(start.stat);
  const y = errDefaults(start.syst);
  const delim = { ",": "comma", ";": "semicolon", "\t": "tab" }[preview.delimiter] ?? preview.delimiter;
  return (
    <>
      <p className="mt-1 text-sm text-ink-soft">
        Separated by {delim}; {preview.headers.length} columns.
        {usedSaved ? " Pre-filled from the mapping of the previous revision." : (
          (saved ? " The saved mapping names columns this file does not have." : "") +
          (preview.guess.guessed.length ? ` Guessed from the headers: ${preview.guess.guessed.join(", ")}. Check each choice.` : " Nothing could be guessed from the headers.")
        )}
      </p>
      <div className="mt-3 overflow-x-auto">
        <table className="text-sm">
          <thead className="border-b border-rule text-left"><tr><th className="pr-4 font-normal text-ink-faint">line</th>{preview.headers.map((h, i) => <th key={i} className="pr-4 font-medium"><span className="font-mono text-xs text-ink-faint">{i + 1}</span> {h}</th>)}</tr></thead>
          <tbody className="font-mono text-xs">
            {preview.rows.map((r) => <tr key={r.line}><td className="pr-4 text-ink-faint">{r.line}</td>{r.fields.map((f, i) => <FileCell key={i} text={f} said={marked.get(`${r.line}:${i + 1}`)} className="pr-4" />)}</tr>)}
          </tbody>
        </table>
        {preview.more ? <p className="text-xs text-ink-faint">… more rows</p> : null}
      </div>
      <Form method="post" className="mt-4 grid grid-cols-3 gap-4 text-sm max-lg:grid-cols-2">
        <input type="hidden" name="pending" value={pending} />
        <input type="hidden" name="fileName" value={fileName} />
        <Column label="x" name="x" headers={preview.headers} value={start.x} error={errors["x"]} optional
          hint="Required, unless both bin edges are mapped: each point is then plotted at its bin's centre." />
        <Column label="bin low edge" name="xLow" headers={preview.headers} value={start.xLow} error={errors["xLow"]} optional />
        <Column label="bin high edge" name="xHigh" headers={preview.headers} value={start.xHigh} error={errors["xHigh"]} optional />
        <Column label="y (required)" name="y" headers={preview.headers} value={start.y} error={errors["y"]} />
        <ErrorColumns label="statistical error" prefix="stat" kind={stat} setKind={setStat} headers={preview.headers} d={s} errors={errors} />
        <ErrorColumns label="systematic error" prefix="syst" kind={syst} setKind={setSyst} headers={preview.headers} d={y} errors={errors} />
        <div className="col-span-full"><Button kind="primary" type="submit" disabled={busy}>{busy ? "Checking every row…" : "Check and store as a revision"}</Button></div>
      </Form>
    </>
  );
}

function Column({ label, name, headers, value, optional, error, hint }: { label: string; name: string; headers: string[]; value?: string; optional?: boolean; error?: string; hint?: string }) {
  const id = useId();
  const described = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(" ") || undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-medium">{label}</label>
      <select id={id} name={name} defaultValue={value ?? ""} aria-invalid={error ? true : undefined} aria-describedby={described}
        className={`border bg-paper px-2 py-1 ${error ? "border-madder" : "border-rule-strong"}`}>
        <option value="">{optional ? "— none" : "— choose a column"}</option>
        {headers.map((h, i) => <option key={i} value={h}>{i + 1}: {h}</option>)}
      </select>
      {hint ? <p id={`${id}-hint`} className="text-ink-soft">{hint}</p> : null}
      {error ? <p id={`${id}-error`} role="alert" className="text-madder">{error.charAt(0).toUpperCase() + error.slice(1)}.</p> : null}
    </div>
  );
}

function ErrorColumns({ label, prefix, kind, setKind, headers, d, errors }: { label: string; prefix: string; kind: ErrKind; setKind: (k: ErrKind) => void; headers: string[]; d: { sym: string; minus: string; plus: string }; errors: Record<string, string> }) {
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="font-medium">{label}</legend>
      <select name={`${prefix}Kind`} value={kind} onChange={(e) => setKind(e.target.value as ErrKind)} className="border border-rule-strong bg-paper px-2 py-1" aria-label={`${label}: kind`}>
        <option value="none">none</option><option value="symmetric">symmetric ±</option><option value="asymmetric">asymmetric − / +</option>
      </select>
      {kind === "symmetric" ? <Column label="column" name={prefix} headers={headers} value={d.sym} error={errors[`${prefix}.column`]} /> : null}
      {kind === "asymmetric" ? <><Column label="− column" name={`${prefix}Minus`} headers={headers} value={d.minus} error={errors[`${prefix}.minus`]} /><Column label="+ column" name={`${prefix}Plus`} headers={headers} value={d.plus} error={errors[`${prefix}.plus`]} /></> : null}
    </fieldset>
  );
}

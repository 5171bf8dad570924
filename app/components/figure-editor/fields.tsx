import { useEffect, useId, useState } from "react";

/** Errors of the draft by model path ("x.label", "panels.0.layers.2.colour"), schema and TeX alike. */
export type PathErrors = Readonly<Record<string, string>>;

const box = "border bg-sheet px-2 py-1 text-sm text-ink outline-none focus:border-ink";

function Label({ htmlFor, children }: { htmlFor: string; children: React.ReactNode }) {
  return <label htmlFor={htmlFor} className="text-xs font-medium text-ink-soft">{children}</label>;
}

function ErrorText({ id, error }: { id: string; error?: string }) {
  return error ? <p id={id} className="text-xs text-madder" role="alert">{error}</p> : null;
}

/** A text field bound to one value of the draft; TeX fields say so and show MathJax's complaint beside them. */
export function TextInput(props: { label: string; value: string; onChange: (v: string) => void; error?: string; tex?: boolean; hint?: string; testId?: string; multiline?: boolean; maxLength?: number }) {
  const id = useId();
  const described = [props.error ? `${id}-e` : null, props.hint ? `${id}-h` : null].filter(Boolean).join(" ") || undefined;
  const common = {
    id, value: props.value, maxLength: props.maxLength, "aria-invalid": props.error ? true : undefined, "aria-describedby": described, "data-testid": props.testId,
    className: `${box} ${props.tex ? "font-mono" : ""} ${props.error ? "border-madder" : "border-rule-strong"}`,
  };
  return (
    <div className="flex flex-col gap-0.5">
      <Label htmlFor={id}>{props.label}{props.tex ? <span className="ml-1 font-normal text-ink-faint">(TeX)</span> : null}</Label>
      {props.multiline
        ? <textarea rows={4} {...common} onChange={(e) => props.onChange(e.target.value)} />
        : <input type="text" spellCheck={!props.tex} {...common} onChange={(e) => props.onChange(e.target.value)} />}
      {props.hint ? <p id={`${id}-h`} className="text-xs text-ink-faint">{props.hint}</p> : null}
      <ErrorText id={`${id}-e`} error={props.error} />
    </div>
  );
}

const parse = (text: string) => (text.trim() === "" ? null : Number(text.trim()));

/**
 * A number field that keeps what is being typed ("1e", "-") as text and passes on a number only
 * when it is one; empty means "automatic" where `allowEmpty` is set.
 */
export function NumberInput(props: { label: string; value: number | null; onChange: (v: number | null) => void; allowEmpty?: boolean; error?: string; hint?: string; testId?: string; placeholder?: string }) {
  const id = useId();
  const [text, setText] = useState(props.value === null ? "" : String(props.value));
  const [local, setLocal] = useState<string | null>(null);
  useEffect(() => {
    const current = parse(text);
    if (current !== props.value) setText(props.value === null ? "" : String(props.value));
    // Only an outside change of the value rewrites the text (not the text being typed).
  }, [props.value]);
  const error = local ?? props.error;
  return (
    <div className="flex flex-col gap-0.5">
      <Label htmlFor={id}>{props.label}</Label>
      <input
        id={id} type="text" inputMode="decimal" value={text} placeholder={props.placeholder} data-testid={props.testId}
        aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-e` : undefined}
        className={`${box} font-mono ${error ? "border-madder" : "border-rule-strong"}`}
        onChange={(e) => {
          setText(e.target.value);
          const v = parse(e.target.value);
          if (v === null && props.allowEmpty) { setLocal(null); props.onChange(null); return; }
          if (v === null || !Number.isFinite(v)) { setLocal(v === null ? "Give a number." : `“${e.target.value}” is not a number.`); return; }
          setLocal(null);
          props.onChange(v);
        }}
      />
      {props.hint ? <p className="text-xs text-ink-faint">{props.hint}</p> : null}
      <ErrorText id={`${id}-e`} error={error} />
    </div>
  );
}

export function Choice<T extends string>(props: { label: string; value: T; options: readonly { value: T; label: string }[]; onChange: (v: T) => void; error?: string; testId?: string }) {
  const id = useId();
  return (
    <div className="flex flex-col gap-0.5">
      <Label htmlFor={id}>{props.label}</Label>
      <select id={id} value={props.value} data-testid={props.testId} onChange={(e) => props.onChange(e.target.value as T)} className={`${box} border-rule-strong`} aria-invalid={props.error ? true : undefined}>
        {props.options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
      </select>
      <ErrorText id={`${id}-e`} error={props.error} />
    </div>
  );
}

export function Section({ title, children, open = true, testId }: { title: string; children: React.ReactNode; open?: boolean; testId?: string }) {
  return (
    <details open={open} className="border-b border-rule py-3" data-testid={testId}>
      <summary className="cursor-pointer font-serif text-base">{title}</summary>
      <div className="mt-3 flex flex-col gap-3">{children}</div>
    </details>
  );
}

export function Row({ children }: { children: React.ReactNode }) {
  return <div className="grid grid-cols-2 gap-2">{children}</div>;
}

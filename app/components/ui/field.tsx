import { useId } from "react";

type FieldProps = {
  label: string;
  name: string;
  error?: string;
  hint?: string;
} & React.InputHTMLAttributes<HTMLInputElement>;

/** A labelled input with its error beside it, wired for screen readers. */
export function Field({ label, name, error, hint, className, ...input }: FieldProps) {
  const id = useId();
  const errId = `${id}-error`;
  const hintId = `${id}-hint`;
  return (
    <div className={`flex flex-col gap-1 ${className ?? ""}`}>
      <label htmlFor={id} className="text-sm font-medium text-ink">{label}</label>
      <input
        id={id}
        name={name}
        aria-invalid={error ? true : undefined}
        aria-describedby={[error ? errId : null, hint ? hintId : null].filter(Boolean).join(" ") || undefined}
        className={`border bg-sheet px-2.5 py-1.5 text-ink focus:border-ink ${error ? "border-madder" : "border-rule-strong"}`}
        {...input}
      />
      {hint ? <p id={hintId} className="text-sm text-ink-soft">{hint}</p> : null}
      {error ? <p id={errId} className="text-sm text-madder" role="alert">{error}</p> : null}
    </div>
  );
}

type SelectProps = { label: string; name: string; error?: string; children: React.ReactNode } & React.SelectHTMLAttributes<HTMLSelectElement>;

export function SelectField({ label, name, error, children, className, ...rest }: SelectProps) {
  const id = useId();
  return (
    <div className={`flex flex-col gap-1 ${className ?? ""}`}>
      <label htmlFor={id} className="text-sm font-medium">{label}</label>
      <select id={id} name={name} aria-invalid={error ? true : undefined} className="border border-rule-strong bg-sheet px-2 py-1.5" {...rest}>
        {children}
      </select>
      {error ? <p className="text-sm text-madder" role="alert">{error}</p> : null}
    </div>
  );
}

import { useState } from "react";

/** A hash shortened and grouped in fours, the whole value one click away. */
export function Fingerprint({ value, groups = 3 }: { value: string; groups?: number }) {
  const [open, setOpen] = useState(false);
  const short = (value.match(/.{1,4}/g) ?? []).slice(0, groups).join(" ");
  return (
    <button type="button" onClick={() => setOpen((o) => !o)} title={open ? "Show short form" : "Show the whole value"}
      className="font-mono text-xs tracking-tight text-ink hover:text-madder" data-fingerprint={value}>
      {/* The name read aloud starts with what is seen (WCAG 2.5.3, "label in name") and ends with the whole value. */}
      <span className="sr-only">fingerprint </span>
      {open ? <span className="select-all break-all">{value}</span> : <>{short} …<span className="sr-only">, whole value {value}</span></>}
    </button>
  );
}

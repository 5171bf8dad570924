import { useState } from "react";

/** A hash shortened and grouped in fours, the whole value one click away. */
export function Fingerprint({ value, groups = 3 }: { value: string; groups?: number }) {
  const [open, setOpen] = useState(false);
  const short = (value.match(/.{1,4}/g) ?? []).slice(0, groups).join(" ");
  return (
    <button type="button" onClick={() => setOpen((o) => !o)} title={open ? "Show short form" : "Show the whole value"}
      className="font-mono text-xs tracking-tight text-ink hover:text-madder" aria-label={`fingerprint ${value}`}>
      {open ? <span className="select-all break-all">{value}</span> : <>{short} …</>}
    </button>
  );
}

import { useEffect, useMemo, useRef, useState } from "react";
import { useLoaderData } from "react-router";
import type { Route } from "./+types/predictions";
import { requireUser } from "~/.server/guards.server";
import { PROCESSES } from "~/engine";
import { PredictionChart } from "~/components/prediction-chart";
import { Notice } from "~/components/ui/notice";
import { Fingerprint } from "~/components/fingerprint";

export async function loader({ request }: Route.LoaderArgs) {
  await requireUser(request);
  return { processes: PROCESSES };
}

type Processes = Awaited<ReturnType<typeof loader>>["processes"];
type Info = Processes[number];

type ApiOk = { engineVersion: string; process: string; frame: string; unit: string; sqrtS: number; parametersHash: string; values: number[] };
type ApiErr = { error: { code: string; message: string; field?: string } };

const UNITS = ["GeV^-2/sr", "cm^2/sr", "fm^2/sr", "mb/sr", "ub/sr", "nb/sr", "pb/sr", "fb/sr"] as const;

interface FormState {
  process: string;
  frame: string;
  energyKind: "kinetic" | "beam" | "sqrtS";
  energy: string;
  energyUnit: "GeV" | "MeV" | "keV";
  mass: string;
  finalMass: string;
  alpha: string;
  thetaFrom: string;
  thetaTo: string;
  points: string;
  unit: string;
}

function initial(p: Info): FormState {
  return {
    process: p.id, frame: p.frames[0], energyKind: p.needsSqrtS ? "sqrtS" : "kinetic", energy: p.needsSqrtS ? "1" : "0.5", energyUnit: "GeV",
    mass: "", finalMass: "", alpha: "", thetaFrom: "5", thetaTo: "175", points: "69", unit: "ub/sr",
  };
}

/** The request body exactly as the API and the command line take it. */
export function buildRequest(f: FormState): { body: Record<string, unknown>; thetas: number[] } {
  const n = Math.max(2, Math.min(721, Math.round(Number(f.points) || 2)));
  const a = Number(f.thetaFrom), b = Number(f.thetaTo);
  const thetas = Array.from({ length: n }, (_, i) => Number((a + ((b - a) * i) / (n - 1)).toPrecision(12)));
  const body: Record<string, unknown> = {
    process: f.process, frame: f.frame,
    energy: { [f.energyKind]: f.energy.trim() === "" ? NaN : Number(f.energy), unit: f.energyUnit },
    thetaDeg: thetas, unit: f.unit,
  };
  if (f.mass.trim()) body.mass = Number(f.mass);
  if (f.finalMass.trim()) body.finalMass = Number(f.finalMass);
  if (f.alpha.trim()) body.alpha = Number(f.alpha);
  return { body, thetas };
}

export default function Predictions() {
  const { processes } = useLoaderData<typeof loader>();
  const [form, setForm] = useState<FormState>(() => initial(processes[0]));
  const [result, setResult] = useState<{ ok: ApiOk; thetas: number[] } | null>(null);
  const [error, setError] = useState<ApiErr["error"] | null>(null);
  const [busy, setBusy] = useState(false);
  const seq = useRef(0);
  const info = processes.find((p) => p.id === form.process) ?? processes[0];
  const { body, thetas } = useMemo(() => buildRequest(form), [form]);

  useEffect(() => {
    // Debounced; a response older than the newest request is dropped, and its fetch aborted.
    const mine = ++seq.current;
    const ctrl = new AbortController();
    const timer = setTimeout(async () => {
      setBusy(true);
      try {
        const res = await fetch("/api/v1/predictions", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body), signal: ctrl.signal });
        const json = (await res.json()) as ApiOk | ApiErr;
        if (mine !== seq.current) return;
        if ("error" in json) { setError(json.error); } else { setError(null); setResult({ ok: json, thetas }); }
      } catch (e) {
        if ((e as Error).name !== "AbortError" && mine === seq.current) setError({ code: "network", message: "The server did not answer." });
      } finally {
        if (mine === seq.current) setBusy(false);
      }
    }, 250);
    return () => { clearTimeout(timer); ctrl.abort(); };
  }, [body, thetas]);

  const set = (k: keyof FormState) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) => {
    const v = e.target.value;
    setForm((f) => {
      if (k === "process") {
        const p = processes.find((x) => x.id === v)!;
        return { ...f, process: v, frame: p.frames.includes(f.frame as never) ? f.frame : p.frames[0], energyKind: p.needsSqrtS ? "sqrtS" : f.energyKind, mass: "", finalMass: "" };
      }
      return { ...f, [k]: v };
    });
  };

  const csv = result ? toCsv(result.ok, result.thetas) : null;
  const fieldError = (name: string) => (error?.field && (error.field === name || error.field.startsWith(`${name}.`) || error.field.startsWith(`${name}[`)) ? error.message : undefined);

  return (
    <div className="grid grid-cols-[20rem_1fr] gap-8 max-lg:grid-cols-1">
      <form className="flex flex-col gap-3 text-sm" onSubmit={(e) => e.preventDefault()} aria-label="Prediction parameters">
        <h1 className="text-3xl">Predictions</h1>
        <p className="text-ink-soft">Tree-level (Born) cross sections from Steradian's engine. The curve follows your input as you type.</p>
        <Select label="Process" value={form.process} onChange={set("process")}>
          {processes.map((p) => <option key={p.id} value={p.id}>{p.reaction} — {p.theory}</option>)}
        </Select>
        <Select label="Frame" value={form.frame} onChange={set("frame")}>
          {info.frames.map((fr) => <option key={fr} value={fr}>{fr === "cm" ? "CM frame" : "lab frame (target at rest)"}</option>)}
        </Select>
        <div className="grid grid-cols-[1fr_5rem] gap-2">
          <Select label="Energy given as" value={form.energyKind} onChange={set("energyKind")}>
            <option value="sqrtS">√s</option>
            {info.needsSqrtS ? null : <><option value="kinetic">beam kinetic energy</option><option value="beam">total beam energy</option></>}
          </Select>
          <Select label="Unit" value={form.energyUnit} onChange={set("energyUnit")}>
            <option>GeV</option><option>MeV</option><option>keV</option>
          </Select>
        </div>
        <Input label="Energy" value={form.energy} onChange={set("energy")} inputMode="decimal" error={fieldError("energy")} />
        <Input label={`Mass, GeV — ${info.massMeaning}`} placeholder={String(info.defaultMass)} value={form.mass} onChange={set("mass")} inputMode="decimal" error={fieldError("mass")} />
        {info.defaultFinalMass != null ? (
          <Input label={`Final mass, GeV — ${info.finalMassMeaning}`} placeholder={String(info.defaultFinalMass)} value={form.finalMass} onChange={set("finalMass")} inputMode="decimal" error={fieldError("finalMass")} />
        ) : null}
        <Input label="α (empty: α(0) = 1/137.035999084, CODATA 2018)" value={form.alpha} onChange={set("alpha")} inputMode="decimal" error={fieldError("alpha")} />
        <div className="grid grid-cols-3 gap-2">
          <Input label="θ from, °" value={form.thetaFrom} onChange={set("thetaFrom")} inputMode="decimal" />
          <Input label="θ to, °" value={form.thetaTo} onChange={set("thetaTo")} inputMode="decimal" />
          <Input label="points" value={form.points} onChange={set("points")} inputMode="numeric" />
        </div>
        {fieldError("thetaDeg") ? <p className="text-madder" role="alert">{fieldError("thetaDeg")}</p> : null}
        <Select label="Unit of dσ/dΩ" value={form.unit} onChange={set("unit")}>
          {UNITS.map((u) => <option key={u} value={u}>{u.replace("ub", "µb").replace("^-2", "⁻²").replace("^2", "²")}</option>)}
        </Select>
      </form>

      <section aria-labelledby="curve-h" className="min-w-0">
        <h2 id="curve-h" className="sr-only">Curve</h2>
        {error && !error.field ? <Notice tone="caution">{error.message}</Notice> : null}
        {error?.field ? <Notice tone="caution">{error.message} <span className="font-mono text-xs">({error.field})</span></Notice> : null}
        <div className={`mt-2 border border-rule bg-sheet p-3 ${busy ? "opacity-70" : ""}`} aria-busy={busy}>
          {result ? <PredictionChart thetas={result.thetas} values={result.ok.values} unit={result.ok.unit} frame={result.ok.frame} /> : <p className="p-10 text-ink-soft">Computing…</p>}
        </div>
        <Conventions info={info} frame={form.frame} />
        {result ? (
          <div className="mt-4 flex flex-wrap items-center gap-4 text-sm">
            <span>engine <span className="font-mono">{result.ok.engineVersion}</span></span>
            <span>√s = <span className="num">{result.ok.sqrtS.toPrecision(6)}</span> GeV</span>
            <span>parameters <Fingerprint value={result.ok.parametersHash} /></span>
            <a className="underline underline-offset-4" download={`${result.ok.process}-${result.ok.frame}.csv`} href={`data:text/csv;charset=utf-8,${encodeURIComponent(csv!)}`}>Download the table (CSV)</a>
          </div>
        ) : null}
      </section>
    </div>
  );
}

function Conventions({ info, frame }: { info: Info; frame: string }) {
  return (
    <dl className="mt-4 grid grid-cols-[11rem_1fr] gap-x-4 gap-y-1 border-t border-rule pt-3 text-sm" aria-label="Conventions">
      <dt className="text-ink-soft">θ is the angle of</dt><dd>{info.referenceParticle}</dd>
      <dt className="text-ink-soft">measured from</dt><dd>the direction of {info.axisParticle}, in the {frame === "cm" ? "CM" : "lab"} frame</dd>
      {frame === "lab" ? <><dt className="text-ink-soft">lab frame</dt><dd>{info.beamParticle} beam on {info.targetParticle} at rest</dd></> : null}
      <dt className="text-ink-soft">identical particles</dt><dd>{info.identicalFinalParticles ? "dσ/dΩ counts one particle in dΩ (no ½); the total is ½∫dΩ over 4π" : "the final particles are distinct"}</dd>
      <dt className="text-ink-soft">approximation</dt><dd>tree level (Born), {info.theory}, unpolarised</dd>
    </dl>
  );
}

function toCsv(r: ApiOk, thetas: number[]): string {
  const head = [`# Steradian engine ${r.engineVersion}; process ${r.process}; frame ${r.frame}; sqrt(s) = ${r.sqrtS} GeV; parameters sha256 ${r.parametersHash}`, `theta_deg,dsigma_dOmega_${r.unit.replace("/", "_per_")}`];
  return [...head, ...thetas.map((t, i) => `${t},${r.values[i]}`)].join("\n") + "\n";
}

function Select({ label, children, ...rest }: { label: string; children: React.ReactNode } & React.SelectHTMLAttributes<HTMLSelectElement>) {
  return (
    <label className="flex flex-col gap-1"><span className="font-medium">{label}</span>
      <select className="border border-rule-strong bg-sheet px-2 py-1.5" {...rest}>{children}</select></label>
  );
}

function Input({ label, error, ...rest }: { label: string; error?: string } & React.InputHTMLAttributes<HTMLInputElement>) {
  return (
    <label className="flex flex-col gap-1"><span className="font-medium">{label}</span>
      <input className={`border bg-sheet px-2 py-1.5 ${error ? "border-madder" : "border-rule-strong"}`} aria-invalid={error ? true : undefined} {...rest} />
      {error ? <span className="text-madder" role="alert">{error}</span> : null}</label>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Predictions · Steradian" }];

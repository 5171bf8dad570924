import { useEffect, useId, useMemo, useState } from "react";
import { useFetcher, useLoaderData, useLocation } from "react-router";
import type { Route } from "./+types/predictions";
import { requireUser } from "~/.server/platform/http/guards.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { addPredictionToFigure, editableFigures } from "./predictions.server";
import { predictionLayerOf } from "~/components/predictions/prediction-layer";
import { PHYSICAL_CONSTANTS, PROCESSES, type Observable, type PredictionResponse } from "~/engine";
import { PredictionChart } from "~/components/prediction-chart";
import { Fingerprint } from "~/components/fingerprint";
import { Notice } from "~/components/ui/notice";
import { Field, SelectField } from "~/components/ui/field";
import { buildPredictionRequest, RANGE_FIELDS } from "~/components/predictions/build-prediction-request";
import { ConventionsList } from "~/components/predictions/conventions-list";
import { inFormWords, inputForError, type ErrorSlot } from "~/components/predictions/input-for-error";
import { predictionCsv } from "~/components/predictions/prediction-csv";
import {
  ENERGY_NAMES, withEnergyUnit, withObservable, withProcess, withVariable,
  type AxisScale, type CurveVariable, type EnergyUnit, type PredictionFormState,
} from "~/components/predictions/prediction-form-state";
import { formFromSearch, searchOfForm } from "~/components/predictions/prediction-url";
import { unitChoices, unitLabel } from "~/components/predictions/unit-choices";
import { useLivePrediction } from "~/components/predictions/use-live-prediction";
import { OBSERVABLE_TITLE, predictionChartSpec, xTitleOf, type ChartView } from "~/figures/prediction-chart-spec";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { processes: PROCESSES, defaultAlpha: PHYSICAL_CONSTANTS.alpha, figures: await editableFigures(user.id) };
}

/** POST: adds the page's prediction to a figure's draft the user may edit. */
export async function action({ request, context }: Route.ActionArgs) {
  await requireUser(request);
  return addPredictionToFigure(request, await request.formData(), clientIp(context));
}

const OBSERVABLES: { value: Observable; label: string }[] = [
  { value: "dsigma/dOmega", label: "dσ/dΩ" },
  { value: "dsigma/dcos", label: "dσ/dcosθ" },
  { value: "dsigma/dt", label: "dσ/dt" },
  { value: "sigma", label: "σ, total or in an acceptance" },
];

/** The chart's view from the axis inputs: an end that is not a number is reported, not guessed. */
function chartViewOf(f: PredictionFormState): { view: ChartView; errors: Partial<Record<"xMin" | "xMax" | "yMin" | "yMax", string>> } {
  const errors: Partial<Record<"xMin" | "xMax" | "yMin" | "yMax", string>> = {};
  const end = (key: "xMin" | "xMax" | "yMin" | "yMax"): number | null => {
    const t = f[key].trim().replace(/\u2212/g, "-");
    if (t === "") return null;
    const v = Number(t);
    if (Number.isFinite(v)) return v;
    errors[key] = `Write a number here, or leave it empty to follow the curve (not “${f[key].trim()}”).`;
    return null;
  };
  return { view: { xScale: f.xScale, yScale: f.yScale, x: [end("xMin"), end("xMax")], y: [end("yMin"), end("yMax")] }, errors };
}

export default function Predictions() {
  const { processes, defaultAlpha, figures } = useLoaderData<typeof loader>();
  const location = useLocation();
  const [form, setForm] = useState<PredictionFormState>(() => formFromSearch(new URLSearchParams(location.search), processes));
  const [energyNote, setEnergyNote] = useState<string | null>(null);
  const info = processes.find((p) => p.id === form.process) ?? processes[0];
  const built = useMemo(() => buildPredictionRequest(form, info), [form, info]);
  const { result, problem, busy } = useLivePrediction(built.body, built.problem);
  const slot: ErrorSlot | null = problem ? (problem.field === undefined ? "general" : inputForError(problem.field, form)) : null;
  const problemText = problem ? inFormWords(problem.message, problem.field, built.body) : "";
  const err = (s: ErrorSlot) => (slot === s ? problemText : undefined);
  const { view, errors: viewErrors } = useMemo(() => chartViewOf(form), [form]);

  // The form lives in the address: a reload or a shared link gives the same curve. replaceState
  // keeps one history entry per visit, and React Router's own state in it is kept as it is.
  useEffect(() => {
    const search = `?${searchOfForm(form, processes).toString()}`;
    if (window.location.search !== search) window.history.replaceState(window.history.state, "", `${window.location.pathname}${search}`);
  }, [form, processes]);

  const set = <K extends keyof PredictionFormState>(k: K) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) => {
    const v = (e.target.type === "checkbox" ? (e.target as HTMLInputElement).checked : e.target.value) as PredictionFormState[K];
    setForm((f) => {
      if (k === "process") {
        const change = withProcess(f, processes.find((p) => p.id === v)!, info);
        setEnergyNote(change.note);
        return change.state;
      }
      if (k === "energy" || k === "energyKind" || k === "from" || k === "to") setEnergyNote(null);
      if (k === "energyUnit") return withEnergyUnit(f, v as EnergyUnit);
      if (k === "observable") return withObservable(f, v as Observable);
      if (k === "variable") return withVariable(f, v as CurveVariable);
      return { ...f, [k]: v };
    });
  };

  const scan = form.variable === "energy";
  const differential = form.observable !== "sigma";
  // A curve is the form's only when it answers exactly the request the form now builds; any
  // other (an older answer while a new one is computed or refused) is shown as out of date and
  // never offered for download.
  const current = result !== null && problem === null && built.body !== null && JSON.stringify(result.request) === JSON.stringify(built.body);
  const response = result?.response ?? null;
  const csv = useMemo(() => (result && current ? predictionCsv(result.response, result.request) : null), [result, current]);

  return (
    <div className="grid grid-cols-[22rem_1fr] gap-8 max-lg:grid-cols-1">
      <form className="flex flex-col gap-4 text-sm" onSubmit={(e) => e.preventDefault()} aria-label="Prediction parameters">
        <div>
          <h1 className="text-3xl">Predictions</h1>
          <p className="mt-1 text-ink-soft">Tree-level cross sections from Steradian's engine. The curve follows your input as you type.</p>
        </div>

        <Group title="Process">
          <SelectField label="Process" name="process" value={form.process} onChange={set("process")} error={err("process")}>
            {processes.map((p) => <option key={p.id} value={p.id}>{p.reaction} — {p.theory}</option>)}
          </SelectField>
          <SelectField label="Frame" name="frame" value={form.frame} onChange={set("frame")} error={err("frame")}>
            {info.frames.map((fr) => <option key={fr} value={fr}>{fr === "cm" ? "CM frame" : `lab frame (${info.targetParticle} at rest)`}</option>)}
          </SelectField>
        </Group>

        <Group title="Energy">
          <div className="grid grid-cols-[1fr_5.5rem] gap-2">
            <SelectField label="Energy given as" name="energyKind" value={form.energyKind} onChange={set("energyKind")}>
              <option value="sqrtS">√s</option>
              {info.needsSqrtS ? null : <><option value="kinetic">beam kinetic energy</option><option value="beam">total beam energy</option></>}
            </SelectField>
            <SelectField label="Energy unit" name="energyUnit" value={form.energyUnit} onChange={set("energyUnit")}>
              <option>GeV</option><option>MeV</option><option>keV</option>
            </SelectField>
          </div>
          {scan ? (
            <p className="text-ink-soft">The energy is scanned: set its range under “Curve”.</p>
          ) : (
            <Field label="Energy" name="energy" value={form.energy} onChange={set("energy")} inputMode="decimal" error={err("energy")}
              hint={info.needsSqrtS ? "γγ has no target at rest: √s only." : form.energyKind === "sqrtS" ? undefined : `${info.beamParticle} beam on ${info.targetParticle} at rest.`} />
          )}
          {energyNote ? <p className="border-l-2 border-warn pl-2 text-sm text-ink" role="status" data-testid="energy-note">{energyNote}</p> : null}
        </Group>

        <Group title="Masses and coupling">
          <Field label={`Mass, GeV — ${info.massMeaning.replace(" (GeV)", "")}`} name="mass" placeholder={`default ${info.defaultMass} (PDG)`} value={form.mass} onChange={set("mass")} inputMode="decimal" error={err("mass")} />
          {info.defaultFinalMass !== null ? (
            <Field label={`Final mass, GeV — ${(info.finalMassMeaning ?? "").replace(" (GeV)", "")}`} name="finalMass" placeholder={`default ${info.defaultFinalMass} (PDG)`} value={form.finalMass} onChange={set("finalMass")} inputMode="decimal" error={err("finalMass")} />
          ) : null}
          <Field label="α" name="alpha" placeholder={`default α(0) = 1/${Number((1 / defaultAlpha).toPrecision(12))} (CODATA 2018)`} value={form.alpha} onChange={set("alpha")} inputMode="decimal" error={err("alpha")} hint="A number or a fraction such as 1/128.9." />
        </Group>

        <Group title="Curve">
          <SelectField label="Observable" name="observable" value={form.observable} onChange={set("observable")} error={err("observable")}>
            {OBSERVABLES.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
          </SelectField>
          <SelectField label="As a function of" name="variable" value={form.variable} onChange={set("variable")}>
            {differential ? (
              <><option value="thetaDeg">θ in degrees</option><option value="cosTheta">cos θ</option><option value="t">t, GeV²</option></>
            ) : (
              <option value="none">nothing: one σ at the energy</option>
            )}
            <option value="energy">energy ({ENERGY_NAMES[form.energyKind]}): a scan</option>
          </SelectField>
          {form.variable === "none" ? null : (
            <div className="flex flex-col gap-2" role="group" aria-label="Range">
              <RangeInputs
                inputs={[
                  { label: "from", name: "from", value: form.from, onChange: set("from"), slot: RANGE_FIELDS.from },
                  { label: "to", name: "to", value: form.to, onChange: set("to"), slot: RANGE_FIELDS.to },
                  { label: form.binned ? "bins" : "points", name: "count", value: form.count, onChange: set("count"), slot: RANGE_FIELDS.count },
                ]}
                slot={slot === "range" || slot === RANGE_FIELDS.from || slot === RANGE_FIELDS.to || slot === RANGE_FIELDS.count ? slot : null}
                message={problemText}
              />
              <Check label="Bin-averaged over equal bins instead of values at points: an angle bin gives the cross section in the bin divided by the bin's width in the variable of the derivative (its solid angle ΔΩ for dσ/dΩ, Δcos θ for dσ/dcos θ, Δt for dσ/dt), as a measured bin does; an energy bin gives the mean over its energies" checked={form.binned} onChange={set("binned")} />
            </div>
          )}
          {scan && differential ? (
            <Field label="at θ, degrees" name="fixedAngle" value={form.fixedAngle} onChange={set("fixedAngle")} inputMode="decimal" error={err("fixedAngle")} />
          ) : null}
          {!differential ? (
            <div className="flex flex-col gap-2">
              <Check label="Only inside an angular acceptance (θ of the reference particle)" checked={form.acceptance} onChange={set("acceptance")} />
              {form.acceptance ? (
                <div className="grid grid-cols-2 gap-2">
                  <Field label="θ from, degrees" name="acceptanceFrom" value={form.acceptanceFrom} onChange={set("acceptanceFrom")} inputMode="decimal" />
                  <Field label="θ to, degrees" name="acceptanceTo" value={form.acceptanceTo} onChange={set("acceptanceTo")} inputMode="decimal" />
                </div>
              ) : null}
              {err("acceptance") ? <p className="text-sm text-madder" role="alert">{err("acceptance")}</p> : null}
            </div>
          ) : null}
          <SelectField label="Unit" name="unit" value={form.unit} onChange={set("unit")} error={err("unit")}>
            {unitChoices(form.observable).map((u) => <option key={u} value={u}>{unitLabel(u)}</option>)}
          </SelectField>
        </Group>

        <Group title="Axes of the chart">
          <div className="grid grid-cols-2 gap-2">
            <SelectField label="x axis" name="xScale" value={form.xScale} onChange={set("xScale")}>
              <option value="linear">linear</option><option value="log">log</option>
            </SelectField>
            <SelectField label="y axis" name="yScale" value={form.yScale} onChange={set("yScale")}>
              <option value="linear">linear</option><option value="log">log</option>
            </SelectField>
            <Field label="x from" name="xMin" placeholder="auto" value={form.xMin} onChange={set("xMin")} inputMode="decimal" error={viewErrors.xMin} />
            <Field label="x to" name="xMax" placeholder="auto" value={form.xMax} onChange={set("xMax")} inputMode="decimal" error={viewErrors.xMax} />
            <Field label="y from" name="yMin" placeholder="auto" value={form.yMin} onChange={set("yMin")} inputMode="decimal" error={viewErrors.yMin} />
            <Field label="y to" name="yMax" placeholder="auto" value={form.yMax} onChange={set("yMax")} inputMode="decimal" error={viewErrors.yMax} />
          </div>
          <p className="text-sm text-ink-soft">An empty end follows the curve. The address of this page keeps every setting: copy it to share the curve.</p>
        </Group>

        {info.acceptsScalarFormFactor ? (
          <Group title="Form factor of the composite scalar">
            <SelectField label="Form factor" name="formFactor" value={form.formFactor} onChange={set("formFactor")} error={err("formFactor")}>
              <option value="none">none (point-like)</option>
              <option value="monopole">monopole 1/(1 − q²/Λ²)²</option>
              <option value="vmd">vector-meson pole, mass and width</option>
            </SelectField>
            {form.formFactor === "monopole" ? (
              <Field label="Λ, GeV" name="formFactorLambda" value={form.formFactorLambda} onChange={set("formFactorLambda")} inputMode="decimal" error={err("formFactor.lambda")} />
            ) : null}
            {form.formFactor === "vmd" ? (
              <div className="grid grid-cols-2 gap-2">
                <Field label="m_V, GeV" name="formFactorMass" value={form.formFactorMass} onChange={set("formFactorMass")} inputMode="decimal" error={err("formFactor.mass")} />
                <Field label="Γ_V, GeV" name="formFactorWidth" value={form.formFactorWidth} onChange={set("formFactorWidth")} inputMode="decimal" error={err("formFactor.width")} />
              </div>
            ) : null}
            {form.formFactor !== "none" ? (
              <SelectField label="q² is" name="formFactorQ2" value={form.formFactorQ2} onChange={set("formFactorQ2")} error={err("formFactor.q2")}>
                <option value="s">s (timelike)</option><option value="t">t (momentum transfer)</option>
              </SelectField>
            ) : null}
          </Group>
        ) : null}
      </form>

      <section aria-labelledby="curve-h" className="flex min-w-0 flex-col gap-4">
        <h2 id="curve-h" className="sr-only">Curve</h2>
        <Notice tone="info">
          Born-level predictions only — no radiative corrections, resolution or acceptance effects. Follow the journal's and the collaboration's rules when comparing with data.
        </Notice>
        {slot === "general" ? <Notice tone="caution">{problemText}</Notice> : null}
        <div className="border border-rule bg-sheet p-3" aria-busy={busy}>
          {response && !current ? (
            <p className="px-1 pb-2 text-ink" role="status" data-testid="stale-curve">
              {problem
                ? `Out of date: this is the curve of an earlier input (${response.conventions.reaction}, ${OBSERVABLE_TITLE[response.observable]}); correct the marked field to see the curve of this one.`
                : "Out of date: computing the curve for the changed input…"}
            </p>
          ) : null}
          <div className={response && !current ? "opacity-35 grayscale" : ""}>
            {response === null ? (
              <p className="p-10 text-ink-soft">{problem ? "Nothing to show yet: correct the marked field." : "Computing…"}</p>
            ) : response.variable === null ? (
              <SingleValue response={response} />
            ) : (
              <CurveOf response={response} view={view} />
            )}
          </div>
        </div>
        {response && !current ? (
          <p className="text-sm text-ink-soft">The table can be downloaded once the curve matches the form.</p>
        ) : null}
        {response && csv ? (
          <div className="flex flex-wrap items-center gap-x-6 gap-y-2 text-sm">
            <span>engine <span className="font-mono">{response.engineVersion}</span></span>
            {Array.isArray(response.sqrtS) ? null : <span>√s = <span className="num">{response.sqrtS.toPrecision(6)}</span> GeV</span>}
            <span data-testid="parameters-hash">parameters <Fingerprint value={response.parametersHash} /></span>
            <a className="ml-auto border border-madder bg-madder px-3.5 py-1.5 font-medium text-sheet hover:bg-madder-dark"
              download={`${response.process}-${response.frame}-${response.parametersHash.slice(0, 8)}.csv`}
              href={`data:text/csv;charset=utf-8,${encodeURIComponent(csv)}`}>
              Download the table (CSV)
            </a>
          </div>
        ) : null}
        {response && current ? <AddToFigure figures={figures} layer={predictionLayerOf(form, info, built.body)} /> : null}
        <div className="border-t border-rule pt-3">
          <h2 className="mb-2 text-lg">Conventions</h2>
          <ConventionsList info={info} frame={response?.frame ?? form.frame} response={response && response.process === info.id ? response : null} />
        </div>
        {response && current && response.values.length > 1 ? <ValuesTable response={response} /> : null}
      </section>
    </div>
  );
}

type FigureChoice = { id: string; title: string; manuscriptId: string; manuscriptTitle: string };

/** Adds the shown prediction as a layer of a chosen figure's draft (figures of manuscripts the user is an author of). */
function AddToFigure({ figures, layer }: { figures: FigureChoice[]; layer: Record<string, unknown> | null }) {
  const fetcher = useFetcher<typeof action>();
  const id = useId();
  if (layer === null) return null;
  if (figures.length === 0) {
    return <p className="text-sm text-ink-soft">To add this curve to a figure, start a figure in a manuscript you are an author of.</p>;
  }
  const result = fetcher.data;
  return (
    <fetcher.Form method="post" className="flex flex-wrap items-end gap-3 border-t border-rule pt-3 text-sm" aria-label="Add to a figure">
      <input type="hidden" name="layer" value={JSON.stringify(layer)} />
      <div className="flex min-w-64 flex-1 flex-col gap-1">
        <label htmlFor={id} className="font-medium">Add this prediction to a figure</label>
        <select id={id} name="figureId" className="border border-rule-strong bg-sheet px-2 py-1.5">
          {figures.map((f) => <option key={f.id} value={f.id}>{f.title} — {f.manuscriptTitle}</option>)}
        </select>
      </div>
      <button type="submit" className="border border-ink px-3.5 py-1.5 font-medium hover:bg-ink hover:text-sheet" disabled={fetcher.state !== "idle"}>
        {fetcher.state === "idle" ? "Add to the figure's draft" : "Adding…"}
      </button>
      <p className="w-full text-ink-soft">The figure draws it on its own axes, at this process, energy, masses, α and form factor; it becomes the draft's next revision.</p>
      {result ? (
        result.ok ? (
          <p role="status" className="w-full text-ok">Added to “{result.figureTitle}” as draft revision {result.draftRevision}. <a className="underline" href={result.figureUrl}>Open the figure</a></p>
        ) : (
          <p role="alert" className="w-full text-madder">{result.message}</p>
        )
      ) : null}
    </fetcher.Form>
  );
}

function Group({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-2.5 border-t border-rule pt-3">
      <legend className="pr-2 text-xs font-medium uppercase tracking-wider text-ink-soft">{title}</legend>
      {children}
    </fieldset>
  );
}

type RangeInput = { label: string; name: string; value: string; onChange: React.ChangeEventHandler<HTMLInputElement>; slot: ErrorSlot };

/** From, to and count side by side; an error of one of them is written under the row, where it has room. */
function RangeInputs({ inputs, slot, message }: { inputs: RangeInput[]; slot: ErrorSlot | null; message?: string }) {
  const id = useId();
  return (
    <>
      <div className="grid grid-cols-3 gap-2">
        {inputs.map((input) => {
          const bad = slot === input.slot || slot === "range";
          return (
            <div key={input.name} className="flex flex-col gap-1">
              <label htmlFor={`${id}-${input.name}`} className="text-sm font-medium text-ink">{input.label}</label>
              <input id={`${id}-${input.name}`} name={input.name} value={input.value} onChange={input.onChange} inputMode={input.name === "count" ? "numeric" : "decimal"}
                aria-invalid={bad ? true : undefined} aria-describedby={bad ? `${id}-error` : undefined}
                className={`min-w-0 border bg-sheet px-2.5 py-1.5 text-ink focus:border-ink ${bad ? "border-madder" : "border-rule-strong"}`} />
            </div>
          );
        })}
      </div>
      {slot && message ? <p id={`${id}-error`} className="text-sm text-madder" role="alert">{message}</p> : null}
    </>
  );
}

function Check({ label, ...rest }: { label: string } & React.InputHTMLAttributes<HTMLInputElement>) {
  return (
    <label className="flex items-start gap-2">
      <input type="checkbox" className="mt-0.5 accent-ink" {...rest} />
      <span>{label}</span>
    </label>
  );
}

function CurveOf({ response: r, view }: { response: PredictionResponse; view: ChartView }) {
  const { spec, description, notes } = useMemo(() => predictionChartSpec(r, view), [r, view]);
  return (
    <>
      <PredictionChart spec={spec} description={description} />
      {notes.map((n) => <p key={n} className="px-1 pt-2 text-sm text-ink-soft">{n}</p>)}
    </>
  );
}

function SingleValue({ response: r }: { response: PredictionResponse }) {
  const acc = r.parameters.acceptance;
  return (
    <p className="p-8 text-center" data-testid="prediction-value">
      <span className="font-serif text-lg">σ{acc ? ` (${acc.range[0]}${acc.variable === "thetaDeg" ? "°" : ""} < ${acc.variable === "thetaDeg" ? "θ" : "cos θ"} < ${acc.range[1]}${acc.variable === "thetaDeg" ? "°" : ""})` : ""} = </span>
      <span className="num text-2xl">{r.values[0].toPrecision(8)}</span> <span>{unitLabel(r.unit)}</span>
    </p>
  );
}

function ValuesTable({ response: r }: { response: PredictionResponse }) {
  const x = xTitleOf(r);
  const scanS = Array.isArray(r.sqrtS) && r.variable !== "sqrtS" ? r.sqrtS : null;
  return (
    <details className="border-t border-rule pt-3 text-sm">
      <summary className="cursor-pointer text-ink-soft">Table ({r.values.length} rows)</summary>
      <div className="mt-2 max-h-72 overflow-auto border border-rule bg-sheet">
        <table className="w-full text-right font-mono text-xs">
          <thead className="sticky top-0 bg-sheet">
            <tr className="border-b border-rule">
              {r.binned ? <><th className="px-3 py-1 font-medium">bin from, {x}</th><th className="px-3 py-1 font-medium">bin to, {x}</th></> : <th className="px-3 py-1 font-medium">{x}</th>}
              {scanS ? <th className="px-3 py-1 font-medium">√s, GeV</th> : null}
              <th className="px-3 py-1 font-medium">{OBSERVABLE_TITLE[r.observable]}, {unitLabel(r.unit)}</th>
            </tr>
          </thead>
          <tbody>
            {r.values.map((v, i) => (
              <tr key={i} className="border-b border-rule/60">
                {r.binned ? <><td className="px-3 py-0.5">{r.bins![i][0]}</td><td className="px-3 py-0.5">{r.bins![i][1]}</td></> : <td className="px-3 py-0.5">{r.points![i]}</td>}
                {scanS ? <td className="px-3 py-0.5">{scanS[i].toPrecision(8)}</td> : null}
                <td className="px-3 py-0.5">{v.toPrecision(10)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </details>
  );
}

export const meta: Route.MetaFunction = () => [{ title: "Predictions · Steradian" }];


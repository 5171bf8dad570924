import { useEffect, useMemo, useState } from "react";
import { Link, data, useFetcher, useLoaderData, useRevalidator } from "react-router";
import type { Route } from "./+types/figure";
import { listDatasets } from "~/.server/datasets/dataset-repository.server";
import { db } from "~/.server/platform/db.server";
import { loadFigurePage } from "~/.server/figures/figure-access.server";
import { loadDatasetInputs } from "~/.server/figures/figure-inputs.server";
import { FigureTitleTaken, saveDraft } from "~/.server/figures/figure-repository.server";
import { draftSaveSchema } from "~/.server/figures/figure-service.server";
import { parseStoredDraft } from "~/.server/figures/render-draft.server";
import { listVersionSummaries } from "~/.server/versions/version-repository.server";
import { clientIp } from "~/.server/platform/http/client-address.server";
import { Choice, NumberInput, Row, Section, TextInput, type PathErrors } from "~/components/figure-editor/fields";
import { LayerEditor } from "~/components/figure-editor/layer-editor";
import { TrueSizeView } from "~/components/figure-editor/true-size";
import { useFigurePreview } from "~/components/figure-editor/use-figure-preview";
import { ManuscriptNav } from "~/components/manuscript-nav";
import { FigureVersionsPanel } from "~/components/versions/figure-versions-panel";
import { Button } from "~/components/ui/button";
import { Notice } from "~/components/ui/notice";
import { PROCESSES } from "~/engine";
import { draftMetadata } from "~/figures/draft-metadata";
import { describeFigure, plainTextTex, xLabelTex, yLabelTex } from "~/figures/figure-labels";
import { figureModelIssues, figureModelSchema, OBSERVABLES, X_VARIABLES, type FigureLayer, type FigureModel } from "~/figures/figure-model";
import { findPreset, DEFAULT_PRESET_ID, SIZE_PRESETS } from "~/figures/journal-presets";
import { colourFor, markerFor } from "~/figures/palette";
import { predictionLayerFor } from "~/figures/starter-model";
import { PT_PER_MM } from "~/figures/build-figure";
import { svgForPage } from "~/figures/svg-for-page";

export async function loader({ request, params }: Route.LoaderArgs) {
  const page = await loadFigurePage(request, params);
  const draft = parseStoredDraft(page.figure);
  const [inputs, datasets, versions] = await Promise.all([
    draft.ok ? loadDatasetInputs(db, page.figure.manuscript_id, draft.model) : Promise.resolve({}),
    listDatasets(db, page.figure.manuscript_id),
    listVersionSummaries(db, page.figure.id),
  ]);
  const { figure } = page;
  return {
    manuscript: page.manuscript, role: page.role, can: page.can,
    figure: { id: figure.id, title: figure.title, draftRevision: figure.draft_revision, updatedAt: figure.updated_at },
    model: draft.ok ? draft.model : null,
    draftIssues: draft.ok ? [] : draft.issues,
    inputs,
    datasets: datasets.filter((d) => d.latestRevision != null).map((d) => ({ id: d.id, name: d.name, latestRevision: Number(d.latestRevision) })),
    versions: versions.map((v) => ({
      number: v.number, state: v.state, fingerprint: v.fingerprint, draftRevision: v.draft_revision, sealedAt: v.sealed_at, sealedByName: v.sealedByName,
      next: { text: v.next.text, names: v.next.names }, supersededByNumber: v.supersededByNumber,
    })),
  };
}

/** The page's save: the same checks and the same guarded update as PUT /api/v1/figures/:id/draft. */
export async function action({ request, params, context }: Route.ActionArgs) {
  const { user, figure } = await loadFigurePage(request, params, "edit:figure");
  const body = draftSaveSchema.safeParse(await request.json().catch(() => null));
  if (!body.success) return data({ kind: "invalid" as const, message: body.error.issues[0].message, issues: [] }, { status: 422 });
  const model = figureModelSchema.safeParse(body.data.model);
  if (!model.success) return data({ kind: "invalid" as const, message: "The figure has fields that need attention.", issues: figureModelIssues(model.error) }, { status: 422 });
  try {
    const saved = await saveDraft(db, { figureId: figure.id, manuscriptId: figure.manuscript_id, baseRevision: body.data.baseRevision, model: model.data, title: body.data.title, userId: user.id, ip: clientIp(context) });
    if (saved.kind === "conflict") {
      return data({ kind: "conflict" as const, message: `${saved.updatedByName} saved this draft since you opened it (it is now at revision ${saved.currentRevision}). Your latest change was not saved.`, currentRevision: saved.currentRevision }, { status: 409 });
    }
    return { kind: "saved" as const, draftRevision: saved.draftRevision };
  } catch (e) {
    if (e instanceof FigureTitleTaken) return data({ kind: "invalid" as const, message: e.message, issues: [{ path: "title", message: e.message }] }, { status: 422 });
    throw e;
  }
}

const freshId = (model: FigureModel, prefix: string) => {
  const used = new Set(model.panels.flatMap((p) => [p.id, ...p.layers.map((l) => l.id)]));
  let n = 1;
  while (used.has(`${prefix}-${n}`)) n++;
  return `${prefix}-${n}`;
};

export default function FigurePage() {
  const loaded = useLoaderData<typeof loader>();
  const { manuscript, role, can, figure, inputs, datasets, versions } = loaded;
  const editable = can["edit:figure"];
  const fetcher = useFetcher<typeof action>();
  const revalidator = useRevalidator();
  const [draft, setDraft] = useState<FigureModel | null>(loaded.model);
  const [title, setTitle] = useState(figure.title);
  const [base, setBase] = useState(figure.draftRevision);
  const [dirty, setDirty] = useState(false);
  const [conflict, setConflict] = useState<string | null>(null);
  const [saveError, setSaveError] = useState<{ message: string; issues: { path: string; message: string }[] } | null>(null);
  const [editedAt, setEditedAt] = useState(0);
  const [trueSize, setTrueSize] = useState(false);

  const checked = useMemo(() => (draft === null ? null : figureModelSchema.safeParse(draft)), [draft]);
  const valid = checked?.success ? checked.data : null;
  const [shown, setShown] = useState<FigureModel | null>(loaded.model);
  useEffect(() => { if (valid) setShown(valid); }, [valid]);

  const metadata = useMemo(() => draftMetadata({ id: figure.id, title, draftRevision: base }, shown ?? ({ altText: "" } as FigureModel)), [figure.id, title, base, shown]);
  const preview = useFigurePreview(shown, inputs, metadata, editedAt);

  const errors: PathErrors = useMemo(() => {
    const out: Record<string, string> = {};
    if (checked && !checked.success) for (const i of figureModelIssues(checked.error)) out[i.path] ??= i.message;
    for (const i of saveError?.issues ?? []) out[i.path] ??= i.message;
    for (const t of preview.texErrors) out[t.path] ??= `This TeX does not render: ${t.message}`;
    return out;
  }, [checked, saveError, preview.texErrors]);

  function edit(fn: (m: FigureModel) => void) {
    if (draft === null || !editable) return;
    const next = structuredClone(draft);
    fn(next);
    setDraft(next);
    setDirty(true);
    setEditedAt(performance.now());
  }

  // Saves a short pause after the last edit, one save at a time, each based on the revision the previous one made.
  // `queued` covers the moment between handing the save to the fetcher and the fetcher reporting it
  // busy, so that the page never says "saved" (nor offers to seal) while a save is on its way.
  const [queued, setQueued] = useState(false);
  useEffect(() => { if (fetcher.state !== "idle") setQueued(false); }, [fetcher.state]);
  useEffect(() => {
    if (!dirty || conflict !== null || fetcher.state !== "idle" || valid === null) return;
    const timer = setTimeout(() => {
      setDirty(false);
      setQueued(true);
      fetcher.submit({ baseRevision: base, model: valid, title: title.trim() === "" ? figure.title : title }, { method: "post", encType: "application/json" });
    }, 350);
    return () => clearTimeout(timer);
  }, [dirty, conflict, fetcher, fetcher.state, valid, base, title, figure.title]);

  useEffect(() => {
    const r = fetcher.data;
    if (!r) return;
    if (r.kind === "saved") { setBase(r.draftRevision); setSaveError(null); }
    else if (r.kind === "conflict") setConflict(r.message);
    else setSaveError({ message: r.message, issues: r.issues });
  }, [fetcher.data]);

  if (draft === null) {
    return (
      <>
        <ManuscriptNav manuscript={manuscript} role={role} can={can} />
        <Notice tone="caution">The stored draft of this figure does not read as a figure: {loaded.draftIssues.map((i) => `${i.path}: ${i.message}`).join("; ")}.</Notice>
      </>
    );
  }

  const preset = findPreset(draft.preset) ?? findPreset(DEFAULT_PRESET_ID)!;
  const saving = fetcher.state !== "idle" || queued ? "saving…" : dirty ? "edited" : conflict ? "not saved" : `saved · revision ${base}`;
  const figureProblems = preview.problems.filter((p) => p.layerId === null);
  const generated = preview.xDomain && preview.yDomain && shown ? describeFigure(shown, { x: preview.xDomain, y: preview.yDomain }) : "";

  const axisEdit = (axis: "x" | "y", fn: (m: FigureModel) => void, relabel: boolean) =>
    edit((m) => {
      const before = { x: xLabelTex(m.x.variable, m.x.frame, m.x.energyUnit), y: yLabelTex(m.y.observable, m.y.unit, m.x.frame) };
      fn(m);
      // A label that is still the generated one follows the axis; one the author wrote stays.
      if (relabel && m.x.label === before.x) m.x.label = xLabelTex(m.x.variable, m.x.frame, m.x.energyUnit);
      if (relabel && m.y.label === before.y) m.y.label = yLabelTex(m.y.observable, m.y.unit, m.x.frame);
      void axis;
    });

  return (
    <>
      <ManuscriptNav manuscript={manuscript} role={role} can={can} />
      <div className="mb-4 flex flex-wrap items-baseline gap-4">
        <h2 className="flex-1 font-serif text-2xl">{title || figure.title}</h2>
        <span className="font-mono text-xs text-ink-soft" data-testid="save-state" aria-live="polite">{saving}</span>
        <a className="text-sm underline underline-offset-4" href={`/api/v1/figures/${figure.id}/draft.svg?download`} data-testid="draft-download">Download the draft SVG</a>
        <Link className="text-sm underline underline-offset-4" to={`/manuscripts/${manuscript.id}/figures`}>All figures</Link>
      </div>
      {conflict ? (
        <div className="mb-4" data-testid="conflict">
          <Notice tone="caution">
            {conflict}{" "}
            <button type="button" className="underline underline-offset-4" onClick={() => { setConflict(null); setDirty(false); window.location.reload(); }}>Reload the saved draft</button>
            {" "}(your unsaved change is lost) — nothing is overwritten silently.
          </Notice>
        </div>
      ) : null}
      {saveError && !conflict ? <div className="mb-4"><Notice tone="caution">{saveError.message}</Notice></div> : null}
      {!editable ? <div className="mb-4"><Notice>You can read this figure; editing needs the role of corresponding author or contributor.</Notice></div> : null}
      <FigureVersionsPanel base={`/manuscripts/${manuscript.id}/figures/${figure.id}`} versions={versions} draftRevision={base} canSeal={can["seal:figure"]}
        busy={dirty || queued || fetcher.state !== "idle" || conflict !== null || valid === null} />
      <div className="grid grid-cols-[26rem_1fr] gap-8 max-xl:grid-cols-1">
        <form className="flex flex-col" onSubmit={(e) => e.preventDefault()} aria-label="Figure settings">
          <fieldset disabled={!editable} className="contents">
            <Section title="Figure">
              <TextInput label="Title" value={title} maxLength={200} onChange={(v) => { setTitle(v); setDirty(true); setEditedAt(performance.now()); }} error={errors.title} />
              <Choice label="Size" value={draft.preset} options={SIZE_PRESETS.map((p) => ({ value: p.id, label: `${p.name} — ${p.widthMm} mm` }))} onChange={(v) => edit((m) => {
                const next = findPreset(v);
                m.preset = v;
                if (next) { m.fontSizePt = Math.max(m.fontSizePt, next.minTextPt); m.lineWidthPt = Math.max(m.lineWidthPt, next.minLineWidthPt); }
              })} />
              <p className="text-xs text-ink-faint">{preset.note}</p>
              <Row>
                <NumberInput label="Text size (pt)" value={draft.fontSizePt} onChange={(v) => v !== null && edit((m) => { m.fontSizePt = v; })} error={errors.fontSizePt ?? (draft.fontSizePt < preset.minTextPt ? `Below the ${preset.minTextPt} pt this size asks for.` : undefined)} />
                <NumberInput label="Line width (pt)" value={draft.lineWidthPt} onChange={(v) => v !== null && edit((m) => { m.lineWidthPt = v; })} error={errors.lineWidthPt ?? (draft.lineWidthPt < preset.minLineWidthPt ? `Below the ${preset.minLineWidthPt} pt this size asks for.` : undefined)} />
              </Row>
              <Row>
                <NumberInput label="Panel height (mm)" value={draft.panelHeightMm} onChange={(v) => v !== null && edit((m) => { m.panelHeightMm = v; })} error={errors.panelHeightMm} />
                <Choice label="Panels per row" value={String(draft.columns)} options={[1, 2, 3].map((n) => ({ value: String(n), label: String(n) }))} onChange={(v) => edit((m) => { m.columns = Number(v); })} />
              </Row>
            </Section>
            <Section title="Axes">
              <Row>
                <Choice label="x" testId="x-variable" value={draft.x.variable} options={X_VARIABLES.map((v) => ({ value: v, label: { thetaDeg: "θ (degrees)", cosTheta: "cos θ", t: "t (GeV²)", sqrtS: "√s", beam: "beam energy", kinetic: "beam kinetic energy" }[v] }))} onChange={(v) => axisEdit("x", (m) => { m.x.variable = v; m.x.domain = null; }, true)} />
                <Choice label="Frame" value={draft.x.frame} options={[{ value: "lab", label: "lab" }, { value: "cm", label: "CM" }]} onChange={(v) => axisEdit("x", (m) => { m.x.frame = v; m.x.domain = null; }, true)} />
              </Row>
              <Row>
                <Choice label="x scale" value={draft.x.scale} options={[{ value: "linear", label: "linear" }, { value: "log", label: "log" }]} onChange={(v) => edit((m) => { m.x.scale = v; m.x.domain = null; })} />
                <Choice label="Energy unit" value={draft.x.energyUnit} options={["GeV", "MeV", "keV"].map((u) => ({ value: u as "GeV", label: u }))} onChange={(v) => axisEdit("x", (m) => { m.x.energyUnit = v; m.x.domain = null; }, true)} />
              </Row>
              <Row>
                <NumberInput label="x from (empty: auto)" allowEmpty value={draft.x.domain?.[0] ?? null} onChange={(v) => edit((m) => { m.x.domain = v === null ? null : [v, m.x.domain?.[1] ?? (preview.xDomain?.[1] ?? v + 1)]; })} error={errors["x.domain"]} />
                <NumberInput label="x to" allowEmpty value={draft.x.domain?.[1] ?? null} onChange={(v) => edit((m) => { m.x.domain = v === null ? null : [m.x.domain?.[0] ?? (preview.xDomain?.[0] ?? v - 1), v]; })} />
              </Row>
              <TextInput label="x label" tex value={draft.x.label} onChange={(v) => edit((m) => { m.x.label = v; })} error={errors["x.label"]} />
              <Row>
                <Choice label="y" value={draft.y.observable} options={OBSERVABLES.map((o) => ({ value: o, label: { "dsigma/dOmega": "dσ/dΩ", "dsigma/dcos": "dσ/dcos θ", "dsigma/dt": "dσ/dt", sigma: "σ" }[o] }))} onChange={(v) => axisEdit("y", (m) => {
                  m.y.observable = v;
                  m.y.unit = { "dsigma/dOmega": "ub/sr", "dsigma/dcos": "ub", "dsigma/dt": "ub/GeV^2", sigma: "ub" }[v];
                  m.y.domain = null;
                }, true)} />
                <TextInput label="y unit" value={draft.y.unit} onChange={(v) => axisEdit("y", (m) => { m.y.unit = v; m.y.domain = null; }, true)} error={errors["y.unit"]} />
              </Row>
              <Row>
                <Choice label="y scale" value={draft.y.scale} options={[{ value: "log", label: "log" }, { value: "linear", label: "linear" }]} onChange={(v) => edit((m) => { m.y.scale = v; m.y.domain = null; })} />
                <span />
              </Row>
              <Row>
                <NumberInput label="y from (empty: auto)" allowEmpty value={draft.y.domain?.[0] ?? null} onChange={(v) => edit((m) => { m.y.domain = v === null ? null : [v, m.y.domain?.[1] ?? (preview.yDomain?.[1] ?? v * 10)]; })} error={errors["y.domain"]} />
                <NumberInput label="y to" allowEmpty value={draft.y.domain?.[1] ?? null} onChange={(v) => edit((m) => { m.y.domain = v === null ? null : [m.y.domain?.[0] ?? (preview.yDomain?.[0] ?? v / 10), v]; })} />
              </Row>
              <TextInput label="y label" tex value={draft.y.label} onChange={(v) => edit((m) => { m.y.label = v; })} error={errors["y.label"]} />
              <Row>
                <Choice label="Legend" value={draft.legend.position} options={[{ value: "upper-right", label: "upper right" }, { value: "upper-left", label: "upper left" }, { value: "lower-left", label: "lower left" }, { value: "lower-right", label: "lower right" }, { value: "none", label: "no legend" }]} onChange={(v) => edit((m) => { m.legend.position = v; })} />
                <Choice label="χ², p-value, normalisation" value={draft.legend.statistics} options={[{ value: "legend", label: "in the legend" }, { value: "caption", label: "on a caption line" }, { value: "none", label: "not shown" }]} onChange={(v) => edit((m) => { m.legend.statistics = v; })} />
              </Row>
            </Section>
            {draft.panels.map((panel, p) => {
              const predictions = panel.layers.filter((l) => l.kind === "prediction").map((l) => ({ id: l.id, label: l.kind === "prediction" ? l.label : "" }));
              return (
                <Section key={panel.id} title={draft.panels.length === 1 ? "Layers" : `Panel ${p + 1} and its layers`} testId={`panel-${p}`}>
                  <Row>
                    <Choice label="Below the panel" testId={`strip-${p}`} value={panel.strip} options={[{ value: "none", label: "nothing" }, { value: "ratio", label: "ratio data / prediction" }, { value: "pull", label: "pull (data − prediction)/σ" }]} onChange={(v) => edit((m) => { m.panels[p].strip = v; })} />
                    <TextInput label="Panel title" tex value={panel.title} onChange={(v) => edit((m) => { m.panels[p].title = v; })} error={errors[`panels.${p}.title`]} />
                  </Row>
                  {panel.layers.map((layer, l) => (
                    <LayerEditor
                      key={layer.id}
                      layer={layer}
                      path={`panels.${p}.layers.${l}`}
                      errors={errors}
                      problems={preview.problems.filter((x) => x.layerId === layer.id)}
                      edit={(fn) => edit((m) => fn(m.panels[p].layers[l] as never))}
                      remove={() => edit((m) => {
                        const [gone] = m.panels[p].layers.splice(l, 1);
                        for (const other of m.panels[p].layers) if (other.kind === "dataset" && other.compareWith === gone.id) other.compareWith = null;
                      })}
                      panelPredictions={predictions}
                      datasets={datasets}
                      inputs={inputs}
                    />
                  ))}
                  <div className="flex flex-wrap gap-2">
                    {datasets.length > 0 ? (
                      <select aria-label="Add a dataset" className="border border-rule-strong bg-sheet px-2 py-1 text-sm" value="" onChange={(e) => {
                        const d = datasets.find((x) => x.id === e.target.value);
                        if (!d) return;
                        edit((m) => {
                          const count = m.panels[p].layers.filter((x) => x.kind === "dataset").length;
                          const layer: FigureLayer = {
                            kind: "dataset", id: freshId(m, "data"), label: plainTextTex(d.name), datasetId: d.id, revisionNumber: d.latestRevision,
                            colour: count === 0 ? "#1b1a17" : colourFor(count + 3), marker: markerFor(count).id, normalisationUncertainty: null,
                            compareWith: m.panels[p].layers.find((x) => x.kind === "prediction")?.id ?? null,
                          };
                          m.panels[p].layers.push(layer);
                        });
                      }}>
                        <option value="">Add a dataset…</option>
                        {datasets.map((d) => <option key={d.id} value={d.id}>{d.name} (r{d.latestRevision})</option>)}
                      </select>
                    ) : null}
                    <select aria-label="Add a prediction" data-testid={`add-prediction-${p}`} className="border border-rule-strong bg-sheet px-2 py-1 text-sm" value="" onChange={(e) => {
                      const process = e.target.value;
                      if (!process) return;
                      edit((m) => {
                        const existing = m.panels[p].layers.find((x) => x.kind === "prediction");
                        const energy = existing?.kind === "prediction" ? { ...existing.energy } : { kind: "kinetic" as const, value: 0.5, unit: "GeV" as const };
                        const count = m.panels[p].layers.filter((x) => x.kind === "prediction").length;
                        m.panels[p].layers.splice(count, 0, predictionLayerFor(process, energy, count, freshId(m, "prediction")));
                        for (const x of m.panels[p].layers) if (x.kind === "dataset" && x.compareWith === null) x.compareWith = m.panels[p].layers[count].id;
                      });
                    }}>
                      <option value="">Add a prediction…</option>
                      {PROCESSES.map((x) => <option key={x.id} value={x.id}>{x.reaction} ({x.theory})</option>)}
                    </select>
                    <Button type="button" onClick={() => edit((m) => { m.panels[p].layers.push({ kind: "annotation", id: freshId(m, "note"), tex: "\\text{synthetic data}", at: [0.05, 0.08] }); })}>Add an annotation</Button>
                    {draft.panels.length > 1 ? <Button type="button" kind="danger" onClick={() => edit((m) => { m.panels.splice(p, 1); })}>Remove this panel</Button> : null}
                  </div>
                </Section>
              );
            })}
            {draft.panels.length < 6 ? (
              <div className="py-3">
                <Button type="button" onClick={() => edit((m) => {
                  const copy = structuredClone(m.panels[m.panels.length - 1]);
                  copy.id = freshId(m, "panel");
                  for (const layer of copy.layers) {
                    const old = layer.id;
                    layer.id = freshId({ ...m, panels: [...m.panels, copy] }, layer.kind === "annotation" ? "note" : layer.kind === "dataset" ? "data" : "prediction");
                    for (const other of copy.layers) if (other.kind === "dataset" && other.compareWith === old) other.compareWith = layer.id;
                  }
                  m.panels.push(copy);
                  if (m.panels.length > 1 && m.columns === 1) m.columns = 2;
                })}>Add a panel (a copy of the last)</Button>
              </div>
            ) : null}
            <Section title="Alt text">
              <TextInput label="Alt text (read aloud in place of the figure)" multiline value={draft.altText} maxLength={2000} onChange={(v) => edit((m) => { m.altText = v; })} error={errors.altText}
                hint={`${draft.altText.length} characters; journals and screen readers favour one to three sentences (about 100–300 characters). Empty: the generated description below is used.`} />
              {generated ? <p className="text-xs text-ink-soft" data-testid="generated-description">Generated: {generated}</p> : null}
              {generated ? <Button type="button" onClick={() => edit((m) => { m.altText = generated; })}>Use the generated description</Button> : null}
            </Section>
          </fieldset>
        </form>
        <section aria-labelledby="preview-h" className="flex min-w-0 flex-col gap-3">
          <div className="flex items-baseline gap-4">
            <h3 id="preview-h" className="flex-1 font-serif text-lg">Preview</h3>
            <label className="text-sm"><input type="checkbox" checked={trueSize} onChange={(e) => setTrueSize(e.target.checked)} /> at printed size, with a ruler</label>
          </div>
          <p className="text-xs text-ink-faint">The preview is drawn by the same code as the server's draft SVG and the export. A draft is not a sealed version. Check the figure against your journal's and your collaboration's own rules: they prevail over this tool's presets.</p>
          {preview.error ? <Notice tone="caution">The preview could not be drawn: {preview.error}</Notice> : null}
          {figureProblems.length > 0 ? <ul className="text-sm text-madder" data-testid="figure-problems">{figureProblems.map((x, i) => <li key={i}>{x.message}</li>)}</ul> : null}
          {checked && !checked.success ? <p className="text-sm text-madder">Some fields need attention: the preview shows the last valid state.</p> : null}
          {preview.svg === null ? <p className="text-ink-soft">Drawing the figure…</p> : trueSize ? (
            <TrueSizeView svg={preview.svg} widthMm={preset.widthMm} heightMm={(preview.svg.match(/viewBox="0 0 [\d.]+ ([\d.]+)"/)?.[1] ? Number(preview.svg.match(/viewBox="0 0 [\d.]+ ([\d.]+)"/)![1]) : 0) / PT_PER_MM} smallestTextPt={preview.smallestTextPt} thinnestLinePt={preview.thinnestLinePt} />
          ) : (
            <div className="border border-rule bg-white p-2 [&>svg]:h-auto [&>svg]:w-full" data-testid="figure-preview" data-rendered-key={preview.renderedKey ?? ""} data-render-ms={preview.renderMs ?? ""} data-draft-revision={base}
              dangerouslySetInnerHTML={{ __html: svgForPage(preview.svg) }} />
          )}
          {preview.svg !== null ? <PreviewDownload svg={preview.svg} title={title || figure.title} /> : null}
          {preview.renderMs !== null ? <p className="font-mono text-xs text-ink-faint">drawn {preview.renderMs} ms after the edit</p> : null}
          {revalidator.state !== "idle" ? <p className="text-xs text-ink-faint">Loading the revisions…</p> : null}
        </section>
      </div>
    </>
  );
}

/** The preview exactly as drawn here, as a file: the same bytes as the server's draft.svg for a saved draft. */
function PreviewDownload({ svg, title }: { svg: string; title: string }) {
  const [href, setHref] = useState<string | null>(null);
  useEffect(() => {
    const url = URL.createObjectURL(new Blob([svg], { type: "image/svg+xml" }));
    setHref(url);
    return () => URL.revokeObjectURL(url);
  }, [svg]);
  if (href === null) return null;
  return <a className="self-start text-xs underline underline-offset-4" href={href} download={`${title.replace(/[^\w.\- ]+/g, "_")} (preview).svg`} data-testid="preview-download">Save the preview as drawn here (SVG)</a>;
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.figure.title ?? "Figure"} · Steradian` }];

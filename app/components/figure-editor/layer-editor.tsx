import { PROCESSES } from "~/engine";
import type { DatasetInputs, FigureProblem } from "~/figures/figure-inputs";
import { datasetInputKey } from "~/figures/figure-inputs";
import { BAND_PARAMETERS, type BandParameter, type DatasetLayer, type FigureLayer, type PredictionLayer } from "~/figures/figure-model";
import { FIGURE_COLOURS, MARKER_SHAPES } from "~/figures/palette";
import { Choice, NumberInput, Row, TextInput, type PathErrors } from "./fields";

export interface DatasetChoice {
  id: string;
  name: string;
  latestRevision: number;
}

const INK = { value: "#1b1a17", label: "ink (black)" };
const colourOptions = [INK, ...FIGURE_COLOURS.map((c) => ({ value: c.hex, label: c.name }))];
const ENERGY_KINDS = [
  { value: "kinetic", label: "beam kinetic energy T" },
  { value: "beam", label: "beam energy E (total)" },
  { value: "sqrtS", label: "√s" },
] as const;
const ENERGY_UNITS = [{ value: "GeV", label: "GeV" }, { value: "MeV", label: "MeV" }, { value: "keV", label: "keV" }] as const;
const BAND_LABELS: Record<(typeof BAND_PARAMETERS)[number], string> = {
  "formFactor.lambda": "form-factor scale Λ (GeV)",
  alpha: "coupling α",
  mass: "mass (GeV)",
  energy: "energy (the layer's unit)",
};

interface Props<L extends FigureLayer> {
  layer: L;
  path: string;
  errors: PathErrors;
  problems: FigureProblem[];
  edit: (fn: (layer: L) => void) => void;
  remove: () => void;
  panelPredictions: { id: string; label: string }[];
  datasets: DatasetChoice[];
  inputs: DatasetInputs;
}

function Problems({ problems }: { problems: FigureProblem[] }) {
  if (problems.length === 0) return null;
  return (
    <ul className="flex flex-col gap-1 text-xs text-madder" data-testid="layer-problems">
      {problems.map((p, i) => <li key={i}>{p.message}</li>)}
    </ul>
  );
}

function Frame({ title, remove, children }: { title: string; remove: () => void; children: React.ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-2 border border-rule p-3">
      <legend className="px-1 text-sm font-medium">{title}</legend>
      {children}
      <button type="button" onClick={remove} className="self-start text-xs text-ink-soft underline underline-offset-4 hover:text-madder">Remove this layer</button>
    </fieldset>
  );
}

function DatasetLayerEditor({ layer, path, errors, problems, edit, remove, panelPredictions, datasets, inputs }: Props<DatasetLayer>) {
  const dataset = datasets.find((d) => d.id === layer.datasetId);
  const pinned = inputs[datasetInputKey(layer.datasetId, layer.revisionNumber)];
  const latest = pinned?.latestRevisionNumber ?? dataset?.latestRevision ?? layer.revisionNumber;
  return (
    <Frame title={`Data: ${dataset?.name ?? "a dataset not in this manuscript"} · r${layer.revisionNumber}`} remove={remove}>
      {latest > layer.revisionNumber ? (
        <p className="flex flex-wrap items-baseline gap-2 border-l-2 border-warn bg-paper px-2 py-1 text-xs" data-testid="newer-revision">
          A newer revision r{latest} of this dataset exists; the figure stays on r{layer.revisionNumber} until you move it.
          <button type="button" className="underline underline-offset-4" onClick={() => edit((l) => { l.revisionNumber = latest; })}>Move to r{latest}</button>
        </p>
      ) : null}
      <TextInput label="Legend entry" tex value={layer.label} onChange={(v) => edit((l) => { l.label = v; })} error={errors[`${path}.label`]} />
      <Row>
        <Choice label="Revision" value={String(layer.revisionNumber)} options={Array.from({ length: latest }, (_, i) => ({ value: String(latest - i), label: `r${latest - i}` }))} onChange={(v) => edit((l) => { l.revisionNumber = Number(v); })} />
        <Choice label="Compared with" value={layer.compareWith ?? ""} options={[{ value: "", label: "no prediction" }, ...panelPredictions.map((p) => ({ value: p.id, label: p.id }))]} onChange={(v) => edit((l) => { l.compareWith = v === "" ? null : v; })} error={errors[`${path}.compareWith`]} />
      </Row>
      <Row>
        <Choice label="Colour" value={layer.colour} options={colourOptions} onChange={(v) => edit((l) => { l.colour = v; })} />
        <Choice label="Marker" value={layer.marker} options={MARKER_SHAPES.map((m) => ({ value: m.id, label: m.name }))} onChange={(v) => edit((l) => { l.marker = v; })} />
      </Row>
      <NumberInput label="Normalisation uncertainty (fraction, fitted in χ²)" allowEmpty placeholder="none" value={layer.normalisationUncertainty} onChange={(v) => edit((l) => { l.normalisationUncertainty = v; })} error={errors[`${path}.normalisationUncertainty`]} hint="e.g. 0.03 for a 3 % luminosity uncertainty; empty: none" />
      <Problems problems={problems} />
    </Frame>
  );
}

function PredictionLayerEditor({ layer, path, errors, problems, edit, remove }: Props<PredictionLayer>) {
  const info = PROCESSES.find((p) => p.id === layer.process);
  return (
    <Frame title={`Prediction ${layer.id}: ${info ? `${info.theory}, ${info.reaction}` : layer.process}`} remove={remove}>
      <TextInput label="Legend entry" tex value={layer.label} onChange={(v) => edit((l) => { l.label = v; })} error={errors[`${path}.label`]} />
      <Choice label="Process" testId={`process-${layer.id}`} value={layer.process} options={PROCESSES.map((p) => ({ value: p.id, label: `${p.reaction} (${p.theory})` }))} onChange={(v) => edit((l) => { l.process = v; })} />
      <Row>
        <Choice label="Energy given as" value={layer.energy.kind} options={ENERGY_KINDS} onChange={(v) => edit((l) => { l.energy.kind = v; })} />
        <Choice label="Unit" value={layer.energy.unit} options={ENERGY_UNITS} onChange={(v) => edit((l) => {
          const factor = { GeV: 1, MeV: 1e-3, keV: 1e-6 };
          l.energy.value = Number(((l.energy.value * factor[l.energy.unit]) / factor[v]).toPrecision(12));
          l.energy.unit = v;
        })} />
      </Row>
      <NumberInput label={`Energy (${layer.energy.unit})`} testId={`energy-${layer.id}`} value={layer.energy.value} onChange={(v) => v !== null && edit((l) => { l.energy.value = v; })} error={errors[`${path}.energy.value`]} />
      <Row>
        <NumberInput label="α (empty: α(0), CODATA)" allowEmpty value={layer.alpha} onChange={(v) => edit((l) => { l.alpha = v; })} error={errors[`${path}.alpha`]} />
        <NumberInput label={`Mass, GeV (empty: ${info?.defaultMass ?? "default"})`} allowEmpty value={layer.mass} onChange={(v) => edit((l) => { l.mass = v; })} error={errors[`${path}.mass`]} />
      </Row>
      <Row>
        <Choice label="Form factor" value={layer.formFactor?.model ?? "none"} options={[{ value: "none", label: "none (point-like)" }, { value: "monopole", label: "monopole Λ" }]} onChange={(v) => edit((l) => { l.formFactor = v === "none" ? null : { model: "monopole", lambda: 0.77, q2: "s" }; })} />
        {layer.formFactor?.model === "monopole" ? (
          <NumberInput label="Λ (GeV)" value={layer.formFactor.lambda} onChange={(v) => v !== null && edit((l) => { if (l.formFactor?.model === "monopole") l.formFactor.lambda = v; })} error={errors[`${path}.formFactor.lambda`]} />
        ) : <span />}
      </Row>
      <Choice label="Band" value={layer.band?.parameter ?? "none"} options={[{ value: "none", label: "none: a line" }, ...BAND_PARAMETERS.map((p) => ({ value: p, label: `between two values of the ${BAND_LABELS[p]}` }))]} onChange={(v) => edit((l) => { l.band = v === "none" ? null : { parameter: v as BandParameter, low: l.band?.low ?? 0, high: l.band?.high ?? 1 }; })} />
      {layer.band ? (
        <Row>
          <NumberInput label="Band from" value={layer.band.low} onChange={(v) => v !== null && edit((l) => { if (l.band) l.band.low = v; })} error={errors[`${path}.band.low`]} />
          <NumberInput label="to" value={layer.band.high} onChange={(v) => v !== null && edit((l) => { if (l.band) l.band.high = v; })} error={errors[`${path}.band.high`]} />
        </Row>
      ) : null}
      <Row>
        <Choice label="Colour" value={layer.colour} options={colourOptions} onChange={(v) => edit((l) => { l.colour = v; })} />
        <Choice label="Line" value={layer.dash} options={[{ value: "solid", label: "solid" }, { value: "dashed", label: "dashed" }, { value: "dotted", label: "dotted" }, { value: "dashdot", label: "dash-dot" }]} onChange={(v) => edit((l) => { l.dash = v; })} />
      </Row>
      <Row>
        <NumberInput label="Fixed θ for an energy axis (deg)" allowEmpty value={layer.fixedThetaDeg} onChange={(v) => edit((l) => { l.fixedThetaDeg = v; })} error={errors[`${path}.fixedThetaDeg`]} />
        <NumberInput label="Points on the curve" value={layer.samples} onChange={(v) => v !== null && edit((l) => { l.samples = Math.round(v); })} error={errors[`${path}.samples`]} />
      </Row>
      <Problems problems={problems} />
    </Frame>
  );
}

export function LayerEditor(props: Props<FigureLayer>) {
  const { layer } = props;
  if (layer.kind === "dataset") return <DatasetLayerEditor {...(props as Props<DatasetLayer>)} />;
  if (layer.kind === "prediction") return <PredictionLayerEditor {...(props as Props<PredictionLayer>)} />;
  return (
    <Frame title={`Annotation ${layer.id}`} remove={props.remove}>
      <TextInput label="Text" tex value={layer.tex} onChange={(v) => props.edit((l) => { if (l.kind === "annotation") l.tex = v; })} error={props.errors[`${props.path}.tex`]} />
      <Row>
        <NumberInput label="Across (0 left – 1 right)" value={layer.at[0]} onChange={(v) => v !== null && props.edit((l) => { if (l.kind === "annotation") l.at = [v, l.at[1]]; })} error={props.errors[`${props.path}.at.0`]} />
        <NumberInput label="Up (0 bottom – 1 top)" value={layer.at[1]} onChange={(v) => v !== null && props.edit((l) => { if (l.kind === "annotation") l.at = [l.at[0], v]; })} error={props.errors[`${props.path}.at.1`]} />
      </Row>
      <Problems problems={props.problems} />
    </Frame>
  );
}

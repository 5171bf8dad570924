import { buildFigure, type BuiltFigure } from "./build-figure";
import { computeFigureData, type FigureData } from "./compute-figure-data";
import type { DatasetInputs, FigureProblem } from "./figure-inputs";
import { describeFigure } from "./figure-labels";
import type { FigureModel } from "./figure-model";
import { DEFAULT_PRESET_ID, findPreset } from "./journal-presets";
import { renderFigureSvg, TexCache, type SvgMetadata } from "./render-figure-svg";

export interface RenderedFigure {
  svg: string;
  data: FigureData;
  built: BuiltFigure;
  /** Data, prediction and TeX problems, each beside its layer or field. */
  problems: FigureProblem[];
  /** TeX that did not render: the model path of the field and MathJax's message. */
  texErrors: { path: string; message: string }[];
}

/** Every TeX field of a model with its path, for field errors. */
export function texFields(model: FigureModel): { path: string; tex: string }[] {
  const out = [
    { path: "x.label", tex: model.x.label },
    { path: "y.label", tex: model.y.label },
  ];
  model.panels.forEach((panel, p) => {
    if (panel.title !== "") out.push({ path: `panels.${p}.title`, tex: panel.title });
    panel.layers.forEach((layer, l) => {
      out.push({ path: `panels.${p}.layers.${l}.${layer.kind === "annotation" ? "tex" : "label"}`, tex: layer.kind === "annotation" ? layer.tex : layer.label });
    });
  });
  return out;
}

/**
 * The figure from its model and the pinned revisions: engine predictions, layout, TeX and vega,
 * to one SVG string. The browser preview and the server's draft.svg and export call this same
 * function (docs/decisions/0008-figure-model.md), so the preview is the export. A `cache` kept
 * between calls makes a re-render after an edit cost only the labels that changed.
 */
export async function renderFigure(model: FigureModel, inputs: DatasetInputs, metadata: SvgMetadata, cache = new TexCache()): Promise<RenderedFigure> {
  const data = computeFigureData(model, inputs);
  const preset = findPreset(model.preset) ?? findPreset(DEFAULT_PRESET_ID)!;
  const problems = [...data.problems];
  if (findPreset(model.preset) === undefined) problems.push({ layerId: null, message: `unknown size preset "${model.preset}": drawn at the default size` });
  let built = buildFigure(model, data, preset, cache.measure);
  // Every placed label must be typeset, also those the layout did not need to measure.
  for (const t of built.texts) cache.measure(t.tex, t.sizePt);
  if (cache.hasMissing) {
    await cache.fill();
    built = buildFigure(model, data, preset, cache.measure);
  }
  const texErrors = texFields(model).flatMap(({ path, tex }) => {
    const failure = cache.failure(tex);
    return failure === undefined ? [] : [{ path, message: failure }];
  });
  // Without alt text of the author's, the SVG carries the generated description.
  const description = metadata.description.trim() !== "" ? metadata.description : describeFigure(model, { x: data.xDomain, y: data.yDomain });
  const svg = await renderFigureSvg(built, cache, { ...metadata, description });
  return { svg, data, built: { ...built, problems }, problems, texErrors };
}

import { useEffect, useRef, useState } from "react";
import type { DatasetInputs, FigureProblem } from "~/figures/figure-inputs";
import type { FigureModel } from "~/figures/figure-model";
import type { SvgMetadata } from "~/figures/render-figure-svg";

type Renderer = typeof import("~/figures/render-figure");
type Cache = InstanceType<typeof import("~/figures/render-figure-svg").TexCache>;

export interface FigurePreview {
  svg: string | null;
  problems: FigureProblem[];
  texErrors: { path: string; message: string }[];
  /** Smallest text and thinnest line drawn, pt. */
  smallestTextPt: number | null;
  thinnestLinePt: number | null;
  xDomain: [number, number] | null;
  yDomain: [number, number] | null;
  /** Time of the last render from the edit that asked for it, ms. */
  renderMs: number | null;
  /** The key of the model this SVG shows, so that a test can wait for a given edit. */
  renderedKey: string | null;
  error: string | null;
}

/**
 * Draws the figure in the browser with the same function the server's draft.svg and export
 * call: the renderer, vega and MathJax load once, on first use, and the TeX labels stay cached
 * between edits. A newer edit supersedes a render still running.
 */
export function useFigurePreview(model: FigureModel | null, inputs: DatasetInputs, metadata: SvgMetadata, editedAt: number): FigurePreview {
  const [state, setState] = useState<FigurePreview>({ svg: null, problems: [], texErrors: [], smallestTextPt: null, thinnestLinePt: null, xDomain: null, yDomain: null, renderMs: null, renderedKey: null, error: null });
  const renderer = useRef<Promise<{ mod: Renderer; cache: Cache }> | null>(null);
  const sequence = useRef(0);
  const key = model === null ? null : JSON.stringify([model, metadata]);

  useEffect(() => {
    if (model === null || key === null) return;
    const mine = ++sequence.current;
    renderer.current ??= Promise.all([import("~/figures/render-figure"), import("~/figures/render-figure-svg")]).then(([mod, svgMod]) => ({ mod, cache: new svgMod.TexCache() }));
    renderer.current
      .then(async ({ mod, cache }) => {
        const out = await mod.renderFigure(model, inputs, metadata, cache);
        if (mine !== sequence.current) return;
        setState({
          svg: out.svg, problems: out.problems, texErrors: out.texErrors,
          smallestTextPt: out.built.smallestTextPt, thinnestLinePt: out.built.thinnestLinePt,
          xDomain: out.data.xDomain, yDomain: out.data.yDomain,
          // Measured from an edit only; the first drawing after the page loads is not an edit.
          renderMs: editedAt > 0 ? Math.round((performance.now() - editedAt) * 10) / 10 : null, renderedKey: key, error: null,
        });
      })
      .catch((error: unknown) => {
        if (mine === sequence.current) setState((s) => ({ ...s, error: error instanceof Error ? error.message : String(error) }));
      });
    // The key stands for model and metadata; inputs change only with a reload of the draft.
  }, [key, inputs]);

  return state;
}

// Browser entry of `npm run bench:figures`: the reference figure drawn by renderFigure with one
// TexCache kept between edits, as the figure page's preview hook does, then an edit (a
// prediction's energy) drawn and put into the page. Times from the edit to the SVG in the DOM.
import { renderFigure } from "~/figures/render-figure";
import { TexCache } from "~/figures/render-figure-svg";
import { referenceInputs, referenceModel } from "~/figures/testing/reference-figure";

declare global {
  interface Window {
    benchFigure: (edits: number) => Promise<{ firstMs: number; editMs: number[] }>;
  }
}

window.benchFigure = async (edits: number) => {
  const host = document.getElementById("preview")!;
  const inputs = referenceInputs();
  const model = referenceModel();
  const cache = new TexCache();
  const metadata = { title: "reference figure", description: "", notes: ["benchmark"] };
  const t0 = performance.now();
  host.innerHTML = (await renderFigure(model, inputs, metadata, cache)).svg;
  host.getBoundingClientRect();
  const firstMs = performance.now() - t0;
  const editMs: number[] = [];
  for (let i = 0; i < edits; i++) {
    const edited = structuredClone(model);
    const layer = edited.panels[0].layers[0];
    if (layer.kind === "prediction") layer.energy.value = 0.5 + 0.01 * (i + 1);
    const start = performance.now();
    host.innerHTML = (await renderFigure(edited, inputs, metadata, cache)).svg;
    host.getBoundingClientRect();
    editMs.push(performance.now() - start);
  }
  return { firstMs, editMs };
};

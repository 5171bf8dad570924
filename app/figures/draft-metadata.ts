import type { FigureModel } from "./figure-model";
import type { SvgMetadata } from "./render-figure-svg";

/**
 * What an unsealed draft's SVG says about itself, the same in the browser preview and in the
 * server's draft.svg, so that nobody mistakes a draft for a sealed version.
 */
export function draftMetadata(figure: { id: string; title: string; draftRevision: number }, model: FigureModel): SvgMetadata {
  return {
    title: figure.title,
    description: model.altText,
    notes: [
      `Unsealed draft, revision ${figure.draftRevision}, of figure ${figure.id}.`,
      "Not a sealed version: it has not been signed off and is not for submission.",
    ],
  };
}

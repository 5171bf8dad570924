import { MARKER_SHAPES } from "./palette";

/**
 * A marker shape by id as an SVG path in a unit box centred at the origin (vega scales it to the
 * mark's size; the legend scales it itself). An unknown id falls back to the first shape, so an
 * old draft whose shape was renamed still draws.
 */
export function markerPath(id: string): { path: string; filled: boolean } {
  const shape = MARKER_SHAPES.find((s) => s.id === id) ?? MARKER_SHAPES[0];
  return { path: shape.path, filled: shape.filled };
}

// Steradian's default colours and marker shapes for figure layers. Chosen for this product
// (scripts/choose-palette.ts shows how and checks them; palette.test.ts keeps them honest): muted,
// warm-leaning hues that sit beside the interface's paper-and-ink look, while staying apart from
// the interface's own accent, which marks actions, not data.

export interface FigureColour {
  id: string;
  name: string;
  hex: string;
}

/**
 * Smallest CIEDE2000 difference (CIE 142-2001) between any two palette colours, and between any
 * palette colour and the figures' ink, under normal vision and under simulated protanopia,
 * deuteranopia and tritanopia (Machado, Oliveira and Fernandes, IEEE TVCG 15 (2009) 1291, full
 * severity). 11 rather than the 10 the composer was asked for, as the set reaches 11.9.
 */
export const MIN_DIFFERENCE_CIEDE2000 = 11;

/** Smallest contrast ratio against the white figure ground: WCAG 2.1, success criterion 1.4.11. */
export const MIN_CONTRAST_ON_WHITE = 3;

/**
 * Eight colours in the order new layers take them: each next colour is the one farthest (worst
 * case over the four visions) from those before it, so a figure with few layers gets the most
 * distinct ones.
 */
export const FIGURE_COLOURS: readonly FigureColour[] = [
  { id: "indigo", name: "indigo", hex: "#1f4e8c" },
  { id: "ochre", name: "ochre", hex: "#c27c12" },
  { id: "lavender", name: "lavender", hex: "#9a77f4" },
  { id: "teal", name: "teal", hex: "#2a8c80" },
  { id: "rose", name: "dusty rose", hex: "#91555d" },
  { id: "vermilion", name: "vermilion", hex: "#b3301f" },
  { id: "plum", name: "plum", hex: "#5f304e" },
  { id: "sage", name: "sage", hex: "#7a9763" },
];

const cycle = (index: number, length: number) => ((Math.trunc(index) % length) + length) % length;

/** The hex colour of the index-th layer, cycling through the palette (negative indices too). */
export function colourFor(index: number): string {
  return FIGURE_COLOURS[cycle(index, FIGURE_COLOURS.length)].hex;
}

export interface MarkerShape {
  id: string;
  name: string;
  /** SVG path in a unit box centred at the origin, every coordinate within [−1, 1], y down. */
  path: string;
  /** Filled with the layer's colour, or open (outlined, filled with the figure's ground). */
  filled: boolean;
}

// All shapes enclose about the same area, 1.25 (unit box), so that no dataset looks weightier
// for its shape: the triangle of side 1.7 centred on its centroid is the largest shape that fits
// the box, and the others are sized to its area. The circle is four cubic Bézier arcs (control
// distance 0.553 r), which keeps every number in the path a point inside the box.
const CIRCLE = "M0.631,0C0.631,0.349,0.349,0.631,0,0.631C-0.349,0.631,-0.631,0.349,-0.631,0C-0.631,-0.349,-0.349,-0.631,0,-0.631C0.349,-0.631,0.631,-0.349,0.631,0Z";
const SQUARE = "M-0.559,-0.559L0.559,-0.559L0.559,0.559L-0.559,0.559Z";
const TRIANGLE_UP = "M0,-0.981L0.85,0.491L-0.85,0.491Z";
const TRIANGLE_DOWN = "M0,0.981L-0.85,-0.491L0.85,-0.491Z";
const DIAMOND = "M0,-0.791L0.791,0L0,0.791L-0.791,0Z";
const CROSS = "M-0.195,-0.9L0.195,-0.9L0.195,-0.195L0.9,-0.195L0.9,0.195L0.195,0.195L0.195,0.9L-0.195,0.9L-0.195,0.195L-0.9,0.195L-0.9,-0.195L-0.195,-0.195Z";

/**
 * Eight marker shapes in the order new datasets take them, alternating filled and open and
 * changing outline each step, so that colour is never the only cue (WCAG 2.1, 1.4.1).
 */
export const MARKER_SHAPES: readonly MarkerShape[] = [
  { id: "disc", name: "disc", path: CIRCLE, filled: true },
  { id: "open-square", name: "open square", path: SQUARE, filled: false },
  { id: "triangle-up", name: "triangle, point up", path: TRIANGLE_UP, filled: true },
  { id: "open-circle", name: "open circle", path: CIRCLE, filled: false },
  { id: "diamond", name: "diamond", path: DIAMOND, filled: true },
  { id: "open-triangle-down", name: "open triangle, point down", path: TRIANGLE_DOWN, filled: false },
  { id: "square", name: "square", path: SQUARE, filled: true },
  { id: "cross", name: "cross", path: CROSS, filled: true },
];

/** The marker shape of the index-th dataset, cycling through the shapes (negative indices too). */
export function markerFor(index: number): MarkerShape {
  return MARKER_SHAPES[cycle(index, MARKER_SHAPES.length)];
}

/**
 * Flattens MathJax's SVG output (nested groups with translate/scale, nested viewports for
 * stretched glyphs, rules as rectangles) into plain filled paths in absolute coordinates. The
 * result has no transforms, ids, references or fill colours of its own, and its numbers are
 * printed with a fixed precision, so that one label always gives the same bytes.
 */

/** An SVG affine map [a b c d e f]: x' = a x + c y + e, y' = b x + d y + f. */
export type Affine = readonly [number, number, number, number, number, number];

export const IDENTITY: Affine = [1, 0, 0, 1, 0, 0];

/** The map `outer ∘ inner`: inner applied first. */
export function compose(outer: Affine, inner: Affine): Affine {
  const [a, b, c, d, e, f] = outer;
  const [A, B, C, D, E, F] = inner;
  return [a * A + c * B, b * A + d * B, a * C + c * D, b * C + d * D, a * E + c * F + e, b * E + d * F + f];
}

export function apply(m: Affine, x: number, y: number): [number, number] {
  return [m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]];
}

/** Raised for SVG that this flattener does not draw (the caller turns it into a TeX error). */
export class UnsupportedSvgError extends Error {
  override name = "UnsupportedSvgError";
}

const NUMBER = /[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/g;

function numbers(text: string): number[] {
  return (text.match(NUMBER) ?? []).map(Number);
}

/** Parses an SVG transform list of translate, scale and matrix (all MathJax writes). */
export function parseTransform(text: string | undefined): Affine {
  let m = IDENTITY;
  if (!text) return m;
  const re = /(\w+)\s*\(([^)]*)\)/g;
  let found: RegExpExecArray | null;
  while ((found = re.exec(text)) !== null) {
    const [, name, args] = found;
    const v = numbers(args);
    let step: Affine;
    if (name === "translate") step = [1, 0, 0, 1, v[0] ?? 0, v[1] ?? 0];
    else if (name === "scale") step = [v[0] ?? 1, 0, 0, v[1] ?? v[0] ?? 1, 0, 0];
    else if (name === "matrix" && v.length === 6) step = v as unknown as Affine;
    else throw new UnsupportedSvgError(`transform ${name}(${args}) is not supported`);
    m = compose(m, step);
  }
  return m;
}

/** Formats a coordinate with at most three decimals, never "-0". */
export function fmt(v: number): string {
  const thousandths = Math.round(v * 1000);
  if (thousandths === 0) return "0";
  // Integer arithmetic: exact, and faster than printing the rounded float.
  const abs = Math.abs(thousandths);
  const whole = Math.floor(abs / 1000);
  const frac = abs % 1000;
  const sign = thousandths < 0 ? "-" : "";
  if (frac === 0) return `${sign}${whole}`;
  const digits = frac < 10 ? `00${frac}` : frac < 100 ? `0${frac}` : `${frac}`;
  return `${sign}${whole}.${digits.replace(/0+$/, "")}`;
}

interface Segment {
  command: "M" | "L" | "C" | "Q" | "Z";
  points: [number, number][];
}

/** Parses path data into absolute M, L, C, Q and Z segments (H, V, S, T and relative forms resolved). */
export function parsePath(d: string): Segment[] {
  const tokens = d.match(/[a-zA-Z]|[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/g) ?? [];
  const isCommand = (t: string | undefined) => t !== undefined && t.length === 1 && ((t >= "a" && t <= "z") || (t >= "A" && t <= "Z"));
  const out: Segment[] = [];
  let i = 0;
  let command = "";
  let x = 0;
  let y = 0;
  let startX = 0;
  let startY = 0;
  // The last control point, for the reflections of S and T.
  let lastCubic: [number, number] | null = null;
  let lastQuad: [number, number] | null = null;
  const next = () => {
    const t = tokens[i++];
    if (t === undefined || isCommand(t)) throw new UnsupportedSvgError(`path data ends early: ${d.slice(0, 60)}`);
    return Number(t);
  };
  while (i < tokens.length) {
    if (isCommand(tokens[i])) command = tokens[i++];
    else if (command === "") throw new UnsupportedSvgError(`path data must start with a command: ${d.slice(0, 60)}`);
    const rel = command === command.toLowerCase();
    const ox = rel ? x : 0;
    const oy = rel ? y : 0;
    const upper = command.toUpperCase();
    let cubic: [number, number] | null = null;
    let quad: [number, number] | null = null;
    switch (upper) {
      case "M":
      case "L": {
        x = ox + next();
        y = oy + next();
        out.push({ command: upper, points: [[x, y]] });
        if (upper === "M") {
          startX = x;
          startY = y;
          // Further pairs after a moveto are linetos.
          command = rel ? "l" : "L";
        }
        break;
      }
      case "H":
        x = ox + next();
        out.push({ command: "L", points: [[x, y]] });
        break;
      case "V":
        y = oy + next();
        out.push({ command: "L", points: [[x, y]] });
        break;
      case "C": {
        const p1: [number, number] = [ox + next(), oy + next()];
        const p2: [number, number] = [ox + next(), oy + next()];
        x = ox + next();
        y = oy + next();
        out.push({ command: "C", points: [p1, p2, [x, y]] });
        cubic = p2;
        break;
      }
      case "S": {
        const p1: [number, number] = lastCubic ? [2 * x - lastCubic[0], 2 * y - lastCubic[1]] : [x, y];
        const p2: [number, number] = [ox + next(), oy + next()];
        x = ox + next();
        y = oy + next();
        out.push({ command: "C", points: [p1, p2, [x, y]] });
        cubic = p2;
        break;
      }
      case "Q": {
        const p1: [number, number] = [ox + next(), oy + next()];
        x = ox + next();
        y = oy + next();
        out.push({ command: "Q", points: [p1, [x, y]] });
        quad = p1;
        break;
      }
      case "T": {
        const p1: [number, number] = lastQuad ? [2 * x - lastQuad[0], 2 * y - lastQuad[1]] : [x, y];
        x = ox + next();
        y = oy + next();
        out.push({ command: "Q", points: [p1, [x, y]] });
        quad = p1;
        break;
      }
      case "Z":
        out.push({ command: "Z", points: [] });
        x = startX;
        y = startY;
        break;
      default:
        throw new UnsupportedSvgError(`path command ${command} is not supported`);
    }
    lastCubic = cubic;
    lastQuad = quad;
  }
  return out;
}

/** Path data of `segments` mapped by `m`, absolute commands, fixed precision. */
export function formatPath(segments: Segment[], m: Affine): string {
  let out = "";
  const [a, b, c, d, e, f] = m;
  for (const s of segments) {
    out += s.command;
    for (let i = 0; i < s.points.length; i++) {
      const [px, py] = s.points[i];
      out += `${i > 0 ? " " : ""}${fmt(a * px + c * py + e)} ${fmt(b * px + d * py + f)}`;
    }
  }
  return out;
}

/** The part of an SVG tree the flattener reads: element name, attributes, children, text. */
export interface SvgNode {
  kind: string;
  attributes: Record<string, string | undefined>;
  children: SvgNode[];
  text?: string;
}

interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

function extend(box: Box | null, m: Affine, points: Iterable<[number, number]>): Box | null {
  let b = box;
  for (const [px, py] of points) {
    const [x, y] = apply(m, px, py);
    b = b ? { x0: Math.min(b.x0, x), y0: Math.min(b.y0, y), x1: Math.max(b.x1, x), y1: Math.max(b.y1, y) } : { x0: x, y0: y, x1: x, y1: y };
  }
  return b;
}

const num = (v: string | undefined, fallback = 0) => (v === undefined || v === "" ? fallback : Number(v));

/**
 * Filled outlines of one element as segments in its own coordinates. A rule (rect without a
 * stroke) is a rectangle; a stroked rect (a box frame) is the ring between the outer and the
 * inner edge of its stroke; a stroked line is the quadrilateral that the stroke covers.
 */
function outline(node: SvgNode): Segment[] | null {
  const a = node.attributes;
  const stroke = num(a["stroke-width"]);
  const rect = (x: number, y: number, w: number, h: number, clockwise: boolean): Segment[] => {
    const corners: [number, number][] = clockwise
      ? [[x, y], [x + w, y], [x + w, y + h], [x, y + h]]
      : [[x, y], [x, y + h], [x + w, y + h], [x + w, y]];
    return [{ command: "M", points: [corners[0]] }, ...corners.slice(1).map((p) => ({ command: "L" as const, points: [p] })), { command: "Z", points: [] }];
  };
  switch (node.kind) {
    case "path": {
      if (stroke > 0 && a.fill === "none") throw new UnsupportedSvgError("a stroked path is not supported");
      const d = a.d ?? "";
      return d.trim() === "" ? null : parsePath(d);
    }
    case "rect": {
      const [x, y, w, h] = [num(a.x), num(a.y), num(a.width), num(a.height)];
      if (a.fill === "none") {
        if (stroke <= 0) return null;
        const s = stroke / 2;
        // Opposite windings: the inner rectangle is a hole under the nonzero rule.
        return [...rect(x - s, y - s, w + 2 * s, h + 2 * s, true), ...rect(x + s, y + s, Math.max(0, w - 2 * s), Math.max(0, h - 2 * s), false)];
      }
      return w > 0 && h > 0 ? rect(x, y, w, h, true) : null;
    }
    case "line": {
      const cls = a.class ?? "";
      if (/mjx-(dashed|dotted)/.test(cls)) throw new UnsupportedSvgError("dashed and dotted table lines are not supported");
      // Table rules take their thickness from MathJax's stylesheet (0.07 em) unless given
      // (in em) as stroke-thickness; frame lines carry a stroke-width in drawing units.
      const width = a["stroke-width"] !== undefined ? stroke : a["stroke-thickness"] !== undefined ? num(a["stroke-thickness"]) * 1000 : /mjx-solid/.test(cls) ? 70 : 0;
      if (width <= 0) return null;
      const [x1, y1, x2, y2] = [num(a.x1), num(a.y1), num(a.x2), num(a.y2)];
      const len = Math.hypot(x2 - x1, y2 - y1);
      if (len === 0) return null;
      const nx = (-(y2 - y1) / len) * (width / 2);
      const ny = ((x2 - x1) / len) * (width / 2);
      const corners: [number, number][] = [[x1 + nx, y1 + ny], [x2 + nx, y2 + ny], [x2 - nx, y2 - ny], [x1 - nx, y1 - ny]];
      return [{ command: "M", points: [corners[0]] }, ...corners.slice(1).map((p) => ({ command: "L" as const, points: [p] })), { command: "Z", points: [] }];
    }
    default:
      return null;
  }
}

interface Drawn {
  segments: Segment[];
  m: Affine;
}

/**
 * A nested <svg> is a viewport that clips: MathJax draws a stretched delimiter's or accent's
 * repeated piece 1.5 times too long and lets the viewport cut it to length. Glyph paths carry
 * no clipping here, so along each axis where the content overflows the viewport, the content
 * is scaled to fit it exactly instead. For an extender (a piece that is the same all along
 * its length) that is the same picture.
 */
function fitViewport(node: SvgNode, viewBoxToOut: Affine, drawn: Drawn[], from: number) {
  const [vx, vy, vw, vh] = viewBoxOf(node);
  const toViewBox = invertScaleTranslate(viewBoxToOut);
  let box: Box | null = null;
  for (const item of drawn.slice(from)) {
    box = extend(box, compose(toViewBox, item.m), item.segments.flatMap((s) => s.points));
  }
  if (!box) return;
  const fit = (lo: number, hi: number, v0: number, v1: number): [number, number] =>
    lo < v0 - 1e-6 || hi > v1 + 1e-6 ? [(v1 - v0) / (hi - lo), v0 - ((v1 - v0) / (hi - lo)) * lo] : [1, 0];
  const [sx, tx] = fit(box.x0, box.x1, vx, vx + vw);
  const [sy, ty] = fit(box.y0, box.y1, vy, vy + vh);
  if (sx === 1 && tx === 0 && sy === 1 && ty === 0) return;
  const fitted = compose(viewBoxToOut, [sx, 0, 0, sy, tx, ty]);
  for (const item of drawn.slice(from)) item.m = compose(fitted, compose(toViewBox, item.m));
}

/** x, y, width, height of a nested viewport's viewBox; only unscaled viewports occur in MathJax's output. */
function viewBoxOf(node: SvgNode): [number, number, number, number] {
  const a = node.attributes;
  const w = num(a.width);
  const h = num(a.height);
  const [vx, vy, vw, vh] = a.viewBox ? numbers(a.viewBox) : [0, 0, w, h];
  if (Math.abs(w - vw) > 1e-6 || Math.abs(h - vh) > 1e-6) throw new UnsupportedSvgError("a scaled nested viewport is not supported");
  return [vx, vy, vw, vh];
}

/** Inverse of an affine map without rotation or shear (all that MathJax produces). */
function invertScaleTranslate(m: Affine): Affine {
  const [a, b, c, d, e, f] = m;
  if (b !== 0 || c !== 0) throw new UnsupportedSvgError("a rotated or sheared viewport is not supported");
  return [1 / a, 0, 0, 1 / d, -e / a, -f / d];
}

function walk(node: SvgNode, m: Affine, drawn: Drawn[]) {
  if (node.kind === "#text" || node.kind === "#comment" || node.kind === "title" || node.kind === "desc") return;
  if (node.kind === "text") {
    const text = node.children.map((c) => c.text ?? "").join("");
    throw new UnsupportedSvgError([...text].length === 1 ? `The character ${JSON.stringify(text)} is not in the figure font` : `The characters ${JSON.stringify(text)} are not in the figure font`);
  }
  if (!["g", "svg", "path", "rect", "line"].includes(node.kind)) throw new UnsupportedSvgError(`<${node.kind}> is not supported in figure labels`);
  const own = compose(m, parseTransform(node.attributes.transform));
  if (node.kind === "svg") {
    const from = drawn.length;
    const [vx, vy] = viewBoxOf(node);
    // Equal viewport and viewBox sizes: the viewport map is a translation.
    const inner = compose(own, [1, 0, 0, 1, num(node.attributes.x) - vx, num(node.attributes.y) - vy]);
    for (const child of node.children) walk(child, inner, drawn);
    fitViewport(node, inner, drawn, from);
    return;
  }
  const segments = outline(node);
  if (segments) drawn.push({ segments, m: own });
  for (const child of node.children) walk(child, own, drawn);
}

/**
 * Every drawn element under `root` as a `<path d="…"/>` in the coordinates that `m` maps to,
 * one path per element (so that windings of different glyphs never cancel each other).
 */
export function flattenToPaths(root: SvgNode, m: Affine): string {
  const drawn: Drawn[] = [];
  for (const child of root.children) walk(child, m, drawn);
  return drawn.map((item) => `<path d="${formatPath(item.segments, item.m)}"/>`).join("");
}

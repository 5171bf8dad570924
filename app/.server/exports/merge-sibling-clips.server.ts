// One clip for a run of sibling groups that clip to the same rectangle, before rasterising
// (docs/decisions/0009-export-rendering.md, "PNG").
import { Parser } from "htmlparser2";

interface Element {
  /** Offsets in the SVG text: the "<" of the open tag, the ">" of the open tag, the ">" of the close tag. */
  start: number;
  openEnd: number;
  end: number;
  /** The clip this group refers to, when it may be moved to a wrapper (see below). */
  clipId: string | null;
}

const CLIP_REF = /^url\(#([^)"'\s]+)\)$/;

/**
 * The SVG with every run of consecutive sibling `<g>` elements that refer to clip paths of the
 * same content wrapped in one `<g clip-path="…">`, and their own clip-path attributes removed.
 *
 * The figure renderer clips each mark group to its plot area, so one panel holds a dozen groups
 * with a dozen identical rectangular clips; resvg draws each clipped group into a layer of the
 * whole canvas, which at 600 dpi was three quarters of a PNG's time. Clipping the run once
 * clips the same shapes to the same rectangle: the picture is the same except for antialiased
 * pixels where overlapping groups are composited in another order of rounding (tested in
 * merge-sibling-clips.test.ts).
 *
 * Only what keeps the same clip geometry is merged: a group with a transform of its own (the
 * clip would be in its transformed space) stays as it is, and so does a reference to a clipPath
 * with attributes other than its id (clipPathUnits, a transform, a clip of its own). Groups are
 * siblings in a run only when nothing, not even text, lies between them. The SVG's own text
 * (the file that is exported as figure.svg) is not changed; this is applied to the copy drawn
 * into pixels.
 */
export function mergeSiblingClips(svg: string): string {
  const clipContent = new Map<string, string>();
  const movableClip = new Set<string>();
  const families: Element[][] = [];
  const stack: { name: string; id: string | undefined; start: number; openEnd: number; clipId: string | null; children: Element[] }[] = [{ name: "", id: undefined, start: -1, openEnd: -1, clipId: null, children: [] }];

  const parser = new Parser(
    {
      onopentag(name, attribs, isImplied) {
        if (isImplied) throw new Error(`the SVG's <${name}> is opened implicitly: not well-formed XML`);
        const ref = name === "g" && attribs.transform === undefined ? CLIP_REF.exec(attribs["clip-path"] ?? "") : null;
        stack.push({ name, id: attribs.id, start: parser.startIndex, openEnd: parser.endIndex, clipId: ref ? ref[1] : null, children: [] });
        if (name === "clipPath" && attribs.id !== undefined && Object.keys(attribs).length === 1) movableClip.add(attribs.id);
      },
      onclosetag(name, isImplied) {
        const frame = stack.pop();
        // A self-closing tag closes where it opened; any other implied close is malformed XML.
        if (frame === undefined || frame.name !== name || (isImplied && parser.endIndex !== frame.openEnd)) throw new Error(`the SVG's <${name}> is not closed where it was opened`);
        if (name === "clipPath" && frame.id !== undefined) clipContent.set(frame.id, svg.slice(frame.openEnd + 1, parser.startIndex));
        if (frame.children.length > 1) families.push(frame.children);
        stack[stack.length - 1].children.push({ start: frame.start, openEnd: frame.openEnd, end: parser.endIndex, clipId: frame.clipId });
      },
    },
    { xmlMode: true },
  );
  parser.end(svg);
  if (stack.length !== 1) throw new Error("the SVG ends inside an element");
  if (stack[0].children.length > 1) families.push(stack[0].children);

  // Clip paths of the same content are one clip; the first id stands for them all.
  const canonical = new Map<string, string>();
  const firstWithContent = new Map<string, string>();
  for (const [id, content] of clipContent) {
    if (!movableClip.has(id)) continue;
    const first = firstWithContent.get(content) ?? id;
    firstWithContent.set(content, first);
    canonical.set(id, first);
  }

  const edits: { at: number; remove: number; insert: string }[] = [];
  for (const children of families) {
    for (let i = 0; i < children.length; ) {
      const clip = children[i].clipId !== null ? canonical.get(children[i].clipId!) : undefined;
      let j = i + 1;
      while (clip !== undefined && j < children.length && children[j].start === children[j - 1].end + 1 && children[j].clipId !== null && canonical.get(children[j].clipId!) === clip) j++;
      if (clip !== undefined && j - i > 1) {
        edits.push({ at: children[i].start, remove: 0, insert: `<g clip-path="url(#${clip})">` });
        for (let k = i; k < j; k++) {
          const open = svg.slice(children[k].start, children[k].openEnd + 1);
          const attr = open.match(/\sclip-path="[^"]*"/)!;
          edits.push({ at: children[k].start + attr.index!, remove: attr[0].length, insert: "" });
        }
        edits.push({ at: children[j - 1].end + 1, remove: 0, insert: "</g>" });
      }
      i = j;
    }
  }
  if (edits.length === 0) return svg;
  edits.sort((a, b) => a.at - b.at);
  let out = "";
  let from = 0;
  for (const e of edits) {
    out += svg.slice(from, e.at) + e.insert;
    from = e.at + e.remove;
  }
  return out + svg.slice(from);
}

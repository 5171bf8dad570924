// What an exported SVG must not hold: anything that runs, or that reaches outside the file.
// The figure renderer never writes these; the check guards the converters (which would
// otherwise read a referenced file from the server's disk) and the files sent to a journal.
// Pure: runs in the browser too.

// Checked in markup only (tags and style sheets), not in text such as the alt text, where the
// renderer escapes < and ", so that a description mentioning "url(" is not refused.
const TAG_RULES: { pattern: RegExp; problem: string }[] = [
  { pattern: /^<script[\s>/]/i, problem: "a <script> element" },
  { pattern: /^<foreignObject[\s>/]/i, problem: "a <foreignObject> element" },
  { pattern: /^<(image|feImage)[\s>/]/i, problem: "an embedded or linked image" },
  { pattern: /^<!(ENTITY|DOCTYPE)/i, problem: "a DOCTYPE or entity declaration" },
  { pattern: /[\s:]href\s*=\s*["'](?!#)/i, problem: "a link to something outside the file (href not starting with #)" },
  { pattern: /url\(\s*["']?(?!#)/i, problem: "a url() outside the file" },
  { pattern: /\son[a-z]+\s*=/i, problem: "an event handler attribute" },
];
const STYLE_RULES: { pattern: RegExp; problem: string }[] = [
  { pattern: /@import/i, problem: "a CSS @import" },
  { pattern: /url\(\s*["']?(?!#)/i, problem: "a url() outside the file" },
];

/** The reasons an SVG is not self-contained; [] when it is. */
export function selfContainedSvgProblems(svg: string): string[] {
  const problems = new Set<string>();
  for (const [tag] of svg.matchAll(/<(?:[^>"']|"[^"]*"|'[^']*')*>/g)) {
    for (const rule of TAG_RULES) if (rule.pattern.test(tag)) problems.add(rule.problem);
  }
  for (const [, css] of svg.matchAll(/<style[^>]*>([\s\S]*?)<\/style>/gi)) {
    for (const rule of STYLE_RULES) if (rule.pattern.test(css)) problems.add(rule.problem);
  }
  return [...problems];
}

export function assertSelfContainedSvg(svg: string): void {
  const problems = selfContainedSvgProblems(svg);
  if (problems.length > 0) throw new Error(`the SVG is not self-contained: it has ${problems.join(", ")}`);
}

/**
 * The export converters draw no fonts: the figure's text must already be glyph outlines (the
 * renderer writes it so). A <text> element would come out in a substitute font in the PDF and
 * not at all in the PNG, so it is refused instead.
 */
export function assertTextAsOutlines(svg: string): void {
  if (/<(text|tspan|textPath)[\s>/]/i.test(svg)) throw new Error("the SVG has <text> elements: the export needs every text drawn as glyph paths");
}

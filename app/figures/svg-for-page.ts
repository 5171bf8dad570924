/**
 * A figure's SVG as the page shows it inline: vega gives every mark and mark group its own ARIA
 * role (graphics-symbol, graphics-object) and role description, which assistive technology
 * then reads as dozens of unnamed images. The figure as a whole is described by its root (alt
 * text, title), so inside it the marks are decoration. Only the inline copy is changed; the
 * rendered, sealed and exported bytes stay as they are.
 */
export function svgForPage(svg: string): string {
  const root = svg.indexOf(">");
  if (root < 0) return svg;
  const inner = svg
    .slice(root + 1)
    .replace(/ role="graphics-(?:symbol|object)"/g, "")
    .replace(/ aria-roledescription="[^"]*"/g, "")
    .replace(/ aria-label="[^"]*"/g, "");
  return svg.slice(0, root + 1) + inner;
}

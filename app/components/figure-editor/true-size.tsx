import { svgForPage } from "~/figures/svg-for-page";
/**
 * The figure at its printed size: CSS millimetres (96 px to the inch, which is what a browser
 * calls physical size; a screen's real pixel density may differ, so the ruler is there to check
 * it against a real one), with a mm ruler along the top and left edges.
 */
export function TrueSizeView({ svg, widthMm, heightMm, smallestTextPt, thinnestLinePt }: { svg: string; widthMm: number; heightMm: number; smallestTextPt: number | null; thinnestLinePt: number | null }) {
  const ticks = (length: number) => Array.from({ length: Math.floor(length) + 1 }, (_, mm) => mm);
  return (
    <div className="flex flex-col gap-2" data-testid="true-size">
      <p className="text-xs text-ink-soft">
        At printed size: {widthMm.toFixed(0)} × {heightMm.toFixed(0)} mm. Smallest text {smallestTextPt?.toFixed(1) ?? "–"} pt, thinnest line {thinnestLinePt?.toFixed(2) ?? "–"} pt.
        Hold a real ruler to the one drawn here: if they differ, your screen's zoom or density does, and the figure will print at the ruler's size.
      </p>
      <div className="grid w-max grid-cols-[6mm_auto] grid-rows-[6mm_auto] bg-sheet">
        <span />
        <svg width={`${widthMm}mm`} height="6mm" viewBox={`0 0 ${widthMm} 6`} aria-hidden="true">
          {ticks(widthMm).map((mm) => <line key={mm} x1={mm} x2={mm} y1={6} y2={mm % 10 === 0 ? 2 : mm % 5 === 0 ? 3.5 : 4.5} stroke="#25241f" strokeWidth={0.12} />)}
          {ticks(widthMm).filter((mm) => mm % 10 === 0).map((mm) => <text key={mm} x={mm + 0.5} y={2.2} fontSize={2} fill="#25241f">{mm / 10}</text>)}
        </svg>
        <svg width="6mm" height={`${heightMm}mm`} viewBox={`0 0 6 ${heightMm}`} aria-hidden="true">
          {ticks(heightMm).map((mm) => <line key={mm} y1={mm} y2={mm} x1={6} x2={mm % 10 === 0 ? 2 : mm % 5 === 0 ? 3.5 : 4.5} stroke="#25241f" strokeWidth={0.12} />)}
        </svg>
        <div style={{ width: `${widthMm}mm`, height: `${heightMm}mm` }} className="[&>svg]:h-full [&>svg]:w-full" dangerouslySetInnerHTML={{ __html: svgForPage(svg) }} />
      </div>
      <p className="text-xs text-ink-faint">Ruler in mm, numbered in cm.</p>
    </div>
  );
}

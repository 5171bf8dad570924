import { useMemo, useState } from "react";
import type { DatasetInputs } from "~/figures/figure-inputs";
import type { FigureModel } from "~/figures/figure-model";
import { useFigurePreview } from "./use-figure-preview";
import { svgForPage } from "~/figures/svg-for-page";

/**
 * A revision's points with their error bars, drawn by the figure renderer (the same code as a
 * figure's preview and export), with a linear or log y axis.
 */
export function QuickLook({ model, inputs, title }: { model: FigureModel; inputs: DatasetInputs; title: string }) {
  const [yScale, setYScale] = useState<"linear" | "log">(() => initialYScale(model.y.scale, inputs));
  const shown = useMemo(() => ({ ...model, y: { ...model.y, scale: yScale, domain: null } }), [model, yScale]);
  const metadata = useMemo(() => ({ title, description: "", notes: ["Quick look at a dataset revision; not a figure for publication."] }), [title]);
  const preview = useFigurePreview(shown, inputs, metadata, 0);
  return (
    <section aria-labelledby="quick-look-h" className="mb-6">
      <div className="flex items-baseline gap-4">
        <h3 id="quick-look-h" className="flex-1 font-serif text-lg">Quick look</h3>
        <fieldset className="flex gap-3 text-sm">
          <legend className="sr-only">y axis</legend>
          {(["log", "linear"] as const).map((s) => (
            <label key={s}><input type="radio" name="quick-look-y" value={s} checked={yScale === s} onChange={() => setYScale(s)} /> {s} y</label>
          ))}
        </fieldset>
      </div>
      {preview.error ? <p className="text-sm text-madder">The points could not be drawn: {preview.error}</p> : null}
      {preview.problems.length > 0 ? <ul className="text-sm text-madder">{preview.problems.map((p, i) => <li key={i}>{p.message}</li>)}</ul> : null}
      {preview.svg === null ? <p className="text-sm text-ink-soft">Drawing the points…</p> : (
        <div className="mt-2 max-w-3xl border border-rule bg-white p-2 [&>svg]:h-auto [&>svg]:w-full" data-testid="quick-look" dangerouslySetInnerHTML={{ __html: svgForPage(preview.svg) }} />
      )}
    </section>
  );
}

/**
 * A log axis only where it shows something: values that are not all positive, or that span less
 * than a decade (one labelled tick at most), start on a linear axis; the reader can still switch.
 */
export function initialYScale(wanted: "linear" | "log", inputs: DatasetInputs): "linear" | "log" {
  if (wanted === "linear") return "linear";
  const ys = Object.values(inputs).flatMap((d) => d.rows.map((r) => r.y));
  if (ys.length === 0) return wanted;
  const min = Math.min(...ys);
  const max = Math.max(...ys);
  return min > 0 && max / min >= 10 ? "log" : "linear";
}

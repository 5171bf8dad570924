import { axisPosition, axisTicks, logMinorTicks, paddedDomain, type AxisTick, type ScaleType } from "./axis-ticks";
import type { DatasetSeries, FigureData, PanelData, PredictionSeries, StripPoint } from "./compute-figure-data";
import type { FigureProblem } from "./figure-inputs";
import type { FigureModel } from "./figure-model";
import type { SizePreset } from "./journal-presets";
import { markerPath } from "./marker-path";

/** Size of a rendered TeX label in pt. */
export interface TexBox {
  widthPt: number;
  heightPt: number;
  depthPt: number;
}
export type MeasureTex = (tex: string, fontSizePt: number) => TexBox;

/** A TeX label placed on the figure: `x`, `y` the anchor point (y down), the baseline at y. */
export interface PlacedTex {
  tex: string;
  sizePt: number;
  x: number;
  y: number;
  /** Horizontal anchor of the label's box at x. */
  anchor: "start" | "middle" | "end";
  /** Rotation about (x, y) in degrees (−90: reading upwards). */
  rotate: 0 | -90;
  colour: string;
}

/** One plotting area drawn by vega: its Vega-Lite spec and where it sits, in pt. */
export interface PlotArea {
  id: string;
  x: number;
  y: number;
  width: number;
  height: number;
  spec: Record<string, unknown>;
}

export interface BuiltFigure {
  widthPt: number;
  heightPt: number;
  plots: PlotArea[];
  /** Frames, ticks and legend symbols: SVG elements in pt, ready to insert. */
  overlay: string[];
  texts: PlacedTex[];
  problems: FigureProblem[];
  /** Smallest text size and thinnest line drawn, pt, for the preset's checks. */
  smallestTextPt: number;
  thinnestLinePt: number;
}

export const PT_PER_MM = 72 / 25.4;
export const FIGURE_BACKGROUND = "#ffffff";
const INK = "#1b1a17";
const GRID = "#d9d6ce";
const DASHES: Record<string, number[] | undefined> = { solid: undefined, dashed: [4, 2.5], dotted: [1, 1.8], dashdot: [4, 1.8, 1, 1.8] };

const fmt = (v: number) => {
  const r = Math.round(v * 1000) / 1000;
  return Object.is(r, -0) ? "0" : String(r);
};

/**
 * Lays out a figure: the model's size preset gives the width, the panel height comes from the
 * model, and every text is a TeX label measured beforehand (so the layout is the same in the
 * browser and on the server). Vega draws the data inside each plotting area; the frame, ticks,
 * labels and legend are drawn around it from the same numbers. Pure and deterministic.
 */
export function buildFigure(model: FigureModel, data: FigureData, preset: SizePreset, measure: MeasureTex): BuiltFigure {
  const f = model.fontSizePt;
  const lw = model.lineWidthPt;
  const gap = 0.5 * f;
  const tickLength = 0.45 * f;
  const widthPt = preset.widthMm * PT_PER_MM;
  const xTicks = axisTicks(data.xDomain, model.x.scale, model.columns > 1 ? 4 : 6);
  const yTicks = axisTicks(data.yDomain, model.y.scale, 5);
  const hasStrip = model.panels.some((p) => p.strip !== "none");
  const strips = data.panels.map((p) => stripData(p, model));

  // A strip's tick at its upper end would touch the main panel's lowest label: left out.
  const stripTicks = strips.map((s) => (s === null ? [] : axisTicks(s.domain, "linear", 3).filter((t) => t.value < s.domain[1] - 1e-9 * Math.abs(s.domain[1] - s.domain[0]))));
  const tickWidth = (ticks: AxisTick[]) => Math.max(0, ...ticks.map((t) => measure(t.tex, f).widthPt));
  const tickHeight = (ticks: AxisTick[]) => Math.max(0, ...ticks.map((t) => measure(t.tex, f).heightPt + measure(t.tex, f).depthPt));
  const yTitle = measure(model.y.label, f);
  const xTitle = measure(model.x.label, f);
  const stripTitles = model.panels.map((p) => (p.strip === "ratio" ? "\\mathrm{data}/\\mathrm{prediction}" : "\\mathrm{pull}"));
  const stripTitleHeight = hasStrip ? Math.max(...stripTitles.map((t) => measure(t, f).heightPt + measure(t, f).depthPt)) : 0;
  const yLabelWidth = Math.max(tickWidth(yTicks), ...stripTicks.map(tickWidth));

  const left = gap + Math.max(yTitle.heightPt + yTitle.depthPt, stripTitleHeight) + gap + yLabelWidth + gap * 0.6;
  const right = Math.max(gap, 0.5 * measure(xTicks[xTicks.length - 1]?.tex ?? "0", f).widthPt + 1);
  const top = gap;
  const xLabelHeight = tickHeight(xTicks);
  const belowRow = gap * 0.6 + xLabelHeight + gap;
  const bottomTitle = xTitle.heightPt + xTitle.depthPt + gap;
  const columns = Math.min(model.columns, model.panels.length);
  const rows = Math.ceil(model.panels.length / columns);
  const columnGap = columns > 1 ? left * 0.6 : 0;
  const cellWidth = (widthPt - left - right - columnGap * (columns - 1)) / columns;
  const mainHeight = model.panelHeightMm * PT_PER_MM;
  const stripHeight = hasStrip ? Math.max(0.3 * mainHeight, 3.2 * f) : 0;
  const rowHeight = mainHeight + stripHeight + belowRow;
  const heightPt = top + rows * rowHeight + bottomTitle;

  const overlay: string[] = [];
  const texts: PlacedTex[] = [];
  const plots: PlotArea[] = [];
  let thinnest = lw;

  data.panels.forEach((panelData, index) => {
    const col = index % columns;
    const row = Math.floor(index / columns);
    const x0 = left + col * (cellWidth + columnGap);
    const y0 = top + row * rowHeight;
    const strip = strips[index];
    const xScale = model.x.scale;
    plots.push({ id: panelData.panel.id, x: x0, y: y0, width: cellWidth, height: mainHeight, spec: mainSpec(model, panelData, data, cellWidth, mainHeight) });
    drawFrame(overlay, x0, y0, cellWidth, mainHeight, lw);
    drawXTicks(overlay, xTicks, data.xDomain, xScale, x0, y0, cellWidth, mainHeight, tickLength, lw);
    drawYTicks(overlay, yTicks, data.yDomain, model.y.scale, x0, y0, cellWidth, mainHeight, tickLength, lw);
    thinnest = Math.min(thinnest, 0.6 * lw);
    for (const t of yTicks) {
      const box = measure(t.tex, f);
      const y = y0 + mainHeight - axisPosition(t.value, data.yDomain, model.y.scale, mainHeight);
      texts.push({ tex: t.tex, sizePt: f, x: x0 - gap * 0.6, y: y + (box.heightPt - box.depthPt) / 2, anchor: "end", rotate: 0, colour: INK });
    }
    let xAxisBottom = y0 + mainHeight;
    if (strip !== null) {
      const sy = y0 + mainHeight;
      plots.push({ id: `${panelData.panel.id}-strip`, x: x0, y: sy, width: cellWidth, height: stripHeight, spec: stripSpec(model, strip, data, cellWidth, stripHeight) });
      drawFrame(overlay, x0, sy, cellWidth, stripHeight, lw);
      drawXTicks(overlay, xTicks, data.xDomain, xScale, x0, sy, cellWidth, stripHeight, tickLength * 0.8, lw);
      drawYTicks(overlay, stripTicks[index], strip.domain, "linear", x0, sy, cellWidth, stripHeight, tickLength * 0.8, lw);
      for (const t of stripTicks[index]) {
        const box = measure(t.tex, f);
        const y = sy + stripHeight - axisPosition(t.value, strip.domain, "linear", stripHeight);
        texts.push({ tex: t.tex, sizePt: f, x: x0 - gap * 0.6, y: y + (box.heightPt - box.depthPt) / 2, anchor: "end", rotate: 0, colour: INK });
      }
      if (col === 0) {
        const title = stripTitles[index];
        const box = measure(title, f);
        texts.push({ tex: title, sizePt: f, x: gap + box.heightPt, y: sy + stripHeight / 2, anchor: "middle", rotate: -90, colour: INK });
      }
      xAxisBottom = sy + stripHeight;
    }
    for (const t of xTicks) {
      const box = measure(t.tex, f);
      const x = x0 + axisPosition(t.value, data.xDomain, xScale, cellWidth);
      texts.push({ tex: t.tex, sizePt: f, x, y: xAxisBottom + gap * 0.6 + box.heightPt, anchor: "middle", rotate: 0, colour: INK });
    }
    if (col === 0) {
      texts.push({ tex: model.y.label, sizePt: f, x: gap + yTitle.heightPt, y: y0 + mainHeight / 2, anchor: "middle", rotate: -90, colour: INK });
    }
    if (panelData.panel.title !== "") {
      const box = measure(panelData.panel.title, f);
      texts.push({ tex: panelData.panel.title, sizePt: f, x: x0 + gap, y: y0 + gap + box.heightPt, anchor: "start", rotate: 0, colour: INK });
    }
    for (const layer of panelData.panel.layers) {
      if (layer.kind !== "annotation") continue;
      texts.push({ tex: layer.tex, sizePt: f, x: x0 + layer.at[0] * cellWidth, y: y0 + (1 - layer.at[1]) * mainHeight, anchor: "start", rotate: 0, colour: INK });
    }
    drawLegend(model, panelData, x0, y0, cellWidth, mainHeight, measure, overlay, texts);
  });

  const xTitleY = top + rows * rowHeight + xTitle.heightPt;
  texts.push({ tex: model.x.label, sizePt: f, x: left + (widthPt - left - right) / 2, y: xTitleY, anchor: "middle", rotate: 0, colour: INK });

  return {
    widthPt,
    heightPt,
    plots,
    overlay,
    texts,
    problems: data.problems,
    smallestTextPt: f,
    thinnestLinePt: thinnest,
  };
}

function drawFrame(out: string[], x: number, y: number, w: number, h: number, lw: number) {
  out.push(`<rect x="${fmt(x)}" y="${fmt(y)}" width="${fmt(w)}" height="${fmt(h)}" fill="none" stroke="${INK}" stroke-width="${fmt(lw)}"/>`);
}

// Ticks point inwards on all four sides (common practice in physics journals), majors longer.
function drawXTicks(out: string[], ticks: AxisTick[], domain: [number, number], scale: ScaleType, x0: number, y0: number, w: number, h: number, len: number, lw: number) {
  const d: string[] = [];
  const add = (v: number, l: number) => {
    const x = fmt(x0 + axisPosition(v, domain, scale, w));
    d.push(`M${x} ${fmt(y0 + h)}v${fmt(-l)}M${x} ${fmt(y0)}v${fmt(l)}`);
  };
  ticks.forEach((t) => add(t.value, len));
  if (scale === "log") logMinorTicks(domain).forEach((v) => add(v, len * 0.55));
  if (d.length > 0) out.push(`<path d="${d.join("")}" fill="none" stroke="${INK}" stroke-width="${fmt(0.6 * lw)}"/>`);
}

function drawYTicks(out: string[], ticks: AxisTick[], domain: [number, number], scale: ScaleType, x0: number, y0: number, w: number, h: number, len: number, lw: number) {
  const d: string[] = [];
  const add = (v: number, l: number) => {
    const y = fmt(y0 + h - axisPosition(v, domain, scale, h));
    d.push(`M${fmt(x0)} ${y}h${fmt(l)}M${fmt(x0 + w)} ${y}h${fmt(-l)}`);
  };
  ticks.forEach((t) => add(t.value, len));
  if (scale === "log") logMinorTicks(domain).forEach((v) => add(v, len * 0.55));
  if (d.length > 0) out.push(`<path d="${d.join("")}" fill="none" stroke="${INK}" stroke-width="${fmt(0.6 * lw)}"/>`);
}

/** Vega-Lite scale of an axis with a fixed domain: the figure's numbers decide, never vega's "nice". */
function scaleOf(type: ScaleType, domain: [number, number]) {
  // vega-lite warns about (and drops) "zero" on a log scale, so it is only set on a linear one.
  return type === "log" ? { type, domain, nice: false, clamp: false } : { type, domain, nice: false, zero: false, clamp: false };
}

function markerSize(f: number) {
  const d = 0.5 * f;
  return d * d;
}

/** Error-bar pieces of measured points as rows for vega: total bar, stat bar with caps, bin bar. */
function errorRows(points: { x: number; bin: [number, number] | null; y: number; lo: number; hi: number; statLo: number; statHi: number }[], yFloor: number | null) {
  // On a log axis a lower end at or below zero is drawn to the axis edge, never dropped.
  const floor = (v: number) => (yFloor !== null && !(v > yFloor) ? yFloor : v);
  return points.map((p) => ({ x: p.x, y: p.y, lo: floor(p.lo), hi: p.hi, slo: floor(p.statLo), shi: p.statHi, blo: p.bin?.[0] ?? p.x, bhi: p.bin?.[1] ?? p.x }));
}

function dataLayers(rows: ReturnType<typeof errorRows>, colour: string, marker: string, model: FigureModel, yScale: Record<string, unknown>, xScale: Record<string, unknown>) {
  const f = model.fontSizePt;
  const lw = model.lineWidthPt;
  const x = { field: "x", type: "quantitative", scale: xScale, axis: null };
  const y = (field: string) => ({ field, type: "quantitative", scale: yScale, axis: null });
  const values = { values: rows };
  const shape = markerPath(marker);
  return [
    { data: values, mark: { type: "rule", color: colour, strokeWidth: 0.6 * lw, clip: true }, encoding: { x, y: y("lo"), y2: { field: "hi" } } },
    { data: values, mark: { type: "rule", color: colour, strokeWidth: lw, clip: true }, encoding: { x, y: y("slo"), y2: { field: "shi" } } },
    { data: values, mark: { type: "tick", orient: "horizontal", color: colour, size: 0.45 * f, thickness: lw, clip: true }, encoding: { x, y: y("slo") } },
    { data: values, mark: { type: "tick", orient: "horizontal", color: colour, size: 0.45 * f, thickness: lw, clip: true }, encoding: { x, y: y("shi") } },
    { data: values, mark: { type: "rule", color: colour, strokeWidth: 0.6 * lw, clip: true }, encoding: { x: { ...x, field: "blo" }, x2: { field: "bhi" }, y: y("y") } },
    {
      data: values,
      mark: { type: "point", shape: shape.path, filled: shape.filled, size: markerSize(f), color: colour, strokeWidth: lw, opacity: 1, clip: true, ...(shape.filled ? {} : { fill: FIGURE_BACKGROUND }) },
      encoding: { x, y: y("y") },
    },
  ];
}

function curveLayers(series: PredictionSeries, model: FigureModel, yScale: Record<string, unknown>, xScale: Record<string, unknown>, yFloor: number | null) {
  const layers: Record<string, unknown>[] = [];
  const keep = (v: number) => Number.isFinite(v) && (yFloor === null || v > 0);
  const x = { field: "x", type: "quantitative", scale: xScale, axis: null };
  if (series.band !== null) {
    layers.push({
      data: { values: series.band.filter((b) => keep(b.low) && keep(b.high)) },
      mark: { type: "area", color: series.layer.colour, opacity: 0.22, clip: true, interpolate: "linear" },
      encoding: { x, y: { field: "low", type: "quantitative", scale: yScale, axis: null }, y2: { field: "high" } },
    });
  }
  layers.push({
    data: { values: series.curve.filter((c) => keep(c.y)) },
    mark: { type: "line", color: series.layer.colour, strokeWidth: model.lineWidthPt * 1.2, clip: true, ...(DASHES[series.layer.dash] ? { strokeDash: DASHES[series.layer.dash] } : {}) },
    encoding: { x, y: { field: "y", type: "quantitative", scale: yScale, axis: null }, order: { field: "x", type: "quantitative" } },
  });
  return layers;
}

function plotSpec(width: number, height: number, layer: Record<string, unknown>[]) {
  return {
    $schema: "https://vega.github.io/schema/vega-lite/v6.json",
    width,
    height,
    autosize: { type: "none" },
    padding: 0,
    background: null,
    config: { view: { stroke: null }, style: { cell: { stroke: null } } },
    layer: layer.length > 0 ? layer : [{ data: { values: [] }, mark: "point" }],
  };
}

function mainSpec(model: FigureModel, panel: PanelData, data: FigureData, width: number, height: number) {
  const xScale = scaleOf(model.x.scale, data.xDomain);
  const yScale = scaleOf(model.y.scale, data.yDomain);
  const yFloor = model.y.scale === "log" ? data.yDomain[0] : null;
  const layers: Record<string, unknown>[] = [];
  for (const p of panel.predictions) layers.push(...curveLayers(p, model, yScale, xScale, yFloor));
  for (const d of panel.datasets) {
    const rows = errorRows(
      d.points.map((p) => ({ x: p.x, bin: p.bin, y: p.y, lo: p.y - p.total[0], hi: p.y + p.total[1], statLo: p.y - p.stat[0], statHi: p.y + p.stat[1] })),
      yFloor,
    ).filter((r) => yFloor === null || r.y > 0);
    layers.push(...dataLayers(rows, d.layer.colour, d.layer.marker, model, yScale, xScale));
  }
  return plotSpec(width, height, layers);
}

interface StripData {
  kind: "ratio" | "pull";
  domain: [number, number];
  series: { layer: DatasetSeries["layer"]; points: StripPoint[] }[];
}

function stripData(panel: PanelData, model: FigureModel): StripData | null {
  const kind = panel.panel.strip;
  if (kind === "none") return null;
  const series = panel.datasets.map((d) => ({ layer: d.layer, points: kind === "ratio" ? d.ratio : d.pull }));
  const values = series.flatMap((s) => s.points.flatMap((p) => (kind === "ratio" ? [p.value - p.error[0], p.value + p.error[1]] : [p.value]))).filter(Number.isFinite);
  let domain: [number, number];
  if (panel.panel.stripDomain !== null) domain = panel.panel.stripDomain;
  else if (kind === "pull") {
    const m = Math.max(3, ...values.map(Math.abs));
    domain = [-Math.ceil(m * 1.1), Math.ceil(m * 1.1)];
  } else {
    const lo = Math.min(1, ...values);
    const hi = Math.max(1, ...values);
    domain = paddedDomain(lo, hi, "linear", 0.12);
  }
  void model;
  return { kind, domain, series };
}

function stripSpec(model: FigureModel, strip: StripData, data: FigureData, width: number, height: number) {
  const xScale = scaleOf(model.x.scale, data.xDomain);
  const yScale = scaleOf("linear", strip.domain);
  const reference = strip.kind === "ratio" ? 1 : 0;
  const layers: Record<string, unknown>[] = [
    {
      data: { values: [{ y: reference }] },
      mark: { type: "rule", color: INK, strokeWidth: 0.6 * model.lineWidthPt, strokeDash: [3, 2] },
      encoding: { y: { field: "y", type: "quantitative", scale: yScale, axis: null } },
    },
  ];
  if (strip.kind === "pull") {
    for (const band of [1, 2]) {
      layers.push({
        data: { values: [{ lo: -band, hi: band }] },
        mark: { type: "rect", color: GRID, opacity: band === 1 ? 0.5 : 0.25 },
        encoding: { y: { field: "lo", type: "quantitative", scale: yScale, axis: null }, y2: { field: "hi" } },
      });
    }
  }
  for (const s of strip.series) {
    const rows = errorRows(
      s.points.map((p) => ({ x: p.x, bin: p.bin, y: p.value, lo: p.value - p.error[0], hi: p.value + p.error[1], statLo: p.value, statHi: p.value })),
      null,
    );
    const [total, , , , bin, marker] = dataLayers(rows, s.layer.colour, s.layer.marker, model, yScale, xScale);
    layers.push(...(strip.kind === "ratio" ? [total, bin, marker] : [bin, marker]));
  }
  return plotSpec(width, height, layers);
}

function statisticsTex(d: DatasetSeries): string | null {
  const s = d.statistics;
  if (s === null) return null;
  const p = s.pValue >= 0.001 ? s.pValue.toFixed(3) : s.pValue.toExponential(1).replace(/e([+-]\d+)/, (_, e) => ` \\times 10^{${Number(e)}}`);
  const norm = s.normalisation ? `,\\ k = ${s.normalisation.value.toFixed(3)} \\pm ${s.normalisation.uncertainty.toFixed(3)}` : "";
  return `\\chi^2/\\mathrm{ndf} = ${s.chi2.toFixed(1)}/${s.ndf},\\ p = ${p}${norm}`;
}

function drawLegend(model: FigureModel, panel: PanelData, x0: number, y0: number, w: number, h: number, measure: MeasureTex, overlay: string[], texts: PlacedTex[]) {
  const position = model.legend.position;
  if (position === "none") return;
  const f = model.fontSizePt;
  const entries: { tex: string; symbol: (cx: number, cy: number) => string; stats: string | null }[] = [];
  for (const d of panel.datasets) {
    const shape = markerPath(d.layer.marker);
    const r = 0.25 * f;
    entries.push({
      tex: d.layer.label,
      symbol: (cx, cy) =>
        `<path transform="translate(${fmt(cx)} ${fmt(cy)}) scale(${fmt(r)})" d="${shape.path}" fill="${shape.filled ? d.layer.colour : FIGURE_BACKGROUND}" stroke="${d.layer.colour}" stroke-width="${fmt(model.lineWidthPt / r)}"/>`,
      stats: model.legend.statistics === "legend" ? statisticsTex(d) : null,
    });
  }
  for (const p of panel.predictions) {
    const dash = DASHES[p.layer.dash];
    entries.push({
      tex: p.layer.label,
      symbol: (cx, cy) =>
        (p.layer.band ? `<rect x="${fmt(cx - f)}" y="${fmt(cy - 0.3 * f)}" width="${fmt(2 * f)}" height="${fmt(0.6 * f)}" fill="${p.layer.colour}" fill-opacity="0.22"/>` : "") +
        `<path d="M${fmt(cx - f)} ${fmt(cy)}h${fmt(2 * f)}" stroke="${p.layer.colour}" stroke-width="${fmt(model.lineWidthPt * 1.2)}"${dash ? ` stroke-dasharray="${dash.join(" ")}"` : ""} fill="none"/>`,
      stats: null,
    });
  }
  if (entries.length === 0) return;
  const lineHeight = 1.25 * f;
  const symbolWidth = 2.6 * f;
  const lines = entries.flatMap((e) => [e.tex, ...(e.stats ? [e.stats] : [])]);
  const textWidth = Math.max(...lines.map((t) => measure(t, f).widthPt));
  const boxWidth = symbolWidth + textWidth;
  const boxHeight = lines.length * lineHeight;
  const pad = 0.6 * f;
  const left = position.endsWith("left") ? x0 + pad : x0 + w - pad - boxWidth;
  let y = position.startsWith("upper") ? y0 + pad + (panel.panel.title ? lineHeight : 0) : y0 + h - pad - boxHeight;
  for (const e of entries) {
    const cy = y + lineHeight / 2;
    overlay.push(e.symbol(left + symbolWidth / 2 - 0.3 * f, cy));
    const box = measure(e.tex, f);
    texts.push({ tex: e.tex, sizePt: f, x: left + symbolWidth, y: cy + (box.heightPt - box.depthPt) / 2, anchor: "start", rotate: 0, colour: INK });
    y += lineHeight;
    if (e.stats) {
      const sb = measure(e.stats, f);
      texts.push({ tex: e.stats, sizePt: f, x: left + symbolWidth, y: y + lineHeight / 2 + (sb.heightPt - sb.depthPt) / 2, anchor: "start", rotate: 0, colour: INK });
      y += lineHeight;
    }
  }
}

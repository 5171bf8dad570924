import { tickStep, ticks } from "d3-array";

export type ScaleType = "linear" | "log";

export interface AxisTick {
  value: number;
  /** The label as TeX (rendered to glyph paths like every other text of the figure). */
  tex: string;
}

/**
 * Tick marks of an axis and their labels. Linear axes take d3-array's "nice" steps (1, 2 or 5
 * times a power of ten; common practice in plotting) about `count` of them; labels show just as
 * many decimals as the step needs, and switch to a × 10ⁿ form for very large or small values.
 * Log axes label whole decades as powers of ten, 10^{n}; when the range spans less than two
 * decades, 2 and 5 times each decade are labelled too, written plainly.
 */
export function axisTicks(domain: readonly [number, number], scale: ScaleType, count: number): AxisTick[] {
  const [lo, hi] = domain;
  if (scale === "linear") {
    const step = tickStep(lo, hi, count);
    const values = ticks(lo, hi, count);
    return values.map((v) => ({ value: v, tex: linearLabel(v, step) }));
  }
  const d0 = Math.floor(Math.log10(lo) + 1e-12);
  const d1 = Math.ceil(Math.log10(hi) - 1e-12);
  const decades: number[] = [];
  for (let d = d0; d <= d1; d++) decades.push(d);
  const inside = (v: number) => v >= lo * (1 - 1e-12) && v <= hi * (1 + 1e-12);
  const span = Math.log10(hi / lo);
  const every = span > 8 ? Math.ceil(span / 6) : 1;
  const result: AxisTick[] = [];
  for (const d of decades) {
    const v = Number(`1e${d}`);
    if (inside(v) && d % every === 0) result.push({ value: v, tex: `10^{${d}}` });
    if (span < 2) {
      for (const m of [2, 5]) {
        const w = Number(`${m}e${d}`);
        if (inside(w)) result.push({ value: w, tex: `${m} \\times 10^{${d}}` });
      }
    }
  }
  // Less than two decades also label 2 and 5 times a power of ten; one style for the whole axis:
  // plain numbers when every label is between 0.01 and 5000, powers of ten otherwise.
  if (span < 2 && result.every((t) => t.value >= 0.01 && t.value <= 5000)) {
    for (const t of result) t.tex = plainNumber(t.value);
  }
  return result.sort((a, b) => a.value - b.value);
}

/** Minor ticks of a log axis: 2…9 times each decade inside the range (none when too dense). */
export function logMinorTicks(domain: readonly [number, number]): number[] {
  const [lo, hi] = domain;
  if (Math.log10(hi / lo) > 8) return [];
  const out: number[] = [];
  for (let d = Math.floor(Math.log10(lo)); d <= Math.ceil(Math.log10(hi)); d++) {
    for (let m = 2; m <= 9; m++) {
      const v = Number(`${m}e${d}`);
      if (v > lo && v < hi) out.push(v);
    }
  }
  return out;
}

function linearLabel(v: number, step: number): string {
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  if (v === 0) return (0).toFixed(decimals);
  const magnitude = Math.floor(Math.log10(Math.abs(v)));
  if (magnitude >= 5 || magnitude <= -4) {
    const stepDigits = Math.max(0, magnitude - Math.floor(Math.log10(step)));
    const mantissa = (v / 10 ** magnitude).toFixed(Math.min(stepDigits, 6));
    return `${trimZeros(mantissa)} \\times 10^{${magnitude}}`;
  }
  return v.toFixed(decimals);
}

function plainNumber(v: number): string {
  return (v >= 1e5 || v < 1e-3 ? v.toExponential().replace(/e([+-]?\d+)/, (_, e) => ` \\times 10^{${Number(e)}}`) : String(v));
}

function trimZeros(s: string): string {
  return s.includes(".") ? s.replace(/\.?0+$/, "") : s;
}

/** A "nice" range around data, padded by a fraction of its span (linear) or of its decades (log). */
export function paddedDomain(lo: number, hi: number, scale: ScaleType, pad = 0.04): [number, number] {
  if (scale === "log") {
    const a = Math.log10(lo);
    const b = Math.log10(hi);
    const w = Math.max(b - a, 0.3);
    return [10 ** (a - pad * w - (w === 0.3 ? 0.15 : 0)), 10 ** (b + pad * w + (w === 0.3 ? 0.15 : 0))];
  }
  const w = hi - lo || Math.abs(hi) || 1;
  return [lo - pad * w, hi + pad * w];
}

/** Position of a value along an axis of `length` (0 at the low end). */
export function axisPosition(value: number, domain: readonly [number, number], scale: ScaleType, length: number): number {
  const [lo, hi] = domain;
  if (scale === "log") return (length * Math.log(value / lo)) / Math.log(hi / lo);
  return (length * (value - lo)) / (hi - lo);
}

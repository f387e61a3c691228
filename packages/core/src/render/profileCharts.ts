import { checkListArgument, checkObjectArgument } from '../_internal/argumentChecks.js';
/**
 * SVG charts of a profile, as text: currents over time, power factor before
 * and after a bank, and load-duration curves. Pure functions; the CLI writes
 * the files and reports can embed the text.
 *
 * A year of 1-minute data is far more points than pixels: each pixel column
 * draws the band between the lowest and highest value it covers (or their
 * mean, for power factor), so peaks stay visible at any width.
 */

export interface ChartSeries {
  readonly name: string;
  readonly values: Float64Array;
  readonly colour?: string;
}

export interface TimeChartInput {
  readonly title: string;
  readonly unit: string;
  readonly series: readonly ChartSeries[];
  /** Label of interval i for the time axis (e.g. local date). */
  readonly labelOf: (i: number) => string;
  /** envelope: min–max band per pixel column; mean: the column average as a line. @defaultValue 'envelope' */
  readonly mode?: 'envelope' | 'mean';
  readonly width?: number;
  readonly height?: number;
  /** Fixed value range; default from the data. */
  readonly yRange?: readonly [number, number];
}

const PALETTE = ['#2f6db5', '#d1495b', '#3c9d5d', '#8c5fb3', '#e39b2d', '#555555'];
const MARGIN = { left: 58, right: 16, top: 34, bottom: 40 };

const escapeXml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
const num = (x: number) => (Math.round(x * 10) / 10).toString();

/** Round tick values covering [lo, hi]. */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) out.push(Math.abs(t) < step * 1e-9 ? 0 : t);
  return out;
}

function frame(title: string, unit: string, w: number, h: number, y: (v: number) => number, ticks: number[], xTicks: { x: number; label: string }[]): string[] {
  const parts = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}" font-family="sans-serif" font-size="11">`,
    `<rect width="${w}" height="${h}" fill="#ffffff"/>`,
    `<text x="${MARGIN.left}" y="20" font-size="13" font-weight="bold">${escapeXml(title)}</text>`,
    `<text x="12" y="${MARGIN.top - 6}" fill="#444">${escapeXml(unit)}</text>`,
  ];
  for (const t of ticks)
    parts.push(
      `<line x1="${MARGIN.left}" x2="${w - MARGIN.right}" y1="${num(y(t))}" y2="${num(y(t))}" stroke="#e3e3e3"/>`,
      `<text x="${MARGIN.left - 6}" y="${num(y(t) + 4)}" text-anchor="end" fill="#444">${escapeXml(String(Number(t.toPrecision(6))))}</text>`,
    );
  // The last label ends at its tick, inside the picture (the right margin is narrower than a date).
  xTicks.forEach((t, k) =>
    parts.push(`<text x="${num(t.x)}" y="${h - MARGIN.bottom + 16}" text-anchor="${k === xTicks.length - 1 && k > 0 ? 'end' : 'middle'}" fill="#444">${escapeXml(t.label)}</text>`),
  );
  parts.push(`<rect x="${MARGIN.left}" y="${MARGIN.top}" width="${w - MARGIN.left - MARGIN.right}" height="${h - MARGIN.top - MARGIN.bottom}" fill="none" stroke="#999"/>`);
  return parts;
}

function legend(series: readonly ChartSeries[], w: number, h: number): string[] {
  let x = MARGIN.left;
  return series.map((s, k) => {
    const colour = s.colour ?? PALETTE[k % PALETTE.length]!;
    const out = `<rect x="${x}" y="${h - 14}" width="10" height="10" fill="${colour}"/><text x="${x + 14}" y="${h - 5}">${escapeXml(s.name)}</text>`;
    x += 24 + s.name.length * 6.5;
    void w;
    return out;
  });
}

/** Values over time, one band or line per series. */
export function renderTimeChart(input: TimeChartInput): string {
  checkObjectArgument(input, 'input', 'a chart input { series, ... }', ['series']);
  checkListArgument(input.series, 'input.series', 'a list of series, each with its values');
  const w = input.width ?? 900;
  const h = input.height ?? 320;
  const n = input.series[0]?.values.length ?? 0;
  const cols = Math.max(1, Math.min(n, w - MARGIN.left - MARGIN.right));
  const mode = input.mode ?? 'envelope';
  const bands = input.series.map((s) => {
    const lo = new Float64Array(cols).fill(Number.POSITIVE_INFINITY);
    const hi = new Float64Array(cols).fill(Number.NEGATIVE_INFINITY);
    const sum = new Float64Array(cols);
    const count = new Float64Array(cols);
    for (let i = 0; i < n; i++) {
      const c = Math.min(cols - 1, Math.floor((i * cols) / n));
      const v = s.values[i]!;
      if (!Number.isFinite(v)) continue;
      if (v < lo[c]!) lo[c] = v;
      if (v > hi[c]!) hi[c] = v;
      sum[c] = sum[c]! + v;
      count[c] = count[c]! + 1;
    }
    return { lo, hi, mean: sum.map((x, c) => (count[c]! > 0 ? x / count[c]! : Number.NaN)) };
  });
  let [yMin, yMax] = input.yRange ?? [Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY];
  if (!input.yRange) {
    for (const b of bands)
      for (let c = 0; c < cols; c++) {
        const lo = mode === 'mean' ? b.mean[c]! : b.lo[c]!;
        const hi = mode === 'mean' ? b.mean[c]! : b.hi[c]!;
        if (Number.isFinite(lo)) yMin = Math.min(yMin, lo);
        if (Number.isFinite(hi)) yMax = Math.max(yMax, hi);
      }
    if (!Number.isFinite(yMin)) [yMin, yMax] = [0, 1];
    if (yMin > 0 && mode === 'envelope') yMin = 0;
    if (yMax === yMin) yMax = yMin + 1;
    // The top of the plot on a tick, so the highest value reads against the scale.
    const ticks = niceTicks(yMin, yMax);
    if (ticks.length > 1 && ticks[ticks.length - 1]! < yMax) yMax = ticks[ticks.length - 1]! + (ticks[1]! - ticks[0]!);
  }
  const plotH = h - MARGIN.top - MARGIN.bottom;
  const y = (v: number) => MARGIN.top + plotH * (1 - (v - yMin) / (yMax - yMin));
  // Fewer intervals than pixels (a day of half-hours): each column is widened to fill the plot.
  const colW = (w - MARGIN.left - MARGIN.right) / cols;
  const x = (c: number) => MARGIN.left + (c + 0.5) * colW;
  // Dates along the axis; times of day when the whole period falls on one date.
  const oneDay = n > 0 && input.labelOf(0).slice(0, 10) === input.labelOf(n - 1).slice(0, 10);
  const tickLabel = (i: number) => (oneDay ? input.labelOf(i).slice(11, 16) : input.labelOf(i).slice(0, 10));
  const xTicks = Array.from({ length: 6 }, (_, k) => {
    const c = Math.round((k * (cols - 1)) / 5);
    return { x: x(c), label: n ? tickLabel(Math.min(n - 1, Math.floor((c * n) / cols))) : '' };
  });
  const parts = frame(input.title, input.unit, w, h, y, niceTicks(yMin, yMax), xTicks);
  bands.forEach((b, k) => {
    const colour = input.series[k]!.colour ?? PALETTE[k % PALETTE.length]!;
    if (mode === 'mean') {
      const pts: string[] = [];
      for (let c = 0; c < cols; c++) if (Number.isFinite(b.mean[c]!)) pts.push(`${num(x(c))},${num(y(b.mean[c]!))}`);
      parts.push(`<polyline fill="none" stroke="${colour}" stroke-width="1.2" points="${pts.join(' ')}"/>`);
    } else {
      const top: string[] = [];
      const bottom: string[] = [];
      for (let c = 0; c < cols; c++) {
        if (!Number.isFinite(b.hi[c]!)) continue;
        top.push(`${num(x(c))},${num(y(b.hi[c]!))}`);
        bottom.unshift(`${num(x(c))},${num(y(b.lo[c]!))}`);
      }
      parts.push(`<polygon fill="${colour}" fill-opacity="0.35" stroke="${colour}" stroke-width="0.6" points="${[...top, ...bottom].join(' ')}"/>`);
    }
  });
  parts.push(...legend(input.series, w, h), '</svg>');
  return parts.join('\n') + '\n';
}

export interface DurationChartInput {
  readonly title: string;
  readonly unit: string;
  readonly series: readonly ChartSeries[];
  /** Hours each value stands for. */
  readonly intervalHours: number;
  readonly width?: number;
  readonly height?: number;
}

/** Load-duration curves: each series sorted from highest to lowest against the hours it is exceeded. */
export function renderDurationChart(input: DurationChartInput): string {
  checkObjectArgument(input, 'input', 'a chart input { series, ... }', ['series']);
  checkListArgument(input.series, 'input.series', 'a list of series, each with its values');
  const w = input.width ?? 900;
  const h = input.height ?? 320;
  const cols = w - MARGIN.left - MARGIN.right;
  const curves = input.series.map((s) => Float64Array.from(s.values).sort().reverse());
  const n = curves[0]?.length ?? 0;
  let yMax = 0;
  let yMin = 0;
  for (const c of curves) {
    if (c.length) {
      yMax = Math.max(yMax, c[0]!);
      yMin = Math.min(yMin, c[c.length - 1]!);
    }
  }
  if (yMax === yMin) yMax = yMin + 1;
  const plotH = h - MARGIN.top - MARGIN.bottom;
  const y = (v: number) => MARGIN.top + plotH * (1 - (v - yMin) / (yMax - yMin));
  const totalHours = n * input.intervalHours;
  const hourTicks = niceTicks(0, totalHours, 6).map((t) => ({ x: MARGIN.left + (t / (totalHours || 1)) * cols, label: `${t} h` }));
  const parts = frame(input.title, input.unit, w, h, y, niceTicks(yMin, yMax), hourTicks);
  curves.forEach((curve, k) => {
    const colour = input.series[k]!.colour ?? PALETTE[k % PALETTE.length]!;
    const pts: string[] = [];
    for (let c = 0; c <= cols && n; c++) pts.push(`${num(MARGIN.left + c)},${num(y(curve[Math.min(n - 1, Math.floor((c * n) / (cols + 1)))]!))}`);
    parts.push(`<polyline fill="none" stroke="${colour}" stroke-width="1.4" points="${pts.join(' ')}"/>`);
  });
  parts.push(...legend(input.series, w, h), '</svg>');
  return parts.join('\n') + '\n';
}

/**
 * The resonance scan of a harmonic study as an SVG chart: for each bank state,
 * the largest impedance seen between any terminal pair of the board against
 * harmonic order, with the orders the loads and supply carry marked, so a peak
 * sitting on one of them stands out.
 */
import type { ResonanceScan } from '../harmonics/harmonicsResult.js';
import { GRID_COLOUR, INK, MUTED_INK } from './palette.js';
import { attrs, coord, drawingTitle, escapeXml, sig3 } from './svgText.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';

export const SCAN_LAYOUT = { width: 640, plotTop: 52, plotHeight: 230, left: 62, right: 20 } as const;

/** Okabe–Ito hues (see palette.ts) plus dash patterns, so states differ without colour too. */
const SERIES_STYLE: readonly { readonly colour: string; readonly dash: string | null }[] = [
  { colour: '#000000', dash: null },
  { colour: '#0072B2', dash: '6 3' },
  { colour: '#D55E00', dash: null },
  { colour: '#009E73', dash: '2 3' },
  { colour: '#CC79A7', dash: '8 3 2 3' },
  { colour: '#E69F00', dash: null },
  { colour: '#56B4E9', dash: '4 4' },
];

/** Round tick step covering `span` in about `count` steps (1-2-5 × 10^k). */
function tickStep(span: number, count: number): number {
  const raw = span / count;
  const p = 10 ** Math.floor(Math.log10(raw));
  const m = raw / p;
  return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10) * p;
}

/**
 * Renders the scan: one curve per kvar level of the bank (up to seven; states with the same kvar on
 * coincide), the highest |Z| over the terminal pairs.
 * @param title the heading; '' for none (the <title> keeps the default words)
 * @returns SVG text; the plot area carries `data-x-range` and `data-y-range` (order and ohm at its edges)
 */
export function renderImpedanceScan(scan: ResonanceScan, title?: string): string {
  checkObjectArgument(scan, 'scan', "a resonance scan (a harmonics report's scan)", ['combinations', 'orders']);
  // '' draws no heading; the <title> keeps the default words (the scan names no board to stand alone).
  const named = drawingTitle(title, 'Impedance seen by harmonic currents, by bank state', null, 'title');
  const { width, plotTop, plotHeight, left, right } = SCAN_LAYOUT;
  // States with equal kvar on give the same curve (equal steps): draw each level once.
  const states = scan.combinations.filter((c, k, all) => all.findIndex((o) => Math.abs(o.capacitorKvar - c.capacitorKvar) < 1e-6) === k).slice(0, SERIES_STYLE.length);
  const curves = states.map((c) => scan.orders.map((_, k) => Math.max(...c.impedanceOhm.map((pair) => pair[k] ?? 0))));
  const xMin = scan.orders[0] ?? 1;
  const xMax = scan.orders[scan.orders.length - 1] ?? xMin + 1;
  const yTop = Math.max(1e-9, ...curves.flat());
  const yStep = tickStep(yTop, 5);
  const yMax = Math.ceil((yTop * 1.02) / yStep) * yStep;
  const plotWidth = width - left - right;
  const x = (h: number) => left + ((h - xMin) / (xMax - xMin)) * plotWidth;
  const y = (z: number) => plotTop + plotHeight - (z / yMax) * plotHeight;
  const parts: string[] = [];
  // Grid: ohm ticks, every odd order, and the checked orders drawn stronger and labelled.
  for (let z = 0; z <= yMax + 1e-12; z += yStep) {
    parts.push(`<line${attrs({ x1: left, y1: y(z), x2: left + plotWidth, y2: y(z), stroke: GRID_COLOUR, 'stroke-width': 0.5 })}/>`);
    parts.push(`<text${attrs({ x: left - 6, y: y(z) + 4, 'font-size': 10, fill: MUTED_INK, 'text-anchor': 'end' })}>${escapeXml(sig3(z))}</text>`);
  }
  for (let h = Math.ceil(xMin); h <= xMax; h++) {
    const checked = scan.checkedOrders.includes(h);
    if (!checked && h % 2 === 0) continue;
    parts.push(`<line${attrs({ x1: x(h), y1: plotTop, x2: x(h), y2: plotTop + plotHeight, stroke: checked ? '#8A8A8A' : GRID_COLOUR, 'stroke-width': checked ? 1 : 0.4, ...(checked ? { 'stroke-dasharray': '3 3' } : {}) })}/>`);
    parts.push(`<text${attrs({ x: x(h), y: plotTop + plotHeight + 14, 'font-size': 10, fill: checked ? INK : MUTED_INK, 'text-anchor': 'middle', 'font-weight': checked ? 'bold' : 'normal' })}>${h}</text>`);
  }
  parts.push(`<rect${attrs({ class: 'plot', x: left, y: plotTop, width: plotWidth, height: plotHeight, fill: 'none', stroke: '#999999', 'data-x-range': `${xMin} ${xMax}`, 'data-y-range': `0 ${yMax}` })}/>`);
  curves.forEach((curve, k) => {
    const style = SERIES_STYLE[k]!;
    const points = curve.map((z, i) => `${coord(x(scan.orders[i]!))},${coord(y(z))}`).join(' ');
    parts.push(
      `<polyline${attrs({ class: 'series', 'data-state': states[k]!.label, points, fill: 'none', stroke: style.colour, 'stroke-width': 1.8, ...(style.dash ? { 'stroke-dasharray': style.dash } : {}) })}/>`,
    );
  });
  // Legend: one row per state, with its kvar and the resonance the formula predicts.
  const legendTop = plotTop + plotHeight + 36;
  states.forEach((c, k) => {
    const style = SERIES_STYLE[k]!;
    const ly = legendTop + k * 17;
    parts.push(`<line${attrs({ x1: left, y1: ly, x2: left + 30, y2: ly, stroke: style.colour, 'stroke-width': 2, ...(style.dash ? { 'stroke-dasharray': style.dash } : {}) })}/>`);
    const peak = c.peaks.length ? ` · peak h ${c.peaks.map((p) => p.order.toFixed(1)).filter((v, i, a) => a.indexOf(v) === i).join(', ')}` : '';
    parts.push(`<text${attrs({ x: left + 38, y: ly + 4, 'font-size': 11, fill: INK })}>${escapeXml(`${c.label} (${c.capacitorKvar.toFixed(1)} kvar)${peak}`)}</text>`);
  });
  const more = scan.combinations.filter((c) => !states.some((st) => Math.abs(st.capacitorKvar - c.capacitorKvar) < 1e-6)).length;
  const height = legendTop + states.length * 17 + (more > 0 ? 18 : 4);
  if (more > 0) parts.push(`<text${attrs({ x: left, y: height - 6, 'font-size': 10, fill: MUTED_INK })}>${escapeXml(`${more} state(s) with other kvar levels not drawn (see the table)`)}</text>`);
  return (
    `<svg xmlns="http://www.w3.org/2000/svg"${attrs({ viewBox: `0 0 ${width} ${coord(height)}`, width, height, 'font-family': 'DejaVu Sans, Liberation Sans, Arial, sans-serif', role: 'img', 'data-view': 'impedance-scan' })}>` +
    `<title>${escapeXml(named.title)}</title>` +
    `<rect${attrs({ x: 0, y: 0, width, height, fill: '#FFFFFF' })}/>` +
    (named.heading === null ? '' : `<text${attrs({ x: 16, y: 22, 'font-size': 15, 'font-weight': 'bold', fill: INK })}>${escapeXml(named.heading)}</text>`) +
    `<text${attrs({ x: 16, y: 40, 'font-size': 11, fill: MUTED_INK })}>${escapeXml('largest |Z| between two terminals (ohm) by harmonic order; dashed: orders on the board')}</text>` +
    parts.join('') +
    `</svg>\n`
  );
}

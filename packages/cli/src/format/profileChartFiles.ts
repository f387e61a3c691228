/** The SVG charts of a profile study, written through `write(name, text)`. */
import { renderDurationChart, renderTimeChart, type IntervalFigures, type ProfileStudy } from '@trivar/core';

function boardPf(f: IntervalFigures): Float64Array {
  const out = new Float64Array(f.count);
  for (let i = 0; i < f.count; i++) {
    let w = 0;
    let q = 0;
    for (let k = 0; k < f.phaseW.length; k++) {
      w += f.phaseW[k]![i]!;
      q += f.phaseVar[k]![i]!;
    }
    const s = Math.hypot(w, q);
    // Signed: leading shown below zero would hide the magnitude; show PF, leading as negative.
    out[i] = s === 0 ? Number.NaN : (Math.sign(q || 1) * Math.abs(w)) / s;
  }
  return out;
}

export const CHART_FILES = ['currents.svg', 'power-factor.svg', 'load-duration.svg'] as const;

export function writeProfileCharts(study: ProfileStudy, write: (name: string, text: string) => void): void {
  const f = study.before;
  const phases = f.lineA.length;
  const names = ['A', 'B', 'C'].slice(0, phases);
  const currents = [...names.map((p, k) => ({ name: `line ${p}`, values: f.lineA[k]! })), ...(study.result.before.conductors.some((c) => c.conductor === 'N') ? [{ name: 'neutral', values: f.neutralA }] : [])];
  const board = study.result.board;
  write('currents.svg', renderTimeChart({ title: `${board}: line and neutral current`, unit: 'A', series: currents, labelOf: study.label }));
  const pf = [{ name: 'before', values: boardPf(f) }, ...(study.after ? [{ name: 'with bank', values: boardPf(study.after) }] : [])];
  write('power-factor.svg', renderTimeChart({ title: `${board}: board power factor (mean per column; below zero = leading)`, unit: 'PF', series: pf, labelOf: study.label, mode: 'mean' }));
  write('load-duration.svg', renderDurationChart({ title: `${board}: load-duration curves`, unit: 'A', series: currents, intervalHours: study.result.intervals.intervalSeconds / 3600 }));
}

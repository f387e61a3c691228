/** The SVG charts of a profile study, written through `write(name, text)`. */
import { labellerOf, renderDurationChart, renderTimeChart, type IntervalFigures, type PhaseLabeller, type ProfileStudy } from '@trivar/core';

/**
 * Power factor per local day from the day's energy, kWh / √(kWh² + kvarh²) with net kvarh,
 * negative when the day's net reactive energy is leading; every interval of a day carries
 * its day's figure, so the chart reads as daily values.
 */
function dailyPf(f: IntervalFigures, label: (i: number) => string): Float64Array {
  const out = new Float64Array(f.count);
  let start = 0;
  while (start < f.count) {
    const day = label(start).slice(0, 10);
    let end = start;
    let w = 0;
    let q = 0;
    while (end < f.count && label(end).slice(0, 10) === day) {
      for (let k = 0; k < f.phaseW.length; k++) {
        w += f.phaseW[k]![end]!;
        q += f.phaseVar[k]![end]!;
      }
      end++;
    }
    const s = Math.hypot(w, q);
    out.fill(s === 0 ? Number.NaN : (Math.sign(q || 1) * Math.abs(w)) / s, start, end);
    start = end;
  }
  return out;
}

export const CHART_FILES = ['currents.svg', 'power-factor.svg', 'load-duration.svg'] as const;

/** @param label the board file's phase labels: the series are named that way */
export function writeProfileCharts(study: ProfileStudy, write: (name: string, text: string) => void, label: PhaseLabeller = labellerOf(study.result.phaseNames)): void {
  const f = study.before;
  const phases = f.lineA.length;
  const names = (['A', 'B', 'C'] as const).slice(0, phases).map(label);
  const currents = [...names.map((p, k) => ({ name: `line ${p}`, values: f.lineA[k]! })), ...(study.result.before.conductors.some((c) => c.conductor === 'N') ? [{ name: 'neutral', values: f.neutralA }] : [])];
  const board = study.result.board;
  write('currents.svg', renderTimeChart({ title: `${board}: line and neutral current`, unit: 'A', series: currents, labelOf: study.label }));
  const pf = [{ name: 'before', values: dailyPf(f, study.label) }, ...(study.after ? [{ name: 'with bank', values: dailyPf(study.after, study.label) }] : [])];
  write('power-factor.svg', renderTimeChart({ title: `${board}: power factor of each day's energy (below zero = leading)`, unit: 'PF', series: pf, labelOf: study.label, mode: 'mean' }));
  write('load-duration.svg', renderDurationChart({ title: `${board}: load-duration curves`, unit: 'A', series: currents, intervalHours: study.result.intervals.intervalSeconds / 3600 }));
}

/**
 * The SVG charts of a profile study, written through `write(name, text)`: three per board (currents,
 * daily power factor, load-duration), and on an installation one more over every board's incomer
 * (its busiest line against the line rating). Each legend carries the figure the tables print
 * beside it (peak current, billing power factor), so a chart can be read back against them.
 */
import {
  billingPowerFactorText,
  labellerOf,
  renderDurationChart,
  renderTimeChart,
  type InstallationProfileStudy,
  type IntervalFigures,
  type PhaseLabeller,
  type ProfileStudy,
  type ProfileSummary,
} from '@trivar/core';
import { fixed } from './textTable.js';

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

/** Up to unity from a tenth below the lowest day (at most 0.9); −1 to 1 when some day leads. */
function pfRange(series: readonly { readonly values: Float64Array }[]): [number, number] {
  let lowest = 1;
  for (const s of series) for (const v of s.values) if (Number.isFinite(v) && v < lowest) lowest = v;
  return lowest < 0 ? [-1, 1] : [Math.min(0.9, Math.floor(lowest * 10) / 10), 1];
}

export const CHART_FILES = ['currents.svg', 'power-factor.svg', 'load-duration.svg'] as const;

/** The installation-wide chart, beside one folder of CHART_FILES per board. */
export const FEEDER_CHART_FILE = 'feeder-loading.svg';

/** What one board's charts are drawn from. */
interface BoardCharts {
  /** Title prefix: the board's name. */
  readonly board: string;
  /** Where the currents are measured, for the titles (the board, or its incoming feeder). */
  readonly currentsAt: string;
  readonly before: IntervalFigures;
  readonly after: IntervalFigures | null;
  readonly summary: ProfileSummary;
  readonly afterSummary: ProfileSummary | null;
  readonly intervalSeconds: number;
  readonly label: (i: number) => string;
}

function writeBoardCharts(c: BoardCharts, write: (name: string, text: string) => void, phase: PhaseLabeller): void {
  const f = c.before;
  const names = (['A', 'B', 'C'] as const).slice(0, f.lineA.length).map(phase);
  const lines = c.summary.conductors.filter((x) => x.conductor !== 'N');
  const neutral = c.summary.conductors.find((x) => x.conductor === 'N');
  const currents = [
    ...names.map((p, k) => ({ name: `line ${p} (peak ${fixed(lines[k]!.maxA, 1)} A)`, values: f.lineA[k]! })),
    ...(neutral ? [{ name: `neutral (peak ${fixed(neutral.maxA, 1)} A)`, values: f.neutralA }] : []),
  ];
  write('currents.svg', renderTimeChart({ title: `${c.board}: line and neutral current${c.currentsAt}`, unit: 'A', series: currents, labelOf: c.label }));
  const pf = [
    { name: `before (billing PF ${billingPowerFactorText(c.summary.energy.billingPf)})`, values: dailyPf(f, c.label) },
    ...(c.after && c.afterSummary ? [{ name: `with bank (billing PF ${billingPowerFactorText(c.afterSummary.energy.billingPf)})`, values: dailyPf(c.after, c.label) }] : []),
  ];
  write('power-factor.svg', renderTimeChart({ title: `${c.board}: power factor of each day's energy (below zero = leading)`, unit: 'PF', series: pf, labelOf: c.label, mode: 'mean', yRange: pfRange(pf) }));
  write('load-duration.svg', renderDurationChart({ title: `${c.board}: load-duration curves${c.currentsAt}`, unit: 'A', series: currents, intervalHours: c.intervalSeconds / 3600 }));
}

/** @param label the board file's phase labels: the series are named that way */
export function writeProfileCharts(study: ProfileStudy, write: (name: string, text: string) => void, label: PhaseLabeller = labellerOf(study.result.phaseNames)): void {
  const r = study.result;
  writeBoardCharts(
    { board: r.board, currentsAt: '', before: study.before, after: study.after, summary: r.before, afterSummary: r.bank?.after ?? null, intervalSeconds: r.intervals.intervalSeconds, label: study.label },
    write,
    label,
  );
}

/**
 * Every board's charts (`write(board, name, text)`), and the feeder loading (`write(null, …)`): each board's
 * incomer (the supply at the main board, its feeder at a sub-board), the busiest line in each interval as
 * a share of the line rating — boards without a line rating are left out of it, and without any the chart
 * is not written.
 */
export function writeInstallationProfileCharts(
  study: InstallationProfileStudy,
  write: (board: string | null, name: string, text: string) => void,
  label: PhaseLabeller = labellerOf(study.result.phaseNames),
): void {
  const r = study.result;
  r.boards.forEach((b, i) =>
    writeBoardCharts(
      {
        board: b.board,
        currentsAt: b.fedFrom === null ? ' (supply)' : ` (feeder from ${b.fedFrom})`,
        before: study.before[i]!,
        after: study.after?.[i] ?? null,
        summary: b.before,
        afterSummary: b.after,
        intervalSeconds: r.intervals.intervalSeconds,
        label: study.label,
      },
      (name, text) => write(b.board, name, text),
      label,
    ),
  );
  const loading = r.boards.flatMap((b, i) => {
    const rating = b.before.conductors.find((c) => c.conductor !== 'N')?.ratingA ?? null;
    if (rating === null) return [];
    const f = study.before[i]!;
    const values = new Float64Array(f.count);
    for (let t = 0; t < f.count; t++) for (const line of f.lineA) values[t] = Math.max(values[t]!, (100 * line[t]!) / rating);
    const peak = Math.max(...b.before.conductors.filter((c) => c.conductor !== 'N').map((c) => c.maxA));
    return [{ name: `${b.board} (peak ${fixed((100 * peak) / rating, 1)} % of ${fixed(rating, 0)} A)`, values }];
  });
  if (loading.length)
    write(null, FEEDER_CHART_FILE, renderTimeChart({ title: `${r.installation}: busiest line of each board's incomer, % of its rating`, unit: '%', series: loading, labelOf: study.label }));
}

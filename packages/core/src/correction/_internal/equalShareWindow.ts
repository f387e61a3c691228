/**
 * The window of an equal three-phase bank under per-line targets: the same kvar
 * t in every branch, with the board re-solved at each trial t.
 *   t_min: the smallest t at which every line meets its target;
 *   t_limit: the largest t before a line passes its lower bound (leads).
 * The per-branch requirements of the least-kvar sizing are unequal (a delta
 * branch also moves active current between its lines), so they say little about
 * what an equal bank — the one an ordinary controller drives — can do; this does.
 * Both are bisections, down to the band where round-off in the solves may flip the
 * answer (`doubt` below); threshold oracles (thresholdOracle.ts) answer their questions,
 * solving only those near the threshold.
 */
import type { BoardProbe, ProbeState } from './boardProbe.js';
import type { LineBand } from './sizeForLineTargets.js';
import { createThresholdOracle, type SideReading } from './thresholdOracle.js';

export interface EqualShareWindow {
  /** Per-branch kvar at nominal voltage; null when no equal bank meets every target below the limit. */
  readonly minKvar: number | null;
  readonly limitKvar: number;
}

const BISECTIONS = 50;

/**
 * @param limitOnly find t_limit only (minKvar is then null): a light-load sizing is read for its limit
 *   alone, what the fixed part may take
 */
export function equalShareWindow(probe: BoardProbe, start: ProbeState, targetBands: readonly LineBand[], limitBands: readonly LineBand[], limitOnly = false): EqualShareWindow {
  const n = probe.slots.length;
  const at = (t: number) => probe.at(new Array<number>(n).fill(t));
  const weights = start.lineS.map((s) => Math.max(s, 1e-6 * Math.max(...start.lineS)));
  const meets = (s: ProbeState) => s.lineQ.every((q, k) => !Number.isFinite(targetBands[k]!.high) || q - targetBands[k]!.high * Math.abs(s.lineP[k]!) <= 1e-9 * weights[k]!);
  const within = (s: ProbeState) => s.lineQ.every((q, k) => q - limitBands[k]!.low * Math.abs(s.lineP[k]!) >= -1e-9 * weights[k]!);
  // Continuous margins beside the two tests, > 0 below their thresholds (less kvar), for the oracles to interpolate on.
  const withinMargin = (s: ProbeState) => Math.min(...s.lineQ.map((q, k) => (q - limitBands[k]!.low * Math.abs(s.lineP[k]!)) / weights[k]! + 1e-9));
  const shortMargin = (s: ProbeState) =>
    Math.max(-1, ...s.lineQ.map((q, k) => (Number.isFinite(targetBands[k]!.high) ? (q - targetBands[k]!.high * Math.abs(s.lineP[k]!)) / weights[k]! - 1e-9 : -1)));
  const scale = start.lineS.reduce((a, b) => a + b, 0);
  if (scale === 0) return { minKvar: 0, limitKvar: 0 };
  // Each trial solve answers both bisections: t_limit's (within the lower bounds below it) and
  // t_min's (short of the target below it, i.e. not meeting it). Only the readings are kept, not the
  // solved states (which would keep every trial's solution alive).
  const targetReading = (s: ProbeState): SideReading => ({ low: !meets(s), margin: shortMargin(s) });
  const readings = new Map<number, { limit: SideReading; target: SideReading }>();
  const solved = (t: number) => {
    let r = readings.get(t);
    if (!r) {
      const s = t === 0 ? start : at(t);
      readings.set(t, (r = { limit: { low: within(s), margin: withinMargin(s) }, target: targetReading(s) }));
    }
    return r;
  };
  // Round-off in the solves blurs both tests over about 4e-13 of the board's kVA either side of their
  // thresholds (the most seen on the shipped examples, on an installation's sub-board): answers are
  // inferred only from 250 times that away.
  const doubt = 1e-10 * scale;
  // The bisections end once their bracket is that narrow (or 1e-12 of t, where that is wider):
  // halving on inside the band only asks the solver about its round-off. Halving to 1e-12 of t took
  // about 12 more solves per threshold and moved the figures by less than 1e-10 of the board's kVA.
  const resolution = (t: number) => Math.max(1e-12 * t, doubt);
  const limitSide = createThresholdOracle((t) => solved(t).limit, doubt);
  const targetSide = createThresholdOracle((t) => solved(t).target, doubt);
  limitSide.isLow(0);
  // t_limit by doubling, then bisection.
  let ok = 0;
  let bad = Math.max(1e-3 * scale, start.lineQ.reduce((a, q) => a + Math.max(0, q), 0) / n);
  while (limitSide.isLow(bad)) {
    ok = bad;
    bad *= 2;
    if (bad > 1e3 * scale) break;
  }
  limitSide.narrow();
  for (let i = 0; i < BISECTIONS && bad - ok > resolution(bad); i++) {
    const mid = (ok + bad) / 2;
    if (limitSide.isLow(mid)) ok = mid;
    else bad = mid;
  }
  const limitKvar = ok;
  if (limitOnly) return { minKvar: null, limitKvar };
  if (meets(start)) return { minKvar: 0, limitKvar };
  if (solved(limitKvar).target.low) return { minKvar: null, limitKvar };
  for (const [t, r] of readings) targetSide.record(t, r.target);
  targetSide.narrow();
  let lo = 0;
  let hi = limitKvar;
  for (let i = 0; i < BISECTIONS && hi - lo > resolution(hi); i++) {
    const mid = (lo + hi) / 2;
    if (!targetSide.isLow(mid)) hi = mid;
    else lo = mid;
  }
  return { minKvar: hi, limitKvar };
}

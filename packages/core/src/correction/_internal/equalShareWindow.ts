/**
 * The window of an equal three-phase bank under per-line targets: the same kvar
 * t in every branch, with the board re-solved at each trial t.
 *   t_min: the smallest t at which every line meets its target;
 *   t_limit: the largest t before a line passes its lower bound (leads).
 * The per-branch requirements of the least-kvar sizing are unequal (a delta
 * branch also moves active current between its lines), so they say little about
 * what an equal bank — the one an ordinary controller drives — can do; this does.
 */
import type { BoardProbe, ProbeState } from './boardProbe.js';
import type { LineBand } from './sizeForLineTargets.js';

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
  const scale = start.lineS.reduce((a, b) => a + b, 0);
  if (scale === 0) return { minKvar: 0, limitKvar: 0 };
  // t_limit by doubling, then bisection.
  let ok = 0;
  let bad = Math.max(1e-3 * scale, start.lineQ.reduce((a, q) => a + Math.max(0, q), 0) / n);
  while (within(at(bad))) {
    ok = bad;
    bad *= 2;
    if (bad > 1e3 * scale) break;
  }
  for (let i = 0; i < BISECTIONS && bad - ok > 1e-12 * bad; i++) {
    const mid = (ok + bad) / 2;
    if (within(at(mid))) ok = mid;
    else bad = mid;
  }
  const limitKvar = ok;
  if (limitOnly) return { minKvar: null, limitKvar };
  if (meets(start)) return { minKvar: 0, limitKvar };
  if (!meets(at(limitKvar))) return { minKvar: null, limitKvar };
  let lo = 0;
  let hi = limitKvar;
  for (let i = 0; i < BISECTIONS && hi - lo > 1e-12 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (meets(at(mid))) hi = mid;
    else lo = mid;
  }
  return { minKvar: hi, limitKvar };
}

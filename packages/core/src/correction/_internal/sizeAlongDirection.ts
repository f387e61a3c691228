/**
 * Bank sized for one board-wide power factor: the branch outputs keep fixed
 * ratios (equal, or in proportion to each branch's need), so only the total t
 * is unknown. The board is re-solved at every trial t:
 *   1. t_limit: the largest t before a line passes its upper bound (leads, or
 *      the board passes the upper lagging PF) — found by doubling, then bisection;
 *   2. the smallest t in [0, t_limit] where the board PF reaches the target —
 *      a scan for the first crossing, then bisection;
 *   3. if no t reaches it, the t with the highest PF (golden-section refinement).
 */
import { boardPowerFactor, TARGET_SLACK, type BoardTargetDefinition, type ResolvedTarget } from '../correctionTarget.js';
import type { BoardProbe, ProbeState } from './boardProbe.js';

export interface DirectionOutcome {
  readonly kvar: readonly number[];
  readonly state: ProbeState;
  readonly status: 'met' | 'unreachable' | 'leading-before' | 'nothing-to-add';
  /** Branch outputs at t_limit, kvar. */
  readonly limitKvar: readonly number[];
}

const SCAN_POINTS = 48;
const BISECTIONS = 60;

/** `lowerTan`: per line, the lower bound on Q/|P| (see `lineBands`). */
export function sizeAlongDirection(
  probe: BoardProbe,
  direction: readonly number[],
  target: ResolvedTarget,
  definition: BoardTargetDefinition,
  lowerTan: readonly number[],
): DirectionOutcome {
  const n = probe.slots.length;
  const zero = probe.at(new Array<number>(n).fill(0));
  const total = direction.reduce((a, b) => a + b, 0);
  if (!(total > 0)) return { kvar: zero.kvar, state: zero, status: 'nothing-to-add', limitKvar: zero.kvar };
  const unit = direction.map((d) => d / total);
  const at = (t: number) => probe.at(unit.map((u) => u * t));
  const largest = Math.max(...zero.lineS);
  const weights = zero.lineS.map((s) => Math.max(s, 1e-6 * largest));
  const pfOf = (s: ProbeState) => boardPowerFactor(s.metered, definition) ?? -Infinity;
  /** ≥ 0 while every line is inside its lower bound and the board is not past the upper PF. */
  const limitMargin = (s: ProbeState) => {
    let m = Infinity;
    s.lineQ.forEach((q, line) => {
      m = Math.min(m, (q - lowerTan[line]! * Math.abs(s.lineP[line]!)) / weights[line]!);
    });
    if (target.maxLaggingPf !== null) m = Math.min(m, target.maxLaggingPf - pfOf(s));
    return m;
  };
  if (limitMargin(zero) < -TARGET_SLACK) return { kvar: zero.kvar, state: zero, status: 'leading-before', limitKvar: zero.kvar };

  const scale = zero.lineS.reduce((a, b) => a + b, 0);
  let tOk = 0;
  let tBad = Math.max(zero.lineQ.reduce((a, q) => a + Math.max(0, q), 0), 1e-3 * scale);
  while (limitMargin(at(tBad)) >= 0) {
    tOk = tBad;
    tBad *= 2;
    if (tBad > 1e3 * scale) break;
  }
  for (let i = 0; i < BISECTIONS && tBad - tOk > 1e-15 * tBad; i++) {
    const mid = (tOk + tBad) / 2;
    if (limitMargin(at(mid)) >= 0) tOk = mid;
    else tBad = mid;
  }
  const tLimit = tOk;
  const limitKvar = unit.map((u) => u * tLimit);

  const scan = Array.from({ length: SCAN_POINTS + 1 }, (_, i) => {
    const t = (tLimit * i) / SCAN_POINTS;
    const state = i === 0 ? zero : at(t);
    return { t, state, pf: pfOf(state) };
  });
  const crossing = scan.findIndex((p) => p.pf >= target.pf);
  if (crossing === 0) return { kvar: zero.kvar, state: zero, status: 'met', limitKvar };
  if (crossing > 0) {
    let lo = scan[crossing - 1]!.t;
    let hi = scan[crossing]!;
    for (let i = 0; i < BISECTIONS && hi.t - lo > 1e-15 * hi.t; i++) {
      const mid = (lo + hi.t) / 2;
      const state = at(mid);
      const pf = pfOf(state);
      if (pf >= target.pf) hi = { t: mid, state, pf };
      else lo = mid;
    }
    return { kvar: hi.state.kvar, state: hi.state, status: 'met', limitKvar };
  }
  // Unreachable: the highest PF on [0, t_limit].
  let best = 0;
  scan.forEach((p, i) => {
    if (p.pf > scan[best]!.pf) best = i;
  });
  let a = scan[Math.max(0, best - 1)]!.t;
  let b = scan[Math.min(SCAN_POINTS, best + 1)]!.t;
  const golden = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < 40 && b - a > 1e-12 * (b + 1e-30); i++) {
    const c = b - golden * (b - a);
    const d = a + golden * (b - a);
    if (pfOf(at(c)) >= pfOf(at(d))) b = d;
    else a = c;
  }
  const refined = at((a + b) / 2);
  const state = pfOf(refined) >= scan[best]!.pf ? refined : scan[best]!.state;
  return { kvar: state.kvar, state, status: 'unreachable', limitKvar };
}

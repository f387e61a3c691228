/**
 * Least-kvar bank for per-line targets, by sequential linear programming on
 * the solved board.
 *
 * Per line ℓ the target is a band low ≤ Q_ℓ/|P_ℓ| ≤ high. Around the present
 * branch outputs x the solved P and Q are linearised (forward differences),
 * which gives the LP
 *   minimise (s, Σx)  lexicographically
 *   subject to Q_ℓ − high·|P_ℓ| ≤ w_ℓ·s,  Q_ℓ − low·|P_ℓ| ≥ 0,  x ≥ 0,  s ≥ 0,
 * where s is the worst shortfall (per unit of the line's apparent power w_ℓ):
 * zero when the targets can be met, otherwise the LP returns the bank that
 * comes closest. The LP is re-solved around its answer until x stops moving;
 * on an ideal source the board is linear in x and one step is exact. Should the
 * lower bounds have no common solution at all, they are relaxed by s as well
 * (lines that already lead get their present τ as bound beforehand, see `lineBands`).
 */
import { solveLinearProgram } from './linearProgram.js';
import { maxAbs } from './realMatrix.js';
import { probeJacobian, type BoardProbe, type ProbeState } from './boardProbe.js';

export interface LineBand {
  readonly high: number;
  readonly low: number;
}

export interface LoopSettings {
  readonly maxIterations: number;
  readonly convergence: number;
  /** Each unknown at least this fraction of their sum (0: no such rule). */
  readonly minShare?: number;
}

export interface LineSizingOutcome {
  readonly kvar: readonly number[];
  readonly state: ProbeState;
  readonly iterations: number;
  readonly converged: boolean;
  /** Largest branch change in the last iteration, per unit of the board's kVA. */
  readonly lastChange: number;
  /** Worst remaining violation of a band, per unit of that line's kVA (0 when every band holds). */
  readonly worstViolation: number;
}

/** Violations are measured per unit of each line's apparent power, floored at this fraction of the largest (an unloaded line may still not be made to lead). */
const WEIGHT_FLOOR = 1e-6;

interface Linearisation {
  readonly state: ProbeState;
  readonly jp: readonly (readonly number[])[];
  readonly jq: readonly (readonly number[])[];
}

/** Coefficients g and constant e of Q_ℓ − τ·|P_ℓ| as a linear function of the new outputs. */
function bandExpression(lin: Linearisation, line: number, tau: number): { g: number[]; e: number } {
  const p = lin.state.lineP[line]!;
  const sign = p < 0 ? -1 : 1;
  const g = lin.jq[line]!.map((dq, i) => dq - tau * sign * lin.jp[line]![i]!);
  const e = lin.state.lineQ[line]! - tau * sign * p - g.reduce((s, gi, i) => s + gi * lin.state.kvar[i]!, 0);
  return { g, e };
}

function solveStep(lin: Linearisation, bands: readonly LineBand[], weights: readonly number[], relaxLower: boolean, minShare: number) {
  const n = lin.state.kvar.length;
  const rows: number[][] = [];
  const bounds: number[] = [];
  bands.forEach((band, line) => {
    const w = weights[line]!;
    if (Number.isFinite(band.high)) {
      const { g, e } = bandExpression(lin, line, band.high);
      rows.push([...g, -w]);
      bounds.push(-e);
    }
    const { g, e } = bandExpression(lin, line, band.low);
    rows.push([...g.map((v) => -v), relaxLower ? -w : 0]);
    bounds.push(e);
  });
  for (let i = 0; i <= n; i++) {
    const row = new Array<number>(n + 1).fill(0);
    row[i] = -1;
    rows.push(row);
    bounds.push(0);
    if (minShare > 0 && i < n) {
      rows.push([...Array.from({ length: n }, (_, j) => minShare - (j === i ? 1 : 0)), 0]);
      bounds.push(0);
    }
  }
  const slackFirst = [...new Array<number>(n).fill(0), 1];
  const totalKvar = [...new Array<number>(n).fill(1), 0];
  return solveLinearProgram({ rows, bounds, objectives: [slackFirst, totalKvar] });
}

export function sizeForLineTargets(probe: BoardProbe, bands: readonly LineBand[], settings: LoopSettings): LineSizingOutcome {
  const n = probe.slots.length;
  const start = probe.at(new Array<number>(n).fill(0));
  const largest = Math.max(...start.lineS);
  const weights = start.lineS.map((s) => Math.max(s, WEIGHT_FLOOR * largest));
  const scale = start.lineS.reduce((a, b) => a + b, 0);
  const violation = (s: ProbeState) =>
    bands.reduce((worst, band, line) => {
      const absP = Math.abs(s.lineP[line]!);
      const q = s.lineQ[line]!;
      const over = Number.isFinite(band.high) ? q - band.high * absP : 0;
      return Math.max(worst, over / weights[line]!, (band.low * absP - q) / weights[line]!);
    }, 0);
  if (scale === 0) return { kvar: start.kvar, state: start, iterations: 0, converged: true, lastChange: 0, worstViolation: 0 };
  const step = 1e-4 * scale;
  let state = start;
  let lastChange = Infinity;
  let iterations = 0;
  let relaxLower = false;
  while (iterations < settings.maxIterations) {
    iterations++;
    const jacobian = probeJacobian(probe, state, (s) => [...s.lineP, ...s.lineQ], step);
    const lin = { state, jp: jacobian.slice(0, bands.length), jq: jacobian.slice(bands.length) };
    let z = solveStep(lin, bands, weights, relaxLower, settings.minShare ?? 0);
    if (!z && !relaxLower) {
      relaxLower = true;
      z = solveStep(lin, bands, weights, relaxLower, settings.minShare ?? 0);
    }
    if (!z) break;
    const next = z.slice(0, n).map((v) => Math.max(0, v));
    lastChange = maxAbs(next.map((v, i) => v - state.kvar[i]!)) / scale;
    state = probe.at(next);
    if (lastChange <= settings.convergence) break;
  }
  return {
    kvar: state.kvar,
    state,
    iterations,
    converged: lastChange <= settings.convergence,
    lastChange,
    worstViolation: Math.max(0, violation(state)),
  };
}

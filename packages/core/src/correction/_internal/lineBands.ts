/**
 * Per-line bands on τ = Q/|P| used by the sizing loops. A line that already
 * sits below its lower bound before correction (a line-to-line load makes one
 * of its lines lead) keeps its present τ as the bound instead: the equipment
 * may not make it worse, and the other lines can still be corrected. The final
 * check still reports that line against the real bound.
 */
import { LEAD_MORE_TOLERANCE, lineTanBounds, type ResolvedTarget } from '../correctionTarget.js';
import type { ProbeState } from './boardProbe.js';
import type { LineBand } from './sizeForLineTargets.js';

export function lineBands(target: ResolvedTarget, start: ProbeState, kind: 'target' | 'limit'): LineBand[] {
  return start.lineQ.map((q, line) => {
    const { high, low } = lineTanBounds(target, line);
    const p = Math.abs(start.lineP[line]!);
    const present = p > 0 ? q / p : q >= 0 ? Infinity : -Infinity;
    // Clamped so a line with no active power keeps finite coefficients (PF 0.001 leading).
    const lower = Math.max(present < low ? present - LEAD_MORE_TOLERANCE : low, -1e3);
    return { high: kind === 'limit' ? lower : high, low: lower };
  });
}

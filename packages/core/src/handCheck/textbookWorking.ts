/**
 * The textbook per-phase method, as it is done by hand: every phase at its
 * nominal voltage, each line-to-line branch's P and Q split half to each of
 * its lines, capacitors giving their nameplate kvar, and
 * Qc = P(tan φ1 − tan φ2), I = √(P² + Q²)/V per phase. The neutral is the phasor
 * sum of the line-to-neutral branches' currents only: a branch across two lines
 * (or on a floating star) returns nothing through the neutral.
 */
import type { Board, PhaseId } from '../board/boardModel.js';
import { abs, add, conj, degToRad, div, polar, type ComplexValue } from '../complex.js';
import { balancedAnglesDeg } from '../board/normaliseBoard.js';
import type { PowerFactorSense } from '../analysis/boardResult.js';
import type { HandCapacitor, TextbookPhase } from './handCheckResult.js';
import { assertBoardModel } from '../board/modelGuards.js';

const isPhase = (t: string, board: Board): t is PhaseId => board.phases.includes(t as PhaseId);

/** P and Q (W, var; load convention) credited to each phase, with line-to-line branches split evenly. */
export function perPhasePowers(board: Board): Map<PhaseId, ComplexValue> {
  const out = new Map<PhaseId, ComplexValue>(board.phases.map((p) => [p, { re: 0, im: 0 }]));
  for (const load of board.loads) {
    for (const b of load.branches) {
      const credit = (p: PhaseId, share: number) => out.set(p, add(out.get(p)!, { re: share * b.sNominal.re, im: share * b.sNominal.im }));
      const fromPhase = isPhase(b.from, board);
      const toPhase = isPhase(b.to, board);
      if (fromPhase && toPhase) {
        credit(b.from as PhaseId, 0.5);
        credit(b.to as PhaseId, 0.5);
      } else if (fromPhase) credit(b.from as PhaseId, 1);
      else if (toPhase) credit(b.to as PhaseId, 1);
    }
  }
  return out;
}

/** P and Q (W, var; load convention) of the branches from each phase to the neutral: what the neutral returns. */
function lineToNeutralPowers(board: Board): Map<PhaseId, ComplexValue> {
  const out = new Map<PhaseId, ComplexValue>(board.phases.map((p) => [p, { re: 0, im: 0 }]));
  for (const b of board.loads.flatMap((l) => l.branches))
    if (b.to === 'N' && isPhase(b.from, board)) out.set(b.from as PhaseId, add(out.get(b.from as PhaseId)!, b.sNominal));
  return out;
}

/** 'none' where the phase carries nothing: no power, no PF to tag, as the board table prints it. */
const senseOf = (p: number, q: number): PowerFactorSense =>
  Math.hypot(p, q) <= 1e-9 ? 'none' : Math.abs(q) <= 1e-9 * Math.max(1, Math.abs(p)) ? 'unity' : q > 0 ? 'lagging' : 'leading';
const pfOf = (p: number, q: number): number => (Math.hypot(p, q) > 0 ? Math.abs(p) / Math.hypot(p, q) : 1);

/** Nominal balanced phase voltages, V. */
export function nominalPhaseVoltages(board: Board): Map<PhaseId, ComplexValue> {
  const angles = balancedAnglesDeg(board.system, board.sequence);
  return new Map(board.phases.map((p, k) => [p, polar(board.nominalLineToNeutralV, degToRad(angles[k]!))]));
}

/** Capacitor kvar credited to each phase (a line-pair capacitor: half to each line). */
export function perPhaseCapacitorKvar(board: Board, capacitors: readonly Pick<HandCapacitor, 'branch' | 'handKvar'>[]): Map<PhaseId, number> {
  const out = new Map<PhaseId, number>(board.phases.map((p) => [p, 0]));
  for (const c of capacitors) {
    const [from, to] = c.branch.split('-') as [PhaseId, PhaseId | 'N'];
    if (to === 'N') out.set(from, out.get(from)! + c.handKvar);
    else {
      out.set(from, out.get(from)! + c.handKvar / 2);
      out.set(to, out.get(to)! + c.handKvar / 2);
    }
  }
  return out;
}

export interface TextbookFigures {
  readonly phases: readonly TextbookPhase[];
  /** |Σ I_x| of the line-to-neutral branches' currents at nominal voltage, A; null without a neutral. */
  readonly neutralA: number | null;
  /** Vector power factor ΣP/|ΣS| (negative when the board exports, as in `BoardResult`). */
  readonly boardPf: number;
}

export function textbookWorking(board: Board, capacitors: readonly Pick<HandCapacitor, 'branch' | 'handKvar'>[], targetPf: number | null): TextbookFigures {
  assertBoardModel(board);
  const powers = perPhasePowers(board);
  const caps = perPhaseCapacitorKvar(board, capacitors);
  const volts = nominalPhaseVoltages(board);
  const v = board.nominalLineToNeutralV;
  const tanTarget = targetPf === null ? null : Math.tan(Math.acos(targetPf));
  const toNeutral = lineToNeutralPowers(board);
  for (const c of capacitors) {
    const [from, to] = c.branch.split('-') as [PhaseId, PhaseId | 'N'];
    if (to === 'N') toNeutral.set(from, add(toNeutral.get(from)!, { re: 0, im: -1000 * c.handKvar }));
  }
  // I = (S/V)*: each phase's line-to-neutral current at its nominal voltage, summed for the neutral.
  const neutral = board.phases.reduce((n, phase) => add(n, conj(div(toNeutral.get(phase)!, volts.get(phase)!))), { re: 0, im: 0 } as ComplexValue);
  let totalP = 0;
  let totalQ = 0;
  const phases = board.phases.map((phase): TextbookPhase => {
    const s = powers.get(phase)!;
    const kW = s.re / 1000;
    const kvarBefore = s.im / 1000;
    const capacitorKvar = caps.get(phase)!;
    const kvarAfter = kvarBefore - capacitorKvar;
    totalP += kW;
    totalQ += kvarAfter;
    const positiveP = kW > 1e-12;
    return {
      phase,
      voltageV: v,
      kW,
      kvarBefore,
      tanBefore: positiveP ? kvarBefore / kW : null,
      pfBefore: pfOf(kW, kvarBefore),
      capacitorKvar,
      requiredKvar: tanTarget !== null && positiveP ? Math.max(0, kW * (kvarBefore / kW - tanTarget)) : null,
      kvarAfter,
      tanAfter: positiveP ? kvarAfter / kW : null,
      pfAfter: pfOf(kW, kvarAfter),
      senseAfter: senseOf(kW, kvarAfter),
      activeCurrentA: (1000 * kW) / v,
      reactiveCurrentBeforeA: (1000 * kvarBefore) / v,
      reactiveCurrentAfterA: (1000 * kvarAfter) / v,
      currentBeforeA: (1000 * Math.hypot(kW, kvarBefore)) / v,
      currentAfterA: (1000 * Math.hypot(kW, kvarAfter)) / v,
    };
  });
  // Board figure as the solver reports it: P/|S|, negative when the board exports.
  const totalS = Math.hypot(totalP, totalQ);
  return { phases, neutralA: board.hasNeutral ? abs(neutral) : null, boardPf: totalS > 0 ? totalP / totalS : 1 };
}

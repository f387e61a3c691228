/**
 * The conditions the capacitor duty is checked in [METHODS §4: "multiply current/kvar by actual
 * C/C_rated (tolerance)"]: the units at nominal capacitance and at both ends of their tolerance
 * (more capacitance draws more current and moves the resonance down, less moves it up, perhaps
 * onto an injected order), each with the board's loads as given and with every load off — the
 * highest voltage the bank sees on a board whose loads draw lagging current (the bank's own rise
 * through the source impedance, no load drop), with background distortion undamped by any load.
 */
import type { Board, BoardLoad, Installation } from '../board/boardModel.js';
import type { CapacitanceTolerance, DutyCondition } from './harmonicsResult.js';
import type { HarmonicModel, LoadBehaviour } from './harmonicModel.js';
import { assertBoardModel, assertInstallationModel } from '../board/modelGuards.js';
import { checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

/**
 * Nominal with the loads as given first (ties keep the plain case), then the tolerance ends, then
 * the same with every load off; with `otherBanks`, all of that with the other banks on, then off.
 */
export function dutyConditions(tolerance: CapacitanceTolerance, otherBanks = false): DutyCondition[] {
  checkObjectArgument(tolerance, 'tolerance', 'a capacitance tolerance { minusPercent, plusPercent }', ['minusPercent', 'plusPercent']);
  checkNumberArgument(tolerance.minusPercent, 'tolerance.minusPercent', 'a tolerance, %, from 0 to 100', (x) => x >= 0 && x <= 100);
  checkNumberArgument(tolerance.plusPercent, 'tolerance.plusPercent', 'a tolerance, %, at least 0', (x) => x >= 0);
  const capacitance = [100, 100 - tolerance.minusPercent, 100 + tolerance.plusPercent].filter((c, i, all) => all.indexOf(c) === i);
  const plain = (['as given', 'off'] as const).flatMap((loads) => capacitance.map((capacitancePercent): DutyCondition => ({ capacitancePercent, loads })));
  return otherBanks ? (['on', 'off'] as const).flatMap((state) => plain.map((c): DutyCondition => ({ ...c, otherBanks: state }))) : plain;
}

/** Every load of the board off (what a study added, such as the bank, stays), as `withSteps` switches a step off. */
export function withLoadsOff(board: Board): Board {
  assertBoardModel(board);
  return { ...board, loads: loadsOff(board.loads) };
}

/** Every load of every board off (what a study added stays). */
export function withInstallationLoadsOff(installation: Installation): Installation {
  return { ...installation, main: withLoadsOff(installation.main), subBoards: installation.subBoards.map((sb) => ({ ...sb, loads: loadsOff(sb.loads) })) };
}

/** Every bank part of the boards other than `b` off (`banks`: per board, its bank's load numbers). */
export function withOtherBanksOff(installation: Installation, banks: readonly (readonly number[])[], b: number): Installation {
  assertInstallationModel(installation);
  return withPartsOff(installation, banks.map((parts, c) => (c === b ? [] : parts)));
}

/** The bank parts `off[c]` (load numbers of board c) switched off: their branches draw nothing. */
export function withPartsOff(installation: Installation, off: readonly (readonly number[])[]): Installation {
  const switched = (c: number, loads: readonly BoardLoad[]) => {
    const parts = new Set(off[c] ?? []);
    return parts.size === 0 ? loads : loads.map((l, i): BoardLoad => (parts.has(i) ? { ...l, branches: l.branches.map((x) => ({ ...x, sNominal: { re: 0, im: 0 } })) } : l));
  };
  return { ...installation, main: { ...installation.main, loads: switched(0, installation.main.loads) }, subBoards: installation.subBoards.map((sb, i) => ({ ...sb, loads: switched(i + 1, sb.loads) })) };
}

const loadsOff = (loads: readonly BoardLoad[]): BoardLoad[] =>
  loads.map((l): BoardLoad => (l.origin === 'board' ? { ...l, branches: l.branches.map((b) => ({ ...b, sNominal: { re: 0, im: 0 } })) } : l));

/**
 * The bank's units at `factor` × their nominal capacitance. A plain part's susceptance scales by
 * the factor; in a detuned part the capacitor does, so p = X_L/X_C becomes p·factor and the
 * effective susceptance B_C/(1 − p) becomes B_C·factor/(1 − p·factor).
 */
export function withCapacitanceFactor(board: Board, model: HarmonicModel, factor: number): { board: Board; model: HarmonicModel } {
  assertBoardModel(board);
  const bank = model.bank;
  if (!bank || factor === 1) return { board, model };
  const p = bank.detuning;
  const scale = (factor * (1 - p)) / (1 - p * factor);
  const parts = new Set([...(bank.fixedLoad === null ? [] : [bank.fixedLoad]), ...bank.stepLoads]);
  return {
    board: {
      ...board,
      loads: board.loads.map((l, i): BoardLoad => (parts.has(i) ? { ...l, branches: l.branches.map((b) => ({ ...b, sNominal: { re: b.sNominal.re * scale, im: b.sNominal.im * scale } })) } : l)),
    },
    model: {
      ...model,
      loads: model.loads.map((b, i): LoadBehaviour => (parts.has(i) && b.kind === 'detuned' ? { kind: 'detuned', p: b.p * factor } : b)),
      bank: { ...bank, detuning: p * factor },
    },
  };
}

/** A condition in words: `nominal capacitance, loads as given`, `capacitance +10 %, every load off`. */
export function conditionWords(c: DutyCondition): string {
  checkObjectArgument(c, 'c', "a duty condition (dutyConditions(...)[i], or a duty check's condition)", ['capacitancePercent', 'loads']);
  checkNumberArgument(c.capacitancePercent, 'c.capacitancePercent', 'a capacitance, % of nominal: a finite number');
  const deviation = c.capacitancePercent - 100;
  const capacitance = deviation === 0 ? 'nominal capacitance' : `capacitance ${deviation > 0 ? '+' : '−'}${Math.abs(Number(deviation.toFixed(2)))} %`;
  const others = c.otherBanks === undefined ? '' : c.otherBanks === 'off' ? ', other banks out of service' : c.otherBanks === 'switched' ? `, ${c.otherBanksState}` : ', other banks on';
  return `${capacitance}, ${c.loads === 'off' ? 'every load off' : 'loads as given'}${others}`;
}

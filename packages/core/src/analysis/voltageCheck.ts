/**
 * A board's voltages against its voltage limits: the board's own (line-to-neutral where
 * it has a neutral, else line-to-line) and every energised load's. The verdict and the
 * voltage warnings come from the same judgement (judgeVoltage: the figure itself, beyond
 * round-off), and reports print a figure near an edge with the decimals that show its side
 * (voltageBesideBand.ts), so they never disagree with each other or with the figures beside them.
 */
import { judgeVoltage, type VoltageLimits } from '../board/conventions/voltageLimits.js';
import { voltageBesideBand } from '../board/conventions/voltageBesideBand.js';
import { checkNumberArgument } from '../_internal/argumentChecks.js';
import { argumentError, isObject } from '../board/modelGuards.js';
import type { BoardResult, LineToLineReading, LoadReading, PhaseReading } from './boardResult.js';
import { quoteText } from '../errors.js';

export interface VoltageExtreme {
  readonly percent: number;
  /** Where, in report labels: `L2` (a board phase), `L1-L2`, or a load's name. */
  readonly at: string;
}

export interface VoltageCheck {
  readonly limits: VoltageLimits;
  /** Board voltages judged: line-to-neutral and line-to-line (with a neutral), or line-to-line only. */
  readonly boardVoltages: 'line-to-neutral' | 'line-to-line';
  readonly lowest: VoltageExtreme;
  readonly highest: VoltageExtreme;
  /** `within` when every board and load voltage is inside the limits (beyond round-off, VOLTAGE_ROUND_OFF_PERCENT). */
  readonly verdict: 'within' | 'under' | 'over' | 'under-and-over';
}

/**
 * The board's own voltages that are judged: line-to-neutral (with a neutral) and
 * line-to-line (where there are two lines or more), in report labels.
 */
export function boardVoltagePoints(
  phases: readonly PhaseReading[],
  lineToLine: readonly LineToLineReading[],
  hasNeutral: boolean,
  label: (phaseOrPair: string) => string,
): (VoltageExtreme & { readonly volts: number })[] {
  // A split-phase board's two lines are not phases: its line-to-neutral voltages are named L1-N, L2-N.
  const splitPhase = hasNeutral && phases.length === 2;
  const own =
    hasNeutral || lineToLine.length === 0
      ? phases.map((p) => ({ percent: p.voltagePercent, at: splitPhase ? `line-to-neutral ${label(p.phase)}-N` : `phase ${label(p.phase)}`, volts: p.voltage.magnitude }))
      : [];
  return [...own, ...lineToLine.map((l) => ({ percent: l.voltagePercent, at: `line-to-line ${label(l.pair)}`, volts: l.voltage.magnitude }))];
}

export function checkVoltages(input: {
  readonly limits: VoltageLimits;
  readonly phases: readonly PhaseReading[];
  readonly lineToLine: readonly LineToLineReading[];
  readonly hasNeutral: boolean;
  readonly loads: readonly LoadReading[];
  readonly label: (phaseOrPair: string) => string;
}): VoltageCheck {
  const { limits, label } = input;
  const byNeutral = input.hasNeutral || input.lineToLine.length === 0;
  const points: VoltageExtreme[] = boardVoltagePoints(input.phases, input.lineToLine, input.hasNeutral, label).map(({ percent, at }) => ({ percent, at }));
  for (const load of input.loads)
    if (load.energised) for (const b of load.branches) points.push({ percent: b.voltagePercent, at: `${quoteText(load.name)}` });
  const lowest = points.reduce((a, b) => (b.percent < a.percent ? b : a));
  const highest = points.reduce((a, b) => (b.percent > a.percent ? b : a));
  const under = judgeVoltage(limits, lowest.percent) === 'under';
  const over = judgeVoltage(limits, highest.percent) === 'over';
  return {
    limits,
    boardVoltages: byNeutral ? 'line-to-neutral' : 'line-to-line',
    lowest,
    highest,
    verdict: under && over ? 'under-and-over' : under ? 'under' : over ? 'over' : 'within',
  };
}

/** The nominal voltages a board's limits are judged at: phase voltages only where a neutral gives them meaning, as above. */
/** @throws {InputError} naming `result` or its board's nominal voltage when it is not a solved board's */
export function judgedNominals(result: Pick<BoardResult, 'board' | 'neutral' | 'lineToLine' | 'phases'>): { lineToNeutralV: number | null; lineToLineV: number | null } {
  // Not in any loop (a report asks once per board): the whole check, so a normalised board or NaN is named, not read.
  if (!isObject(result) || !isObject(result.board) || !Array.isArray(result.lineToLine) || !Array.isArray(result.phases) || !(result.neutral === null || isObject(result.neutral)))
    throw argumentError('result', 'a solved board from solveBoard(...) or solveBoardModel(...)', result, 'the result argument is not a solved board', 'solved');
  const b = result.board;
  checkNumberArgument(b.nominalLineToNeutralV, 'result.board.nominalLineToNeutralV', 'a nominal voltage in V, a finite number above 0', (x) => x > 0);
  if (b.nominalLineToLineV !== null) checkNumberArgument(b.nominalLineToLineV, 'result.board.nominalLineToLineV', 'a nominal voltage in V, a finite number above 0, or null', (x) => x > 0);
  return {
    lineToNeutralV: result.neutral !== null || result.lineToLine.length === 0 ? b.nominalLineToNeutralV : null,
    lineToLineV: b.nominalLineToLineV !== null && result.phases.length > 1 ? b.nominalLineToLineV : null,
  };
}

/**
 * The decimals a board's band line prints each kind of its ends in V with: 1, or as many as a judged
 * voltage of that kind needed beside it to show its side of an edge (voltageBesideBand), so the band
 * and the figures read alike. For bandVoltsWords.
 */
export function bandDecimalsOf(result: Pick<BoardResult, 'voltageCheck' | 'phases' | 'lineToLine' | 'neutral' | 'loads'>): { lineToNeutral: number; lineToLine: number } {
  const limits = result.voltageCheck.limits;
  const most = { lineToNeutral: 1, lineToLine: 1 };
  const take = (kind: keyof typeof most, volts: number, percent: number) => {
    most[kind] = Math.max(most[kind], voltageBesideBand(limits, { volts, percent }).voltsDecimals);
  };
  if (result.neutral !== null || result.lineToLine.length === 0) for (const p of result.phases) take('lineToNeutral', p.voltage.magnitude, p.voltagePercent);
  for (const l of result.lineToLine) take('lineToLine', l.voltage.magnitude, l.voltagePercent);
  for (const load of result.loads)
    if (load.energised) for (const b of load.branches) take(b.to === 'N' || b.to.startsWith('star') ? 'lineToNeutral' : 'lineToLine', b.voltage.magnitude, b.voltagePercent);
  return most;
}

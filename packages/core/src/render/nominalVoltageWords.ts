/**
 * A board's nominal voltages and its source's in words, one wording for the text report,
 * the HTML report and the installation report.
 */
import type { BoardResult } from '../analysis/boardResult.js';
import { IEC_60038_STAR_PAIRS, STANDARD_STAR_PAIRS } from '../board/nominalVoltages.js';
import { argumentIssueError, checkNumberArgument } from '../_internal/argumentChecks.js';

/** A voltage to 0.1 V without a trailing ".0": 230, 230.9, 120. */
const volts = (v: number) => String(Math.round(v * 10) / 10);

/** The words below print these figures: NaN wrote "NaN V line-to-line". */
function checkBoardFigures(board: BoardResult['board']): void {
  if (typeof board !== 'object' || board === null) throw argumentIssueError('board', "a solved board's board figures (result.board)", board);
  checkNumberArgument(board.nominalLineToNeutralV, 'board.nominalLineToNeutralV', 'a nominal voltage in V, a finite number above 0', (x) => x > 0);
  if (board.nominalLineToLineV !== null) checkNumberArgument(board.nominalLineToLineV, 'board.nominalLineToLineV', 'a nominal voltage in V, a finite number above 0, or null', (x) => x > 0);
}

/** "400 V line-to-line, 230 V line-to-neutral", or "230 V" on a single-phase 2-wire board. */
export function nominalVoltageWords(board: BoardResult['board']): string {
  checkBoardFigures(board);
  return board.nominalLineToLineV !== null ? `${volts(board.nominalLineToLineV)} V line-to-line, ${volts(board.nominalLineToNeutralV)} V line-to-neutral` : `${volts(board.nominalLineToNeutralV)} V`;
}

/**
 * What the source holds its terminals at with no load: the nominal voltage, or (where the nominal
 * pair is not exactly √3 apart) the figure the file gave and the other one it implies.
 */
export function sourceVoltageWords(board: BoardResult['board'], unbalancedEmf: boolean, label: PhaseLabel = (p) => p): string {
  checkBoardFigures(board);
  // A single-phase source has one voltage: nothing to be balanced or entered per phase.
  const single = board.system === 'single-phase';
  if (board.sourceEmf) return `as entered${single ? '' : ' per phase'}: ${enteredEmfWords(board.sourceEmf, label)}`;
  if (unbalancedEmf && !single) return 'unbalanced, as entered per phase';
  const s = board.sourceNominal;
  if (!s) return single ? 'at nominal voltage' : 'balanced at nominal voltage';
  if (single) return `${heldWords(s)} (the figure given, which loads are rated at; limits are judged at the nominal)`;
  return `balanced, ${heldWords(s)} (the figures given, which loads are rated at; limits are judged at the nominal pair, not exactly √3 apart)`;
}

/** A text report's line under its header where the source is not exactly the nominal pair; null where it is. */
export function sourceHeldLine(board: BoardResult['board'], label: PhaseLabel = (p) => p): string | null {
  checkBoardFigures(board);
  const s = board.sourceNominal;
  if (board.sourceEmf) {
    const rated = s ? `loads are rated at ${heldWords(s)} and limits` : 'loads are rated and limits';
    return `source as entered per phase, not the nominal: ${enteredEmfWords(board.sourceEmf, label)} (open-circuit EMF of each phase); ${rated} are judged at the nominal ${nominalPairWords(board)}`;
  }
  return s ? `source holds ${heldWords(s)} as given, and loads are rated there; limits are judged at the nominal ${nominalPairWords(board)}` : null;
}

type PhaseLabel = (phase: string) => string;

/** "A 240 V ∠0°, B 225 V ∠-118°, C 232 V ∠121°": each EMF as entered, to 0.1 V and 0.1°. */
const enteredEmfWords = (emf: NonNullable<BoardResult['board']['sourceEmf']>, label: PhaseLabel) =>
  emf.map((e) => `${label(e.phase)} ${volts(e.magnitude)} V ∠${volts(e.angleDeg)}°`).join(', ');

/**
 * What an ideal source holds at its terminals, for the power balance: the nominal voltage, or the
 * EMFs the file entered per phase.
 */
export function idealSourceHolds(board: BoardResult['board']): string {
  return board.sourceEmf ? 'the EMFs entered per phase at its terminals' : 'nominal voltage at its terminals';
}

const heldWords = (s: NonNullable<BoardResult['board']['sourceNominal']>) =>
  s.lineToLineV === null ? `${volts(s.lineToNeutralV)} V` : `${volts(s.lineToNeutralV)} V line-to-neutral, ${volts(s.lineToLineV)} V line-to-line`;

const nominalPairWords = (b: BoardResult['board']) => (b.nominalLineToLineV === null ? `${volts(b.nominalLineToNeutralV)} V` : `${volts(b.nominalLineToNeutralV)}/${volts(b.nominalLineToLineV)} V`);

/**
 * A note where a star system's nominal voltages are none of IEC 60038's pairs (410 V, say, a
 * transformer's no-load voltage): the limits are then taken at the figures given, not at the system
 * nominal a standard's band is written for. Null on a standard pair and on other systems.
 */
export function nonStandardNominalNote(board: BoardResult['board']): string | null {
  checkBoardFigures(board);
  if (board.system !== 'three-phase-4wire' || board.nominalLineToLineV === null) return null;
  const { nominalLineToNeutralV: ln, nominalLineToLineV: ll } = board;
  if (STANDARD_STAR_PAIRS.some(([n, l]) => n === ln || l === ll)) return null;
  const pairs = IEC_60038_STAR_PAIRS.map(([n, l]) => `${n}/${l}`).join(', ');
  return `${volts(ll)} V is not a nominal voltage of IEC 60038 (${pairs} V): the limits are taken at the figures given. Where it is what the source holds with no load, give the system's nominal as the voltage and the source's figure per phase under supply.emf`;
}

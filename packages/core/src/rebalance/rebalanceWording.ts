/** Every sentence a rebalancing report carries, in one place. */
import type { PhaseLabel } from '../board/conventions/phaseNames.js';
import { bandWords } from '../board/conventions/voltageLimits.js';
import { percentBesideBand } from '../board/conventions/voltageBesideBand.js';
import type { VoltageCheck } from '../analysis/voltageCheck.js';
import { BANKS_IN_SERVICE_BASIS } from '../analysis/banksInServiceWords.js';
import { groupDigits } from '../_internal/groupDigits.js';
import { quoteText } from '../errors.js';
import { unitWords } from '../analysis/sourceUnitsWords.js';
import type { RatedReading } from './ratedCurrentLimits.js';

/** A rated item over its rating, with where and when, and its figures now and after the moves. */
interface RatingWords {
  readonly what: string;
  readonly board: string | null;
  readonly condition: string | null;
  readonly nowA: number;
  readonly afterA: number;
  readonly ratingA: number;
}

/**
 * The overload the search left, for the notes: its largest loading now and after (network re-solve, %), whether
 * proven least, the move limit (null: none), the boards whose circuits the study lets move (null: every board).
 */
interface LeastOverload {
  readonly beforePercent: number;
  readonly afterPercent: number;
  readonly proven: boolean;
  /** A lower bound shows no arrangement keeps every limit (loadingBound.ts). */
  readonly unreachable: boolean;
  /** The study sets no line capacity: every limit is a rating the file gives. */
  readonly ratingsOnly: boolean;
  readonly moveLimit: number | null;
  readonly onlyBoards: readonly string[] | null;
}

/** What a proof covers: " of the circuits on "Shed"" where the study lets only some boards' circuits move. */
export const scopeWords = (onlyBoards: readonly string[] | null) => (onlyBoards === null ? '' : ` of the circuits on ${onlyBoards.map(quoteText).join(', ')}`);
const limitWords = (moveLimit: number | null, onlyBoards: readonly string[] | null = null) =>
  `${scopeWords(onlyBoards)}${moveLimit === null ? '' : ` with at most ${moveLimit} move${moveLimit === 1 ? '' : 's'}`}`;
const loadingWords = (percent: number) => percent.toFixed(0);

const whereWords = (x: RatingWords) => `${x.board ? ` at ${quoteText(x.board)}` : ''}${x.condition ? ` in ${quoteText(x.condition)}` : ''}`;

const VERDICT_WORDS: Record<VoltageCheck['verdict'], string> = {
  within: 'within',
  under: 'below',
  over: 'above',
  'under-and-over': 'both below and above',
};

/** "lowest 97.4 % (phase B)" or the highest, whichever side the verdict names; both for within. */
function extremesWords(check: VoltageCheck): string {
  // Beside the verdict: a figure near an edge with the decimals that show its side (voltageBesideBand.ts).
  const low = `lowest ${percentBesideBand(check.limits, check.lowest.percent)} % (${check.lowest.at})`;
  const high = `highest ${percentBesideBand(check.limits, check.highest.percent)} % (${check.highest.at})`;
  return check.verdict === 'under' ? low : check.verdict === 'over' ? high : `${low}, ${high}`;
}

/** Scores in one sentence with one precision, the one their smallest non-zero member needs (a near-zero neutral still shows). */
function scoresWords(...xs: number[]): string[] {
  const sizes = xs.map(Math.abs).filter((x) => x > 0);
  const smallest = sizes.length ? Math.min(...sizes) : 0;
  const digits = smallest >= 100 ? 1 : smallest >= 1 ? 2 : 3;
  return xs.map((x) => x.toFixed(digits));
}

const SHARED_NEUTRAL_CAUTION = 'Circuits that share a neutral (multi-wire branch circuits) must stay on different lines, and keep their common disconnect: check before moving either.';

/** The cautions of a rebalancing study; the shared-neutral one only where a board circuits may move on has a neutral. */
export const rebalanceCautions = (anyNeutral: boolean): readonly string[] => [
  'Moving a circuit is work on live-capable equipment: isolate and prove dead first; the work is for a qualified electrician under local codes and licensed practice.',
  ...(anyNeutral ? [SHARED_NEUTRAL_CAUTION] : []),
  'Keep residual-current and arc-fault devices with their circuits, and update the circuit chart and labels after the work.',
  `Figures assume the stated load conditions; measure the ${anyNeutral ? 'line and neutral currents' : 'line currents'} after the work.`,
];

/** Every caution a rebalancing report may carry (a board with a neutral). */
export const REBALANCE_CAUTIONS: readonly string[] = rebalanceCautions(true);

export const REBALANCE_NOTES = {
  banksInService: (banks: readonly string[]) =>
    `Capacitor banks in service in every solve, now and after, ${BANKS_IN_SERVICE_BASIS}: ${banks.join('; ')}. They stay as they are: nothing of a three-phase bank moves.`,
  /**
   * Moved circuits whose number the usual North-American numbering ties to the line they leave; `positions`
   * counts the breaker's (a 2-pole breaker's two positions each need a new number).
   */
  renumber: (moved: readonly { board: string | null; circuit: string; name: string; positions: number }[]) => {
    const one = moved.length === 1;
    const numbers = !one || moved[0]!.positions > 1;
    const positionWord = (several: boolean) => (several ? 'positions' : 'position');
    return `${moved.map((m) => `${quoteText(m.name)}${m.board ? ` on ${quoteText(m.board)}` : ''} (circuit ${m.circuit}${m.positions > 1 ? `, ${m.positions} poles` : ''})`).join(', ')} ${one ? (numbers ? 'takes breaker positions' : 'takes a breaker position') : 'take breaker positions'} on ${one ? `its new line${moved[0]!.positions > 1 ? 's' : ''}` : 'their new lines'}: the usual panel numbering ties each circuit number to a line, so ${one ? 'it needs' : 'they need'} the number${numbers ? 's' : ''} of the new ${positionWord(numbers)}. A file rewritten with these moves keeps the old number${numbers ? 's' : ''}; re-assign ${numbers ? 'them' : 'it'} there and on the circuit chart.`;
  },
  oneLine: 'A single-phase supply has one line: every circuit is on it and there is no other to move one to, so there is nothing to rebalance.',
  /** Loads with harmonic spectra: the neutral figures are the fundamental's; the rms from the harmonic study, where it ran. */
  harmonicNeutral: (
    neutrals: readonly { board: string; ratingA: number | null; before: { rmsA: number; loadingPercent: number | null }; after: { rmsA: number; loadingPercent: number | null } }[],
    withBoard: boolean,
  ) => {
    const head =
      'The loads have harmonic spectra: the neutral currents above are the fundamental only. The triplen orders (3, 9, 15…) add in the neutral whatever line a circuit is on, so moving circuits leaves them where they are.';
    if (!neutrals.length) return `${head} Run trivar harmonics on the file, and on it after the moves, for the neutral's rms.`;
    const each = neutrals.map((n) => {
      const load = n.before.loadingPercent !== null && n.after.loadingPercent !== null && n.ratingA !== null
        ? ` (${n.before.loadingPercent.toFixed(0)} % → ${n.after.loadingPercent.toFixed(0)} % of its ${n.ratingA.toFixed(0)} A rating${n.after.loadingPercent > 100 ? (n.before.loadingPercent > 100 ? ': still above it' : ': above it') : ''})`
        : '';
      return `${withBoard ? `${quoteText(n.board)} ` : ''}${n.before.rmsA.toFixed(1)} → ${n.after.rmsA.toFixed(1)} A${load}`;
    });
    return `${head} The harmonic study at the file's own loads gives the neutral's rms now → after: ${each.join('; ')}.`;
  },
  nothingToMove: 'No circuit on this board can move (three-phase, pinned, or the supply offers no other connection).',
  alreadyBest: 'The present wiring is already the best found: no moves.',
  /** No move keeps the file's ratings, where moves without them would lower the score (fast model). */
  ratingsKeepWiring: (moves: number, now: number, free: number) => {
    const [nowWords, freeWords] = scoresWords(now, free);
    return `The present wiring stays: every move set that lowers the score would put a rated conductor or supply unit over its rating, or further over, in some condition. Without the ratings, ${moves} move${moves === 1 ? '' : 's'} would take the score from ${nowWords} to ${freeWords} (fast model).`;
  },
  /** No move within the limit, where more moves would lower the score (fast model). */
  limitKeepsWiring: (limit: number, moves: number, now: number, free: number) => {
    const [nowWords, freeWords] = scoresWords(now, free);
    return `${limit === 0 ? 'The move limit of 0 allows no move' : `No move within the limit of ${limit} lowers the score`}, so the present wiring stays; without the limit, ${moves} move${moves === 1 ? '' : 's'} would take the score from ${nowWords} to ${freeWords} (fast model).`;
  },
  solvedNotBetter: (before: number, after: number) =>
    `The network re-solve scores the moved board ${after.toFixed(3)} against ${before.toFixed(3)} now: not better, so keep the present wiring (voltage drop or load models differ from the fast model here).`,
  modelDiffers: (percent: number) =>
    `The network re-solve differs from the fast model by up to ${percent.toFixed(1)} % of a line current (impedances and load models); the solved figures are the ones to trust.`,
  budgetReached: (nodes: number) =>
    `The exact search stopped at its budget of ${groupDigits(nodes)} nodes; the answer is the best found and its gap comes from the lower bound.`,
  noBound: 'The custom score broke the rule that it never falls when a figure grows, so no lower bound is reported.',
  /** `moveLimit` null where the study sets none (the circuit count is no limit the user gave). */
  capacityNotMet: (moveLimit: number | null, onlyBoards: readonly string[] | null, provenImpossible: boolean, excesses: readonly string[]) =>
    `${provenImpossible ? 'No assignment' : 'No assignment found'}${limitWords(moveLimit, onlyBoards)} keeps every line within its capacity${provenImpossible ? ' (proven by the lower bound)' : ''}; this answer exceeds it least: ${excesses.join('; ')}.`,
  /** `fastA`: the fast model's figure where the network re-solve (`currentA`) has the line within its capacity. */
  excess: (e: { board: string; condition: string; line: PhaseLabel; currentA: number; capacityA: number; fastA: number | null }, withBoard: boolean) =>
    `line ${e.line}${withBoard ? ` at ${quoteText(e.board)}` : ''} in ${quoteText(e.condition)} carries ${
      e.fastA === null
        ? `${e.currentA.toFixed(1)} A, ${(e.currentA - e.capacityA).toFixed(1)} A over its ${e.capacityA.toFixed(0)} A capacity`
        : `${e.fastA.toFixed(1)} A in the fast model, ${(e.fastA - e.capacityA).toFixed(1)} A over its ${e.capacityA.toFixed(0)} A capacity (${e.currentA.toFixed(1)} A in the network re-solve)`
    }`,
  overCapacityNow: (board: string | null, line: PhaseLabel, amps: number, capacity: number, condition: string) =>
    `The present wiring puts ${amps.toFixed(1)} A on line ${line}${board ? ` at ${quoteText(board)}` : ''} in ${quoteText(condition)}, above its ${capacity.toFixed(0)} A capacity.`,
  /** A rated item in words: "line C", "the neutral", "the supply transformer", "the supply's unit on C-N". */
  ratedItem: (r: RatedReading, label: (term: string) => string) =>
    r.conductor === 'line'
      ? `line ${label(r.at!)}`
      : r.conductor === 'neutral'
        ? 'the neutral'
        : r.conductor === 'transformer'
          ? "the supply transformer's most loaded line"
          : `the supply's single-phase unit on ${unitWords(r.at!, label)}`,
  /** Rated items the moves put over their rating (or further over) in the network re-solve. */
  overRatingAfterMoves: (items: readonly RatingWords[]) =>
    `! These moves overload what the file rates: ${items
      .map((x) => `${x.what}${whereWords(x)} would carry ${x.afterA.toFixed(1)} A against its rating of ${x.ratingA.toFixed(1)} A (now ${x.nowA.toFixed(1)} A)`)
      .join('; ')}. trivar solve of the rewritten file warns of it. The search kept the fast model within the ratings; the network re-solve differs here: do not make these moves as they stand (pin a circuit, or lower the move limit, and run again).`,
  /**
   * Rated items the search itself put over their rating, or further over, to lower the largest overload
   * (the fast model has them over too): where no arrangement keeps every rating.
   */
  overRatingTraded: (items: readonly RatingWords[], least: LeastOverload) =>
    `! To lower the worst overload, these moves put what the file rates over its rating, or further over: ${items
      .map((x) => `${x.what}${whereWords(x)} would carry ${x.afterA.toFixed(1)} A against its rating of ${x.ratingA.toFixed(1)} A (now ${x.nowA.toFixed(1)} A)`)
      .join('; ')}. ${least.proven || least.unreachable ? `Every arrangement${limitWords(least.moveLimit, least.onlyBoards)} leaves something over ${least.ratingsOnly ? 'its rating' : 'a rating or capacity'} (proven${least.proven ? '' : ' by a lower bound'})` : 'No arrangement found keeps every rating'}; with this one the most loaded current is at ${loadingWords(least.afterPercent)} % of its limit, against ${loadingWords(least.beforePercent)} % now. An overload remains: check each rating and its protection before the work, and reduce the load or upgrade what is over.`,
  /** Rated items over their rating as things stand, and what the moves do to them. */
  overRatingNow: (items: readonly RatingWords[], moved: boolean, least: LeastOverload | null) => {
    const head = `Over its rating as things stand: ${items
      .map((x) => `${x.what}${whereWords(x)} carries ${x.nowA.toFixed(1)} A against its rating of ${x.ratingA.toFixed(1)} A${moved ? `, ${x.afterA.toFixed(1)} A after the moves${x.afterA <= x.ratingA ? ' (within it)' : ''}` : ''}`)
      .join('; ')}.`;
    if (moved && items.every((x) => x.afterA <= x.ratingA)) return `${head} The moves bring it within.`;
    const lowered = moved && least !== null && loadingWords(least.afterPercent) !== loadingWords(least.beforePercent) && least.afterPercent < least.beforePercent;
    if (lowered)
      return `${head} The moves lower the largest loading from ${loadingWords(least.beforePercent)} % to ${loadingWords(least.afterPercent)} % of its limit${
        least.proven ? `, and no arrangement${limitWords(least.moveLimit, least.onlyBoards)} lowers the overload further (proven)` : ', the least overload found'
      }; what stays over needs its rating and protection checked.`;
    const why =
      least?.moveLimit === 0
        ? 'The move limit of 0 allows no move'
        : least?.proven
          ? `No arrangement${limitWords(least.moveLimit, least.onlyBoards)} lowers the overload (proven)`
          : 'Moving circuits has not brought it within';
    return `${head} ${why}: check the rating and the protection.`;
  },
  /** Where more moves than the limit allows would lower the overload, though not remove it (fast model figures). */
  limitKeepsLargerOverload: (limit: number, moves: number, widerPercent: number) =>
    `The move limit of ${limit} keeps a larger overload: with ${moves} move${moves === 1 ? '' : 's'} the most loaded current would be at about ${loadingWords(widerPercent)} % of its limit (fast model).`,
  /** Fewest-moves mode where no answer keeps every limit: the rule ranks only answers within them, so it chose nothing. */
  nearBestUnused: (percent: number) =>
    `The fewest-moves rule (within ${percent.toFixed(1)} % of the best score) had no effect: it chooses only among answers that keep every rating and capacity, and none does here, so the answer is the one with the least overload, however many moves it takes.`,
  /** Where the study lets only some boards' circuits move and moving others would keep every limit (fast model). */
  otherBoardsWithin: (onlyBoards: readonly string[], moves: number) =>
    `Only the circuits on ${onlyBoards.map(quoteText).join(', ')} were allowed to move. With the other boards' circuits free to move as well, ${moves} move${moves === 1 ? '' : 's'} would keep every limited current within its limit (fast model): run again without the board restriction for that work order.`,
  /** Where the move limit keeps an overload that more moves remove. */
  limitKeepsOverload: (limit: number, moves: number) =>
    `The move limit of ${limit} keeps an overload: with ${moves} move${moves === 1 ? '' : 's'} every limited current would be within its limit, the file's ratings and the study's capacities (fast model). Raise the limit for that work order.`,
  /** A board outside its own voltage limits after the moves or now (`board` null on a one-board file, `condition` null with one condition). */
  voltagesOutside: (v: { limits: VoltageCheck['limits']; before: VoltageCheck; after: VoltageCheck }, board: string | null, condition: string | null, moved: boolean) => {
    const where = `${board ? ` at ${quoteText(board)}` : ''}${condition ? ` in ${quoteText(condition)}` : ''}`;
    const limits = `its voltage limits ${bandWords(v.limits)} (${v.limits.preset})`;
    if (!moved) return `The voltages${where} are ${VERDICT_WORDS[v.before.verdict]} ${limits}: ${extremesWords(v.before)}.`;
    return `After the moves the voltages${where} are ${VERDICT_WORDS[v.after.verdict]} ${limits}: ${extremesWords(v.after)}; now ${VERDICT_WORDS[v.before.verdict]} (${extremesWords(v.before)}).`;
  },
} as const;

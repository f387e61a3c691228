/**
 * The currents the file's own ratings allow at a board's incomer, as limits of the rebalancing search:
 * each line conductor's `ratingA` (its own where the feeder gives one per line), the neutral's, and on
 * the main board the supply transformer's rated line current and each rated unit of a bank or open
 * delta (on the line whose current flows through it). These are the ratings `trivar solve` judges
 * (boardWarnings.ts: line-over-rating, neutral-over-rating, transformer-overload, source-unit-overload),
 * read at the same rated currents (readSupplyState.ts), so a move set the search keeps within them is
 * one solve does not warn of, up to the fast model's difference from the network re-solve.
 */
import { lineRatingOf, type Board } from '../board/boardModel.js';
import type { BoardResult } from '../analysis/boardResult.js';

export interface RatedCurrentLimits {
  /** Smallest rated current on each line (phase order), A; Infinity where the file rates nothing on it. */
  readonly lineA: readonly number[];
  /** The neutral's rating, A; Infinity where none is given or the board has no neutral. */
  readonly neutralA: number;
}

/** Rated line current of the supply transformer, as readTransformer takes it. */
function transformerRatedCurrentA(board: Board): number {
  const ratedVA = board.transformerKVA! * 1000;
  if (board.system === 'single-phase') return ratedVA / board.nominalLineToNeutralV;
  if (board.system === 'split-phase') return ratedVA / board.nominalLineToLineV!;
  return ratedVA / (Math.sqrt(3) * board.nominalLineToLineV!);
}

/**
 * @param board a board of the installation as rebalanceTree gives it.
 * @param isMain true for the main board: the supply's transformer and units are rated there only.
 */
export function ratedCurrentLimits(board: Board, isMain: boolean): RatedCurrentLimits {
  const lineA = board.phases.map((_, k) => lineRatingOf(board, k) ?? Infinity);
  if (isMain) {
    if (board.transformerKVA !== null) {
      const rated = transformerRatedCurrentA(board);
      lineA.forEach((a, k) => (lineA[k] = Math.min(a, rated)));
    }
    for (const unit of board.sourceUnits ?? []) {
      const k = board.phases.indexOf(unit.line);
      if (k >= 0) lineA[k] = Math.min(lineA[k]!, (unit.kVA * 1000) / unit.ratedV);
    }
  }
  return { lineA, neutralA: board.hasNeutral ? (board.neutralRatingA ?? Infinity) : Infinity };
}

/** One rated item of a solved board: what it is, its current and its rated current, A. */
export interface RatedReading {
  /** A line conductor, the neutral, the supply transformer (its most loaded line) or one rated unit of a bank or open delta. */
  readonly conductor: 'line' | 'neutral' | 'transformer' | 'source-unit';
  /** The line (data key) for a line conductor; a unit's winding (`C`, or `A-B` in an open delta); null otherwise. */
  readonly at: string | null;
  readonly currentA: number;
  readonly ratingA: number;
}

/** Every rating solve judges on a solved board, with the current it judges (the figures of its warnings). */
export function ratedReadings(result: BoardResult, board: Board): RatedReading[] {
  const out: RatedReading[] = [];
  result.phases.forEach((p, k) => {
    const ratingA = lineRatingOf(board, k);
    if (ratingA !== null) out.push({ conductor: 'line', at: p.phase, currentA: p.current.magnitude, ratingA });
  });
  if (result.neutral?.ratingA != null) out.push({ conductor: 'neutral', at: null, currentA: result.neutral.current.magnitude, ratingA: result.neutral.ratingA });
  if (result.transformer) out.push({ conductor: 'transformer', at: null, currentA: result.transformer.largestLineCurrentA, ratingA: result.transformer.ratedCurrentA });
  for (const u of result.sourceUnits ?? []) out.push({ conductor: 'source-unit', at: u.winding, currentA: u.currentA, ratingA: u.ratedCurrentA });
  return out;
}

/**
 * The neutral of a rebalanced file with harmonic data, now and after the moves. Rebalancing moves the
 * fundamental: the triplen orders (3, 9, 15…) of single-phase non-linear loads add in the neutral
 * whatever line a circuit is on, so the neutral's rms, the figure that heats it, barely changes. The
 * harmonic study (trivar harmonics) is run on the file as it is and on the file with the moves, at
 * the file's own loads.
 */
import { readBoardText } from '../board/readBoardText.js';
import { isInstallationInput } from '../board/installationInput.js';
import { InputError, NumericalError } from '../errors.js';
import { boardHasHarmonicData, installationHasHarmonicData } from '../harmonics/boardHasHarmonicData.js';
import { rewriteBoardText } from '../rebalance/rewriteBoardText.js';
import type { HarmonicNeutralComparison, RebalanceReport } from '../rebalance/rebalanceResult.js';
import { REBALANCE_NOTES } from '../rebalance/rebalanceWording.js';
import { studyInstallationHarmonics } from './studyInstallationHarmonics.js';
import { parseBoard } from './validateBoard.js';
import { parseInstallation } from './validateInstallation.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';
import { assertText } from '../board/modelGuards.js';

function hasHarmonicData(input: unknown): boolean {
  return isInstallationInput(input) ? installationHasHarmonicData(parseInstallation(input)) : boardHasHarmonicData(parseBoard(input));
}

/** Each board's neutral with harmonics: rms, its triplen part, and its loading against the rating. */
function neutrals(input: unknown) {
  return studyInstallationHarmonics(input).boards.map((b) => ({
    board: b.board,
    ratingA: b.neutral?.ratingA ?? null,
    figures: b.neutral
      ? { rmsA: b.neutral.current.rms, triplenA: b.triplenNeutralA ?? 0, loadingPercent: b.neutral.loadingPercent ?? null }
      : null,
  }));
}

/**
 * The report with `harmonicNeutral` and its note where the file has harmonic data; unchanged otherwise.
 * @param text the board or installation file the report was made from (YAML or JSON).
 */
export function withHarmonicNeutral(report: RebalanceReport, text: string): RebalanceReport {
  checkObjectArgument(report, 'report', 'a rebalance report from rebalanceBoard(...)');
  assertText(text, 'text');
  if (report.oneLine) return report;
  const input = readBoardText(text);
  if (!hasHarmonicData(input)) return report;
  let comparisons: HarmonicNeutralComparison[];
  try {
    const before = neutrals(input);
    const after = neutrals(readBoardText(rewriteBoardText(text, report.moves)));
    comparisons = before.flatMap((b, k) => {
      const a = after[k]!;
      return b.figures && a.figures ? [{ board: b.board, ratingA: b.ratingA, before: b.figures, after: a.figures }] : [];
    });
  } catch (error) {
    // The figures are a help to the note, not the study: where the harmonic study refuses the file or
    // cannot solve it, the note points to that study, which says why.
    if (!(error instanceof NumericalError || error instanceof InputError)) throw error;
    return { ...report, notes: [...report.notes, REBALANCE_NOTES.harmonicNeutral([], report.boards.all.length > 1)] };
  }
  return { ...report, harmonicNeutral: comparisons, notes: [...report.notes, REBALANCE_NOTES.harmonicNeutral(comparisons, report.boards.all.length > 1)] };
}

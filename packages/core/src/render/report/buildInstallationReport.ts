/**
 * Assembles the report of an installation: its description and one-line
 * drawing, the feeders, the totals, one section per board, the studies that
 * ran (correction at a board, harmonics, further sections), then
 * assumptions, standards and safety cautions over every board.
 */
import type { InstallationBaseSpec } from '../../board/installationSchema.js';
import type { InstallationResult } from '../../analysis/installationResult.js';
import type { CorrectionReport } from '../../correction/correctionResult.js';
import type { CorrectionComparison } from '../../correction/compareCorrections.js';
import { correctionComparisonSection } from './correctionComparisonBlocks.js';
import type { InstallationEffect } from '../../correction/installationEffect.js';
import type { InstallationHarmonicsReport } from '../../harmonics/harmonicsResult.js';
import { installationCorrectionSection } from './installationCorrectionSection.js';
import { installationHarmonicsSections } from './installationHarmonicsSections.js';
import type { ReportBlock, ReportDocument, ReportSection } from './reportDocument.js';
import { boardSection, boardSectionIds, feedersSection, installationDescription, totalsSection } from './installationSections.js';
import { closingSections, placeSection } from './buildBoardReport.js';
import { correctionSection, nothingToAdd, resonanceSection } from './correctionSection.js';
import { openNeutralSection } from './boardSections.js';
import { banksPlacementWords, type BanksPlacement } from '../../correction/banksPlacementWords.js';
import { INSTALLATION_ASSUMPTIONS } from './reportWording.js';
import { assertInstallationResult } from '../../analysis/resultGuards.js';
import { argumentError, isObject } from '../../board/modelGuards.js';

export interface InstallationReportInput {
  /** The installation file as validated (`parseInstallation`). */
  readonly spec: InstallationBaseSpec;
  /** The solved installation (`solveInstallation`). */
  readonly result: InstallationResult;
  /** A correction study at one board of the installation (`correctInstallation`), if one ran. @defaultValue none */
  readonly correction?: { readonly board: string; readonly report: CorrectionReport; readonly effect: InstallationEffect } | null;
  /**
   * The arrangements compared at that board, when the study named no arrangement
   * (`compareInstallationCorrections`; `correction` is then the recommended one's, if any). @defaultValue none
   */
  readonly correctionComparison?: { readonly board: string; readonly comparison: CorrectionComparison } | null;
  /**
   * The file's banks around that study (`correctInstallation`'s `otherBanksInService`, `replacedBank`,
   * `leadingWithBanks`): stated at the head of its section. @defaultValue none
   */
  readonly banksPlacement?: BanksPlacement | null;
  /**
   * The installation's harmonic study (`studyInstallationHarmonics`), if one ran: an overview and a
   * section per board; the overview replaces a correction study's resonance estimate. @defaultValue none
   */
  readonly harmonics?: InstallationHarmonicsReport | null;
  /** Sections from further studies, placed before the assumptions; the same id replaces. @defaultValue [] */
  readonly studySections?: readonly ReportSection[];
}

/** A study's section retitled with the board it was made at (its id kept, so it can still be replaced). */
const atBoard = (section: ReportSection, board: string): ReportSection => ({ ...section, title: `${section.title} — ${board}` });

/**
 * Builds the report of a solved installation as a document (render it with
 * `renderReportHtml` or `renderReportMarkdown`).
 * @example
 * const spec = parseInstallation(readBoardText(text));
 * const doc = buildInstallationReport({ spec, result: solveInstallation(spec) });
 * doc.sections.slice(0, 3).map((s) => s.id) //=> ['installation', 'feeders', 'totals']
 */
/** A correction section headed by what the study took of the file's banks. */
function withBanksPlacement(placement: BanksPlacement | null): (section: ReportSection) => ReportSection {
  if (!placement) return (section) => section;
  const w = banksPlacementWords(placement);
  const text = [w.inService, w.replaced].filter((t): t is string => t !== null).join(' ');
  const head: ReportBlock[] = [...(text ? [{ kind: 'paragraph' as const, text }] : []), ...(w.leading ? [{ kind: 'list' as const, items: [w.leading], tone: 'warning' as const }] : [])];
  return (section) => ({ ...section, blocks: [...head, ...section.blocks] });
}

export function buildInstallationReport(input: InstallationReportInput): ReportDocument {
  if (!isObject(input)) throw argumentError('input', '{ spec, result } (the validated installation file and its solved installation)', input, 'the input argument is not a report input');
  assertInstallationResult(input.result, 'input.result');
  if (!isObject(input.spec) || !Array.isArray(input.spec.boards)) throw argumentError('input.spec', 'the installation file as validated, from parseInstallation(...)', input.spec, 'the input argument is not a report input');
  const { spec, result } = input;
  const ids = boardSectionIds(result.boards.map((b) => b.name));
  const sections: ReportSection[] = [installationDescription(spec, result), feedersSection(result), totalsSection(result)];
  for (const b of result.boards) {
    sections.push(boardSection(spec, result, b, ids.get(b.name)!));
    const open = openNeutralSection(b.result);
    if (open) sections.push({ ...atBoard(open, b.name), id: `${ids.get(b.name)!}-open-neutral` });
  }
  const correction = input.correction ?? null;
  const compared = input.correctionComparison ?? null;
  const idle = nothingToAdd(correction?.report ?? null, compared?.comparison ?? null);
  const banks = withBanksPlacement(input.banksPlacement ?? null);
  if (correction) {
    sections.push(banks(atBoard(correctionSection(correction.report, compared?.comparison ?? null), correction.board)));
    const resonance = idle ? null : resonanceSection(correction.report);
    if (resonance) sections.push(atBoard(resonance, correction.board));
    // Nothing added: every board's before → after would read "x → x".
    if (!idle && correction.report.status !== 'nothing-to-build') sections.push(installationCorrectionSection(correction.effect));
  } else if (compared) sections.push(banks(atBoard(correctionComparisonSection(compared.comparison, input.result.installation.system, input.result.boards[0]!.result.conventions.region), compared.board)));
  const harmonics = input.harmonics ?? null;
  if (harmonics) {
    // The overview takes the place of a resonance estimate; the boards' sections follow it.
    const [overview, ...perBoard] = installationHarmonicsSections(harmonics, ids);
    const at = sections.findIndex((s) => s.id === overview!.id);
    if (at >= 0) sections.splice(at, 1, overview!, ...perBoard);
    else sections.push(overview!, ...perBoard);
  }
  for (const extra of input.studySections ?? []) placeSection(sections, extra);
  sections.push(
    ...closingSections({
      results: result.boards.map((b) => b.result),
      correction: idle ? null : (correction?.report ?? null),
      harmonics,
      handCheck: null,
      assumptions: INSTALLATION_ASSUMPTIONS,
    }),
  );
  const main = result.boards[0]!.result.board;
  const volts = result.boards[0]!.result.conventions.voltageNotation;
  return {
    title: result.installation.name,
    subtitle: `Installation report · ${result.installation.boardCount} board${result.installation.boardCount === 1 ? '' : 's'} · ${volts} · ${main.frequencyHz} Hz`,
    sections,
  };
}

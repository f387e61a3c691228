/**
 * Assembles the report of a board: description, panel schedule, results,
 * correction and resonance (when a correction study ran), sections handed in
 * by other studies, then assumptions, standards and safety cautions.
 */
import type { BoardBaseSpec } from '../../board/boardSchema.js';
import type { BoardResult } from '../../analysis/boardResult.js';
import type { CorrectionReport } from '../../correction/correctionResult.js';
import type { CorrectionComparison } from '../../correction/compareCorrections.js';
import { correctionComparisonSection } from './correctionComparisonBlocks.js';
import type { HarmonicsReport } from '../../harmonics/harmonicsResult.js';
import { harmonicsSection, harmonicsStandards } from './harmonicsSection.js';
import type { VoltageDistortionCheck } from '../../harmonics/harmonicsResult.js';
import type { HandCheckResult } from '../../handCheck/handCheckResult.js';
import { handCheckSection } from './handCheckSection.js';
import type { ReportDocument, ReportSection } from './reportDocument.js';
import { installationSection, openNeutralSection, resultsSection, scheduleSection } from './boardSections.js';
import { correctionSection, nothingToAdd, resonanceSection } from './correctionSection.js';
import { labelIn } from '../../board/conventions/phaseNames.js';
import { starWordOf } from '../../board/conventions/regionWords.js';
import { BOARD_STANDARDS, CORRECTION_ASSUMPTIONS, correctionStandards, modelAssumptions, THREE_PHASE_STANDARDS } from './reportWording.js';
import { assertBoardResult } from '../../analysis/resultGuards.js';
import { argumentError, isObject } from '../../board/modelGuards.js';

export interface BoardReportInput {
  /** The board file as validated (`parseBoard`; the board’s own fields are read): names, circuit numbers, breakers, supply data. */
  readonly spec: BoardBaseSpec;
  /** The solved board. */
  readonly result: BoardResult;
  /** A correction study of the same board, if one ran (with no arrangement named: the recommended one's). @defaultValue none */
  readonly correction?: CorrectionReport | null;
  /** The arrangements compared, when the study named no arrangement (`compareCorrections`). @defaultValue none */
  readonly correctionComparison?: CorrectionComparison | null;
  /** A harmonic study of the same board, if one ran; its section replaces the correction's resonance estimate. @defaultValue none */
  readonly harmonics?: HarmonicsReport | null;
  /**
   * Sections from further studies (harmonic spectrum, load profile…), placed
   * before the assumptions. A section whose id is already present replaces it
   * (a full harmonic study replaces the resonance estimate, id `harmonics`).
   * @defaultValue []
   */
  readonly studySections?: readonly ReportSection[];
  /**
   * A check of the user's hand calculation on this board (`checkHandFigures`), with an optional
   * drawing of the line current triangles without and with their capacitors. @defaultValue none
   */
  readonly handCheck?: { readonly result: HandCheckResult; readonly triangles?: string } | null;
}

/** What the closing sections draw on: every board result in the report and the studies that ran. */
export interface ClosingInput {
  readonly results: readonly BoardResult[];
  readonly correction: CorrectionReport | null;
  /** A harmonic study of a board or an installation: its standards (the document each board's voltages were judged against) and cautions. */
  readonly harmonics:
    | (Pick<HarmonicsReport, 'cautions'> & {
        readonly voltageDistortion?: Pick<VoltageDistortionCheck, 'basis'>;
        readonly boards?: readonly { readonly voltageDistortion: Pick<VoltageDistortionCheck, 'basis'> }[];
      })
    | null;
  readonly handCheck: HandCheckResult | null;
  /** Extra assumptions (e.g. of an installation). @defaultValue [] */
  readonly assumptions?: readonly string[];
}

/** Assumptions, standards referred to and safety cautions, drawn from every study that ran. */
export function closingSections(input: ClosingInput): ReportSection[] {
  const { correction, harmonics, handCheck } = input;
  // A hand check adds capacitors too, so the capacitor law (the first correction assumption) applies to it.
  const capacitorAssumptions = correction ? CORRECTION_ASSUMPTIONS : handCheck ? CORRECTION_ASSUMPTIONS.slice(0, 1) : [];
  const first = input.results[0];
  const label = first ? (p: string) => labelIn(first.conventions.phaseNames, p) : undefined;
  const assumptions = [...modelAssumptions(input.results.map((r) => r.board.system), label), ...(input.assumptions ?? []), ...capacitorAssumptions];
  const standards = [
    ...BOARD_STANDARDS,
    ...(input.results.some((r) => r.sequences) ? THREE_PHASE_STANDARDS : []),
    ...(correction ? correctionStandards(starWordOf(first?.conventions.region ?? 'iec'), input.results.some((r) => r.board.system.startsWith('three-phase'))) : []),
    ...(harmonics ? harmonicsStandards([...(harmonics.voltageDistortion ? [harmonics.voltageDistortion.basis] : []), ...(harmonics.boards ?? []).map((b) => b.voltageDistortion.basis)]) : []),
  ];
  const cautions = [...new Set([...(correction?.cautions ?? []), ...(harmonics?.cautions ?? []), ...(handCheck?.cautions ?? []), ...input.results.flatMap((r) => r.cautions)])];
  return [
    { id: 'assumptions', title: 'Assumptions', blocks: [{ kind: 'list', items: assumptions }] },
    {
      id: 'standards',
      title: 'Standards and methods referred to',
      blocks: [{ kind: 'table', caption: 'Where each figure comes from', columns: [{ label: 'Standard or method' }, { label: 'Used for' }], rows: standards.map((s) => [s.name, s.use]) }],
    },
    { id: 'cautions', title: 'Safety cautions', blocks: [{ kind: 'list', tone: 'caution', items: cautions }] },
  ];
}

/** Adds a study's section, replacing one with the same id. */
export function placeSection(sections: ReportSection[], section: ReportSection): void {
  const at = sections.findIndex((s) => s.id === section.id);
  if (at >= 0) sections[at] = section;
  else sections.push(section);
}

/**
 * Builds the report of a solved board as a document (render it with
 * `renderReportHtml` or `renderReportMarkdown`).
 * @example
 * const doc = buildBoardReport({ spec, result: solveBoardModel(normaliseBoard(spec)) });
 * doc.sections.map((s) => s.id) //=> ['installation', 'schedule', 'results', 'assumptions', 'standards', 'cautions']
 */
export function buildBoardReport(input: BoardReportInput): ReportDocument {
  if (!isObject(input)) throw argumentError('input', '{ spec, result } (the validated board file and its solved board)', input, 'the input argument is not a report input');
  assertBoardResult(input.result, 'input.result');
  if (!isObject(input.spec) || !Array.isArray(input.spec.loads)) throw argumentError('input.spec', 'the board file as validated, from parseBoard(...)', input.spec, 'the input argument is not a report input');
  const { spec, result } = input;
  const correction = input.correction ?? null;
  const fileBank = (spec as { harmonics?: { bank?: Parameters<typeof resultsSection>[1] } }).harmonics?.bank;
  const sections: ReportSection[] = [installationSection(spec, result), scheduleSection(spec, result), resultsSection(result, fileBank)];
  const openNeutral = openNeutralSection(result);
  if (openNeutral) sections.push(openNeutral);
  const comparison = input.correctionComparison ?? null;
  const idle = nothingToAdd(correction, comparison);
  if (correction) {
    sections.push(correctionSection(correction, comparison));
    const resonance = idle ? null : resonanceSection(correction);
    if (resonance) sections.push(resonance);
  } else if (comparison) sections.push(correctionComparisonSection(comparison, result.board.system, result.conventions.region));
  if (input.harmonics) placeSection(sections, harmonicsSection(input.harmonics));
  if (input.handCheck) placeSection(sections, handCheckSection(input.handCheck.result, input.handCheck.triangles, result.conventions.phaseNames));
  for (const extra of input.studySections ?? []) placeSection(sections, extra);
  // Nothing to install: no capacitor assumptions, standards or cautions.
  sections.push(...closingSections({ results: [result], correction: idle ? null : correction, harmonics: input.harmonics ?? null, handCheck: input.handCheck?.result ?? null }));
  return {
    title: result.board.name,
    subtitle: `Board report · ${result.board.nominalLineToNeutralV.toFixed(0)} V line-to-neutral · ${result.board.frequencyHz} Hz`,
    sections,
  };
}

/**
 * Assembles the report of a board: description, panel schedule, results,
 * correction and resonance (when a correction study ran), sections handed in
 * by other studies, then assumptions, standards and safety cautions.
 */
import type { BoardBaseSpec } from '../../board/boardSchema.js';
import type { BoardResult } from '../../analysis/boardResult.js';
import type { CorrectionReport } from '../../correction/correctionResult.js';
import type { HarmonicsReport } from '../../harmonics/harmonicsResult.js';
import { harmonicsSection, HARMONICS_STANDARDS } from './harmonicsSection.js';
import type { ReportDocument, ReportSection } from './reportDocument.js';
import { installationSection, openNeutralSection, resultsSection, scheduleSection } from './boardSections.js';
import { correctionSection, resonanceSection } from './correctionSection.js';
import { BOARD_STANDARDS, CORRECTION_ASSUMPTIONS, CORRECTION_STANDARDS, MODEL_ASSUMPTIONS, THREE_PHASE_STANDARDS } from './reportWording.js';

export interface BoardReportInput {
  /** The board file as validated (`parseBoard`; the board’s own fields are read): names, circuit numbers, breakers, supply data. */
  readonly spec: BoardBaseSpec;
  /** The solved board. */
  readonly result: BoardResult;
  /** A correction study of the same board, if one ran. @defaultValue none */
  readonly correction?: CorrectionReport | null;
  /** A harmonic study of the same board, if one ran; its section replaces the correction's resonance estimate. @defaultValue none */
  readonly harmonics?: HarmonicsReport | null;
  /**
   * Sections from further studies (harmonic spectrum, load profile…), placed
   * before the assumptions. A section whose id is already present replaces it
   * (a full harmonic study replaces the resonance estimate, id `harmonics`).
   * @defaultValue []
   */
  readonly studySections?: readonly ReportSection[];
}

function closingSections(input: BoardReportInput): ReportSection[] {
  const correction = input.correction ?? null;
  const assumptions = [...MODEL_ASSUMPTIONS, ...(correction ? CORRECTION_ASSUMPTIONS : [])];
  const harmonics = input.harmonics ?? null;
  const standards = [
    ...BOARD_STANDARDS,
    ...(input.result.sequences ? THREE_PHASE_STANDARDS : []),
    ...(correction ? CORRECTION_STANDARDS : []),
    ...(harmonics ? HARMONICS_STANDARDS : []),
  ];
  const cautions = [...new Set([...(correction?.cautions ?? []), ...(harmonics?.cautions ?? []), ...input.result.cautions])];
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

/**
 * Builds the report of a solved board as a document (render it with
 * `renderReportHtml` or `renderReportMarkdown`).
 * @example
 * const doc = buildBoardReport({ spec, result: solveBoardModel(normaliseBoard(spec)) });
 * doc.sections.map((s) => s.id) //=> ['installation', 'schedule', 'results', 'assumptions', 'standards', 'cautions']
 */
export function buildBoardReport(input: BoardReportInput): ReportDocument {
  const { spec, result } = input;
  const correction = input.correction ?? null;
  const sections: ReportSection[] = [installationSection(spec, result), scheduleSection(spec, result), resultsSection(result)];
  const openNeutral = openNeutralSection(result);
  if (openNeutral) sections.push(openNeutral);
  if (correction) {
    sections.push(correctionSection(correction));
    const resonance = resonanceSection(correction);
    if (resonance) sections.push(resonance);
  }
  if (input.harmonics) {
    const section = harmonicsSection(input.harmonics);
    const at = sections.findIndex((s) => s.id === section.id);
    if (at >= 0) sections[at] = section;
    else sections.push(section);
  }
  for (const extra of input.studySections ?? []) {
    const at = sections.findIndex((s) => s.id === extra.id);
    if (at >= 0) sections[at] = extra;
    else sections.push(extra);
  }
  sections.push(...closingSections(input));
  return {
    title: result.board.name,
    subtitle: `Board report · ${result.board.nominalLineToNeutralV.toFixed(0)} V line-to-neutral · ${result.board.frequencyHz} Hz`,
    sections,
  };
}

/**
 * `trivar correct` on an installation: where the equipment goes, the study on that board, then what the
 * equipment does to every board, feeder and the supply (fits 100 columns).
 */
import {
  arrangementNames,
  banksPlacementWords,
  labellerOf,
  lowestInstallationVoltageChange,
  lowestVoltageChange,
  meteringPointWords,
  type BeforeAfter,
  type InstallationComparison,
  type InstallationCorrection,
  type InstallationEffect,
  type InstallationHarmonicComparison,
  type InstallationHarmonicCorrection,
  type ResonanceWithoutBank,
} from '@trivar/core';
import { renderComparisonHarmonics, renderCorrectionHarmonics } from './correctionHarmonicsReport.js';
import { fixed, renderTableWithin, section } from './textTable.js';
import { treeName } from './boardTree.js';
import { renderCorrectionReport } from './correctionReport.js';
import { comparedBoard, renderComparisonReport, tableNames } from './comparisonReport.js';
import { REPORT_WIDTH, wrapText } from './wrapText.js';

const note = (text: string) => `${wrapText(text, '  (', '   ', REPORT_WIDTH - 1)})`;
const change = (x: BeforeAfter | null, digits: number) => (x === null ? '' : `${fixed(x.before, digits)} → ${fixed(x.after, digits)}`);
/** The same without spaces, for table cells (keeps the tables inside 100 columns). */
const cell = (x: BeforeAfter | null, digits: number) => (x === null ? '' : `${fixed(x.before, digits)}→${fixed(x.after, digits)}`);
function placeLines(c: Omit<InstallationCorrection | InstallationComparison, 'report' | 'comparison'>): string {
  const where = c.boardIndex === 0 ? `${c.board} (the main board)` : c.board;
  const judged = c.measuredAt === undefined ? `the incomer of ${c.board}` : meteringPointWords(c.measuredAt);
  return [
    wrapText(`${c.installation}: correction equipment on ${where}`, '', '  '),
    wrapText(
      `The target is judged at ${judged}. Every solve below is of the whole installation (loads at their models, every feeder's impedance), so the equipment's effect on the boards above and beside it is part of it.`,
      '',
      '',
    ),
    ...banksLines(c),
    '',
  ].join('\n');
}

/** The file's banks: those on other boards in service in every solve, the one on this board replaced, a point they make lead. */
function banksLines(c: Omit<InstallationCorrection | InstallationComparison, 'report' | 'comparison'>): string[] {
  const w = banksPlacementWords(c);
  return [...[w.inService, w.replaced].flatMap((t) => (t ? [wrapText(t, '', '')] : [])), ...(w.leading ? [wrapText(`! ${w.leading}`, '', '  ')] : [])];
}

function boardTable(e: InstallationEffect): string {
  const threePhase = e.boards.some((b) => b.negativeSequenceCurrentPercent !== null);
  const hasNeutral = e.boards.some((b) => b.neutralCurrentA !== null);
  const rows = e.boards.map((b) => [
    treeName(b.name, b.depth) + (b.hasEquipment ? ' *' : ''),
    ((x) => `${x.before}→${x.after}`)(lowestVoltageChange(e, b)),
    cell(b.feeder.largestLineCurrentA, 1),
    ...(hasNeutral ? [cell(b.neutralCurrentA, 1)] : []),
    cell(b.vectorPf, 3),
    ...(threePhase ? [cell(b.negativeSequenceCurrentPercent, 1)] : []),
    cell(b.incomerKvar, 2),
  ]);
  return renderTableWithin(
    [
      { header: 'board', align: 'left' },
      { header: 'lowest %nom' },
      { header: 'largest line A' },
      ...(hasNeutral ? [{ header: 'N A' }] : []),
      { header: 'PF' },
      ...(threePhase ? [{ header: 'I2/I1 %' }] : []),
      { header: 'kvar in' },
    ],
    rows,
  );
}

function feederTable(e: InstallationEffect): string {
  const hasNeutral = e.boards.some((b) => b.feeder.neutralCurrentA !== null);
  const rows = e.boards.map((b) => [
    b.name,
    b.fedFrom ?? 'supply',
    cell(b.feeder.largestLineCurrentA, 1),
    ...(hasNeutral ? [cell(b.feeder.neutralCurrentA, 1)] : []),
    cell(b.feeder.voltageDropPercent, 2),
    cell(b.feeder.lossesKW, 3),
  ]);
  return renderTableWithin(
    [{ header: 'to', align: 'left' }, { header: 'from', align: 'left' }, { header: 'largest line A' }, ...(hasNeutral ? [{ header: 'N A' }] : []), { header: 'drop %' }, { header: 'loss kW' }],
    rows,
  );
}

function supplyLines(e: InstallationEffect): string {
  const s = e.supply;
  const label = labellerOf(e.before.boards[0]!.result.conventions.phaseNames);
  const row = (label: string, text: string) => `  ${label.padEnd(25)} ${text}`;
  return [
    row('from the source', `${change(s.kW, 2)} kW, ${change(s.kvar, 2)} kvar, ${change(s.kVA, 2)} kVA`),
    row('PF at the source', change(s.pf, 3)),
    row('losses (source + feeders)', `${change(s.lossesKW, 3)} kW`),
    row('lowest voltage', ((x) => `${x.before} → ${x.after} % of nominal`)(lowestInstallationVoltageChange(e))),
    ...(s.transformerLoadingPercent ? [row('transformer', `${change(s.transformerLoadingPercent, 0)} % of rated current`)] : []),
    ...(s.sourceUnitLoadingPercent ? [row('supply units', `${s.sourceUnitLoadingPercent.map((u) => `${label(u.winding)} ${change(u.loading, 0)} %`).join(', ')} of rated current`)] : []),
  ].join('\n');
}

/** The effect section alone (every board, every feeder, the supply). */
export function renderInstallationEffect(e: InstallationEffect): string {
  const outside = e.boards.filter((b) => b.loadsOutsideVoltageBand.before > 0 || b.loadsOutsideVoltageBand.after > 0);
  const band = outside.length
    ? `\n${outside.map((b) => wrapText(`${b.name}: ${b.loadsOutsideVoltageBand.before} → ${b.loadsOutsideVoltageBand.after} load(s) outside the voltage band`, '  ! ', '    ')).join('\n')}`
    : `\n  every load stays inside the voltage band before and after`;
  // What the equipment makes worse on the boards it feeds through (its own board's are in the warnings above).
  const others = e.otherBoards.map((w) => `\n${wrapText(`${w.board}: ${w.message}`, '  ! ', '    ')}`).join('');
  return (
    section('Every board, before → after (the whole installation re-solved with the equipment)') +
    boardTable(e) +
    `\n${note("* the board the equipment is on. At each board's incomer (everything its feeder carries): lowest voltage the limits judge, largest line current, neutral current, vector PF |ΣP|/|ΣS|, |I2|/|I1|, reactive power in (+ lagging). Per line: --json.")}` +
    band +
    others +
    '\n' +
    section('Feeders, before → after') +
    feederTable(e) +
    `\n${note(`drop: |V| at the sending end minus |V| at the board, the phase that changes most (negative: a rise), % of nominal; for the service feeder, from the source EMF. loss: conductor losses, ${e.before.boards[0]!.result.board.idealSource ? 'the source being ideal (no windings to lose power in)' : "the service feeder's with the source windings"}.`)}` +
    '\n' +
    section('Supply, before → after') +
    supplyLines(e) +
    '\n'
  );
}

/** Nothing added (the board meets the target, or there is nothing to build): no effect to show. */
const addsNothing = (status: string) => status === 'already-meets-target' || status === 'nothing-to-build';

// With nothing to add, every board's before → after would read "x→x": the board report says it once.
export function renderInstallationCorrection(c: InstallationCorrection): string {
  const effect = addsNothing(c.report.status) ? '' : renderInstallationEffect(c.effect);
  return `${placeLines(c)}\n${renderCorrectionReport(c.report)}${effect}`;
}

/** The recommended arrangement's effect on every board; nothing when it adds nothing (every "x→x"). */
function recommendedEffect(c: InstallationComparison): string {
  const recommended = c.comparison.outcomes.find((o) => o.arrangement === c.comparison.recommended)?.report;
  const compared = comparedBoard(c.comparison);
  return c.effect && recommended && !addsNothing(recommended.status)
    ? `\nThe recommended ${arrangementNames(compared.system, compared.region)[recommended.arrangement]} across the installation\n${renderInstallationEffect(c.effect)}`
    : '';
}

export function renderInstallationComparison(c: InstallationComparison): string {
  return `${placeLines(c)}\n${renderComparisonReport(c.comparison)}${recommendedEffect(c)}`;
}

const INSTALLATION_DETAILS =
  'details: --json carries the chosen bank’s study on the whole installation (report.harmonics.check); trivar harmonics on the installation file studies the banks its harmonics.banks lists';

/** What the installation resonates near with none of the new bank in service: the other banks' doing, not counted against it. */
function withoutBankLines(board: string, w: ResonanceWithoutBank | null): string {
  if (!w || (w.withOtherBanksOn.length === 0 && w.withOtherBanksSwitched.length === 0)) return '';
  const parts = [
    ...(w.withOtherBanksOn.length ? [`near order ${w.withOtherBanksOn.join(', ')} with every other bank on`] : []),
    ...w.withOtherBanksSwitched.map((s) => `near order ${s.order} (h ${fixed(s.peakOrder, 2)}) with ${s.otherBanks}`),
  ];
  return `${wrapText(
    `! with none of the new bank in service, the installation seen from ${board} already resonates ${parts.join('; ')}: the other banks' matter (trivar harmonics studies them), not counted against this bank`,
    '  ',
    '    ',
  )}\n`;
}

export function renderInstallationCorrectionWithHarmonics(c: InstallationHarmonicCorrection): string {
  return `${placeLines(c)}\n${renderCorrectionReport(c.report)}${renderCorrectionHarmonics(c.report.harmonics, INSTALLATION_DETAILS)}${withoutBankLines(c.board, c.resonanceWithoutBank)}${addsNothing(c.report.status) ? '' : renderInstallationEffect(c.effect)}`;
}

export function renderInstallationComparisonWithHarmonics(c: InstallationHarmonicComparison): string {
  const effect = recommendedEffect(c);
  const harmonics = renderComparisonHarmonics(c.comparison.harmonics, tableNames(comparedBoard(c.comparison)));
  return `${placeLines(c)}\n${renderComparisonReport(c.comparison)}${harmonics}${withoutBankLines(c.board, c.resonanceWithoutBank)}${effect}`;
}

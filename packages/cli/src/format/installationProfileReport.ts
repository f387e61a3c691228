/** InstallationProfileResult → the text report of `trivar profile` on an installation file. */
import { BANKS_IN_SERVICE_BASIS, bankInServiceWords, billingPowerFactorText, labellerOf, type ListedBankInService, type InstallationProfileBoard, type InstallationProfileResult, type InstallationScenarioResult, type PhaseLabeller } from '@trivar/core';
import {
  bankLines,
  noBankLines,
  warningLines,
  currentTable,
  dataLines,
  energyTable,
  monthTable,
  OVER_RATING_CAUTION,
  percentBeside,
  scenarioOverRating,
  scenarioTariffLines,
  scenarioTable,
  scenarioYearLine,
  thresholdLines,
  voltageTable,
  worstTable,
} from './profileReport.js';
import { fixed, renderTableWithin, section, thousands } from './textTable.js';
import { wrapText } from './wrapText.js';

const hours = (h: number) => (h === 0 ? '0' : h < 10 ? fixed(h, 2) : fixed(h, 1));
const limitPercent = (x: number) => String(Math.round(x * 100) / 100);

/** One row per board: its incomer's peak against its rating, its neutral, its voltage band and hours outside it. */
function boardTable(r: InstallationProfileResult): string {
  const rows = r.boards.map((b) => {
    const lines = b.before.conductors.filter((c) => c.conductor !== 'N');
    const worst = lines.reduce((m, c) => (c.maxA > m.maxA ? c : m), lines[0]!);
    const neutral = b.before.conductors.find((c) => c.conductor === 'N');
    const lowest = Math.min(...b.before.voltages.map((v) => v.minPercent));
    const highest = Math.max(...b.before.voltages.map((v) => v.maxPercent));
    return [
      b.board,
      b.fedFrom ?? 'supply',
      fixed(worst.maxA, 1),
      worst.ratingA === null ? '-' : fixed(worst.ratingA, 0),
      neutral ? fixed(neutral.maxA, 1) : '-',
      percentBeside(lowest, b.limits),
      percentBeside(highest, b.limits),
      `${limitPercent(b.limits.voltageLowPercent)}-${limitPercent(b.limits.voltageHighPercent)}`,
      hours(b.before.hoursVoltageLow),
      hours(b.before.hoursVoltageHigh),
    ];
  });
  return renderTableWithin(
    [
      { header: 'board', align: 'left' },
      { header: 'fed from', align: 'left' },
      { header: 'peak line A' },
      { header: 'rating A' },
      { header: 'peak N A' },
      { header: 'lowest %' },
      { header: 'highest %' },
      { header: 'band %' },
      { header: 'h low' },
      { header: 'h high' },
    ],
    rows,
  );
}

/** A board's own figures: its incomer's currents, its voltages against its band, its energy. */
function boardSection(b: InstallationProfileBoard, label: PhaseLabeller): string[] {
  const where = b.fedFrom === null ? 'supply to the main board' : `feeder from ${b.fedFrom}`;
  return [
    section(`${b.board} — currents in the ${where}`),
    currentTable(b.before, label),
    section(`${b.board} — voltages at the board (% of nominal)`),
    voltageTable(b.before, label, b.limits),
    ...thresholdLines(b.before, b),
    `  energy through the board: ${thousands(b.before.energy.kWhImport)} kWh imported, billing power factor ${billingPowerFactorText(b.before.energy.billingPf)}`,
  ];
}

/** The banks the file lists in service, in one wrapped line; nothing when there are none. */
function banksInServiceLines(banks: readonly ListedBankInService[], each: 'interval' | 'scenario'): string[] {
  if (!banks.length) return [];
  return [wrapText(`capacitor banks in service in every ${each}, ${BANKS_IN_SERVICE_BASIS}: ${banks.map((b) => bankInServiceWords(b)).join('; ')}`, '  ', '    ')];
}

/** The intervals with the highest neutral current on every board with a neutral (its incoming feeder's); the main board's highest line current where none has one. */
function worstSections(r: InstallationProfileResult): string[] {
  const withNeutral = r.boards.filter((b) => b.before.worstByNeutral.length);
  const main = r.boards[0]!;
  if (!withNeutral.length) return [section(`Intervals with the highest line current at ${main.board}`), worstTable(main.before, main.limits.unbalance)];
  return withNeutral.flatMap((b) => [section(`Intervals with the highest neutral current at ${b.board}${b.fedFrom === null ? '' : ` (its feeder from ${b.fedFrom})`}`), worstTable(b.before, b.limits.unbalance)]);
}

export function renderInstallationProfileReport(r: InstallationProfileResult, currency: string, label: PhaseLabeller = labellerOf(r.phaseNames)): string {
  const main = r.boards[0]!;
  const bankBoard = r.bank ? r.boards.find((b) => b.board === r.bank!.board)! : null;
  const parts = [
    `${r.installation} — load over time, every board`,
    ...dataLines(r),
    ...banksInServiceLines(r.banksInService, 'interval'),
    ...(r.replacedBank ? [wrapText(`the file's bank on ${r.replacedBank.board}, ${bankInServiceWords(r.replacedBank).slice(r.replacedBank.board.length + 1)}, is left out: the bank studied takes its place`, '  ', '    ')] : []),
    section('Boards (currents: the supply at the main board, each sub-board\'s incoming feeder)'),
    boardTable(r),
    ...r.boards.flatMap((b) => boardSection(b, label)),
    section(`Energy at the supply (${main.board})`),
    energyTable(main.before, label),
    section(`Calendar months at the supply (${main.board})`),
    monthTable(main.before, main.after, currency),
    ...worstSections(r),
  ];
  if (r.bankNotSized) parts.push(section(`Automatic bank on ${r.bankNotSized.board} over the profile`), noBankLines(r.bankNotSized.words));
  if (r.bank && bankBoard) {
    parts.push(section(`Automatic bank on ${r.bank.board} over the profile`), bankLines({ bank: r.bank, before: bankBoard.before, limits: bankBoard.limits }));
    const meter = r.bank.meter;
    if (meter)
      parts.push(
        `  the controller measures ${meter.point === 'origin' ? "at the origin (the supply's terminals, before the service cable)" : `at the incomer of ${meter.point}`}, not at ${r.bank.board}: billing power factor there ${billingPowerFactorText(meter.before.energy.billingPf)} → ${billingPowerFactorText(meter.after.energy.billingPf)}, lagging kvarh ${thousands(meter.before.energy.kvarhLagging)} → ${thousands(meter.after.energy.kvarhLagging)}`,
      );
    if (bankBoard !== main)
      parts.push(
        `  at the supply (${main.board}): billing power factor ${billingPowerFactorText(main.before.energy.billingPf)} → ${billingPowerFactorText(main.after!.energy.billingPf)}; peak line current ${fixed(Math.max(...main.before.conductors.filter((c) => c.conductor !== 'N').map((c) => c.maxA)), 1)} A → ${fixed(Math.max(...main.after!.conductors.filter((c) => c.conductor !== 'N').map((c) => c.maxA)), 1)} A`,
      );
  }
  const cautions = r.bank?.resonance ? [...r.cautions, r.bank.resonance.caution] : r.cautions;
  parts.push(...warningLines(r.warnings), section('Cautions'), ...cautions.map((c) => `  - ${c}`));
  return `${parts.join('\n')}\n`;
}

/** The installation's scenarios (no interval data): a table per board, its incomer's currents and its own voltage band. */
export function renderInstallationScenarioReport(r: InstallationScenarioResult, label: PhaseLabeller = labellerOf(r.phaseNames)): string {
  const parts = [`${r.installation} — scenarios (${fixed(r.hours, 0)} h), every board`, '  solved on the nodal path: every board and feeder at once in each scenario', ...banksInServiceLines(r.banksInService, 'scenario')];
  for (const b of r.boards) {
    parts.push(section(`${b.board} — currents in the ${b.fedFrom === null ? 'supply to the main board' : `feeder from ${b.fedFrom}`}`), scenarioTable(b, label, b.limits), scenarioYearLine(b));
    const band = `${limitPercent(b.limits.voltageLowPercent)}-${limitPercent(b.limits.voltageHighPercent)} %`;
    const from = b.limits.voltageLimitsFrom === 'profile.limits' ? 'profile.limits' : `the board's limits, ${b.limits.voltageLimitsFrom}`;
    parts.push(
      b.outsideBand.length
        ? `  voltage outside ${band} (${from}) in: ${b.outsideBand.join(', ')}`
        : `  every scenario within ${band} (${from})`,
    );
  }
  parts.push(...scenarioTariffLines(r.tariff, r.boards[0]!, [section(`Tariff at ${r.boards[0]!.board}, where the supply is billed`)]));
  const over = r.boards.flatMap((b) => scenarioOverRating(b, label, `${b.board}, `));
  if (over.length) parts.push(section('Over a rating'), ...over, OVER_RATING_CAUTION);
  return `${parts.join('\n')}\n`;
}

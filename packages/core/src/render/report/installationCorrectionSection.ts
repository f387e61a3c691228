/**
 * What correction equipment on one board of an installation does to every
 * board and to the supply, as a report section. Reads only the plain
 * `InstallationEffect` of the correction study.
 */
import type { InstallationEffect } from '../../correction/installationEffect.js';
import type { BeforeAfter } from '../../correction/correctionResult.js';
import { fixed } from '../svgText.js';
import { percentBesideBand } from '../../board/conventions/voltageBesideBand.js';
import { lowestVoltagePercentText } from './installationSections.js';
import { BANKS_IN_SERVICE_BASIS, bankInServiceWords } from '../../analysis/banksInServiceWords.js';
import type { ReportColumn, ReportSection } from './reportDocument.js';

/** The banks in service on other boards, in both solves. */
const banksInService = (effect: InstallationEffect): string =>
  effect.before.banksInService.length
    ? ` Banks in service in both, ${BANKS_IN_SERVICE_BASIS}: ${effect.before.banksInService.map((b) => bankInServiceWords(b)).join('; ')}.`
    : '';
const num = (label: string): ReportColumn => ({ label, align: 'right' });
const change = (x: BeforeAfter, digits: number, unit = ''): string => `${fixed(x.before, digits)} → ${fixed(x.after, digits)}${unit}`;

/**
 * A board's lowest voltage before and after, % of nominal, each printed against the board's limits (the ones
 * its count of loads outside the band judges by), with the decimals that show its side of an edge.
 */
export function lowestVoltageChange(effect: Pick<InstallationEffect, 'before'>, board: { readonly name: string; readonly lowestVoltagePercent: BeforeAfter }): { before: string; after: string } {
  const limits = effect.before.boards.find((b) => b.name === board.name)?.result.voltageCheck.limits;
  const text = (x: number) => (limits ? percentBesideBand(limits, x) : fixed(x, 1));
  return { before: text(board.lowestVoltagePercent.before), after: text(board.lowestVoltagePercent.after) };
}

/** The installation's lowest voltage before and after, each against the limits of the board it is on. */
export function lowestInstallationVoltageChange(effect: Pick<InstallationEffect, 'before' | 'after'>): { before: string; after: string } {
  return { before: lowestVoltagePercentText(effect.before), after: lowestVoltagePercentText(effect.after) };
}

export function installationCorrectionSection(effect: InstallationEffect): ReportSection {
  const s = effect.supply;
  const supply: [string, string][] = [
    ['From the source', `${change(s.kVA, 1)} kVA (${change(s.kvar, 1)} kvar)`],
    ['Power factor at the source, kW / |kVA|', change(s.pf, 3)],
    [effect.before.boards[0]!.result.board.idealSource ? 'Losses (every feeder; the source is ideal)' : 'Losses (source windings and every feeder)', change(s.lossesKW, 3, ' kW')],
    ['Lowest voltage in the installation', ((x) => `${x.before} → ${x.after} % of nominal`)(lowestInstallationVoltageChange(effect))],
  ];
  if (s.transformerLoadingPercent) supply.push(['Supply transformer loading', change(s.transformerLoadingPercent, 0, ' %')]);
  return {
    id: 'correction-effect',
    title: `Effect of the equipment on ${effect.board} across the installation`,
    blocks: [
      {
        kind: 'paragraph',
        text: `The whole installation solved without and with the equipment on ${effect.board}: each board's incomer carries that board and every board beyond it, so boards between the equipment and the supply see its effect too.${banksInService(effect)}`,
      },
      {
        kind: 'table',
        caption: 'Every board, before → after',
        columns: [{ label: 'Board' }, num('PF at incomer'), num('Incomer kvar'), num('Largest feeder A'), num('Lowest V %nom'), num('Feeder loss kW')],
        rows: effect.boards.map((b) => [
          `${b.name}${b.hasEquipment ? ' (equipment here)' : ''}`,
          b.vectorPf === null ? '—' : change(b.vectorPf, 3),
          change(b.incomerKvar, 1),
          change(b.feeder.largestLineCurrentA, 1),
          ((x) => `${x.before} → ${x.after}`)(lowestVoltageChange(effect, b)),
          change(b.feeder.lossesKW, 3),
        ]),
        note: 'PF at incomer: vector power factor |ΣP|/|ΣS| of what the board’s feeder carries. Incomer kvar above zero is lagging (taken from the board feeding it).',
      },
      // What it makes worse on the boards it is fed through (its own board's warnings are the correction's).
      ...(effect.otherBoards.length ? [{ kind: 'list' as const, tone: 'warning' as const, items: effect.otherBoards.map((w) => `${w.board}: ${w.message}`) }] : []),
      { kind: 'facts', items: supply },
    ],
  };
}

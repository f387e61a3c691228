/**
 * Report sections of an installation: its description with the one-line
 * drawing, the feeders, the totals, and one section per board (schedule,
 * results, voltages against limits, phasors).
 */
import { percentBesideBand } from '../../board/conventions/voltageBesideBand.js';
import { BANKS_IN_SERVICE_BASIS, bankInServiceWords } from '../../analysis/banksInServiceWords.js';
import type { InstallationBaseSpec } from '../../board/installationSchema.js';
import type { InstallationBoardResult, InstallationResult } from '../../analysis/installationResult.js';
import { boardSpecOf } from '../../board/installationRules.js';
import { fixed } from '../svgText.js';
import { sourceUnitsWords } from '../../analysis/sourceUnitsWords.js';
import { labellerOf } from '../../board/conventions/phaseNames.js';
import { renderOneLineDiagram } from '../renderOneLineDiagram.js';
import type { ReportBlock, ReportColumn, ReportSection } from './reportDocument.js';
import { conductorWords, resultBlocks, scheduleTable, sourceWords, systemFacts } from './boardSections.js';
import { sourceVoltageWords } from '../nominalVoltageWords.js';
import { checkListArgument } from '../../_internal/argumentChecks.js';

const num = (label: string): ReportColumn => ({ label, align: 'right' });

/** Where a feeder's drop is read: its worst phase, the worse of a split-phase board's two lines, a single-phase board's one line. */
const worstWord = (system: string): string => (system.startsWith('three-phase') ? 'worst phase' : system === 'split-phase' ? 'worse line' : 'line');

/** File- and anchor-safe ids for the boards, unique even where two names differ only in case or punctuation. */
export function boardSectionIds(names: readonly string[]): Map<string, string> {
  checkListArgument(names, 'names', 'a list of board names (strings)', (x) => typeof x === 'string');
  const used = new Set<string>();
  const out = new Map<string, string>();
  for (const name of names) {
    const base = `board-${name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'unnamed'}`;
    let id = base;
    for (let k = 2; used.has(id); k++) id = `${base}-${k}`;
    used.add(id);
    out.set(name, id);
  }
  return out;
}

/** The board's entry in the file (names are unique in a valid installation). */
const specIndex = (spec: InstallationBaseSpec, name: string): number => spec.boards.findIndex((b) => b.name === name);

/** The feeder of a board in words: the library cable's description, or the conductors as entered. */
function feederWords(spec: InstallationBaseSpec, result: InstallationResult, name: string): string {
  const reading = result.feeders.find((f) => f.board === name);
  if (reading?.description) return reading.description;
  const feeder = spec.boards[specIndex(spec, name)]?.feeder;
  if (!feeder) return 'none entered (zero impedance)';
  const naming = result.boards[0]!.result.conventions.phaseNames;
  const line = conductorWords(feeder.line, feeder, naming);
  return feeder.neutral && result.boards[0]!.result.neutral ? `${line}; neutral ${conductorWords(feeder.neutral, feeder, naming)}` : line;
}

/** The supply lines printed beside the source symbol of the one-line drawing. */
export function supplyLinesOf(spec: InstallationBaseSpec, result: InstallationResult): string[] {
  const b = result.boards[0]!.result.board;
  const volts = result.boards[0]!.result.conventions.voltageNotation;
  const t = spec.supply.transformer;
  return [`Supply ${volts} · ${b.frequencyHz} Hz`, t ? `transformer ${t.kVA} kVA, ${t.impedancePercent} %` : sourceWords(spec.supply, result.boards[0]!.result.conventions.phaseNames)];
}

export function installationDescription(spec: InstallationBaseSpec, result: InstallationResult): ReportSection {
  const main = result.boards[0]!.result;
  const circuits = spec.boards.reduce((n, b) => n + b.loads.length, 0);
  const items: [string, string][] = [
    ['Installation', result.installation.name],
    ...systemFacts(main),
    ['Source', sourceWords(spec.supply, main.conventions.phaseNames)],
    ['Source voltages', sourceVoltageWords(main.board, spec.supply.emf !== undefined, labellerOf(main.conventions.phaseNames))],
    ['Boards', `${result.installation.boardCount}, main board ${result.boards[0]!.name}`],
    ['Circuits', `${circuits}`],
  ];
  const blocks: ReportBlock[] = [];
  // As `trivar solve` does: a collapse anywhere is said before any figure, so none is read as a working installation.
  const collapsed = result.boards.filter((b) => b.result.operatingPoint.collapsed);
  if (collapsed.length)
    blocks.push({
      kind: 'list',
      tone: 'warning',
      items: [
        `Supply collapse at ${collapsed.map((b) => b.name).join(', ')}: the supply cannot carry these loads; the figures below are not a working installation.`,
        ...collapsed.flatMap((b) => b.result.operatingPoint.findings.map((f) => `${b.name}: ${f}`)),
      ],
    });
  blocks.push({ kind: 'facts', items });
  if (spec.note) blocks.push({ kind: 'paragraph', text: spec.note });
  blocks.push({
    kind: 'table',
    caption: 'Boards and how each is fed',
    columns: [{ label: 'Board' }, { label: 'Fed from' }, { label: 'Feeder' }, num('Circuits'), num('Own kW'), num('Fed kW')],
    rows: result.boards.map((b) => [
      b.name,
      b.fedFrom ?? 'supply',
      feederWords(spec, result, b.name),
      String(spec.boards[specIndex(spec, b.name)]?.loads.length ?? 0),
      fixed(b.result.totals.kW, 2),
      fixed(b.result.source.kW, 2),
    ]),
    note: `Own: the board's circuits. Fed: what enters the board's feeder at its sending end: the boards beyond it and the feeder's losses included (for the main board, what the source EMFs deliver${result.boards[0]!.result.board.idealSource ? '' : ", the source windings' losses included"}).`,
  });
  blocks.push({
    kind: 'figure',
    name: 'one-line',
    caption: 'One-line drawing: each feeder with its line and neutral currents and its voltage drop',
    svg: renderOneLineDiagram(result, { supplyLines: supplyLinesOf(spec, result) }),
  });
  return { id: 'installation', title: 'Installation and supply', blocks };
}

export function feedersSection(result: InstallationResult): ReportSection {
  const phases = result.feeders[0]?.lines.map((l) => l.phase) ?? [];
  const hasNeutral = result.feeders.some((f) => f.neutral !== null);
  const loading = (f: InstallationResult['feeders'][number]): string => {
    const all = [...f.lines.map((l) => l.loadingPercent), f.neutral?.loadingPercent ?? null].filter((x): x is number => x !== null);
    return all.length ? fixed(Math.max(...all), 0) : '—';
  };
  return {
    id: 'feeders',
    title: 'Feeders',
    blocks: [
      {
        kind: 'table',
        caption: 'Currents, loading, voltage drop and losses of every feeder',
        columns: [{ label: 'To' }, { label: 'From' }, ...phases.map((p) => num(`${result.boards[0]!.result.conventions.phaseLabels[p]} A`)), ...(hasNeutral ? [num('N A')] : []), num('Loading %'), num('Drop %'), num('Loss kW')],
        rows: result.feeders.map((f) => [
          f.board,
          f.from ?? 'supply',
          ...f.lines.map((l) => fixed(l.current.magnitude, 1)),
          ...(hasNeutral ? [f.neutral ? (f.neutral.open ? 'open' : fixed(f.neutral.current.magnitude, 1)) : '—'] : []),
          loading(f),
          fixed(f.voltageDropPercent, 2),
          fixed(f.lossesKW, 3),
        ]),
        note: `Loading: the most loaded conductor against its rating (— without ratings). Drop: |V| at the sending end minus |V| at the board, ${result.installation.system === 'single-phase' ? 'line to neutral' : `the ${result.installation.system === 'split-phase' ? 'line' : 'phase'} that changes most`} (negative: a rise), % of nominal line-to-neutral voltage; for the service feeder, from the source EMF. Loss: conductor losses${result.boards[0]!.result.board.idealSource ? ', the source being ideal (no windings to lose power in)' : ' (the service feeder also the source windings)'}.`,
      },
    ],
  };
}

/** The installation's lowest voltage, % of nominal, printed against the limits of the board it is on (voltageBesideBand). */
export function lowestVoltagePercentText(result: Pick<InstallationResult, 'totals' | 'boards'>): string {
  const t = result.totals;
  const board = result.boards.find((b) => b.name === t.lowestVoltageBoard);
  return board ? percentBesideBand(board.result.voltageCheck.limits, t.lowestVoltagePercent) : fixed(t.lowestVoltagePercent, 1);
}

export function totalsSection(result: InstallationResult): ReportSection {
  const t = result.totals;
  const sourceKVA = Math.hypot(t.sourceKW, t.sourceKvar);
  const main = result.boards[0]!.result;
  const warnings = result.boards.reduce((n, b) => n + b.result.warnings.length, 0);
  const items: [string, string][] = [
    ['Loads on every board', `${fixed(t.loadKW, 2)} kW, ${fixed(t.loadKvar, 2)} kvar`],
    [main.board.idealSource ? 'Losses (every feeder; the source is ideal)' : 'Losses (source windings and every feeder)', `${fixed(t.lossesKW, 3)} kW`],
    ['From the source', `${fixed(t.sourceKW, 2)} kW, ${fixed(t.sourceKvar, 2)} kvar, ${fixed(sourceKVA, 2)} kVA`],
    ['Power factor at the source, kW / |kVA|', sourceKVA > 0 ? fixed(t.sourceKW / sourceKVA, 3) : '—'],
    ['Lowest voltage', `${lowestVoltagePercentText(result)} % of nominal, at ${t.lowestVoltageBoard} (${t.lowestVoltageAt})`],
  ];
  if (result.banksInService.length)
    items.push(['Capacitor banks in service', `${result.banksInService.map((b) => bankInServiceWords(b, b.deliveredKvar)).join('; ')} — ${BANKS_IN_SERVICE_BASIS}`]);
  if (main.transformer) items.push(['Supply transformer loading', `${fixed(main.transformer.loadingPercent, 0)} % of ${fixed(main.transformer.ratedKVA, 0)} kVA (most loaded line)`]);
  if (main.sourceUnits) items.push(['Supply units loading', sourceUnitsWords(main.sourceUnits, labellerOf(main.conventions.phaseNames))]);
  items.push(['Warnings', warnings ? `${warnings}, listed under each board` : 'none']);
  return { id: 'totals', title: 'Installation totals', blocks: [{ kind: 'facts', items }] };
}

/** A board without circuits of its own: it feeds other boards, or nothing is connected to it at all. */
const noCircuitsWords = (feedsOthers: boolean): string =>
  feedsOthers ? 'No circuits of its own: this board only feeds others.' : 'No circuits: nothing is connected to this board, and it feeds no other board.';

/** One board of the installation: where it is fed from, its panel schedule and its solved figures. */
export function boardSection(spec: InstallationBaseSpec, result: InstallationResult, board: InstallationBoardResult, id: string): ReportSection {
  const own = boardSpecOf(spec, specIndex(spec, board.name));
  const feeder = result.feeders.find((f) => f.board === board.name)!;
  const fedBy = board.fedFrom === null ? 'the supply (main board)' : board.fedFrom;
  const blocks: ReportBlock[] = [
    {
      kind: 'facts',
      items: [
        ['Fed from', fedBy],
        ['Feeder', feederWords(spec, result, board.name)],
        ...(board.result.board.withoutNeutral ? [['Neutral', 'none at this board: its feeder, or one upstream, has line conductors only'] as [string, string]] : []),
        // The main board's figures count from the source EMF: the source windings are in them, feeder or none.
        [
          board.fedFrom === null ? (board.result.board.idealSource ? 'Drop and loss from the source (service feeder; the source is ideal)' : 'Drop and loss from the source (source windings and service feeder)') : 'Feeder drop and loss',
          `${fixed(feeder.voltageDropPercent, 2)} % ${worstWord(result.installation.system)}, ${fixed(feeder.lossesKW, 3)} kW`,
        ],
        ['Circuits', `${own.loads.length}`],
      ],
    },
    ...(own.loads.length ? [scheduleTable(own.loads, board.result)] : [{ kind: 'paragraph' as const, text: noCircuitsWords(result.boards.some((b) => b.fedFrom === board.name)) }]),
    ...resultBlocks(board.result, { figurePrefix: `${id}-`, sequenceFigure: false }),
  ];
  return { id, title: `Board: ${board.name}`, blocks };
}

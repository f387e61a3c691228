/** InstallationResult → the text report of `trivar solve` on an installation: a summary per board and per feeder. */
import { idealSourceHolds, BANKS_IN_SERVICE_BASIS, OPEN_NEUTRAL_BAND, lowestVoltagePercentText, percentBesideBand, bandWords, sourceHeldLine, bankInServiceWords, labelIn, unbalanceFigure, VOLTAGE_UNBALANCE_LIMITS, type InstallationResult } from '@trivar/core';
import { fixed, renderTable, section } from './textTable.js';
import { treeName } from './boardTree.js';
import { renderSolveReport } from './solveReport.js';
import { REPORT_WIDTH, wrapText } from './wrapText.js';

const note = (text: string) => `${wrapText(text, '  (', '   ', REPORT_WIDTH - 1)})`;

const SYSTEM_WORDS: Record<string, string> = {
  'three-phase-4wire': 'three-phase 4-wire',
  'three-phase-3wire': 'three-phase 3-wire',
  'split-phase': 'split-phase 3-wire',
  'single-phase': 'single-phase 2-wire',
};

const VERDICT_CELL = { within: 'ok', under: 'UNDER', over: 'OVER', 'under-and-over': 'UNDER+OVER' } as const;

/** One line for the whole installation, from the same per-board verdicts the table shows. */
function limitsLine(r: InstallationResult): string {
  const limits = r.boards[0]!.result.voltageCheck.limits;
  const wordsOf = (l: typeof limits) => `${bandWords(l)} (${l.preset})`;
  const main = wordsOf(limits);
  // A board judged against limits of its own says which: the line's limits are the main board's.
  const own = (b: InstallationResult['boards'][number]) => {
    const w = wordsOf(b.result.voltageCheck.limits);
    return w === main ? '' : `, against its own ${w}`;
  };
  const outside = r.boards.filter((b) => b.result.voltageCheck.verdict !== 'within');
  const verdict =
    outside.length === 0
      ? 'every board within its limits'
      : `outside at ${outside.map((b) => `${b.name} (${VERDICT_CELL[b.result.voltageCheck.verdict].toLowerCase()}${own(b)})`).join(', ')}`;
  const others = r.boards.filter((b) => own(b) !== '').length;
  return wrapText(`voltage limits ${main}${others ? `, ${others} board${others === 1 ? ' with limits of its own' : 's with limits of their own'}` : ''}: ${verdict}`, '  ');
}

/** The voltage unbalance index the installation's region judges (unbalanceLimits.ts): |V2|/|V1|, or the line-to-line deviation. */
const unbalanceLimitOf = (r: InstallationResult) => VOLTAGE_UNBALANCE_LIMITS[r.boards[0]!.result.conventions.region];

/**
 * Which boards the unbalance column can fill: a three-phase board's (it has sequence components); a split-phase
 * or single-phase board has one line-to-line voltage or none, so no index. 'none' leaves out the column and its legend.
 */
function unbalanceColumn(r: InstallationResult): 'every board' | 'some boards' | 'none' {
  const judged = r.boards.filter((b) => b.result.unbalance !== null).length;
  return judged === 0 ? 'none' : judged === r.boards.length ? 'every board' : 'some boards';
}

/** The unbalance column's index in words where it is not |V2|/|V1| (its header says that one), and which boards it applies to. */
function unbalanceWords(r: InstallationResult): string {
  const column = unbalanceColumn(r);
  if (column === 'none') return '';
  const limit = unbalanceLimitOf(r);
  const header = limit.index === 'negative-sequence' ? 'VUF' : 'V unbal.';
  const which = column === 'some boards' ? ", on three-phase boards only ('-': a board with no three line voltages)" : '';
  if (limit.definition === null) return which === '' ? '' : `${header}${which}; `;
  return `${header}: ${limit.definition} (${limit.source})${which}; `;
}

function boardTable(r: InstallationResult): string {
  const limit = unbalanceLimitOf(r);
  const withUnbalance = unbalanceColumn(r) !== 'none';
  const rows = r.boards.map((b) => {
    const res = b.result;
    // The voltages the verdict beside them judges (line-to-neutral, line-to-line, at the loads).
    return [
      treeName(b.name, b.depth),
      percentBesideBand(res.voltageCheck.limits, res.voltageCheck.lowest.percent),
      percentBesideBand(res.voltageCheck.limits, res.voltageCheck.highest.percent),
      res.neutral ? fixed(res.neutral.current.magnitude, 1) : res.board.withoutNeutral ? '-' : '',
      ...(withUnbalance ? [res.unbalance ? fixed(unbalanceFigure(limit, res.unbalance), 2) : '-'] : []),
      fixed(res.totals.kW, 2),
      fixed(res.totals.kvar, 2),
      fixed(res.source.kW, 2),
      VERDICT_CELL[res.voltageCheck.verdict],
      String(res.warnings.length || ''),
    ];
  });
  return renderTable(
    [
      { header: 'board', align: 'left' },
      { header: 'min %nom' },
      { header: 'max %nom' },
      { header: 'N A' },
      ...(withUnbalance ? [{ header: limit.index === 'negative-sequence' ? 'VUF %' : 'V unbal. %' }] : []),
      { header: 'own kW' },
      { header: 'own kvar' },
      { header: 'fed kW' },
      { header: 'limits', align: 'left' },
      { header: 'warnings' },
    ],
    rows,
  );
}

function feederTable(r: InstallationResult): string {
  const phases = r.feeders[0]?.lines.map((l) => l.phase) ?? [];
  const hasNeutral = r.feeders[0]?.neutral !== null;
  const rows = r.feeders.map((f) => [
    f.board,
    f.from ?? 'supply',
    ...f.lines.map((l) => fixed(l.current.magnitude, 1)),
    // A feeder of line conductors only, on a system with a neutral: '-', no conductor to read.
    ...(hasNeutral ? [f.neutral ? (f.neutral.open ? 'open' : fixed(f.neutral.current.magnitude, 1)) : '-'] : []),
    fixed(f.voltageDropPercent, 2),
    fixed(f.lossesKW, 3),
  ]);
  return renderTable(
    [
      { header: 'to', align: 'left' },
      { header: 'from', align: 'left' },
      ...phases.map((p) => ({ header: `${labelIn(r.boards[0]!.result.conventions.phaseNames, p)} A` })),
      ...(hasNeutral ? [{ header: 'N A' }] : []),
      { header: 'drop %' },
      { header: 'loss kW' },
    ],
    rows,
  );
}

function cableList(r: InstallationResult): string {
  const lines = r.feeders.filter((f) => f.description).map((f) => wrapText(`${f.board}: ${f.description}`, '  cable to ', '    '));
  return lines.length ? `\n${lines.join('\n')}` : '';
}

/** Boards whose supply collapsed: stated before any figure, as the board report does. */
function collapseBlock(r: InstallationResult): string[] {
  const collapsed = r.boards.filter((b) => b.result.operatingPoint.collapsed);
  if (!collapsed.length) return [];
  const findings = collapsed.flatMap((b) => b.result.operatingPoint.findings.map((f) => wrapText(`${b.name}: ${f}`, '  ! ')));
  return [`\nSUPPLY COLLAPSE — the supply cannot carry these loads; the figures below are not a working installation:\n${findings.join('\n')}`];
}

/** The broken-neutral study of every board, one row each (the full study is in each board's report). */
function openNeutralSummary(r: InstallationResult): string | null {
  const studied = r.boards.filter((b) => b.result.openNeutral);
  if (!studied.length) return null;
  const rows = studied.map((b) => {
    const s = b.result.openNeutral!;
    if (!s.applicable) return [b.name, '', '', '', 'not applicable'];
    return [
      b.name,
      s.barVoltage ? fixed(s.barVoltage.magnitude, 1) : '',
      s.highestPercent === null ? '' : percentBesideBand(OPEN_NEUTRAL_BAND, s.highestPercent),
      s.lowestPercent === null ? '' : percentBesideBand(OPEN_NEUTRAL_BAND, s.lowestPercent),
      s.reachedFromIntact ? 'reached' : 'worst found',
    ];
  });
  const table = renderTable(
    [{ header: 'neutral broken at', align: 'left' }, { header: 'bar V' }, { header: 'highest %nom' }, { header: 'lowest %nom' }, { header: 'state', align: 'left' }],
    rows,
  );
  const cautions = mergedOpenNeutralCautions(studied.map((b) => ({ board: b.name, highestPercent: b.result.openNeutral!.highestPercent ?? 0, cautions: b.result.openNeutral!.cautions })));
  return (
    section("If a board's neutral broke") +
    table +
    `\n${note("each board's own feeder neutral open, the rest intact; %nom: what that board's line-to-neutral loads see (the boards it feeds float with it); full study: --board \"<name>\".")}` +
    (cautions.length ? `\n${cautions.map((c) => wrapText(c, '  ! ')).join('\n')}` : '')
  );
}

/** Where a caution quotes its example: the caution's own words end before it. */
const EXAMPLE_OPENING = '(here "';

/**
 * Each board's broken-neutral cautions, once: a caution every board gives alike is said once, and one
 * that quotes an example figure (a load above the line-to-line voltage) is said once with the worst
 * board's example, naming whose break it is, rather than once per board with near-equal figures.
 */
function mergedOpenNeutralCautions(boards: readonly { readonly board: string; readonly highestPercent: number; readonly cautions: readonly string[] }[]): string[] {
  const byKind = new Map<string, { text: string; board: string; highestPercent: number; boards: Set<string> }>();
  for (const b of boards)
    for (const text of b.cautions) {
      const at = text.indexOf(EXAMPLE_OPENING);
      const kind = at < 0 ? text : text.slice(0, at);
      const seen = byKind.get(kind);
      if (!seen) byKind.set(kind, { text, board: b.board, highestPercent: b.highestPercent, boards: new Set([text]) });
      else {
        seen.boards.add(text);
        if (b.highestPercent > seen.highestPercent) Object.assign(seen, { text, board: b.board, highestPercent: b.highestPercent });
      }
    }
  return [...byKind.values()].map((k) => (k.boards.size > 1 ? k.text.replace(EXAMPLE_OPENING, `(here, with the neutral broken at ${k.board}, "`) : k.text));
}

/** The file's banks, in service in this solve: stated, as they are part of every figure above. */
function banksLine(r: InstallationResult): string[] {
  if (!r.banksInService.length) return [];
  const banks = r.banksInService.map((b) => bankInServiceWords(b, b.deliveredKvar)).join('; ');
  return [wrapText(`capacitor banks in service, ${BANKS_IN_SERVICE_BASIS} (each board's own kvar includes its bank): ${banks}`, '  ', '    ')];
}

export interface InstallationReportOptions {
  /** Boards whose full report follows the summary. */
  readonly detailed: readonly string[];
}

/** The one line an ideal supply gets: what it means for the figures, and how to give the real one. */
const idealSourceLine = (board: InstallationResult['boards'][number]['result']['board']) =>
  wrapText(`ideal (zero source impedance: no transformer or impedance given): ${idealSourceHolds(board)} whatever the load, so no drop or loss before the service feeder`, '  source      ', '              ');

export function renderInstallationReport(r: InstallationResult, options: InstallationReportOptions): string {
  const first = r.boards[0]!.result.board;
  // The trade's notation, the region's way round (230/400 V, 208Y/120 V, 120/240 V).
  const volts = r.boards[0]!.result.conventions.voltageNotation;
  const t = r.totals;
  const warnings = r.boards.flatMap((b) => b.result.warnings.map((w) => wrapText(`${b.name}: ${w.message}`, '  ! ')));
  const cautions = [...new Set(r.boards.flatMap((b) => b.result.cautions))];
  const ideal = first.idealSource === true;
  const parts = [
    [
      r.installation.name,
      `${SYSTEM_WORDS[r.installation.system] ?? r.installation.system} · ${volts} · ${first.frequencyHz} Hz · ${r.installation.boardCount} board${r.installation.boardCount === 1 ? '' : 's'}`,
      ...[sourceHeldLine(first, (p) => labelIn(r.boards[0]!.result.conventions.phaseNames, p))].flatMap((held) => (held ? [wrapText(held, '', '  ')] : [])),
    ].join('\n'),
    ...collapseBlock(r),
    section('Boards') + boardTable(r) + `\n${note(`min and max %nom: the lowest and highest voltage the limits judge (line-to-neutral, line-to-line, at the loads); ${unbalanceWords(r)}own: this board's circuits; fed: what enters its feeder at the sending end, the feeder's loss and the boards beyond it included (main board: what the source EMFs deliver).`)}`,
    section('Feeders') +
      feederTable(r) +
      `\n${note(`drop: |V| at the sending end minus |V| at the board, the phase that changes most (negative: a rise), % of nominal; for the service feeder, from the source EMF. loss: conductor losses, ${ideal ? 'the source being ideal (no windings to lose power in)' : "the service feeder's with the source windings"}.`)}` +
      cableList(r),
    section('Installation') +
      [
        `  loads       ${fixed(t.loadKW, 3)} kW  ${fixed(t.loadKvar, 3)} kvar`,
        `  losses      ${fixed(t.lossesKW, 3)} kW  (${ideal ? 'every feeder' : 'source windings and every feeder'})`,
        `  from source ${fixed(t.sourceKW, 3)} kW  ${fixed(t.sourceKvar, 3)} kvar`,
        ...(ideal ? [idealSourceLine(first)] : []),
        `  lowest voltage ${lowestVoltagePercentText(r)} % of nominal, at ${t.lowestVoltageBoard} (${t.lowestVoltageAt})`,
        limitsLine(r),
        ...banksLine(r),
      ].join('\n'),
    section('Warnings') + (warnings.length ? warnings.join('\n') : '  none'),
  ];
  const openNeutral = options.detailed.length === 0 ? openNeutralSummary(r) : null;
  if (openNeutral) parts.push(openNeutral);
  for (const name of options.detailed) {
    const board = r.boards.find((b) => b.name === name)!;
    parts.push(section(`━━ ${name}${board.fedFrom ? ` (fed from ${board.fedFrom})` : ''} ━━`) + renderSolveReport(board.result).trimEnd());
  }
  if (options.detailed.length === 0)
    parts.push(section('Notes') + ['Full figures of one board: --board "<name>"; of every board: --all-boards; everything as data: --json.', ...cautions].map((c) => wrapText(c, '  * ')).join('\n'));
  return `${parts.join('\n')}\n`;
}

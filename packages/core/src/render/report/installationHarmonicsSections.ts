/**
 * The harmonic study of an installation as report sections: an overview (a row
 * per board with its busbar against its voltage levels, IEEE 519 at the supply intake, spectra, assumptions, warnings
 * naming their board), then one section per board (the feeder into it, its
 * busbar, its neutral, and the scan and duty of a bank on it). The blocks are
 * the board report's (harmonicsBlocks.ts).
 */
import type { BoardHarmonics, InstallationHarmonicsReport } from '../../harmonics/harmonicsResult.js';
import { labellerOf, type PhaseLabeller } from '../../board/conventions/phaseNames.js';
import { fixed } from '../svgText.js';
import { signedPfText } from '../powerFactorText.js';
import type { ReportBlock, ReportSection } from './reportDocument.js';
import { dutyBlocks, harmonicCurrentTable, jointScanBlocks, harmonicVoltageTable, neutralBlocks, orDash, scanBlocks, spectraList, tddTable, voltageDistortionTable } from './harmonicsBlocks.js';
import { argumentIssueError, checkObjectArgument } from '../../_internal/argumentChecks.js';

/** The bus voltage with the highest THD, as `4.1 % L1-N`. */
function worstBusWords(b: BoardHarmonics, label: PhaseLabeller): string {
  const worst = b.voltageDistortion.buses.reduce<{ bus: string; thd: number } | null>((w, x) => (x.thdPercent !== null && (!w || x.thdPercent > w.thd) ? { bus: x.bus, thd: x.thdPercent } : w), null);
  return worst ? `${fixed(worst.thd, 1)} ${label(worst.bus)}` : '—';
}

/** What the boards' voltages were judged against: one basis, or each board's. */
export function basesWords(r: InstallationHarmonicsReport): string {
  const names = [...new Set(r.boards.map((b) => b.voltageDistortion.basisName))];
  return names.length === 1 ? names[0]! : r.boards.map((b) => `${b.voltageDistortion.basisName} (${b.board})`).join(', ');
}

function boardsTable(r: InstallationHarmonicsReport, label: PhaseLabeller): ReportBlock {
  return {
    kind: 'table',
    caption: 'Every board: its busbar voltage and the feeder into it (rms with harmonics)',
    columns: [
      { label: 'Board' },
      { label: 'V THD %' },
      { label: 'Voltage levels' },
      { label: 'Feeder A' },
      { label: 'I THD %', align: 'right' },
      { label: 'N A', align: 'right' },
      { label: 'Triplen A', align: 'right' },
      { label: 'N load %', align: 'right' },
      { label: 'True PF', align: 'right' },
    ],
    rows: r.boards.map((b) => {
      const largest = b.lines.reduce((w, l) => (l.current.rms > w.current.rms ? l : w));
      const n = b.neutral;
      return [
        b.board,
        worstBusWords(b, label),
        b.voltageDistortion.ok ? 'within' : 'exceeds',
        `${fixed(largest.current.rms, 1)} ${label(largest.phase)}`,
        orDash(largest.current.thdPercent, 1),
        n ? fixed(n.current.rms, 1) : '—',
        orDash(b.triplenNeutralA, 1),
        n === null || n.loadingPercent === null ? '—' : `${fixed(n.loadingPercent, 0)}${n.overloaded ? ' OVER' : ''}`,
        signedPfText(b.powerFactor.true, '—'),
      ];
    }),
    note: `V THD: the busbar voltage with the highest THD; Voltage levels: every bus voltage of the board against the ${basesWords(r)}; Feeder A: the largest line current of the feeder into the board (the service feeder at the main board) and its THD; Triplen A: orders 3, 9, 15… in that feeder’s neutral; N load: % of its neutral rating.`,
  };
}

/**
 * The report sections of an installation's harmonic study: `harmonics` (the
 * overview; it replaces a correction study's resonance estimate, as in a board
 * report) and one `<board id>-harmonics` per board.
 * @param ids the report's section id of each board (`boardSectionIds`)
 */
export function installationHarmonicsSections(r: InstallationHarmonicsReport, ids: ReadonlyMap<string, string>): ReportSection[] {
  checkObjectArgument(r, 'r', 'an installation harmonics report from studyInstallationHarmonics(...)', ['phaseNames', 'orders', 'boards']);
  if (!(ids instanceof Map)) throw argumentIssueError('ids', 'a Map of board name to section id (boardSectionIds(...))', ids);
  const label = labellerOf(r.phaseNames);
  const overview: ReportBlock[] = [
    { kind: 'paragraph', text: `Orders solved: ${r.orders.join(', ') || 'none (no spectrum or background given)'}. State of the banks for the figures below: ${r.state}.` },
    boardsTable(r, label),
  ];
  if (r.tdd) overview.push(tddTable(r.tdd, label, 'at the supply intake'));
  const spectra = r.boards.flatMap((b) => b.spectra.map((s) => ({ ...s, load: `${s.load} (${b.board})` })));
  if (spectra.length) overview.push(spectraList(spectra));
  overview.push({ kind: 'list', items: r.assumptions });
  if (r.warnings.length) overview.push({ kind: 'list', tone: 'warning', items: r.warnings.map((w) => `${w.board ?? 'supply intake'}: ${w.message}`) });
  const sections: ReportSection[] = [{ id: 'harmonics', title: 'Harmonics and resonance', blocks: overview }];

  for (const b of r.boards) {
    const id = ids.get(b.board)!;
    const feeder = b.fedFrom === null ? 'the service feeder' : `the feeder from ${b.fedFrom}`;
    const blocks: ReportBlock[] = [
      harmonicCurrentTable(b.lines, b.neutral, label, `Currents in ${feeder} into ${b.board}`),
      harmonicVoltageTable(b, label, `Voltages and power factor at the busbar of ${b.board}`),
      voltageDistortionTable(b.voltageDistortion, label, `Bus voltage distortion at ${b.board}`),
    ];
    if (b.neutral) blocks.push(...neutralBlocks(b.neutral));
    const scan = r.scans.find((s) => s.board === b.board);
    if (scan) {
      const othersOn = scan.jointScan ? ', every other bank fully on' : '';
      blocks.push(...scanBlocks(scan.scan, { seenFrom: ` seen from ${b.board}${othersOn}`, figureName: `${id}-impedance-scan` }));
      if (scan.jointScan) blocks.push(...jointScanBlocks(scan.jointScan, { seenFrom: ` seen from ${b.board}` }));
      if (scan.capacitorDuty) blocks.push(...dutyBlocks(scan.capacitorDuty, label));
    }
    sections.push({ id: `${id}-harmonics`, title: `Harmonics — ${b.board}`, blocks });
  }
  return sections;
}

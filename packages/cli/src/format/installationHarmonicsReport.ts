/**
 * InstallationHarmonicsReport → the text report of `trivar harmonics` on an installation: one
 * summary row per board (busbar distortion against its voltage levels, incoming feeder, its neutral), the supply's IEEE 519
 * check, the scan and duty of each bank, then the full figures of the boards asked for.
 */
import { jointCoverageWords, nearestWords, signedPfText, voltageBasisWords, type BoardHarmonics, type InstallationHarmonicsReport, type JointScan } from '@trivar/core';
import { fixed, renderTable, renderTableWithin, section } from './textTable.js';
import { wrapText } from './wrapText.js';
import { treeName } from './boardTree.js';
import { alikeStates, boardDisplacementText, currentTable, dutyLines, labeller, neutralLines, prose, resonanceTitle, scanLine, scanTable, spectraLines, tddLines, voltageTable } from './harmonicsReport.js';


/** The busbar voltage with the highest THD: its label and THD. */
function worstBus(b: BoardHarmonics): { bus: string; thd: number } | null {
  return b.voltageDistortion.buses.reduce<{ bus: string; thd: number } | null>((w, x) => (x.thdPercent !== null && (!w || x.thdPercent > w.thd) ? { bus: x.bus, thd: x.thdPercent } : w), null);
}

/** What the boards' voltages were judged against, with the levels: one basis for all, or each board's. */
function basisNote(r: InstallationHarmonicsReport): string {
  const words = [...new Set(r.boards.map((b) => voltageBasisWords(b.voltageDistortion)))];
  return words.length === 1 ? words[0]! : r.boards.map((b) => `${b.board}: ${voltageBasisWords(b.voltageDistortion)}`).join('; ');
}

function boardTable(r: InstallationHarmonicsReport): string {
  const label = labeller(r);
  const rows = r.boards.map((b) => {
    const worst = worstBus(b);
    const largestLine = b.lines.reduce((w, l) => (l.current.rms > w.current.rms ? l : w));
    return [
      treeName(b.board, b.depth),
      worst ? `${fixed(worst.thd, 1)} ${label(worst.bus)}` : '-',
      b.voltageDistortion.ok ? 'ok' : 'OVER',
      `${fixed(largestLine.current.rms, 1)} ${label(largestLine.phase)}`,
      largestLine.current.thdPercent === null ? '-' : fixed(largestLine.current.thdPercent, 1),
      b.neutral ? fixed(b.neutral.current.rms, 1) : '',
      b.triplenNeutralA === null ? '' : fixed(b.triplenNeutralA, 1),
      b.neutral?.loadingPercent === null || b.neutral?.loadingPercent === undefined ? '-' : `${fixed(b.neutral.loadingPercent, 0)}${b.neutral.overloaded ? ' OVER' : ''}`,
      signedPfText(b.powerFactor.true),
    ];
  });
  return renderTableWithin(
    [
      { header: 'board', align: 'left' },
      { header: 'V THD %', align: 'left' },
      { header: 'V levels', align: 'left' },
      { header: 'feeder A', align: 'left' },
      { header: 'I THD %' },
      { header: 'N A' },
      { header: 'triplen A' },
      { header: 'N load %', align: 'left' },
      { header: 'true PF' },
    ],
    rows,
  );
}

const note = (text: string) => wrapText(text, '  (', '   ');

/**
 * The scan with the other banks switched: bank states alike in output on one row, as in the scan
 * table; under each row, the other banks' state of its nearest approach to a checked order.
 */
function jointScanTable(joint: JointScan): string {
  const list = alikeStates(joint.combinations);
  const rows = list.map(({ labels, c }) => [
    labels.length > 2 ? `${labels[0]} (+${labels.length - 1} alike)` : labels.join(', '),
    fixed(c.capacitorKvar, 1),
    c.lowestPeak && c.highestPeak ? `${fixed(c.lowestPeak.order, 1)} … ${fixed(c.highestPeak.order, 1)}` : 'none',
    c.nearOrders.map((n) => n.order).join(', ') || '-',
    c.nearest ? nearestWords(c.nearest) : '-',
  ]);
  const [head, rule, ...body] = renderTable(
    [
      { header: 'bank state', align: 'left' },
      { header: 'kvar on' },
      { header: 'peaks (h)', align: 'left' },
      { header: 'near orders', align: 'left' },
      { header: 'nearest a checked order', align: 'left' },
    ],
    rows,
  ).split('\n');
  const at = head!.indexOf('nearest');
  const indent = ' '.repeat(at);
  return [head!, rule!, ...body.flatMap((line, k) => (list[k]!.c.nearest ? [line, wrapText(`with ${list[k]!.c.nearest!.otherBanks}`, indent, `${indent}  `)] : [line]))].join('\n');
}

export interface InstallationHarmonicsReportOptions {
  /** Boards whose full figures follow the summary. */
  readonly detailed: readonly string[];
}

export function renderInstallationHarmonicsReport(r: InstallationHarmonicsReport, options: InstallationHarmonicsReportOptions): string {
  const label = labeller(r);
  const out: string[] = [];
  out.push(`${r.installation} — harmonics at ${r.frequencyHz} Hz · ${r.boards.length} boards`);
  out.push(wrapText(`orders solved: ${r.orders.join(', ') || 'none (no spectrum or background given: linear installation)'}; state: ${r.state}`, '', '  '));
  out.push(section('Boards (busbar voltage distortion; the feeder into each board, rms with harmonics)'));
  out.push(boardTable(r));
  out.push(
    note(
      `V THD: the busbar voltage with the highest THD; V levels: every bus voltage against the ${basisNote(r)}; feeder A: the largest line current of the feeder into the board (the service feeder at the main board) and its THD; triplen A: the neutral’s orders 3, 9, 15…; N load: % of the feeder’s neutral rating; warnings below name their board.)`,
    ),
  );
  if (r.tdd) {
    out.push(section('Current distortion at the supply intake (IEEE 519)'));
    out.push(...tddLines(r.tdd, label));
  }
  for (const s of r.scans) {
    out.push(section(resonanceTitle(s.scan, ` seen from ${s.board}${s.jointScan ? ', every other bank fully on' : ''}`)));
    out.push(scanTable(s.scan, label));
    out.push(scanLine(s.scan, label));
    if (s.jointScan) {
      out.push(section(`Resonance seen from ${s.board} with the other banks switched (peaks over all their states)`));
      out.push(jointScanTable(s.jointScan));
      out.push(prose(jointCoverageWords(s.jointScan)));
    }
    if (s.capacitorDuty) {
      out.push(section(`Capacitor duty with harmonics, bank on ${s.board} (every bank state)`));
      out.push(...dutyLines(s.capacitorDuty, label));
    }
  }
  const spectra = r.boards.flatMap((b) => b.spectra.map((s) => ({ ...s, load: `${s.load} (${b.board})` })));
  if (spectra.length) {
    out.push(section('Spectra used'));
    out.push(...spectraLines(spectra));
  }
  for (const name of options.detailed) {
    const b = r.boards.find((x) => x.board === name)!;
    const readings = { ...b, orders: r.orders, phaseNames: r.phaseNames };
    out.push(section(`━━ ${name}${b.fedFrom ? ` (fed from ${b.fedFrom})` : ' (fed from the supply)'} ━━`));
    out.push(section(`Currents in the feeder into ${name} (rms with harmonics; orders as % of each line’s fundamental)`));
    out.push(currentTable(readings));
    out.push(section(`Voltages and power factor at ${name}`));
    out.push(voltageTable(readings));
    out.push(prose(`board: true PF ${signedPfText(b.powerFactor.true)}, displacement PF ${boardDisplacementText(b.powerFactor)} (ΣP / Σ V·I over the lines)`));
    if (b.neutral) {
      out.push(section(`Neutral of the feeder into ${name}`));
      out.push(...neutralLines(b.neutral));
    }
  }
  out.push(section('Assumptions'));
  out.push(...r.assumptions.map((a) => prose(a, '  - ')));
  if (r.warnings.length) {
    out.push(section('Warnings'));
    out.push(...r.warnings.map((w) => prose(w.board === null ? `supply intake: ${w.message}` : `${w.board}: ${w.message}`, '  ! ')));
  }
  if (options.detailed.length === 0) out.push(section('Notes'), prose('Full figures of one board: --board "<name>"; of every board: --all-boards; everything as data: --json.', '  * '));
  out.push(section('Cautions'));
  out.push(...r.cautions.map((c) => prose(c, '  - ')));
  return `${out.join('\n')}\n`;
}

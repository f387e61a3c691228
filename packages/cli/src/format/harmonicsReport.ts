/** HarmonicsReport → the human-readable report of `trivar harmonics`. */
import { busFigureTexts, conditionWords, displacementPfText, labelIn, signedPfText, type HarmonicsPowerFactor, voltageBasisWords, type DistortionReading, type HarmonicsReport, type ResonanceScan, type CapacitorDuty, type TddCheck, type NeutralCheck } from '@trivar/core';
import { fixed, renderTable, section, textWidth } from './textTable.js';
import { REPORT_WIDTH } from './wrapText.js';
import { wrapText } from './wrapText.js';

/** A prose line of the report, wrapped to the report width under its own indent. */
export const prose = (text: string, first = '  ', rest = '    ') => wrapText(text, first, rest);

/** Orders shown as columns of the current table; the JSON has them all. */
const MAX_ORDER_COLUMNS = 8;

const thd = (d: DistortionReading) => (d.thdPercent === null ? '-' : fixed(d.thdPercent, 1));
const orderPercent = (d: DistortionReading, h: number) => {
  const o = d.orders.find((x) => x.order === h);
  return o ? (o.percentOfFundamental === null ? '-' : fixed(o.percentOfFundamental, 1)) : '';
};

/** A phase, pair or branch as the board file names it (L1-N or A-N). */
export type Label = (term: string) => string;
export const labeller = (r: Pick<HarmonicsReport, 'phaseNames'>): Label => (term) => labelIn(r.phaseNames, term);

/** What the current and voltage tables read: one board's lines, pairs and neutral, the orders solved and the naming. */
export type BoardReadings = Pick<HarmonicsReport, 'lines' | 'lineToLine' | 'hasNeutral' | 'neutral' | 'orders' | 'phaseNames' | 'voltageDistortion'>;

export function currentTable(r: BoardReadings): string {
  const label = labeller(r);
  const shown = r.orders.slice(0, MAX_ORDER_COLUMNS);
  const rows = r.lines.map((l) => [label(l.phase), fixed(l.current.rms, 1), fixed(l.current.fundamental, 1), thd(l.current), ...shown.map((h) => orderPercent(l.current, h))]);
  if (r.neutral) rows.push(['N', fixed(r.neutral.current.rms, 1), fixed(r.neutral.current.fundamental, 1), '', ...shown.map((h) => orderPercent(r.neutral!.current, h))]);
  const notes = [
    ...(r.neutral ? ['  N row: orders as % of the neutral’s own fundamental current'] : []),
    ...(r.orders.length > shown.length ? [`  orders above ${shown.at(-1)} in --json`] : []),
  ];
  const note = notes.length ? `\n${notes.join('\n')}` : '';
  return (
    renderTable(
      [{ header: 'line', align: 'left' }, { header: 'rms A' }, { header: 'h1 A' }, { header: 'THD %' }, ...shown.map((h) => ({ header: `h${h} %` }))],
      rows,
    ) + note
  );
}

export function voltageTable(r: BoardReadings): string {
  const label = labeller(r);
  // THD and the largest order as the verdict under the table judges them: over a level, with the decimals to read over it.
  const figures = (bus: string, d: DistortionReading) => {
    const texts = busFigureTexts(r.voltageDistortion, bus);
    return [d.thdPercent === null ? '-' : texts.thd(d.thdPercent), largestOrder(d, texts.order)];
  };
  // Without a neutral only the line-to-line voltages exist at the board; the power factors are the board's.
  if (!r.hasNeutral && r.lineToLine.length)
    return renderTable(
      [{ header: 'at board', align: 'left' }, { header: 'rms V' }, { header: 'THD %' }, { header: 'largest', align: 'left' }],
      r.lineToLine.map((p) => [label(p.pair), fixed(p.voltage.rms, 1), ...figures(p.pair, p.voltage)]),
    );
  const rows = [
    ...r.lines.map((l) => [label(`${l.phase}-N`), fixed(l.voltage.rms, 1), ...figures(`${l.phase}-N`, l.voltage), signedPfText(l.truePf), displacementPfText(l.displacementPf, { sense: l.displacementSense, kW: l.fundamentalKW, kvar: l.fundamentalKvar })]),
    ...r.lineToLine.map((p) => [label(p.pair), fixed(p.voltage.rms, 1), ...figures(p.pair, p.voltage), '', '']),
  ];
  return renderTable(
    [{ header: 'at board', align: 'left' }, { header: 'rms V' }, { header: 'THD %' }, { header: 'largest', align: 'left' }, { header: 'true PF' }, { header: 'displ. PF' }],
    rows,
  );
}

function largestOrder(d: DistortionReading, percentText: (order: number, x: number) => string): string {
  if (d.orders.length === 0) return '-';
  const o = d.orders.reduce((a, b) => (b.magnitude > a.magnitude ? b : a));
  return o.percentOfFundamental === null ? `h${o.order} ${fixed(o.magnitude, 1)}` : `h${o.order} ${percentText(o.order, o.percentOfFundamental)} %`;
}

export function neutralLines(n: NeutralCheck): string[] {
  const lines = [
    prose(`${fixed(n.current.rms, 1)} A rms, of which ${fixed(n.current.fundamental, 1)} A at the fundamental; ${n.ratioToPhase === null ? '' : `${fixed(n.ratioToPhase, 2)} × the largest line current; `}${n.triplenSharePercent === null ? 'no current to heat it' : `triplen orders ${fixed(n.triplenSharePercent, 0)} % of its heating (rms²)`}`),
  ];
  if (n.ratingA !== null) lines.push(`  rating ${fixed(n.ratingA, 0)} A: ${fixed(n.loadingPercent ?? 0, 0)} % loaded${n.overloaded ? ' — OVERLOADED' : ''}`);
  else lines.push('  no neutral rating in the board file (feeder.neutral.ratingA): not checked');
  if (n.practice) lines.push(prose(`practice: ${n.practice}`));
  return lines;
}

export function tddLines(t: TddCheck, label: Label): string[] {
  const head = prose(`I_sc/I_L = ${fixed(t.shortCircuitRatio, 1)} (${t.shortCircuitRatioFrom}), I_L = ${fixed(t.demandCurrentA, 1)} A (${t.demandCurrentFrom}); table row ${t.tableRow}, TDD limit ${t.tddLimitPercent} %`);
  const columns = [{ header: 'line', align: 'left' as const }, { header: 'TDD %' }, { header: 'limit %' }, { header: 'orders over their limit', align: 'left' as const }, { header: 'verdict', align: 'left' as const }];
  const rows = t.lines.map((l) => {
    const over = l.orders.filter((o) => !o.ok).map((o) => `h${o.order} ${fixed(o.percentOfDemand, 1)}/${o.limitPercent}`);
    return [label(l.phase), fixed(l.tddPercent, 1), fixed(t.tddLimitPercent, 1), over.join(', ') || '-', l.ok ? 'within' : 'EXCEEDS'];
  });
  return [head, fitOrdersColumn(columns, rows), prose(`source: ${t.source}`)];
}

/** Many orders over their limit make a long cell: it continues on rows of its own rather than widen the table. */
function fitOrdersColumn(columns: Parameters<typeof renderTable>[0], rows: string[][]): string {
  const table = renderTable(columns, rows);
  const excess = Math.max(...table.split('\n').map(textWidth)) - REPORT_WIDTH;
  if (excess <= 0) return table;
  const room = Math.max(...rows.map((r) => textWidth(r[3]!))) - excess;
  const split: string[][] = [];
  for (const row of rows) {
    const lines: string[] = [];
    for (const part of row[3]!.split(', ')) {
      const last = lines.length - 1;
      if (last >= 0 && textWidth(`${lines[last]}, ${part}`) < room) lines[last] = `${lines[last]}, ${part}`;
      else lines.push(part);
    }
    lines.forEach((text, k) => split.push(k === 0 ? [...row.slice(0, 3), k < lines.length - 1 ? `${text},` : text, row[4]!] : ['', '', '', k < lines.length - 1 ? `${text},` : text, '']));
  }
  return renderTable(columns, split);
}


/** Bank states with the same output, in first-seen order: each with its labels and its first state. */
export function alikeStates<C extends { readonly capacitorKvar: number; readonly label: string }>(combinations: readonly C[]): { labels: string[]; c: C }[] {
  const groups = new Map<string, { labels: string[]; c: C }>();
  for (const c of combinations) {
    const key = fixed(c.capacitorKvar, 2);
    const g = groups.get(key);
    if (g) g.labels.push(c.label);
    else groups.set(key, { labels: [c.label], c });
  }
  return [...groups.values()];
}

/** Bank states with the same output resonate alike: one row per output, listing the states. */
export function scanTable(s: ResonanceScan, label: Label): string {
  const rows = alikeStates(s.combinations).map(({ labels, c }) => {
    const orders = [...new Set(c.peaks.map((p) => fixed(p.order, 1)))];
    const main = c.peaks.length ? c.peaks.reduce((a, b) => (b.impedanceOhm > a.impedanceOhm ? b : a)) : null;
    return [
      labels.length > 2 ? `${labels[0]} (+${labels.length - 1} alike)` : labels.join(', '),
      fixed(c.capacitorKvar, 1),
      c.formulaOrder === null ? '-' : fixed(c.formulaOrder, 2),
      orders.join(' ') || 'none',
      main ? `${fixed(main.impedanceOhm, 3)} (${label(main.pair)})` : '-',
      c.nearOrders.length ? c.nearOrders.join(', ') : '-',
    ];
  });
  return renderTable(
    [
      { header: 'bank state', align: 'left' },
      { header: 'kvar on' },
      { header: 'estimated h' },
      { header: 'scanned peaks (h)', align: 'left' },
      { header: 'largest |Z| ohm', align: 'left' },
      { header: 'near orders', align: 'left' },
    ],
    rows,
  );
}

/** The design row at or above the continuous rating (the running state's rms, as printed). */
const runningAtRated = (d: CapacitorDuty): boolean => d.continuousVoltage !== null && Number(d.continuousVoltage.highestPu.toFixed(3)) >= d.continuousVoltage.limitPu;

export function dutyLines(d: CapacitorDuty, label: Label): string[] {
  const lim = d.limits;
  const w = d.worst.figures;
  const cell = (x: number, limit: number | null) => `${fixed(x, 2)}${limit === null ? '' : ` / ${limit}`}`;
  const dutyCells = (f: typeof w) => [cell(f.voltageRms, lim.voltageRms), cell(f.voltagePeak, lim.voltagePeak), cell(f.currentRms, lim.currentRms), cell(f.kvar, lim.kvar)];
  return [
    prose(`${fixed(d.ratedV, 0)} V units${d.detuningPercent > 0 ? `, detuned p = ${fixed(d.detuningPercent, 2)} %` : ''}; capacitor fundamental voltage ${fixed(d.capacitorVoltageV, 1)} V; judged against ${d.standard === 'ieee-18' ? 'IEEE 18' : 'IEC 60831-1'}`),
    renderTable(
      [{ header: 'worst state', align: 'left' }, { header: 'branch', align: 'left' }, { header: 'V rms pu' }, { header: 'V peak pu' }, { header: 'I rms pu' }, { header: 'kvar pu' }, { header: 'verdict', align: 'left' }],
      [
        [`${d.worstNominal.label} (design)`, label(d.worstNominal.branch), ...dutyCells(d.worstNominal.figures), !d.worstNominal.ok ? 'EXCEEDS' : runningAtRated(d) ? 'AT/ABOVE RATED V' : 'within'],
        [d.worst.label, label(d.worst.branch), ...dutyCells(w), !d.ok ? 'EXCEEDS' : d.continuousVoltage?.reached ? 'within the 8 h limits only' : 'within limits everywhere'],
      ],
    ),
    prose(
      `design = nominal capacitance, loads as given${d.conditions.some((c) => c.otherBanks) ? ', other banks on' : ''}; worst of every state at capacitance −${d.capacitanceTolerance.minusPercent} % / nominal / +${d.capacitanceTolerance.plusPercent} %, loads as given and all off${d.conditions.some((c) => c.otherBanks) ? ', other banks on, out of service and in any state the joint scan finds near a checked order' : ''}: ${d.worst.label}, ${conditionWords(d.worst.condition)}`,
    ),
    prose(
      // Every state checked, every load off included; the continuous judgement (the warning) is of the states the
      // bank can stay in, so where the two differ each figure says which it is.
      `highest fundamental voltage across a capacitor in any state checked (every load off included): ${fixed(d.highestCapacitorVoltageV, 1)} V (${fixed(d.highestCapacitorVoltageV / d.ratedV, 3)} × rated)${
        d.continuousVoltage?.reached
          ? `; in the states the bank can stay in (loads as given) ${fixed(d.continuousVoltage.fundamentalPu * d.ratedV, 1)} V (${fixed(d.continuousVoltage.fundamentalPu, 3)} ×), at or above the ${fixed(d.continuousVoltage.limitPu, 2)} × rated they stand continuously (IEC 60831-1): see the warning`
          : ''
      }`,
    ),
    prose(`limits: ${d.limitsSource}`),
  ];
}

/** Loads grouped by the spectrum they use, one line per spectrum. */
export function spectraLines(spectra: readonly { readonly load: string; readonly spectrum: string; readonly source: string }[]): string[] {
  const seen = new Map<string, string[]>();
  for (const s of spectra) seen.set(`${s.spectrum}: ${s.source}`, [...(seen.get(`${s.spectrum}: ${s.source}`) ?? []), s.load]);
  return [...seen].map(([what, loads]) => prose(`${what} — ${loads.join(', ')}`));
}

/** The scan's grid and what it checks, in one line. */
export function scanLine(s: ResonanceScan, label: Label): string {
  return prose(`scanned h = ${s.orders[0]} … ${s.orders.at(-1)} (${s.orders.length} points, pairs ${s.pairs.map(label).join(' ')}); checked against ${s.checkedOrdersFrom}: ${s.checkedOrders.join(', ')}`);
}

/** The resonance section's title: the short-circuit power at the board, or an ideal source. */
export function resonanceTitle(s: ResonanceScan, where = ''): string {
  return `Resonance with the supply${where}${s.shortCircuitKVA === null ? ' (ideal source: none possible)' : ` (S_sc ${fixed(s.shortCircuitKVA, 0)} kVA)`}`;
}

export function renderHarmonicsReport(r: HarmonicsReport): string {
  const out: string[] = [];
  out.push(`${r.board} — harmonics at ${r.frequencyHz} Hz`);
  out.push(wrapText(`orders solved: ${r.orders.join(', ') || 'none (no spectrum or background given: linear board)'}; state: ${r.state}`, '', '  '));
  out.push(section('Currents (rms with harmonics; orders as % of each line’s fundamental)'));
  out.push(currentTable(r));
  out.push(section('Voltages and power factor at the board'));
  out.push(voltageTable(r));
  out.push(
    prose(`board: true PF ${signedPfText(r.powerFactor.true)}, displacement PF ${boardDisplacementText(r.powerFactor)} (ΣP / Σ V·I over the lines)`),
  );
  const v = r.voltageDistortion;
  const overBuses = v.buses.filter((b) => !b.ok).map((b) => labeller(r)(b.bus));
  out.push(prose(`bus voltages against the ${voltageBasisWords(v)}: ${v.ok ? 'within on every bus voltage' : `EXCEEDED on ${overBuses.join(', ')} (see warnings)`}`));
  if (r.neutral) {
    out.push(section('Neutral conductor'));
    out.push(...neutralLines(r.neutral));
  }
  if (r.tdd) {
    out.push(section('Current distortion at the feed (IEEE 519)'));
    out.push(...tddLines(r.tdd, labeller(r)));
  }
  out.push(section(resonanceTitle(r.scan)));
  out.push(scanTable(r.scan, labeller(r)));
  out.push(scanLine(r.scan, labeller(r)));
  if (r.capacitorDuty) {
    out.push(section('Capacitor duty with harmonics (every bank state)'));
    out.push(...dutyLines(r.capacitorDuty, labeller(r)));
  }
  if (r.spectra.length) {
    out.push(section('Spectra used'));
    out.push(...spectraLines(r.spectra));
  }
  out.push(section('Assumptions'));
  out.push(...r.assumptions.map((a) => prose(a, '  - ')));
  if (r.warnings.length) {
    out.push(section('Warnings'));
    out.push(...r.warnings.map((w) => prose(w.message, '  ! ')));
  }
  out.push(section('Cautions'));
  out.push(...r.cautions.map((c) => prose(c, '  - ')));
  return `${out.join('\n')}\n`;
}

/** The board's displacement PF with its sense (of ΣQ1 over the lines), as the line rows print theirs. */
export function boardDisplacementText(pf: HarmonicsPowerFactor): string {
  return displacementPfText(pf.displacement, { sense: pf.displacementSense, kW: pf.fundamentalKW, kvar: pf.fundamentalKvar });
}

/**
 * Report blocks of a harmonic study, shared by the board section and the
 * installation's sections: currents and voltages with harmonics, the neutral,
 * IEEE 519 at the feed, the bus voltages against their basis (IEC 61000-2-2, EN 50160
 * or IEEE 519), the resonance scan and capacitor duty.
 * Phases and branches as the file names them (the labeller it hands in).
 */
import type {
  BusVoltageDistortion,
  CapacitorDuty,
  DistortionReading,
  HarmonicLineReading,
  JointScan,
  LoadSpectrumNote,
  NeutralCheck,
  ResonanceScan,
  TddCheck,
  VoltageDistortionCheck,
} from '../../harmonics/harmonicsResult.js';
import { conditionWords } from '../../harmonics/dutyConditions.js';
import { busFigureTexts, jointCoverageWords, nearestWords, percentAgainstLevel, voltageBasisWords } from '../../harmonics/harmonicsWording.js';
import type { PhaseLabeller } from '../../board/conventions/phaseNames.js';
import { fixed } from '../svgText.js';
import { levelText } from '../../harmonics/voltageDistortionLimits.js';
import { renderImpedanceScan } from '../renderImpedanceScan.js';
import type { ReportBlock } from './reportDocument.js';
import { displacementPfText, signedPfText } from '../powerFactorText.js';

export const orDash = (x: number | null | undefined, d: number): string => (x === null || x === undefined ? '—' : fixed(x, d));
/** Orders shown as columns (more would not fit a printed page); every order stays in the JSON. */
const SHOWN_ORDERS = 6;

/** Line currents (and the neutral's) with their rms, fundamental, THD and the first orders as % of the fundamental. */
export function harmonicCurrentTable(lines: readonly HarmonicLineReading[], neutral: NeutralCheck | null, label: PhaseLabeller, caption: string): ReportBlock {
  const shown = [...new Set(lines.flatMap((l) => l.current.orders.map((o) => o.order)))].sort((a, b) => a - b).slice(0, SHOWN_ORDERS);
  const pct = (orders: HarmonicLineReading['current']['orders'], order: number) => orDash(orders.find((o) => o.order === order)?.percentOfFundamental, 1);
  const rows = lines.map((l) => [label(l.phase), fixed(l.current.rms, 1), fixed(l.current.fundamental, 1), orDash(l.current.thdPercent, 1), ...shown.map((o) => pct(l.current.orders, o))]);
  if (neutral) {
    const n = neutral.current;
    rows.push(['N', fixed(n.rms, 1), fixed(n.fundamental, 1), '—', ...shown.map((o) => pct(n.orders, o))]);
  }
  return {
    kind: 'table',
    caption,
    columns: [{ label: 'Line' }, { label: 'rms A', align: 'right' }, { label: 'h1 A', align: 'right' }, { label: 'THD %', align: 'right' }, ...shown.map((o) => ({ label: `h${o} %`, align: 'right' as const }))],
    rows,
    note: 'Orders as % of the same conductor\'s fundamental current.',
  };
}

/** Each line's voltage with harmonics and its true and displacement power factor. */
export function harmonicVoltageTable(
  h: {
    readonly lines: readonly HarmonicLineReading[];
    readonly lineToLine: readonly { readonly pair: string; readonly voltage: DistortionReading }[];
    readonly hasNeutral: boolean;
    readonly voltageDistortion: VoltageDistortionCheck;
  },
  label: PhaseLabeller,
  caption: string,
): ReportBlock {
  const { lines } = h;
  // THD as the bus table beside it prints it: over its limit, with the decimals to read over it.
  const thdOf = (bus: string, d: DistortionReading) => (d.thdPercent === null ? '—' : busFigureTexts(h.voltageDistortion, bus).thd(d.thdPercent));
  // Without a neutral only the line-to-line voltages exist at the board.
  if (!h.hasNeutral && h.lineToLine.length)
    return {
      kind: 'table',
      caption: caption.replace('Voltages and power factor', 'Line-to-line voltages'),
      columns: [{ label: 'Lines' }, { label: 'rms V', align: 'right' }, { label: 'THD %', align: 'right' }],
      rows: h.lineToLine.map((p) => [label(p.pair), fixed(p.voltage.rms, 1), thdOf(p.pair, p.voltage)]),
    };
  return {
    kind: 'table',
    caption,
    columns: [{ label: 'Line' }, { label: 'rms V', align: 'right' }, { label: 'THD %', align: 'right' }, { label: 'true PF', align: 'right' }, { label: 'displacement PF', align: 'right' }],
    rows: lines.map((l) => [label(l.phase), fixed(l.voltage.rms, 1), thdOf(`${l.phase}-N`, l.voltage), signedPfText(l.truePf, '—'), displacementPfText(l.displacementPf, { sense: l.displacementSense, kW: l.fundamentalKW, kvar: l.fundamentalKvar }, '—')]),
  };
}

const againstLevel = percentAgainstLevel;

/** Every bus voltage against the levels of its basis (IEC 61000-2-2, EN 50160 or IEEE 519), each failing order with the level it exceeds. */
export function voltageDistortionTable(check: VoltageDistortionCheck, label: PhaseLabeller, caption: string): ReportBlock {
  const flat = check.individualLimitPercent;
  const levels = flat !== null ? `${levelText(flat)} % one order` : 'a level per order';
  return {
    kind: 'table',
    caption: `${caption} (${check.basisName}: ${levels}, ${levelText(check.thdLimitPercent)} % THD)`,
    columns: [{ label: 'Bus' }, { label: 'THD %', align: 'right' }, { label: 'Largest order' }, { label: 'Orders over their level' }, { label: 'Verdict' }],
    rows: check.buses.map((b) => [
      label(b.bus),
      b.thdPercent === null ? '—' : againstLevel(b.thdPercent, check.thdLimitPercent),
      b.largest ? `h${b.largest.order} ${largestText(b)} %` : '—',
      b.ordersAbove.map((o) => `h${o.order} ${againstLevel(o.percent, o.limitPercent)} % (level ${levelText(o.limitPercent)} %)`).join(', ') || 'none',
      b.ok ? 'within limits' : 'exceeds',
    ]),
    note: `Judged against the ${voltageBasisWords(check)}. ${check.source}.`,
  };
}

/** The largest order as the column beside it prints it where it is over its level. */
function largestText(b: BusVoltageDistortion): string {
  const over = b.ordersAbove.find((o) => o.order === b.largest!.order);
  return over ? againstLevel(over.percent, over.limitPercent) : fixed(b.largest!.percent, 1);
}

/** The neutral's current, its share of triplen orders, its loading and the usual sizing practice. */
export function neutralBlocks(n: NeutralCheck): ReportBlock[] {
  return [
    {
      kind: 'facts',
      items: [
        ['Neutral current', `${fixed(n.current.rms, 1)} A rms (${fixed(n.current.fundamental, 1)} A fundamental)`],
        ['Neutral / largest line', orDash(n.ratioToPhase, 2)],
        ['Triplen share of neutral heating', `${orDash(n.triplenSharePercent, 0)} %`],
        ['Neutral loading', n.loadingPercent === null ? 'no rating entered' : `${fixed(n.loadingPercent, 0)} % of ${fixed(n.ratingA!, 0)} A${n.overloaded ? ' — OVERLOADED' : ''}`],
      ],
    },
    ...(n.practice ? [{ kind: 'paragraph' as const, text: n.practice }] : []),
  ];
}

/** IEEE 519 current distortion at the point of common coupling, per line. */
export function tddTable(t: TddCheck, label: PhaseLabeller, where: string): ReportBlock {
  return {
    kind: 'table',
    caption: `Current distortion ${where} (IEEE 519): Isc/IL ${fixed(t.shortCircuitRatio, 1)}, row ${t.tableRow}, TDD limit ${fixed(t.tddLimitPercent, 1)} %`,
    columns: [{ label: 'Line' }, { label: 'TDD %', align: 'right' }, { label: 'Orders over their limit' }, { label: 'Verdict' }],
    rows: t.lines.map((l) => [
      label(l.phase),
      fixed(l.tddPercent, 1),
      l.orders.filter((o) => !o.ok).map((o) => `h${o.order} ${fixed(o.percentOfDemand, 1)}/${fixed(o.limitPercent, 1)}`).join(', ') || 'none',
      l.ok ? 'within limits' : 'exceeds',
    ]),
    note: t.source,
  };
}

/** Where a scan is seen from and the name of its drawing (unique in the report: it names a file beside Markdown). */
export interface ScanPlace {
  /** Added to the caption, e.g. ` seen from Workshop`. @defaultValue '' */
  readonly seenFrom?: string;
  readonly figureName: string;
}

/** The resonance scan: every bank state's peaks and near orders, and the impedance drawing. */
export function scanBlocks(scan: ResonanceScan, place: ScanPlace): ReportBlock[] {
  const blocks: ReportBlock[] = [
    {
      kind: 'table',
      caption: `Resonance with the supply${place.seenFrom ?? ''}${scan.shortCircuitKVA === null ? '' : ` (short-circuit power ${fixed(scan.shortCircuitKVA, 0)} kVA)`}`,
      columns: [{ label: 'Bank state' }, { label: 'kvar on', align: 'right' }, { label: 'Estimated h', align: 'right' }, { label: 'Scanned peaks (h)' }, { label: 'Near orders' }],
      rows: scan.combinations.map((c) => [
        c.label,
        fixed(c.capacitorKvar, 1),
        orDash(c.formulaOrder, 2),
        [...new Set(c.peaks.map((p) => p.order.toFixed(1)))].join(', ') || 'none',
        c.nearOrders.join(', ') || '—',
      ]),
      note: `${scan.basis.replace(/\.?$/, '.')} Orders checked: ${scan.checkedOrders.join(', ')} (${scan.checkedOrdersFrom}).`,
    },
  ];
  if (scan.combinations.some((c) => c.impedanceOhm.length > 0))
    blocks.push({ kind: 'figure', name: place.figureName, caption: `Resonance scan${place.seenFrom ?? ''}: impedance against harmonic order for each bank state`, svg: renderImpedanceScan(scan) });
  return blocks;
}

/**
 * The resonance with the other banks switched: per state of this bank, the peaks over their states,
 * the nearest a peak comes to a checked order and in which state, and the orders within ±10 %.
 */
export function jointScanBlocks(joint: JointScan, place: Pick<ScanPlace, 'seenFrom'>): ReportBlock[] {
  return [
    {
      kind: 'table',
      caption: `Resonance${place.seenFrom ?? ''} with the other banks switched`,
      columns: [
        { label: 'Bank state' },
        { label: 'kvar on', align: 'right' },
        { label: 'Peaks over their states (h)' },
        { label: 'Nearest a checked order' },
        { label: 'Other banks then' },
        { label: 'Near orders' },
      ],
      rows: joint.combinations.map((c) => [
        c.label,
        fixed(c.capacitorKvar, 1),
        c.lowestPeak && c.highestPeak ? `${fixed(c.lowestPeak.order, 1)} … ${fixed(c.highestPeak.order, 1)}` : 'none',
        c.nearest ? nearestWords(c.nearest) : '—',
        c.nearest?.otherBanks ?? '—',
        c.nearOrders.map((n) => n.order).join(', ') || '—',
      ]),
      note: `${jointCoverageWords(joint)}. The table above is the same bank with every other bank fully on.`,
    },
  ];
}

/** The capacitor units' duty with harmonics in their worst state and condition. */
export function dutyBlocks(d: CapacitorDuty, label: PhaseLabeller): ReportBlock[] {
  const w = d.worst;
  return [
    {
      kind: 'facts',
      items: [
        ['Capacitor units', `rated ${fixed(d.ratedV, 0)} V; fundamental ${fixed(d.capacitorVoltageV, 1)} V across them${d.detuningPercent ? `; detuned ${fixed(d.detuningPercent, 1)} %` : ''}`],
        ['Worst state', `${w.label}, branch ${label(w.branch)}, ${conditionWords(w.condition)} (checked at capacitance −${d.capacitanceTolerance.minusPercent} %, nominal and +${d.capacitanceTolerance.plusPercent} %, loads as given and all off${d.conditions.some((c) => c.otherBanks) ? ', other banks on, out of service and in any state the joint scan finds near a checked order' : ''})`],
        ['Highest capacitor voltage (fundamental, any state checked, every load off included)', `${fixed(d.highestCapacitorVoltageV, 1)} V`],
        ['V rms / V peak / I rms / kvar (per unit)', `${fixed(w.figures.voltageRms, 2)} / ${fixed(w.figures.voltagePeak, 2)} / ${fixed(w.figures.currentRms, 2)} / ${fixed(w.figures.kvar, 2)}`],
        [
          'Duty verdict',
          !d.ok
            ? 'LIMIT EXCEEDED in at least one state'
            : d.continuousVoltage?.reached
              ? `within the 8-hour limits, but at or above the ${fixed(d.continuousVoltage.limitPu, 2)} × rated voltage the units stand continuously (IEC 60831-1): units rated too low`
              : 'within limits in every state',
        ],
      ],
    },
    { kind: 'paragraph', text: d.limitsSource },
  ];
}

/** The spectra used, with their sources. */
export const spectraList = (spectra: readonly LoadSpectrumNote[]): ReportBlock => ({
  kind: 'list',
  items: spectra.map((s) => `${s.load}: ${s.spectrum} (current THD ${fixed(s.thdPercent, 1)} %) — ${s.source}`),
});

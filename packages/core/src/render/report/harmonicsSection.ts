/** The report section of a harmonic study: distortion per line and in the neutral, IEEE 519, resonance scan, capacitor duty. */
import type { HarmonicsReport } from '../../harmonics/harmonicsResult.js';
import { conditionWords } from '../../harmonics/dutyConditions.js';
import { labelIn } from '../../board/conventions/phaseNames.js';
import { fixed } from '../svgText.js';
import { renderImpedanceScan } from '../renderImpedanceScan.js';
import type { ReportBlock, ReportSection } from './reportDocument.js';
import type { StandardReference } from './reportWording.js';

const orDash = (x: number | null | undefined, d: number): string => (x === null || x === undefined ? '—' : fixed(x, d));
/** Orders shown as columns (more would not fit a printed page); every order stays in the JSON. */
const SHOWN_ORDERS = 6;

export const HARMONICS_STANDARDS: readonly StandardReference[] = [
  { name: 'IEEE Std 519-2014', use: 'current distortion limits at the point of common coupling (TDD and individual orders)' },
  { name: 'IEC 60831-1 / IEEE Std 18', use: 'capacitor voltage, current and kvar with harmonics' },
];

export function harmonicsSection(h: HarmonicsReport): ReportSection {
  // Phases and branches as the board file names them (L1 or A).
  const label = (term: string) => labelIn(h.phaseNames, term);
  const shown = [...new Set(h.lines.flatMap((l) => l.current.orders.map((o) => o.order)))].sort((a, b) => a - b).slice(0, SHOWN_ORDERS);
  const pct = (orders: HarmonicsReport['lines'][number]['current']['orders'], order: number) => orDash(orders.find((o) => o.order === order)?.percentOfFundamental, 1);
  const currentRows = h.lines.map((l) => [label(l.phase), fixed(l.current.rms, 1), fixed(l.current.fundamental, 1), orDash(l.current.thdPercent, 1), ...shown.map((o) => pct(l.current.orders, o))]);
  if (h.neutral) {
    const n = h.neutral.current;
    currentRows.push(['N', fixed(n.rms, 1), fixed(n.fundamental, 1), '—', ...shown.map((o) => pct(n.orders, o))]);
  }
  const blocks: ReportBlock[] = [
    { kind: 'paragraph', text: `Orders solved: ${h.orders.join(', ')}. State of the bank for the figures below: ${h.state}.` },
    {
      kind: 'table',
      caption: 'Line and neutral currents with harmonics',
      columns: [{ label: 'Line' }, { label: 'rms A', align: 'right' }, { label: 'h1 A', align: 'right' }, { label: 'THD %', align: 'right' }, ...shown.map((o) => ({ label: `h${o} %`, align: 'right' as const }))],
      rows: currentRows,
      note: 'Orders as % of the same conductor\'s fundamental current.',
    },
    {
      kind: 'table',
      caption: 'Voltages and power factor at the board',
      columns: [{ label: 'Line' }, { label: 'rms V', align: 'right' }, { label: 'THD %', align: 'right' }, { label: 'true PF', align: 'right' }, { label: 'displacement PF', align: 'right' }],
      rows: h.lines.map((l) => [label(l.phase), fixed(l.voltage.rms, 1), orDash(l.voltage.thdPercent, 1), orDash(l.truePf, 3), orDash(l.displacementPf, 3)]),
    },
  ];
  if (h.neutral) {
    const n = h.neutral;
    blocks.push({
      kind: 'facts',
      items: [
        ['Neutral current', `${fixed(n.current.rms, 1)} A rms (${fixed(n.current.fundamental, 1)} A fundamental)`],
        ['Neutral / largest line', orDash(n.ratioToPhase, 2)],
        ['Triplen share of neutral heating', `${orDash(n.triplenSharePercent, 0)} %`],
        ['Neutral loading', n.loadingPercent === null ? 'no rating entered' : `${fixed(n.loadingPercent, 0)} % of ${fixed(n.ratingA!, 0)} A${n.overloaded ? ' — OVERLOADED' : ''}`],
      ],
    });
    blocks.push({ kind: 'paragraph', text: n.practice });
  }
  if (h.tdd) {
    const t = h.tdd;
    blocks.push({
      kind: 'table',
      caption: `Current distortion at the feed (IEEE 519): Isc/IL ${fixed(t.shortCircuitRatio, 1)}, row ${t.tableRow}, TDD limit ${fixed(t.tddLimitPercent, 1)} %`,
      columns: [{ label: 'Line' }, { label: 'TDD %', align: 'right' }, { label: 'Orders over their limit' }, { label: 'Verdict' }],
      rows: t.lines.map((l) => [
        label(l.phase),
        fixed(l.tddPercent, 1),
        l.orders.filter((o) => !o.ok).map((o) => `h${o.order} ${fixed(o.percentOfDemand, 1)}/${fixed(o.limitPercent, 1)}`).join(', ') || 'none',
        l.ok ? 'within limits' : 'exceeds',
      ]),
      note: t.source,
    });
  }
  const scan = h.scan;
  blocks.push({
    kind: 'table',
    caption: `Resonance with the supply${scan.shortCircuitKVA === null ? '' : ` (short-circuit power ${fixed(scan.shortCircuitKVA, 0)} kVA)`}`,
    columns: [{ label: 'Bank state' }, { label: 'kvar on', align: 'right' }, { label: '√(Ssc/Qc)', align: 'right' }, { label: 'Scanned peaks (h)' }, { label: 'Near orders' }],
    rows: scan.combinations.map((c) => [
      c.label,
      fixed(c.capacitorKvar, 1),
      orDash(c.formulaOrder, 2),
      [...new Set(c.peaks.map((p) => p.order.toFixed(1)))].join(', ') || 'none',
      c.nearOrders.join(', ') || '—',
    ]),
    note: `${scan.basis} Orders checked: ${scan.checkedOrders.join(', ')} (${scan.checkedOrdersFrom}).`,
  });
  if (scan.combinations.some((c) => c.impedanceOhm.length > 0)) blocks.push({ kind: 'figure', name: 'impedance-scan', caption: 'Resonance scan: impedance against harmonic order for each bank state', svg: renderImpedanceScan(scan) });
  if (h.capacitorDuty) {
    const d = h.capacitorDuty;
    const w = d.worst;
    blocks.push({
      kind: 'facts',
      items: [
        ['Capacitor units', `rated ${fixed(d.ratedV, 0)} V; fundamental ${fixed(d.capacitorVoltageV, 1)} V across them${d.detuningPercent ? `; detuned ${fixed(d.detuningPercent, 1)} %` : ''}`],
        ['Worst state', `${w.label}, branch ${label(w.branch)}, ${conditionWords(w.condition)} (checked at capacitance −${d.capacitanceTolerance.minusPercent} %, nominal and +${d.capacitanceTolerance.plusPercent} %, loads as given and all off)`],
        ['Highest capacitor voltage (fundamental)', `${fixed(d.highestCapacitorVoltageV, 1)} V`],
        ['V rms / V peak / I rms / kvar (per unit)', `${fixed(w.figures.voltageRms, 2)} / ${fixed(w.figures.voltagePeak, 2)} / ${fixed(w.figures.currentRms, 2)} / ${fixed(w.figures.kvar, 2)}`],
        ['Duty verdict', d.ok ? 'within limits in every state' : 'LIMIT EXCEEDED in at least one state'],
      ],
    });
    blocks.push({ kind: 'paragraph', text: d.limitsSource });
  }
  if (h.spectra.length) blocks.push({ kind: 'list', items: h.spectra.map((s) => `${s.load}: ${s.spectrum} (current THD ${fixed(s.thdPercent, 1)} %) — ${s.source}`) });
  blocks.push({ kind: 'list', items: h.assumptions });
  if (h.warnings.length) blocks.push({ kind: 'list', tone: 'warning', items: h.warnings.map((x) => x.message) });
  return { id: 'harmonics', title: 'Harmonics and resonance', blocks };
}

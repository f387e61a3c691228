/** The report section of a harmonic study: distortion per line and in the neutral, IEEE 519, resonance scan, capacitor duty. */
import type { HarmonicsReport } from '../../harmonics/harmonicsResult.js';
import { labellerOf } from '../../board/conventions/phaseNames.js';
import type { ReportBlock, ReportSection } from './reportDocument.js';
import type { StandardReference } from './reportWording.js';
import { dutyBlocks, harmonicCurrentTable, harmonicVoltageTable, neutralBlocks, scanBlocks, spectraList, tddTable } from './harmonicsBlocks.js';
import { checkObjectArgument } from '../../_internal/argumentChecks.js';

export const HARMONICS_STANDARDS: readonly StandardReference[] = [
  { name: 'IEEE Std 519-2014', use: 'current distortion limits at the point of common coupling (TDD and individual orders); bus voltage distortion limits' },
  { name: 'IEC 60831-1 / IEEE Std 18', use: 'capacitor voltage, current and kvar with harmonics' },
];

export function harmonicsSection(h: HarmonicsReport): ReportSection {
  checkObjectArgument(h, 'h', 'a harmonics report from studyHarmonics(...) or analyseHarmonics(...)', ['phaseNames', 'orders', 'lines']);
  // Phases and branches as the board file names them (L1 or A).
  const label = labellerOf(h.phaseNames);
  const blocks: ReportBlock[] = [
    { kind: 'paragraph', text: `Orders solved: ${h.orders.join(', ')}. State of the bank for the figures below: ${h.state}.` },
    harmonicCurrentTable(h.lines, h.neutral, label, 'Line and neutral currents with harmonics'),
    harmonicVoltageTable(h, label, 'Voltages and power factor at the board'),
  ];
  if (h.neutral) blocks.push(...neutralBlocks(h.neutral));
  if (h.tdd) blocks.push(tddTable(h.tdd, label, 'at the feed'));
  blocks.push(...scanBlocks(h.scan, { figureName: 'impedance-scan' }));
  if (h.capacitorDuty) blocks.push(...dutyBlocks(h.capacitorDuty, label));
  if (h.spectra.length) blocks.push(spectraList(h.spectra));
  blocks.push({ kind: 'list', items: h.assumptions });
  if (h.warnings.length) blocks.push({ kind: 'list', tone: 'warning', items: h.warnings.map((x) => x.message) });
  return { id: 'harmonics', title: 'Harmonics and resonance', blocks };
}

/** The report section of a harmonic study: distortion per line and in the neutral, the bus voltages against their basis, IEEE 519 at the feed, resonance scan, capacitor duty. */
import type { HarmonicsReport } from '../../harmonics/harmonicsResult.js';
import { labellerOf } from '../../board/conventions/phaseNames.js';
import type { ReportBlock, ReportSection } from './reportDocument.js';
import type { StandardReference } from './reportWording.js';
import { dutyBlocks, harmonicCurrentTable, harmonicVoltageTable, neutralBlocks, scanBlocks, spectraList, tddTable, voltageDistortionTable } from './harmonicsBlocks.js';
import type { VoltageDistortionBasis } from '../../harmonics/voltageDistortionLimits.js';
import { checkObjectArgument } from '../../_internal/argumentChecks.js';

const VOLTAGE_BASIS_STANDARDS: Readonly<Record<VoltageDistortionBasis, StandardReference>> = {
  'iec-61000-2-2': { name: 'IEC 61000-2-2', use: 'compatibility levels of public LV networks the bus harmonic voltages are judged against (each order and THD)' },
  'en50160': { name: 'EN 50160', use: 'LV supply levels the bus harmonic voltages are judged against (each order and THD)' },
  'ieee-519': { name: 'IEEE Std 519-2014', use: 'bus voltage distortion limits at ≤ 1 kV (each order and THD)' },
};

/** The standards of a harmonic study: IEEE 519 for the current at the feed, the document each board's voltages were judged against, the capacitor standards. */
export function harmonicsStandards(bases: readonly VoltageDistortionBasis[]): StandardReference[] {
  return [
    { name: 'IEEE Std 519-2014', use: 'current distortion limits at the point of common coupling (TDD and individual orders)' },
    ...[...new Set(bases)].map((b) => VOLTAGE_BASIS_STANDARDS[b]),
    { name: 'IEC 60831-1 / IEEE Std 18', use: 'capacitor voltage, current and kvar with harmonics' },
  ];
}

export function harmonicsSection(h: HarmonicsReport): ReportSection {
  checkObjectArgument(h, 'h', 'a harmonics report from studyHarmonics(...) or analyseHarmonics(...)', ['phaseNames', 'orders', 'lines']);
  // Phases and branches as the board file names them (L1 or A).
  const label = labellerOf(h.phaseNames);
  const blocks: ReportBlock[] = [
    { kind: 'paragraph', text: `Orders solved: ${h.orders.join(', ')}. State of the bank for the figures below: ${h.state}.` },
    harmonicCurrentTable(h.lines, h.neutral, label, 'Line and neutral currents with harmonics'),
    harmonicVoltageTable(h, label, 'Voltages and power factor at the board'),
    voltageDistortionTable(h.voltageDistortion, label, 'Bus voltage distortion at the board'),
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

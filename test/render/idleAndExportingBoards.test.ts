/**
 * A board that carries nothing and one that only exports, in the report and the results: no angle
 * beside a current of nothing, no PF of nothing (null in the data, "—" in the report), and an
 * exporter's PF written as `trivar solve` writes it ("1.000 export"), never "1.000 lag" on one line
 * and "1.000 lead" on the other, nor "-1.000".
 */
import { describe, expect, it } from 'vitest';
import {
  buildBoardReport,
  buildInstallationReport,
  normaliseBoard,
  parseBoard,
  parseInstallation,
  powerFactorText,
  renderReportMarkdown,
  signedPfText,
  solveBoardModel,
  solveInstallation,
} from '@trivar/core';

const house = parseInstallation({
  name: 'Split house',
  supply: { voltage: '120/240', frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2.2, xOverR: 1.8 } },
  boards: [
    { name: 'Service panel', loads: [{ name: 'Range', connection: 'L1-L2', kW: 8, model: 'constant-impedance' }, { name: 'Kitchen', connection: 'L1-N', kW: 1.8, pf: 0.95 }] },
    { name: 'Garage subpanel', fedFrom: 'Service panel', feeder: { lengthFt: 120, line: { awg: '6' }, neutral: { awg: '6' } }, loads: [{ name: 'Welder', connection: 'L1-L2', kW: 5, pf: 0.7 }] },
    { name: 'Empty shed', fedFrom: 'Garage subpanel', feeder: { lengthFt: 80, line: { awg: '10' }, neutral: { awg: '10' } }, loads: [] },
    { name: 'Spare bay', fedFrom: 'Service panel', loads: [] },
    { name: 'Bay tools', fedFrom: 'Spare bay', loads: [{ name: 'Drill', connection: 'L1-N', kW: 0.5 }] },
    { name: 'PV only', fedFrom: 'Service panel', loads: [{ name: 'Inverter', connection: 'L1-L2', kW: -7.6, pf: 1 }] },
  ],
});
const result = solveInstallation(house);
const markdown = renderReportMarkdown(buildInstallationReport({ spec: house, result }), 'house').markdown;

/** The Markdown of one board's section, up to the next section. */
const sectionOf = (name: string): string => markdown.split(`## Board: ${name}\n`)[1]!.split('\n## ')[0]!;
/** The cells of a table row that starts with `| first |`. */
const rowOf = (section: string, first: string): string[] =>
  section.split('\n').find((l) => l.startsWith(`| ${first} |`))!.split('|').slice(1, -1).map((c) => c.trim());

describe('a board with nothing on it', () => {
  const shed = result.boards.find((b) => b.name === 'Empty shed')!.result;

  it('has no PF in the data: vector and arithmetic pf are null at 0 kVA', () => {
    expect(shed.powerFactor.vector).toEqual({ kVA: 0, pf: null });
    expect(shed.powerFactor.arithmetic).toEqual({ kVA: 0, pf: null });
  });

  it('the report leaves current angles blank beside 0.0 A and shows its PF as —', () => {
    const section = sectionOf('Empty shed');
    for (const line of ['L1', 'L2', 'N']) {
      const cells = rowOf(section, line);
      expect(cells[4]).toBe('0.0');
      expect(cells[5]).toBe('');
    }
    expect(rowOf(section, 'L1')[2]).toMatch(/^-?\d+\.\d$/); // the voltage keeps its angle
    expect(section).toContain('- **Power factor, vector |ΣS|:** — (0.00 kVA)');
    expect(section).toContain('- **Power factor, arithmetic Σ|V||I|:** — (0.00 kVA)');
  });

  it('says it has no circuits, not that it feeds others, when it feeds nothing', () => {
    expect(sectionOf('Empty shed')).toContain('No circuits: nothing is connected to this board, and it feeds no other board.');
    expect(sectionOf('Empty shed')).not.toContain('only feeds others');
    expect(sectionOf('Spare bay')).toContain('No circuits of its own: this board only feeds others.');
  });
});

describe('a board that only exports', () => {
  it('writes "1.000 export" on each line, the circuit and the board, with no lag/lead and no minus sign', () => {
    const section = sectionOf('PV only');
    expect(rowOf(section, 'L1')[8]).toBe('1.000 export');
    expect(rowOf(section, 'L2')[8]).toBe('1.000 export');
    expect(rowOf(section, 'N')[5]).toBe(''); // no neutral current, no angle
    expect(rowOf(section, '—')[8]).toBe('1.000 export');
    expect(section).toContain('- **Power factor, vector |ΣS|:** 1.000 export (7.60 kVA)');
    expect(section).not.toMatch(/1\.000 (lag|lead)|-1\.000/);
  });

  it('a three-phase PV board report: every PF as solve text writes it', () => {
    const spec = parseBoard({ name: 'PV', supply: { system: 'three-phase-4wire', voltage: '400/230', frequencyHz: 50 }, loads: [{ name: 'PV', connection: 'ABC-star', kW: -30, pf: 1 }] });
    const r = solveBoardModel(normaliseBoard(spec));
    const md = renderReportMarkdown(buildBoardReport({ spec, result: r }), 'pv').markdown;
    expect(md).not.toMatch(/1\.000 (lag|lead)|-1\.000/);
    expect(md).toContain('- **Power factor, vector |ΣS|:** 1.000 export (30.00 kVA)');
    expect(md).toContain('- **Power factor, effective (IEEE 1459):** 1.000 export (30.00 kVA)');
  });
});

describe('the PF words', () => {
  it('powerFactorText: export, a tag only where vars show, none for no power', () => {
    expect(powerFactorText({ pf: 0.9999997, sense: 'lagging', kVA: 3.8, kW: -3.8, kvar: 0.001 })).toBe('1.000 export');
    expect(powerFactorText({ pf: 0.9999997, sense: 'leading', kVA: 3.8, kW: 3.8, kvar: -0.001 })).toBe('1.000');
    expect(powerFactorText({ pf: 0.95, sense: 'leading', kVA: 10, kW: 9.5, kvar: -3.1 })).toBe('0.950 lead');
    expect(powerFactorText({ pf: null, sense: 'none', kVA: 0, kW: 0, kvar: 0 }, '—')).toBe('—');
  });

  it('signedPfText: a negative board PF is an export, null is none', () => {
    expect(signedPfText(-0.9999997)).toBe('1.000 export');
    expect(signedPfText(0.83)).toBe('0.830');
    expect(signedPfText(null)).toBe('-');
    expect(signedPfText(-0.0000001)).toBe('0.000');
  });
});

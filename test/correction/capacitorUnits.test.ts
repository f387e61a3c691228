/**
 * Capacitor units at the voltage and frequency they are used at, the built-in
 * typical catalogues, how a bank is built from them, and the controller settings.
 * Sources: Q = Q_r·(V/V_r)²·(f/f_r) from Q = 2πf·C·V² (methods notes §4);
 * capacitance tolerance −5/+10 % of IEC 60831-1 (from memory); C/k = Q_step/(√3·U·k)
 * (methods notes §10, common practice, from memory); voltage margins by practice
 * (methods notes §10, common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { capacitorOutput, correctBoard, responseThresholdA, selectBankUnits, sizeDeltaBank, sizeStarBank, standardCtPrimaryA, TYPICAL_CATALOGUES } from '@trivar/core';
import { makeBoard } from './support/boards.js';
import { expectClose } from '../support/tolerance.js';

const exact = { rel: 1e-12, abs: 0 };

describe('capacitor output follows the square law (methods notes §4)', () => {
  it('a 480 V unit used at 400 V gives (400/480)² of its rating', () => {
    const out = capacitorOutput({ ratedKvar: 25, ratedV: 480, ratedHz: 50 }, { voltageV: 400, frequencyHz: 50 });
    expectClose(out.kvar, 25 * (400 / 480) ** 2, exact, 'kvar');
    expectClose(out.kvar, 17.3611111111, { rel: 1e-10, abs: 0 }, 'kvar (worked)');
    expectClose(out.currentA, (out.kvar * 1000) / 400, exact, 'current');
    expectClose(out.ratedCurrentA, 25000 / 480, exact, 'rated current');
  });

  it('frequency: a 50 Hz unit at 60 Hz gives 6/5 of its output at the same voltage', () => {
    const out = capacitorOutput({ ratedKvar: 10, ratedV: 440, ratedHz: 50 }, { voltageV: 440, frequencyHz: 60 });
    expectClose(out.kvar, 12, exact, 'kvar');
  });

  it('capacitance from the rating: C = Q_r/(2π·f_r·V_r²)', () => {
    const out = capacitorOutput({ ratedKvar: 10, ratedV: 400, ratedHz: 50 }, { voltageV: 230, frequencyHz: 50 });
    expectClose(out.capacitanceUF, (10000 / (2 * Math.PI * 50 * 400 ** 2)) * 1e6, exact, 'µF');
    expectClose(out.capacitanceUF, 198.94367886, { rel: 1e-9, abs: 0 }, 'µF (worked)');
  });
});

describe('typical catalogues (typical catalogue practice, not any vendor; from memory)', () => {
  const volts = (practice: 'iec' | 'north-american', kind: string) => [
    ...new Set(TYPICAL_CATALOGUES[practice].units.filter((u) => u.kind === kind).map((u) => u.ratedV)),
  ];
  it('IEC: three-phase units 400/415/440/480/525 V at 50 Hz; North-American: 208/240/480/600 V at 60 Hz; every unit marked typical', () => {
    expect(volts('iec', 'three-phase')).toEqual([400, 415, 440, 480, 525]);
    expect(volts('north-american', 'three-phase')).toEqual([208, 240, 480, 600]);
    expect(TYPICAL_CATALOGUES.iec.units.every((u) => u.ratedHz === 50)).toBe(true);
    expect(TYPICAL_CATALOGUES['north-american'].units.every((u) => u.ratedHz === 60)).toBe(true);
    for (const c of Object.values(TYPICAL_CATALOGUES)) for (const u of c.units) expect(u.name).toMatch(/^typical /);
  });
});

/** One delta bank per board; the unit voltage the practice should pick. */
const TABLE: readonly { name: string; lineToLine: number; hz: 50 | 60; ratedV: number; margin: number; practice: string }[] = [
  // North-American practice: units at their nameplate voltage (margin 0).
  { name: '120/208 V office panel', lineToLine: 208, hz: 60, ratedV: 208, margin: 0, practice: 'north-american' },
  { name: '277/480 V plant', lineToLine: 480, hz: 60, ratedV: 480, margin: 0, practice: 'north-american' },
  { name: '347/600 V plant', lineToLine: 600, hz: 60, ratedV: 600, margin: 0, practice: 'north-american' },
  // IEC practice: 10 % above the nominal voltage.
  { name: '230/400 V workshop', lineToLine: 400, hz: 50, ratedV: 440, margin: 10, practice: 'iec' },
  { name: '240/415 V works', lineToLine: 415, hz: 50, ratedV: 480, margin: 10, practice: 'iec' },
];

describe('unit voltage by practice (table: IEC and North-American boards)', () => {
  for (const row of TABLE) {
    it(`${row.name}: ${row.ratedV} V units, ${row.margin} % margin, every unit at or above the delivery floor`, () => {
      const board = makeBoard('three-phase-4wire', [{ name: 'motors', connection: 'ABC-delta', kW: 60, pf: 0.78 }], {
        lineToLine: row.lineToLine,
        frequencyHz: row.hz,
        transformer: { kVA: 500, impedancePercent: 5, xOverR: 5 },
      });
      const report = correctBoard(board, { arrangement: 'delta-bank', target: { pf: 0.95 } });
      expect(report.status).toBe('meets-target');
      const sel = report.selection!;
      expect(sel.practice).toBe(row.practice);
      expect(sel.voltageMarginPercent).toBe(row.margin);
      for (const step of sel.steps) {
        expect(step.unit.ratedV).toBe(row.ratedV);
        expect(step.unit.deliveredFraction).toBeGreaterThanOrEqual(0.65);
        expect(step.unit.source).toBe('typical');
      }
      // Equal three-phase steps on a balanced board: one controller reading one CT.
      expect(sel.steps.every((s) => s.kind === 'three-phase' && s.unit.kind === 'three-phase')).toBe(true);
      expect(sel.controller!.measurement).toBe('one-line');
      // Headline: delivered at the solved voltage is what the square law gives from the nameplate.
      const delivered = sel.steps.reduce((sum, s) => sum + s.nameplateKvar * s.unit.deliveredFraction, 0);
      expectClose(sel.deliveredKvar, delivered, { rel: 1e-6, abs: 0 }, 'delivered');
    });
  }

  it('a 480 V board taken as IEC practice (+10 %) would need 600 V units at 64 % output: below the floor, so none fits', () => {
    const board = makeBoard('three-phase-3wire', [{ name: 'motors', connection: 'ABC-delta', kW: 60, pf: 0.78 }], { lineToLine: 480, frequencyHz: 60 });
    const report = correctBoard(board, { arrangement: 'delta-bank', practice: 'iec', catalogue: TYPICAL_CATALOGUES['north-american'].units.map(({ name, kind, ratedKvar, ratedV, ratedHz }) => ({ name, kind, ratedKvar, ratedV, ratedHz })) });
    expect(report.status).toBe('no-suitable-units');
    expect(report.reasons.join(' ')).toMatch(/rated at least 528\.0 V/);
  });
});

describe('C/k response threshold (methods notes §10: C/k = Q_step/(√3·U_LL·k_CT), common practice)', () => {
  it('worked set: 25 kvar steps on 400 V with a 500/5 A CT give 0.361 A; 50 kvar on 480 V with 800/5 give 0.376 A', () => {
    expectClose(responseThresholdA(25, 'three-phase', 400, 100), 25000 / (Math.sqrt(3) * 400 * 100), exact, 'C/k');
    expectClose(responseThresholdA(25, 'three-phase', 400, 100), 0.36084, { rel: 1e-4, abs: 0 }, 'C/k worked');
    expectClose(responseThresholdA(50, 'three-phase', 480, 160), 0.37587, { rel: 1e-4, abs: 0 }, 'C/k worked');
    // A single-phase step on one line: Q/(U·k) (derived).
    expectClose(responseThresholdA(5, 'single-phase', 230, 60), 5000 / (230 * 60), exact, 'single-phase');
  });

  it('standard CT primaries: the next of 10, 12.5, 15, 20, 25, 30, 40, 50, 60, 75 × 10ⁿ A', () => {
    expect([standardCtPrimaryA(9), standardCtPrimaryA(131), standardCtPrimaryA(260.6), standardCtPrimaryA(1000)]).toEqual([10, 150, 300, 1000]);
  });

  it("the report's controller: C/k of its smallest step from the formula, the setting 0.65 × C/k, and a reconnection delay of at least the discharge time", () => {
    const board = makeBoard('three-phase-4wire', [{ name: 'motors', connection: 'ABC-delta', kW: 80, pf: 0.8 }], { transformer: { kVA: 400, impedancePercent: 4, xOverR: 4 } });
    const report = correctBoard(board, { arrangement: 'delta-bank', controller: { ctPrimaryA: 200, outputs: 8 } });
    const c = report.selection!.controller!;
    expect(c.ctRatio).toBe(40);
    const smallest = Math.min(...report.selection!.steps.filter((s) => s.output !== null).map((s) => s.kvarAtNominalV));
    expectClose(c.responseThresholdA, (smallest * 1000) / (Math.sqrt(3) * 400 * 40), { rel: 1e-12, abs: 0 }, 'C/k');
    expectClose(c.responseSettingA, 0.65 * c.responseThresholdA, exact, 'setting');
    expect(c.reconnectionDelayS).toBeGreaterThanOrEqual(c.dischargeTimeS);
    expect(c.dischargeTimeS).toBe(180);
    expect(c.outputsUsed).toBeLessThanOrEqual(8);
  });
});

describe('choosing units for a bank', () => {
  const board = makeBoard('three-phase-4wire', [
    { name: 'line A ovens', connection: 'A-N', kW: 9, pf: 0.75 },
    { name: 'line B mixers', connection: 'B-N', kW: 6, pf: 0.8 },
    { name: 'line C chillers', connection: 'C-N', kW: 7.5, pf: 0.78 },
  ]);

  it('a star bank on 230 V: single-phase 280 V units (253 V needed: the 230 V nominal + 10 %; 67 % output)', () => {
    const sizing = sizeStarBank(board, { target: { pf: 0.95 } });
    const selection = selectBankUnits(sizing, {});
    expect(selection.catalogue).toBe('typical');
    expect(selection.catalogueNote).toMatch(/not any vendor/);
    // Units are sold for the system's 230 V (IEC 60038 230/400), though the model's source holds 400/√3 = 230.9 V.
    for (const s of selection.selections) expect(s.requiredRatedV).toBeCloseTo(1.1 * 230, 9);
    for (const step of selection.steps) {
      expect(step.unit.ratedV).toBe(280);
      expect(step.unit.kind).toBe('single-phase');
      expectClose(step.unit.deliveredFraction, (sizing.branches[0]!.appliedV / 280) ** 2, { rel: 0.01, abs: 0 }, 'output share');
    }
  });

  it('a unit cap of 10 per branch with 0.5 kvar units still builds the largest bank that fits (never drops to nothing)', () => {
    const sizing = sizeDeltaBank(board, { target: { pf: 0.95 } });
    const catalogue = [{ name: 'C-0.5', ratedKvar: 0.5, ratedV: 440, ratedHz: 50 as const }];
    const capped = selectBankUnits(sizing, { catalogue, maxUnitsPerBranch: 10 });
    expect(capped.nameplateKvar).toBeGreaterThan(0);
    for (const s of capped.selections) expect(s.units).toBeLessThanOrEqual(10);
    // With 20 allowed, all three branches get units (not all on one).
    const twenty = selectBankUnits(sizing, { catalogue, maxUnitsPerBranch: 20 });
    expect(twenty.selections.filter((s) => s.units > 0).length).toBe(3);
    for (const s of twenty.selections) expect(s.units).toBeLessThanOrEqual(20);
  });

  it('a fixed part is only used with a light-load sizing, and stays within what the light load can take at +10 %', () => {
    const sizing = sizeDeltaBank(board, { target: { pf: 0.95 } });
    expect(selectBankUnits(sizing).selections.every((s) => s.fixedCapacitanceUF === 0)).toBe(true);
    const light = makeBoard('three-phase-4wire', [
      { name: 'line A ovens', connection: 'A-N', kW: 6, pf: 0.75 },
      { name: 'line B mixers', connection: 'B-N', kW: 4, pf: 0.8 },
      { name: 'line C chillers', connection: 'C-N', kW: 5, pf: 0.78 },
    ]);
    const lightSizing = sizeDeltaBank(light, { target: { pf: 0.95 } });
    const selection = selectBankUnits(sizing, { lightLoad: lightSizing });
    selection.selections.forEach((s, i) => {
      expect(s.fixedCapacitanceUF * 1.1).toBeLessThanOrEqual((lightSizing.branches[i]!.limitSusceptanceS! / (2 * Math.PI * 50)) * 1e6 * (1 + 1e-12));
    });
  });
});

describe('a branch no unit suits, beside branches that have units', () => {
  it('is listed as unbuildable (no "short of the target" guess), the other branches still built', () => {
    // A bakery-sized board on an ideal source; its light-load state (written by hand here) puts 300 V across
    // C-N, so a unit there must be rated at least 300 / 1.10 = 272.7 V. The catalogue: 265 V units, which suit
    // A-N and B-N (≥ 253 V, 75.3 % of nameplate at the nominal 230 V), and 300 V units, which reach 272.7 V
    // but give (230/300)² = 58.8 % at nominal, under the 65 % floor. So nothing suits C-N.
    const board = makeBoard('three-phase-4wire', [
      { name: 'oven fans', connection: 'A-N', kW: 9, pf: 0.72 },
      { name: 'mixer', connection: 'B-N', kW: 5.5, pf: 0.8 },
      { name: 'proofer', connection: 'C-N', kW: 7, pf: 0.86 },
    ]);
    const sizing = sizeStarBank(board, { target: { pf: 0.95 } });
    const lightLoad = { ...sizing, branches: sizing.branches.map((b) => (b.branch === 'C-N' ? { ...b, appliedV: 300 } : b)) };
    const catalogue = [
      { ratedKvar: 2, ratedV: 265, ratedHz: 50 as const },
      { ratedKvar: 2, ratedV: 300, ratedHz: 50 as const },
    ];
    const selection = selectBankUnits(sizing, { catalogue, lightLoad });
    expect(selection.unbuildable!.branches).toEqual(['C-N']);
    expect(selection.unbuildable!.requiredRatedV).toBeCloseTo(300 / 1.1, 9);
    expect(selection.unbuildable!.message).toContain('fits C-N: a unit there must be rated at least 272.7 V and still deliver 65 % of its nameplate at the nominal 230.0 V across it');
    expect((100 * (230 / 300) ** 2).toFixed(1)).toBe('58.8');
    const units = (branch: string) => selection.selections.find((s) => s.branch === branch)!.units;
    expect(units('A-N')).toBeGreaterThan(0);
    expect(units('B-N')).toBeGreaterThan(0);
    expect(units('C-N')).toBe(0);
    expect(selection.steps.every((s) => s.unit.ratedV === 265)).toBe(true);
    expect(selection.warnings.map((w) => w.code)).not.toContain('units-below-target');
  });
});

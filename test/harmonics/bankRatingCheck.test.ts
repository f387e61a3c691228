/**
 * A capacitor rating far from the voltage across the capacitors is refused (or, well above, warned), at
 * the field that holds it: line to neutral for a star, line to line for a delta, U/(1 − p) behind a
 * detuning reactor. A rating typed 28 for 280 made a 30 kvar bank deliver about 2000 kvar with exit 0.
 */
import { describe, expect, it } from 'vitest';
import {
  InputError,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseHandFigures,
  parseInstallation,
  solveInstallation,
  studyHarmonics,
  withBanksInService,
} from '@trivar/core';
import { BANK_RATING_BOUNDS, voltageAcrossCapacitors } from '../../packages/core/src/board/bankRatingCheck.js';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 500, impedancePercent: 4.5, xOverR: 4 } };

/** An invented joinery with a bank on its board file. */
const joinery = (bank: Record<string, unknown>) => ({
  name: 'Oakbridge joinery',
  supply,
  loads: [
    { name: 'Planer', connection: 'ABC-delta', kW: 30, pf: 0.8 },
    { name: 'Dust extractor', connection: 'ABC-star', kW: 15, pf: 0.82 },
    { name: 'Offices', connection: 'B-N', kW: 5, pf: 0.95, spectrum: 'switch-mode' },
  ],
  harmonics: { bank: { stepsKvar: [20, 20], ...bank } },
});

/** An invented two-board yard with a bank on its sub-board. */
const yard = (ratedV: number) => ({
  name: 'Tollgate builders yard',
  supply,
  boards: [
    { name: 'Gatehouse', feeder: { lengthM: 8, line: { mm2: 95 }, neutral: { mm2: 95 } }, loads: [{ name: 'Saw bench', connection: 'ABC-delta', kW: 18, pf: 0.8 }] },
    { name: 'Stores', fedFrom: 'Gatehouse', feeder: { lengthM: 35, line: { mm2: 35 }, neutral: { mm2: 35 } }, loads: [{ name: 'Forklift chargers', connection: 'ABC-star', kW: 12, pf: 0.85 }] },
  ],
  harmonics: { banks: [{ board: 'Stores', connection: 'star', ratedV, stepsKvar: [5, 5] }] },
});

function issuesOf(call: () => unknown): { path: string; message: string }[] {
  try {
    call();
  } catch (e) {
    if (e instanceof InputError) return e.issues.map((i) => ({ path: i.path, message: i.message }));
    throw e;
  }
  return [];
}

describe('the voltage across the capacitors', () => {
  const nominal = { ln: 400 / Math.sqrt(3), ll: 400 };
  it('star: line to neutral; delta: line to line; detuned: U/(1 − p)', () => {
    expect(voltageAcrossCapacitors(nominal, { connection: 'star' })).toBeCloseTo(230.94, 2);
    expect(voltageAcrossCapacitors(nominal, { connection: 'delta' })).toBe(400);
    // 400 / 0.93 = 430.11 V behind a 7 % reactor.
    expect(voltageAcrossCapacitors(nominal, { connection: 'delta', detuningPercent: 7 })).toBeCloseTo(430.11, 2);
  });
  it('bounds: refused below 0.8 × and above 4 ×, warned above 2 ×', () => {
    expect(BANK_RATING_BOUNDS).toEqual({ refuseBelow: 0.8, warnAbove: 2, refuseAbove: 4 });
  });
});

describe('a board file bank (harmonics.bank.ratedV)', () => {
  it('28 V for a star on 230/400 V is refused, naming the field and the 230.9 V across', () => {
    const issues = issuesOf(() => parseBoard(joinery({ connection: 'star', ratedV: 28 })));
    expect(issues.map((i) => i.path)).toEqual(['harmonics.bank.ratedV']);
    // 0.8 × 230.94 = 184.75 V, 4 × 230.94 = 923.76 V; 30 kvar-type output × (230.94/28)² = 68 × rated.
    expect(issues[0]!.message).toContain('from 184.8 V to 923.8 V (0.8 to 4 × the 230.9 V across each capacitor: line to neutral)');
    expect(issues[0]!.message).toContain('deliver 68 × their rated kvar');
    expect(issues[0]!.message).toContain('(received 28)');
  });

  it('a detuned delta is judged at U/(1 − p): 340 V refused, 350 V and 440 V taken', () => {
    const low = issuesOf(() => parseBoard(joinery({ connection: 'delta', ratedV: 340, detuningPercent: 7 })));
    expect(low[0]!.path).toBe('harmonics.bank.ratedV');
    expect(low[0]!.message).toContain('from 344.1 V to 1720.4 V (0.8 to 4 × the 430.1 V across each capacitor: line to line, raised by the 7 % detuning reactor to U/(1 − p))');
    expect(issuesOf(() => parseBoard(joinery({ connection: 'delta', ratedV: 350, detuningPercent: 7 })))).toEqual([]);
    expect(issuesOf(() => parseBoard(joinery({ connection: 'delta', ratedV: 440, detuningPercent: 7 })))).toEqual([]);
  });

  it('40000 V on a 400 V delta is refused: the bank would deliver 0.01 % of its kvar', () => {
    const issues = issuesOf(() => studyHarmonics(joinery({ connection: 'delta', ratedV: 40000 })));
    expect(issues.map((i) => i.path)).toEqual(['harmonics.bank.ratedV']);
    expect(issues[0]!.message).toContain('deliver 0.01 % of their rated kvar');
  });

  it('480 V units in a star on 230 V: studied, with a warning (2.08 ×, 23 % of the kvar)', () => {
    const report = studyHarmonics(joinery({ connection: 'star', ratedV: 480 }));
    const w = report.warnings.find((x) => x.code === 'bank-rated-far-above');
    expect(w?.value).toBeCloseTo(480 / 230.94, 3);
    expect(w?.message).toContain("the bank's capacitors are rated 480 V, 2.08 × the 230.9 V across each (line to neutral): they deliver 23 % of their rated kvar");
    // 400 V units in a star (1.73 ×) and 210 V units (0.91 ×, the duty check judges them) pass without it.
    for (const ratedV of [400, 210]) expect(studyHarmonics(joinery({ connection: 'star', ratedV })).warnings.map((x) => x.code)).not.toContain('bank-rated-far-above');
  });
});

describe('an installation bank (harmonics.banks[i].ratedV)', () => {
  it('refused at its path when the file is read, and when banks are handed to withBanksInService', () => {
    expect(issuesOf(() => parseInstallation(yard(28))).map((i) => i.path)).toEqual(['harmonics.banks[0].ratedV']);
    const installation = normaliseInstallation(parseInstallation(yard(250))).installation;
    const bank = { board: 'Stores', connection: 'star' as const, ratedV: 28, stepsKvar: [5, 5] };
    expect(issuesOf(() => withBanksInService(installation, [bank])).map((i) => i.path)).toEqual(['harmonics.banks[0].ratedV']);
  });

  it('a bank well above the voltage across is warned on its board by solve', () => {
    const result = solveInstallation(yard(480));
    const stores = result.boards.find((b) => b.result.board.name === 'Stores')!;
    expect(stores.result.warnings.map((w) => w.code)).toContain('bank-rated-far-above');
    expect(solveInstallation(yard(250)).boards.flatMap((b) => b.result.warnings.map((w) => w.code))).not.toContain('bank-rated-far-above');
  });
});

describe('a hand figure capacitor (capacitors[k].ratedV)', () => {
  const board = normaliseBoard(parseBoard({ ...joinery({ connection: 'star', ratedV: 250 }), harmonics: undefined }));
  it('kvar stated at 40 V on an A-N branch is refused; at 440 V across a line pair it is taken', () => {
    const issues = issuesOf(() => parseHandFigures({ capacitors: [{ branch: 'A-N', kvar: 5, ratedV: 40 }] }, board));
    expect(issues.map((i) => i.path)).toEqual(['capacitors[0].ratedV']);
    expect(issues[0]!.message).toContain('the 230.9 V across each capacitor: line to neutral');
    expect(issuesOf(() => parseHandFigures({ capacitors: [{ branch: 'B-C', kvar: 5, ratedV: 440 }] }, board))).toEqual([]);
  });
});

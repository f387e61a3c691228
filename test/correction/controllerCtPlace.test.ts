/**
 * The controller's CT goes where the controller reads — the equipment's board, or the point the target
 * is measured at — and must carry the larger of the before and after line currents there. Its primary is
 * the next standard rating at or above 1.25 × that current, and C/k = (Q_step / (√3·U)) / k_CT is worked
 * on it; a CT given is checked against the same figure. Every board here is invented, on an ideal 400 V
 * source so that the currents are worked by hand from the loads.
 */
import { describe, expect, it } from 'vitest';
import {
  correctBoard,
  correctInstallation,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseInstallation,
  readBoardText,
  selectBankUnits,
  sizeDeltaBank,
  type ControllerSettings,
  type CorrectionWarning,
} from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

const boardOf = (lines: readonly string[]) => normaliseBoard(parseBoard(readBoardText(lines.join('\n'))));
const installationOf = (lines: readonly string[]) => normaliseInstallation(parseInstallation(readBoardText(lines.join('\n')))).installation;
const controllerOf = (selection: { controller: ControllerSettings | null } | null): ControllerSettings => selection!.controller!;
const warningOf = (warnings: readonly CorrectionWarning[], code: string) => warnings.find((w) => w.code === code);

/** U_LL·√3 of a 400 V board: the three-phase step's C/k divides by it. */
const SQRT3_U = Math.sqrt(3) * 400;

/** A bakery's dough mixer, 30 kW at PF 0.75, three-phase: one board, nothing upstream. */
const bakery = boardOf([
  'name: Saddle Lane bakery',
  'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
  'loads:',
  '  - { name: Dough mixer, connection: ABC-delta, kW: 30, pf: 0.75 }',
]);

/**
 * A laundry: ironers on the intake board, a steam press on a sub-board a short feeder away. The bank goes
 * on the press room and the target is measured at the origin, where the ironers' current passes too.
 */
const laundry = installationOf([
  'name: Fenwick Road laundry',
  'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
  'boards:',
  '  - name: Intake board',
  '    loads:',
  '      - { name: Ironers, connection: ABC-delta, kW: 40, pf: 0.9 }',
  '  - name: Press room',
  '    fedFrom: Intake board',
  '    feeder: { lengthM: 5, line: { mm2: 95 }, neutral: { mm2: 95 } }',
  '    loads:',
  '      - { name: Steam press, connection: ABC-delta, kW: 15, pf: 0.7 }',
]);

/**
 * A kiln shed: the heaviest line (A) already runs near unity and only line C needs correcting. Line B's
 * resistive oven would lead with any capacitance beside it, so a delta bank can only go on C-A, and a C-A
 * capacitor moves active power into line A: its current rises.
 */
const kilnShed = boardOf([
  'name: Brook Street kiln shed',
  'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
  'loads:',
  '  - { name: Kiln elements, connection: A-N, kW: 35, pf: 0.97 }',
  '  - { name: Glaze oven, connection: B-N, kW: 3, pf: 1 }',
  '  - { name: Pug mill, connection: C-N, kW: 10, pf: 0.7 }',
]);

describe("the controller's CT on the equipment's own board", () => {
  it('bakery: 57.7 A before and less after, so 1.25 × 57.7 = 72.2 A → 75/5, C/k 0.596 A for a 7.5 kvar 440 V step', () => {
    const report = correctBoard(bakery, { arrangement: 'delta-bank' });
    const c = controllerOf(report.selection);
    // By hand: I = 30000 / (√3 × 400 × 0.75) = 57.735 A; 1.25 × 57.735 = 72.17 A → the next standard rating, 75 A.
    expect(c.ctBasis.place).toBe('board');
    expect(c.ctBasis.point).toBe('Saddle Lane bakery');
    expect(c.ctBasis.sizedOn).toBe('before');
    expectClose(c.ctBasis.currentA, 57.735, { rel: 1e-5, abs: 0 }, 'largest line current before');
    expect(c.ctBasis.largestLineCurrentA!.after).toBeLessThan(c.ctBasis.largestLineCurrentA!.before);
    expect(c.ctPrimaryA).toBe(75);
    expect(c.ctRatio).toBe(15);
    // By hand: the smallest step is one 3-ph 7.5 kvar 440 V unit, 7.5 × (400/440)² = 6.198 kvar at 400 V;
    // C/k = 6198.3 / (√3 × 400) / 15 = 8.9465 A / 15 = 0.5964 A.
    expect(report.selection!.steps.every((s) => s.unit.ratedKvar === 7.5 && s.unit.ratedV === 440)).toBe(true);
    expectClose(c.responseThresholdA, 0.5964, { rel: 2e-4, abs: 0 }, 'C/k');
    expectClose(c.responseThresholdA, (7.5e3 * (400 / 440) ** 2) / SQRT3_U / 15, { rel: 1e-12, abs: 0 }, 'C/k by the formula');
    for (const s of report.selection!.steps) expectClose(s.responseThresholdA, c.responseThresholdA, { rel: 1e-12, abs: 0 }, `step ${s.output} C/k`);
    expect(c.ctBasis.placeWords).toBe('the incomer of Saddle Lane bakery, the board the equipment is on');
    // Less capacitance leaves more of the lagging current: the −5 % end is the one that draws more after correction.
    expect(c.ctBasis.capacitance!.end).toBe('low');
    expect(c.ctBasis.capacitance!.afterA.low).toBeGreaterThan(c.ctBasis.capacitance!.afterA.high);
    expect(c.ctBasis.currentWords).toMatch(/^57\.7 A, the largest line current there before correction \(\d+\.\d A after, capacitance at −5 %\)$/);
  });

  it('kiln shed: line A rises from 156.2 A to 173.2 A with the bank and 175.4 A at +10 % capacitance, so the CT is 250/5 on that figure (200/5 on the before one would run at 87 %)', () => {
    const report = correctBoard(kilnShed, { arrangement: 'delta-bank' });
    const c = controllerOf(report.selection);
    // By hand, before: line A carries 35 kW at 0.97, 36.082 kVA / 230.94 V = 156.24 A.
    // The bank as built: three 8.33 kvar 480 V units on C-A, 24.99 × (400/480)² = 17.354 kvar at 400 V.
    // A C-A capacitor of Q_c puts Q_c/(2√3) of active power and −Q_c/2 of reactive power on line A (its
    // current I = jωC·V_CA, against V_AN): P_A = 35 + 5.010 = 40.010 kW, Q_A = 35 × tan(acos 0.97) − 8.677
    // = 8.773 − 8.677 = 0.096 kvar, |S_A| = 40.010 kVA, I_A = 173.25 A.
    const stepKvar = 24.99 * (400 / 480) ** 2;
    const steps = report.selection!.steps;
    expect(steps.map((s) => [s.branches.join(' '), s.units, s.unit.ratedKvar, s.unit.ratedV])).toEqual([['C-A', 3, 8.33, 480]]);
    const qA = 35 * Math.tan(Math.acos(0.97)) - stepKvar / 2;
    const pA = 35 + stepKvar / (2 * Math.sqrt(3));
    const afterA = (Math.hypot(pA, qA) * 1000) / (400 / Math.sqrt(3));
    expectClose(afterA, 173.25, { rel: 1e-4, abs: 0 }, 'hand figure after');
    // The same at each tolerance end, Q_c × 0.95 and × 1.10 (capacitance tolerance −5 %/+10 %): the capacitor moves active
    // power onto line A, so more capacitance draws more there. −5 %: P_A = 39.759, Q_A = 0.530 → 172.18 A;
    // +10 %: P_A = 40.511, Q_A = −0.772 → 175.45 A.
    const atFactor = (k: number) => (Math.hypot(35 + (k * stepKvar) / (2 * Math.sqrt(3)), 35 * Math.tan(Math.acos(0.97)) - (k * stepKvar) / 2) * 1000) / (400 / Math.sqrt(3));
    expectClose(atFactor(0.95), 172.18, { rel: 1e-4, abs: 0 }, 'hand figure at −5 %');
    expectClose(atFactor(1.1), 175.45, { rel: 1e-4, abs: 0 }, 'hand figure at +10 %');
    expect(c.ctBasis.sizedOn).toBe('after');
    expectClose(c.ctBasis.largestLineCurrentA!.before, 156.24, { rel: 1e-4, abs: 0 }, 'largest line current before');
    expectClose(c.ctBasis.largestLineCurrentA!.after, afterA, { rel: 1e-5, abs: 0 }, 'largest line current after, nominal capacitance');
    expect(c.ctBasis.capacitance).toMatchObject({ end: 'high', capacitanceFactor: 1.1 });
    expectClose(c.ctBasis.capacitance!.afterA.low, atFactor(0.95), { rel: 1e-5, abs: 0 }, 'after at −5 %');
    expectClose(c.ctBasis.capacitance!.afterA.high, atFactor(1.1), { rel: 1e-5, abs: 0 }, 'after at +10 %');
    expectClose(c.ctBasis.currentA, atFactor(1.1), { rel: 1e-5, abs: 0 }, 'the CT basis: after, at the +10 % end');
    // 1.25 × 175.45 = 219.3 A → 250 A; the before figure alone gives 1.25 × 156.24 = 195.3 A → 200 A.
    expect(c.ctPrimaryA).toBe(250);
    // A step across two lines, read per line: C/k = (√3/2) × 17354 / 400 / 50 = 0.7515 A.
    expect(c.thresholdBasis).toBe('line-pair');
    expectClose(c.responseThresholdA, 0.7515, { rel: 2e-4, abs: 0 }, 'C/k');
    expect(c.ctBasis.currentWords).toBe(
      '175.4 A, the largest line current there after correction, with the capacitors at the +10 % end of their tolerance, the end that draws more there (173.2 A at nominal capacitance; 156.2 A before)',
    );
  });

  it('a selection made on its own chooses on the sizing: the larger of before and after as sized, at the board the equipment is on', () => {
    const sizing = sizeDeltaBank(kilnShed, { target: { pf: 0.95 } });
    const c = controllerOf(selectBankUnits(sizing));
    // The continuous sizing puts 17.07 kvar on C-A: line A as sized (35 + 4.93) kW, (8.77 − 8.54) kvar, about 172.9 A.
    expect(c.ctBasis).toMatchObject({ place: 'board', point: null, afterFrom: 'as-sized', sizedOn: 'after' });
    expectClose(c.ctBasis.currentA, Math.max(...sizing.lines.map((l) => l.currentA.after)), { rel: 1e-12, abs: 0 }, 'after as sized');
    expect(c.ctPrimaryA).toBe(250);
    expect(c.ctBasis.placeWords).toBe('the incomer of the board the equipment is on');
    expect(c.ctBasis.currentWords).toMatch(/^172\.\d A, the largest line current there after correction, as sized \(156\.2 A before\)$/);
    // A current given by the caller is taken as it is.
    const given = controllerOf(selectBankUnits(sizing, { lineCurrentA: 90 }));
    expect(given.ctBasis).toMatchObject({ sizedOn: 'given', currentA: 90, largestLineCurrentA: null });
    expect(given.ctPrimaryA).toBe(125);
  });
});

describe("the controller's CT where the target is measured", () => {
  it('laundry, bank on the press room, target at the origin: 1.25 × 93.8 A → 125/5 (not 40/5 from the press room), C/k 0.358 A', () => {
    const k = correctInstallation(laundry, { arrangement: 'delta-bank', target: { pf: 0.95, measuredAt: 'origin' } }, { board: 'Press room' });
    const c = controllerOf(k.report.selection);
    // By hand at the origin: (40 + j19.37) + (15 + j15.30) = 55 + j34.67 kVA, 65.02 kVA / (√3 × 400) = 93.84 A
    // (the 5 m feeder adds a few watts); after correction it is less.
    expect(c.ctBasis).toMatchObject({ place: 'metering-point', point: 'origin', afterFrom: 'as-built', sizedOn: 'before' });
    expectClose(c.ctBasis.currentA, 93.84, { rel: 1e-3, abs: 0 }, 'origin current before');
    expect(c.ctBasis.largestLineCurrentA!.after).toBeLessThan(c.ctBasis.currentA);
    expect(c.ctPrimaryA).toBe(125);
    // The press room alone: 15 kW / 0.7 = 21.43 kVA, 30.93 A; 1.25 × 30.93 = 38.7 A → 40 A, the CT the board's figure would give.
    const pressRoom = k.report.verification.lines.map((l) => l.currentA.before);
    expectClose(Math.max(...pressRoom), 30.93, { rel: 1e-3, abs: 0 }, 'press room current before');
    // C/k on 125/5: one 3-ph 7.5 kvar 440 V unit, 6198.3 / (√3 × 400) / 25 = 0.3579 A.
    expect(k.report.selection!.steps.every((s) => s.unit.ratedKvar === 7.5 && s.unit.ratedV === 440)).toBe(true);
    expectClose(c.responseThresholdA, 0.3579, { rel: 2e-4, abs: 0 }, 'C/k');
    for (const s of k.report.selection!.steps) expectClose(s.responseThresholdA, c.responseThresholdA, { rel: 1e-12, abs: 0 }, `step ${s.output} C/k`);
    expect(c.ctBasis.placeWords).toBe("the origin of the installation (the supply's terminals, where the service cable starts), where the target is measured");
    // The warning on reading at the press room instead names the press room's own currents.
    expect(warningOf(k.report.warnings, 'controller-reads-elsewhere')!.message).toMatch(/choose that CT on the line currents at Press room \(up to 30\.9 A before and \d+\.\d A after correction\)$/);
    expect(warningOf(k.report.warnings, 'ct-below-line-current')).toBeUndefined();
  });

  it('a CT given too small for the origin is warned, with C/k on it; the same CT is enough at the press room', () => {
    const atOrigin = correctInstallation(laundry, { arrangement: 'delta-bank', target: { pf: 0.95, measuredAt: 'origin' }, controller: { ctPrimaryA: 50 } }, { board: 'Press room' });
    const c = controllerOf(atOrigin.report.selection);
    expect(c.ctChosen).toBe(false);
    expect(c.ctPrimaryA).toBe(50);
    // C/k on 50/5: 6198.3 / (√3 × 400) / 10 = 0.8946 A.
    expectClose(c.responseThresholdA, 0.8946, { rel: 2e-4, abs: 0 }, 'C/k');
    const w = warningOf(atOrigin.report.warnings, 'ct-below-line-current')!;
    expect(w.value).toBe(50);
    expectClose(w.threshold!, 93.84, { rel: 1e-3, abs: 0 }, 'current the CT must carry');
    expect(w.message).toBe(
      "the CT primary (50 A) is below the largest line current (93.9 A) before correction at the origin of the installation (the supply's terminals, where the service cable starts), where the target is measured: the CT runs past its rating and saturates, and the controller misreads the reactive current; raise controller.ctPrimaryA to at least 94 A (125 A is the next standard rating at or above 1.25 × it)",
    );
    // Measured at the press room, 50 A carries its 30.9 A: nothing to warn.
    const atBoard = correctInstallation(laundry, { arrangement: 'delta-bank', controller: { ctPrimaryA: 50 } }, { board: 'Press room' });
    expect(controllerOf(atBoard.report.selection).ctBasis).toMatchObject({ place: 'board', point: 'Press room' });
    expect(warningOf(atBoard.report.warnings, 'ct-below-line-current')).toBeUndefined();
  });

  it('a CT given below the after-correction current is warned on that figure', () => {
    // The kiln shed's line A: 156.2 A before, 173.2 A after, 175.4 A at +10 % capacitance; a 160 A CT carries the first only.
    const report = correctBoard(kilnShed, { arrangement: 'delta-bank', controller: { ctPrimaryA: 160 } });
    const w = warningOf(report.warnings, 'ct-below-line-current')!;
    expectClose(w.threshold!, 175.45, { rel: 1e-4, abs: 0 }, 'after figure at +10 %');
    expect(w.message).toMatch(
      /^the CT primary \(160 A\) is below the largest line current \(175\.4 A\) after correction at the incomer of Brook Street kiln shed, the board the equipment is on, with the capacitors at the \+10 % end of their tolerance: .*raise controller\.ctPrimaryA to at least 176 A \(250 A is the next standard rating at or above 1\.25 × it\)$/,
    );
  });
});

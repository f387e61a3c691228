/**
 * The exported helpers that take plain numbers refuse what has no answer — NaN, a temperature below the
 * range the resistance law holds in, line voltages that cannot close a triangle, a negative step — with
 * an InputError naming the argument, and still give the textbook figure for good input.
 */
import { describe, expect, it } from 'vitest';
import {
  meteringPointWords,
  nominalVoltageWords,
  writeVoltageNotation,
  motorDeratingFactor,
  standardCtPrimaryA,
  assumedPfNote,
  billingPowerFactorText,
  isExportKW,
  signedPfText,
  bandVolts,
  bandVoltsWords,
  bandWords,
  checkBalance,
  checkTarget,
  collapseError,
  conductorResistance,
  judgedNominals,
  normaliseBoard,
  parseBoard,
  resolveTarget,
  solveBoardModel,
  InputError,
  judgeVoltage,
  labelIn,
  powerFactorText,
  responseThresholdA,
  sequenceComponents,
  unbalanceFactorFromLineMagnitudes,
  type VoltageLimits,
} from '@trivar/core';

/** The first issue's path and message of the InputError `call` throws. */
function refusal(call: () => unknown): { path: string; message: string } {
  try {
    call();
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    const issue = (error as InputError).issues[0]!;
    return { path: issue.path, message: issue.message };
  }
  throw new Error('expected an InputError, got a result');
}

const limits: VoltageLimits = { preset: 'custom', underPercent: 6, overPercent: 10, source: 'test band −6 %/+10 %' };

describe('judgeVoltage', () => {
  it('refuses NaN, which used to read as within the limits', () => {
    expect(refusal(() => judgeVoltage(limits, Number.NaN))).toEqual({ path: 'percent', message: 'percent: expected a voltage as a finite percentage of nominal, e.g. 97.4 (received NaN)' });
    expect(refusal(() => judgeVoltage({ ...limits, underPercent: Number.NaN }, 97)).path).toBe('limits.underPercent');
  });

  it('judges the figure itself, past a round-off allowance of 0.001 %: 93.96 % is under a −6 % band, 93.9995 % on its edge', () => {
    expect(judgeVoltage(limits, 93.96)).toBe('under');
    expect(judgeVoltage(limits, 93.9995)).toBe('within');
    expect(judgeVoltage(limits, 93.998)).toBe('under');
    expect(judgeVoltage(limits, 110.0005)).toBe('within');
    expect(judgeVoltage(limits, 110.002)).toBe('over');
    expect(judgeVoltage(limits, 110.04)).toBe('over');
  });
});

describe('bandVolts, bandVoltsWords and bandWords', () => {
  it('refuse NaN limits and nominal voltages, which printed "NaN–NaN V" and "±undefined %"', () => {
    expect(refusal(() => bandVolts(limits, Number.NaN))).toEqual({ path: 'nominalV', message: 'nominalV: expected a nominal voltage in V, a finite number above 0 (received NaN)' });
    expect(refusal(() => bandVolts({ underPercent: Number.NaN, overPercent: 10 }, 230)).path).toBe('limits.underPercent');
    expect(refusal(() => bandWords({ ...limits, overPercent: undefined as never })).path).toBe('limits.overPercent');
    expect(refusal(() => bandVoltsWords(limits, { lineToNeutralV: Number.NaN, lineToLineV: 400 })).path).toBe('nominal.lineToNeutralV');
    expect(refusal(() => bandVoltsWords(null as never, { lineToNeutralV: 230, lineToLineV: 400 })).path).toBe('limits');
  });

  it('write a good band: −6/+10 % of 230 V is 216.2–253.0 V', () => {
    expect(bandVolts(limits, 230)).toEqual({ low: '216.2', high: '253.0' });
    expect(bandWords(limits)).toBe('−6/+10 %');
    expect(bandVoltsWords(limits, { lineToNeutralV: 230, lineToLineV: null })).toBe('230.0 V: 216.2–253.0 V line-to-neutral');
  });
});

describe('powerFactorText', () => {
  it('refuses a NaN power factor, which used to print "NaN lag"', () => {
    expect(refusal(() => powerFactorText({ pf: Number.NaN, sense: 'lagging', kVA: 1, kW: 1, kvar: 0 })).path).toBe('reading.pf');
    expect(refusal(() => powerFactorText({ pf: 0.9, sense: 'lagging', kVA: Number.POSITIVE_INFINITY, kW: 1, kvar: 0 })).path).toBe('reading.kVA');
  });

  it('prints a good reading as before: 0.9 lagging on 10 kVA → "0.900 lag"', () => {
    expect(powerFactorText({ pf: 0.9, sense: 'lagging', kVA: 10, kW: 9, kvar: 4.36 })).toBe('0.900 lag');
  });
});

describe('the power-factor words of reports', () => {
  it('refuse NaN, which printed "NaN" (signedPfText, billingPowerFactorText) or read as not exported (isExportKW)', () => {
    expect(refusal(() => signedPfText(Number.NaN))).toEqual({ path: 'pf', message: 'pf: expected a signed power factor from -1 to 1 (negative when the board exports), or null where no power flows (received NaN)' });
    expect(refusal(() => signedPfText(1.5)).path).toBe('pf');
    expect(refusal(() => billingPowerFactorText(Number.NaN)).path).toBe('pf');
    expect(refusal(() => isExportKW(Number.NaN)).path).toBe('kW');
    expect(refusal(() => assumedPfNote([2, Number.NaN])).path).toBe('assumedKW[1]');
    expect(refusal(() => assumedPfNote([])).path).toBe('assumedKW');
  });

  it('print good figures as before: −0.95 is "0.950 export", a billing PF of 0.9 "0.900", −0.004 kW is exported', () => {
    expect(signedPfText(-0.95)).toBe('0.950 export');
    expect(signedPfText(null)).toBe('-');
    expect(billingPowerFactorText(0.9)).toBe('0.900');
    expect(billingPowerFactorText(null)).toBe('none (no energy imported)');
    expect(isExportKW(-0.004)).toBe(false);
    expect(isExportKW(-0.006)).toBe(true);
    expect(assumedPfNote([2, -3])).toBe('*: pf not given in the file, taken as 1 (a resistive load; where it exports, a source at unity power factor).');
  });
});

describe('sequenceComponents', () => {
  it('refuses two values, which used to throw a TypeError', () => {
    expect(refusal(() => sequenceComponents([{ re: 1, im: 0 }, { re: 1, im: 0 }] as never)).path).toBe('x');
    expect(refusal(() => sequenceComponents([{ re: 1, im: 0 }, { re: 1, im: 0 }, { re: 1, im: 0 }], 'BCA' as never)).path).toBe('sequence');
  });

  it('refuses a NaN or infinite part, naming it (NaN used to come out in every component)', () => {
    const one = { re: 1, im: 0 };
    expect(refusal(() => sequenceComponents([{ re: Number.NaN, im: 0 }, one, one]))).toEqual({ path: 'x[0].re', message: 'x[0].re: expected a finite real part (received NaN)' });
    expect(refusal(() => sequenceComponents([one, one, { re: 0, im: Number.NEGATIVE_INFINITY }])).path).toBe('x[2].im');
  });

  it('a balanced ABC set of 1 ∠0°, 1 ∠−120°, 1 ∠120° is all positive sequence', () => {
    const s = sequenceComponents([
      { re: 1, im: 0 },
      { re: -0.5, im: -Math.sqrt(3) / 2 },
      { re: -0.5, im: Math.sqrt(3) / 2 },
    ]);
    expect(s.positive.re).toBeCloseTo(1, 12);
    expect(Math.hypot(s.negative.re, s.negative.im)).toBeLessThan(1e-12);
    expect(Math.hypot(s.zero.re, s.zero.im)).toBeLessThan(1e-12);
  });
});

describe('conductorResistance', () => {
  it('refuses −300 °C, which gave −0.296 Ω/km (below absolute zero), and an unknown material', () => {
    expect(refusal(() => conductorResistance({ mm2: 16 }, 'copper', -300))).toEqual({ path: 'temperatureC', message: 'temperatureC: expected a conductor temperature from -50 to 250 °C (received -300)' });
    expect(refusal(() => conductorResistance({ mm2: 16 }, 'copper', Number.NaN)).path).toBe('temperatureC');
    expect(refusal(() => conductorResistance({ mm2: 16 }, 'gold' as never)).path).toBe('material');
  });

  it('16 mm² copper: 1.15 Ω/km at 20 °C (IEC 60228 class 2), × (1 + 0.00393 × 50) = 1.376 Ω/km at 70 °C', () => {
    expect(conductorResistance({ mm2: 16 }, 'copper', 70)!.ohmPerKm).toBeCloseTo(1.15 * (1 + 0.00393 * 50), 12);
    expect(conductorResistance({ mm2: 17 }, 'copper')).toBeNull();
  });

  it('a size named like an inherited key is no size of the tables (it read a function, and NaN Ω/km)', () => {
    expect(conductorResistance({ awg: 'constructor' } as never, 'copper')).toBeNull();
    expect(conductorResistance({ mm2: 'toString' } as never, 'aluminium')).toBeNull();
  });
});

describe('unbalanceFactorFromLineMagnitudes', () => {
  it('refuses three magnitudes that cannot close a triangle (400, 400, 900 V gave 100 %) and a negative one (gave 0 %)', () => {
    expect(refusal(() => unbalanceFactorFromLineMagnitudes([400, 400, 900])).path).toBe('magnitudes');
    expect(refusal(() => unbalanceFactorFromLineMagnitudes([-400, 400, 400])).path).toBe('magnitudes[0]');
    expect(refusal(() => unbalanceFactorFromLineMagnitudes([400, Number.NaN, 400])).path).toBe('magnitudes[1]');
  });

  it('balanced is 0 %, the flat triangle (400, 400, 800 V) its limit of 100 %', () => {
    expect(unbalanceFactorFromLineMagnitudes([400, 400, 400])).toBeCloseTo(0, 6);
    expect(unbalanceFactorFromLineMagnitudes([400, 400, 800])).toBeCloseTo(100, 6);
  });
});

describe('voltage and metering words', () => {
  it('refuse NaN voltages ("NaN/NaN V"), an unknown system or region, and a metering point that is no name ("the incomer of null")', () => {
    expect(refusal(() => writeVoltageNotation('three-phase-4wire', Number.NaN, 400, 'iec')).path).toBe('lineToNeutralV');
    expect(refusal(() => writeVoltageNotation('two-phase' as never, 230, 400, 'iec')).path).toBe('system');
    expect(refusal(() => writeVoltageNotation('three-phase-4wire', 230, 400, 'europe' as never)).path).toBe('region');
    expect(refusal(() => nominalVoltageWords({ ...solved.board, nominalLineToLineV: Number.NaN })).path).toBe('board.nominalLineToLineV');
    expect(refusal(() => meteringPointWords(null as never))).toEqual({ path: 'point', message: 'point: expected "origin" or the name of a board (received null)' });
  });

  it('write good figures as before: 230/400 V (IEC), 208Y/120 V (North America), the workshop board at 400 and 230 V', () => {
    expect(writeVoltageNotation('three-phase-4wire', 230, 400, 'iec')).toBe('230/400 V');
    expect(writeVoltageNotation('three-phase-4wire', 120, 208, 'north-america')).toBe('208Y/120 V');
    expect(nominalVoltageWords(solved.board)).toBe('400 V line-to-line, 230 V line-to-neutral');
    expect(meteringPointWords('yard')).toBe('the incomer of yard');
  });
});

describe('motorDeratingFactor and standardCtPrimaryA', () => {
  it('refuse NaN and null, which read as "operation not recommended" (NaN) and as 0 % or 0 A', () => {
    expect(refusal(() => motorDeratingFactor(Number.NaN)).path).toBe('lineVoltageRatePercent');
    expect(refusal(() => motorDeratingFactor(null as never)).path).toBe('lineVoltageRatePercent');
    expect(refusal(() => motorDeratingFactor(-1)).path).toBe('lineVoltageRatePercent');
    expect(refusal(() => standardCtPrimaryA(null as never))).toEqual({ path: 'amps', message: 'amps: expected the current the CT must carry, A, a finite number, 0 or more (received null)' });
    expect(refusal(() => standardCtPrimaryA(Number.NaN)).path).toBe('amps');
  });

  it('read good figures as before: NEMA MG 1 gives 0.95 at 2 % and 0.91 between 2.5 % (0.93) and 3 % (0.89); 113 A takes a 125 A CT', () => {
    expect(motorDeratingFactor(2)).toBeCloseTo(0.95, 12);
    expect(motorDeratingFactor(2.75)).toBeCloseTo(0.91, 12);
    expect(motorDeratingFactor(6)).toBeNull();
    // IEC 61869-2 preferred primaries (from memory): 100, 125, 150 A.
    expect(standardCtPrimaryA(113)).toBe(125);
  });
});

describe('responseThresholdA', () => {
  it('refuses a negative step, which gave a negative threshold, and a zero CT ratio', () => {
    expect(refusal(() => responseThresholdA(-10, 'three-phase', 400, 100)).path).toBe('kvarAtNominalV');
    expect(refusal(() => responseThresholdA(10, 'three-phase', 400, 0)).path).toBe('ctRatio');
    expect(refusal(() => responseThresholdA(10, 'three-phase', Number.NaN, 100)).path).toBe('voltageV');
  });

  it('a 10 kvar three-phase step at 400 V on a 500/5 CT: 10 000 / (√3 × 400 × 100) = 0.1443 A', () => {
    expect(responseThresholdA(10, 'three-phase', 400, 100)).toBeCloseTo(10_000 / (Math.sqrt(3) * 400 * 100), 12);
  });
});

describe('labelIn', () => {
  it('spells known terms in L1/L2/L3 and leaves any other text as it is, an inherited key included', () => {
    expect(labelIn('L1/L2/L3', 'A-N')).toBe('L1-N');
    expect(labelIn('L1/L2/L3', 'constructor')).toBe('constructor');
  });
});

// A workshop sub-board of my own: a 6 kW A-N heater and a 4 kW, pf 0.6 lagging B-N compressor on a stiff 400/230 V supply.
const workshop = normaliseBoard(
  parseBoard({
    name: 'workshop',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
    loads: [
      { name: 'heater', connection: 'A-N', kW: 6, pf: 1 },
      { name: 'compressor', connection: 'B-N', kW: 4, pf: 0.6 },
    ],
  }),
);
const solved = solveBoardModel(workshop);

describe('checkTarget', () => {
  const target = resolveTarget({ pf: 0.95 }, workshop);

  it('refuses a target with a NaN PF (it judged against NaN) and per-line minimums that are not one per line (the missing lines went unjudged)', () => {
    expect(refusal(() => checkTarget(solved, { ...target, pf: Number.NaN }))).toEqual({ path: 'target.pf', message: 'target.pf: expected a power factor above 0 and at most 1 (received NaN)' });
    expect(refusal(() => checkTarget(solved, { ...target, lines: [] })).message).toBe('target.lines: expected one { phase, minPf } per line, in the order of result.phases (A, B, C) (received a list of 0)');
    expect(refusal(() => checkTarget(solved, { ...target, lines: target.lines.map((l, k) => (k === 1 ? { ...l, minPf: 1.2 } : l)) })).path).toBe('target.lines[1].minPf');
    expect(refusal(() => checkTarget(solved, { ...target, definition: 'average' as never })).path).toBe('target.definition');
  });

  it('refuses what is not a solved board (a TypeError before) and a board before with other lines', () => {
    expect(refusal(() => checkTarget(null as never, target)).message).toBe('result: expected a solved board from solveBoard(...) or solveBoardModel(...) (received null)');
    expect(refusal(() => checkTarget(workshop as never, target)).message).toContain('(received a normalised board, not solved)');
    expect(refusal(() => checkTarget(solved, null as never)).path).toBe('target');
    expect(refusal(() => checkTarget(solved, target, { phases: solved.phases.slice(0, 2) })).path).toBe('before.phases');
  });

  it('judges a good target as before: line B at pf 0.6 is below 0.95, lines A (pf 1) and C (idle) pass', () => {
    const check = checkTarget(solved, target, solved);
    expect(check.met).toBe(false);
    expect(check.lines.map((l) => l.meetsMinimum)).toEqual([true, false, true]);
    expect(check.lines[2]!.loaded).toBe(false);
  });
});

describe('checkBalance', () => {
  it('refuses a NaN limit, which read every board as balanced, and a normalised board, which read as 0 % unbalance', () => {
    expect(refusal(() => checkBalance(solved, { maxNegativeSequencePercent: Number.NaN, maxNeutralPercent: 20 }))).toEqual({
      path: 'target.maxNegativeSequencePercent',
      message: 'target.maxNegativeSequencePercent: expected a percentage from 0 to 100 (received NaN)',
    });
    expect(refusal(() => checkBalance(solved, { maxNegativeSequencePercent: 10, maxNeutralPercent: -1 })).path).toBe('target.maxNeutralPercent');
    expect(refusal(() => checkBalance(workshop as never, { maxNegativeSequencePercent: 10, maxNeutralPercent: 20 })).path).toBe('result');
  });

  it('judges a good target: two loads on two lines leave |I2|/|I1| well above 10 %', () => {
    const check = checkBalance(solved, { maxNegativeSequencePercent: 10, maxNeutralPercent: null });
    expect(check.met).toBe(false);
    // Stiff supply: I_A = 6000/230 ∠0, I_B = (4000/0.6)/230 ∠(−120° − 53.13°); |I2|/|I1| from these two phasors.
    const rad = Math.PI / 180;
    const ia = { re: 6000 / 230, im: 0 };
    const mb = 4000 / 0.6 / 230;
    const ib = { re: mb * Math.cos((-120 - Math.acos(0.6) / rad) * rad), im: mb * Math.sin((-120 - Math.acos(0.6) / rad) * rad) };
    const s = sequenceComponents([ia, ib, { re: 0, im: 0 }]);
    expect(check.negativeSequencePercent).toBeCloseTo((100 * Math.hypot(s.negative.re, s.negative.im)) / Math.hypot(s.positive.re, s.positive.im), 3);
  });
});

describe('judgedNominals', () => {
  it('refuses a normalised board and a NaN nominal (a TypeError and NaN before)', () => {
    expect(refusal(() => judgedNominals(workshop as never)).message).toBe('result: expected a solved board from solveBoard(...) or solveBoardModel(...) (received a normalised board, not solved)');
    expect(refusal(() => judgedNominals({ ...solved, board: { ...solved.board, nominalLineToNeutralV: Number.NaN } })).path).toBe('result.board.nominalLineToNeutralV');
  });

  it('a 4-wire 400/230 V board is judged at 230 V and 400 V', () => {
    expect(judgedNominals(solved)).toEqual({ lineToNeutralV: 230, lineToLineV: 400 });
  });
});

describe('collapseError', () => {
  it('refuses nothing to quote (a TypeError, or "cannot carry these loads: " with nothing after)', () => {
    expect(refusal(() => collapseError(null as never)).path).toBe('result');
    expect(refusal(() => collapseError({ operatingPoint: { findings: [] } })).message).toBe(
      'result.operatingPoint.findings: expected the findings of a collapsed operating point, at least one, as text (received a list of 0)',
    );
  });

  it('quotes the findings it is given', () => {
    expect(collapseError({ operatingPoint: { findings: ['line A below 50 %'] } }).message).toBe('no viable operating point: the supply cannot carry these loads: line A below 50 %');
  });
});

/**
 * The exported helpers that take plain numbers refuse what has no answer — NaN, a temperature below the
 * range the resistance law holds in, line voltages that cannot close a triangle, a negative step — with
 * an InputError naming the argument, and still give the textbook figure for good input.
 */
import { describe, expect, it } from 'vitest';
import {
  conductorResistance,
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

  it('judges on the printed figure: 93.96 % prints 94.0 (within a −6 % band), 93.94 % prints 93.9 (under)', () => {
    expect(judgeVoltage(limits, 93.96)).toBe('within');
    expect(judgeVoltage(limits, 93.94)).toBe('under');
    expect(judgeVoltage(limits, 110.06)).toBe('over');
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

describe('sequenceComponents', () => {
  it('refuses two values, which used to throw a TypeError', () => {
    expect(refusal(() => sequenceComponents([{ re: 1, im: 0 }, { re: 1, im: 0 }] as never)).path).toBe('x');
    expect(refusal(() => sequenceComponents([{ re: 1, im: 0 }, { re: 1, im: 0 }, { re: 1, im: 0 }], 'BCA' as never)).path).toBe('sequence');
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

/**
 * A board whose every line already leads below the target (capacitors already in service exceed what
 * its loads take) cannot be corrected with capacitors: the study says so (infeasible, the leading
 * lines named) instead of "meets the target" beside a PF of 0.93 leading, and its harmonic check sizes
 * no variant. A board where a line-to-line load makes one line lead against the neutral keeps the
 * "not leading more" rule for that line.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, correctWithHarmonics, normaliseBoard, parseBoard, type BoardSpec } from '@trivar/core';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 4 } } as const;

// Invented: a 60 kW heating board with a 40 kvar fixed capacitor left connected. Per line, by hand at
// nominal voltage: P 20 kW, Q −13.3 kvar, PF = 20/√(20² + 13.3²) = 0.83 leading.
const overCompensated: BoardSpec = {
  supply,
  loads: [
    { name: 'heaters', connection: 'ABC-delta', kW: 60, pf: 1 },
    { name: 'old capacitor', connection: 'ABC-delta', kW: 0, kvar: -40, model: 'constant-impedance' },
  ],
};

describe('a board that already leads on every line', () => {
  it('capacitor banks cannot reach the target: infeasible, with the leading lines named', () => {
    const board = normaliseBoard(parseBoard(overCompensated));
    for (const arrangement of ['star-bank', 'delta-bank'] as const) {
      const r = correctBoard(board, { arrangement });
      expect(r.status).toBe('infeasible');
      expect(r.reasons.join(' ')).toContain('lines A, B, C already lead before correction: capacitors cannot help there');
      for (const line of r.verification.before.phases) {
        expect(line.sense).toBe('leading');
        // Hand figure above, less than 1 % off for the solved voltage (the capacitor's Q goes as V²).
        expect(Math.abs(line.pf! - 0.833)).toBeLessThan(0.01);
      }
    }
  });

  it('its harmonic check sizes no variant and says why', () => {
    const spec = { ...overCompensated, loads: [...overCompensated.loads, { name: 'drives', connection: 'A-N', kW: 2, pf: 0.95, spectrum: 'six-pulse-drive' }] } as BoardSpec;
    const parsed = parseBoard(spec);
    const r = correctWithHarmonics(parsed, normaliseBoard(parsed), { arrangement: 'delta-bank' });
    expect(r.status).toBe('infeasible');
    expect(r.harmonics.variants).toEqual([]);
    expect(r.harmonics.chosen).toBeNull();
    expect(r.harmonics.summary).toBe('no capacitors are added, so there is no bank to check against the harmonics');
  });

  it('one line leading because of a line-to-line load is not taken for an over-compensated board', () => {
    // A resistive A-B heater: line A's current leads V_A by 30° (PF 0.866 leading), line B's lags by 30°.
    const board = normaliseBoard(parseBoard({ supply, loads: [{ name: 'heater', connection: 'A-B', kW: 20, pf: 1 }, { name: 'lamps', connection: 'C-N', kW: 5, pf: 0.9 }] }));
    const r = correctBoard(board, { arrangement: 'delta-bank' });
    expect(r.verification.before.phases.map((p) => p.sense)).toEqual(['leading', 'lagging', 'lagging']);
    expect(Math.abs(r.verification.before.phases[0]!.pf! - Math.cos(Math.PI / 6))).toBeLessThan(0.01);
    expect(r.reasons.join(' ')).not.toContain('already lead');
  });
});

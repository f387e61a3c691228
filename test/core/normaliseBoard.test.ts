import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, solveBoard } from '@trivar/core';

const base = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;

describe('normaliseBoard', () => {
  it('derives the per-phase source impedance from a transformer rating (|Z| = u_k·V²/S, split by X/R)', () => {
    const b = normaliseBoard(parseBoard({ supply: { ...base, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } }, loads: [{ name: 'x', connection: 'A-N', kW: 1, pf: 1 }] }));
    const z = (0.04 * 400 * 400) / 250_000; // 0.0256 ohm
    expect(b.sourceImpedance.re).toBeCloseTo(z / Math.sqrt(10), 12);
    expect(b.sourceImpedance.im).toBeCloseTo((3 * z) / Math.sqrt(10), 12);
  });
  it('takes feeder impedance from length × per-km values', () => {
    const b = normaliseBoard(parseBoard({ supply: base, feeder: { line: { lengthM: 40, rOhmPerKm: 0.32, xOhmPerKm: 0.08 }, neutral: { r: 0, x: 0 } }, loads: [{ name: 'x', connection: 'A-N', kW: 1, pf: 1 }] }));
    expect(b.lineImpedance.re).toBeCloseTo(0.0128, 12);
    expect(b.lineImpedance.im).toBeCloseTo(0.0032, 12);
    expect(b.neutralImpedance).toEqual({ re: 0, im: 0 });
  });
  it('balanced EMFs follow the phase sequence', () => {
    const acb = normaliseBoard(parseBoard({ supply: { ...base, sequence: 'ACB' }, loads: [{ name: 'x', connection: 'A-N', kW: 1, pf: 1 }] }));
    expect(Math.atan2(acb.emf[1]!.im, acb.emf[1]!.re) * (180 / Math.PI)).toBeCloseTo(120, 9);
    expect(Math.hypot(acb.emf[0]!.re, acb.emf[0]!.im)).toBeCloseTo(400 / Math.sqrt(3), 9);
  });
  it('splits a balanced three-phase rating into three equal branches', () => {
    const b = normaliseBoard(parseBoard({ supply: base, loads: [{ name: 'm', connection: 'ABC-delta', kW: 30, pf: 0.8 }] }));
    const branches = b.loads[0]!.branches;
    expect(branches.map((x) => `${x.from}-${x.to}`)).toEqual(['A-B', 'B-C', 'C-A']);
    for (const br of branches) {
      expect(br.sNominal.re).toBeCloseTo(10_000, 9);
      expect(br.sNominal.im).toBeCloseTo(7_500, 9); // 10 kW at pf 0.8 lagging → 7.5 kvar
      expect(br.vNominal).toBe(400);
    }
  });
  it('turns a current rating into power at the nominal voltage of the connection', () => {
    const b = normaliseBoard(parseBoard({ supply: base, loads: [{ name: 'w', connection: 'A-B', A: 10, pf: 0.6, sense: 'leading' }, { name: 's', connection: 'ABC-star', A: 10, pf: 1 }] }));
    expect(b.loads[0]!.branches[0]!.sNominal.re).toBeCloseTo(2400, 9);
    expect(b.loads[0]!.branches[0]!.sNominal.im).toBeCloseTo(-3200, 9);
    expect(b.loads[1]!.branches[0]!.sNominal.re).toBeCloseTo((Math.sqrt(3) * 400 * 10) / 3, 9);
  });
  it('split-phase is 2 × 120 V; impedance star loads on 3-wire float', () => {
    const sp = normaliseBoard(parseBoard({ supply: { system: 'split-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60 }, loads: [{ name: 'h', connection: 'A-B', kW: 4.8, pf: 1 }] }));
    expect(sp.nominalLineToLineV).toBe(240);
    expect(sp.emf[1]!.re).toBeCloseTo(-120, 9);
    const tw = normaliseBoard(
      parseBoard({
        supply: { ...base, system: 'three-phase-3wire' },
        loads: [
          { name: 's', connection: 'ABC-star', ohms: { r: 50, x: 5 } },
          { name: 'p', connection: 'ABC-star', kW: 3, pf: 1 },
        ],
      }),
    );
    expect(tw.loads[0]!.branches[0]!.to).toBe('star:0');
    // A floating star of voltage-dependent elements is taken as its equivalent delta, same rating.
    expect(tw.loads[1]!.branches.map((b) => `${b.from}-${b.to}`)).toEqual(['A-B', 'B-C', 'C-A']);
    expect(tw.loads[1]!.branches[0]!.sNominal.re).toBeCloseTo(1000, 9);
  });
  it('a kW-only load is resistive: pf 1, Q = 0, and the result says it was assumed', () => {
    const spec = { supply: base, loads: [{ name: 'kettle', connection: 'A-N' as const, kW: 2 }, { name: 'motor', connection: 'B-N' as const, kW: 2, pf: 0.8 }] };
    const board = normaliseBoard(parseBoard(spec));
    expect(board.loads[0]!.branches[0]!.sNominal).toEqual({ re: 2000, im: 0 });
    expect(board.loads[0]!.pfAssumed).toBe(true);
    expect(board.loads[1]!.pfAssumed).toBeUndefined();
    const result = solveBoard(spec);
    expect(result.loads[0]!.pfAssumed).toBe(true);
    expect(result.loads[0]!.pf).toBe(1);
    expect('pfAssumed' in result.loads[1]!).toBe(false);
  });
});

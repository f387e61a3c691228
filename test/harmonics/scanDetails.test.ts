/**
 * Scan details: unequal branches of a floating star bank split the parallel
 * resonance into more than one peak, each reported (and each a true local
 * maximum of |Z|); the skin-effect option scales source and feeder resistance
 * by √h and leaves reactances as in the constant case.
 */
import { describe, expect, it } from 'vitest';
import {
  createScanEvaluator,
  impedanceAtOrder,
  normaliseBoard,
  parseBoard,
  resolveHarmonicModel,
  scanResonance,
  solveNetwork,
  type Board,
  type BankModel,
} from '@trivar/core';

describe('resonance peaks of an unequal floating star bank', () => {
  it('reports a peak per resonance, each a local maximum', () => {
    const spec = parseBoard({
      supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 500, impedancePercent: 5, xOverR: 20 } },
      loads: [{ name: 'heaters', connection: 'ABC-delta', kW: 30, pf: 1 }],
    });
    const plain = normaliseBoard(spec);
    const v = plain.nominalLineToNeutralV;
    const star = `star:${plain.loads.length}` as const;
    // 20, 60 and 120 kvar-equivalent branches at the line-to-neutral voltage.
    const branch = (from: 'A' | 'B' | 'C', kvar: number) => ({ from, to: star, sNominal: { re: 0, im: -kvar * 1000 }, vNominal: v, zip: { z: 1, i: 0, p: 0 } });
    const board: Board = {
      ...plain,
      loads: [...plain.loads, { name: 'uneven bank', connection: 'ABC-star', model: 'constant-impedance', origin: 'added', branches: [branch('A', 20), branch('B', 60), branch('C', 120)] }],
    };
    const bank: BankModel = { ratedV: 400, elementNominalV: v, stepsKvar: [], fixedKvar: 200, detuning: 0, fixedLoad: plain.loads.length, stepLoads: [] };
    const model = resolveHarmonicModel(spec, board, bank);
    const fundamental = solveNetwork(board);
    const scan = scanResonance(fundamental, model, { checkedOrders: [5, 7], checkedOrdersFrom: 'characteristic orders (no spectrum given)' });
    const peaks = scan.combinations[0]!.peaks;
    const distinct = [...new Set(peaks.map((p) => p.order.toFixed(2)))];
    expect(distinct.length, JSON.stringify(peaks)).toBeGreaterThanOrEqual(2);
    const evaluator = createScanEvaluator(fundamental, model);
    const out = new Float64Array(evaluator.pairs.length);
    for (const p of peaks) {
      const k = scan.pairs.indexOf(p.pair);
      const at = (h: number) => {
        evaluator.prepare(h);
        evaluator.impedances([], out, 0);
        return out[k]!;
      };
      expect(at(p.order)).toBeGreaterThan(at(p.order * 0.999));
      expect(at(p.order)).toBeGreaterThan(at(p.order * 1.001));
    }
  });
});

describe('frequency-dependent resistance', () => {
  it('skin effect: R × √h, X × h (inductive) or / h (capacitive); constant: R unchanged', () => {
    const z = { re: 0.02, im: 0.08 };
    expect(impedanceAtOrder(z, 9, 'skin-effect')).toEqual({ re: 0.02 * 3, im: 0.08 * 9 });
    expect(impedanceAtOrder(z, 9, 'constant')).toEqual({ re: 0.02, im: 0.08 * 9 });
    expect(impedanceAtOrder({ re: 1, im: -6 }, 3, 'skin-effect')).toEqual({ re: Math.sqrt(3), im: -2 });
  });
});

/**
 * Laws of the harmonic solve, on random boards with random spectra and
 * background distortion (fast-check):
 * - power balance at every order: what the supply EMFs deliver at order h
 *   equals what every branch absorbs (linear loads, and the non-linear loads'
 *   current sources, which usually give power back) plus the I²Z of the source,
 *   feeder and neutral conductors — Tellegen's theorem, complex S;
 * - Kirchhoff's current law at every node of every order (the law helper of the
 *   fundamental tests);
 * - the scan's fast nodal inverse equals the general solve driven by 1 A.
 * Worst residuals go to test/harmonics/.order-laws.json.
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import {
  createScanEvaluator,
  impedanceAtOrder,
  normaliseBoard,
  ordersPresent,
  parseBoard,
  resolveHarmonicModel,
  solveAtOrder,
  solveFixedNetwork,
  solveNetwork,
  terminalVoltage,
  type BoardSpec,
  type ComplexValue,
  type NetworkSolution,
  branchAdmittanceAtOrder,
} from '@trivar/core';
import { C0, c, cAbs, cAdd, cPower, cScale, cSub } from '../support/complexMath.js';
import { FigureLog } from '../support/figureLog.js';
import { harmonicBoardArb } from '../property/arbitraries/harmonicBoardSpec.js';
import { assertCurrentLawHolds, ratedPower } from '../property/laws.js';

const figures = new FigureLog(new URL('./.order-laws.json', import.meta.url));
afterAll(() => figures.write());

function prepared(spec: BoardSpec) {
  const parsed = parseBoard(spec);
  const board = normaliseBoard(parsed);
  const model = resolveHarmonicModel(parsed, board, null);
  return { board, model, fundamental: solveNetwork(board) };
}

/** Complex power balance at one order: EMFs deliver = branches absorb + conductors' I²Z. */
function powerResidual(solution: NetworkSolution): { residual: number; scale: number } {
  const b = solution.board;
  let delivered = C0;
  b.emf.forEach((e, k) => (delivered = cAdd(delivered, cPower(e, solution.lineCurrents[k]!))));
  let absorbed = C0;
  let scale = cAbs(delivered);
  solution.branches.forEach((branches) =>
    branches.forEach((st) => {
      const s = cPower(st.voltage, st.current);
      absorbed = cAdd(absorbed, s);
      scale = Math.max(scale, cAbs(s));
    }),
  );
  const zLine = cAdd(b.sourceImpedance, b.lineImpedance);
  for (const i of solution.lineCurrents) absorbed = cAdd(absorbed, cScale(zLine, cAbs(i) ** 2));
  if (solution.neutralCurrent && !b.neutralOpen) absorbed = cAdd(absorbed, cScale(b.neutralImpedance, cAbs(solution.neutralCurrent) ** 2));
  // Floor: 1e-6 of the board's rated VA, for an order where almost nothing flows.
  return { residual: cAbs(cSub(delivered, absorbed)), scale: Math.max(scale, 1e-6 * ratedPower(b)) };
}

describe('harmonic solve laws on random boards', () => {
  it('at every order: supply + injections = loads + losses, and KCL at every node', () => {
    fc.assert(
      fc.property(harmonicBoardArb, (spec) => {
        const { model, fundamental } = prepared(spec);
        for (const h of ordersPresent(model)) {
          const solution = solveAtOrder(fundamental, model, h);
          const { residual, scale } = powerResidual(solution);
          figures.note('power balance per order (of largest branch VA)', residual / scale, JSON.stringify(spec));
          expect(residual).toBeLessThanOrEqual(1e-9 * scale);
          figures.note('kcl per order', assertCurrentLawHolds(solution), JSON.stringify(spec));
        }
      }),
      { numRuns: 60 },
    );
  });

  it('the scan’s nodal inverse equals the general solve with 1 A driven between the terminals', () => {
    fc.assert(
      fc.property(harmonicBoardArb.filter((s) => s.supply.system !== 'single-phase'), fc.double({ min: 1, max: 30, noNaN: true }), (spec, h) => {
        const { model, fundamental } = prepared(spec);
        const evaluator = createScanEvaluator(fundamental, model);
        evaluator.prepare(h);
        const out = new Float64Array(evaluator.pairs.length);
        evaluator.impedances([], out, 0);
        const board = fundamental.board;
        evaluator.pairs.forEach(([p, q], k) => {
          // The general path: EMFs shorted, every branch at its order-h admittance, a 1 A source from q to p.
          const driven = {
            ...board,
            emf: board.emf.map(() => c(0)),
            sourceImpedance: impedanceAtOrder(board.sourceImpedance, h),
            lineImpedance: impedanceAtOrder(board.lineImpedance, h),
            neutralImpedance: impedanceAtOrder(board.neutralImpedance, h),
            loads: [...board.loads, { name: 'drive', connection: 'A-N' as const, model: 'constant-impedance' as const, origin: 'added' as const, branches: [{ from: q, to: p, sNominal: c(1), vNominal: 1, zip: { z: 1, i: 0, p: 0 } }] }],
          };
          const admittances = [...fundamental.branches.map((bs, l) => bs.map((st) => branchAdmittanceAtOrder(st.admittance, model.loads[l]!, h))), [c(0)]];
          const sources: (ComplexValue | null)[][] = [...board.loads.map((l) => l.branches.map(() => null)), [c(1)]];
          const solved = solveFixedNetwork(driven, { admittances, branchSources: sources });
          const z = cSub(terminalVoltage(solved, p) ?? C0, terminalVoltage(solved, q) ?? C0);
          const error = Math.abs(cAbs(z) - out[k]!) / Math.max(cAbs(z), 1e-12);
          figures.note('scan inverse vs general solve (relative)', error, JSON.stringify({ spec, h, pair: `${p}-${q}` }));
          expect(error).toBeLessThan(1e-9);
        });
      }),
      { numRuns: 40 },
    );
  });
});

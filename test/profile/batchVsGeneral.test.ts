/**
 * The batch kernels against the general solver (solveNetwork) on random
 * boards and random intervals: every bus voltage, line and neutral current
 * must agree to 1e-9 relative (absolute floor 1e-9 × the largest quantity of
 * its kind on the interval). Both batch paths run: closed-form where the board
 * qualifies, nodal always.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyseSolution, normaliseBoard, parseBoard, solveNetwork, terminalVoltage, type Board } from '@trivar/core';
import { allocateFigures, recordInterval } from '../../packages/core/src/profile/solveBatch.js';
import { expectClose } from '../support/tolerance.js';
import { compileBatchNetwork, edgePowersAt, type DriverSpec } from '../../packages/core/src/profile/batchNetwork.js';
import { closedFormBlocker, createClosedFormKernel } from '../../packages/core/src/profile/closedFormKernel.js';
import { createCompiledKernel } from '../../packages/core/src/profile/compiledKernel.js';
import { isLinearClosedForm, solveLinearClosedForm } from '../../packages/core/src/profile/linearClosedForm.js';
import type { BatchKernel } from '../../packages/core/src/profile/batchKernel.js';
import { boardSpecArb } from '../property/arbitraries/boardSpec.js';
import { expectComplexClose } from '../support/tolerance.js';

const REL = 1e-9;

/** One scale-factor driver per load (coefficient = the load's rated power). */
function perLoadDrivers(board: Board): DriverSpec[] {
  return board.loads.map((load, l) => ({
    name: load.name,
    loads: [{ load: l, coefficient: load.branches.reduce((s, b) => ({ re: s.re + b.sNominal.re, im: s.im + b.sNominal.im }), { re: 0, im: 0 }) }],
  }));
}

/** The same interval as a plain Board for the general solver. */
function scaledBoard(board: Board, scales: readonly number[]): Board {
  return {
    ...board,
    loads: board.loads.map((load, l) => ({
      ...load,
      branches: load.branches.map((b) => ({ ...b, sNominal: { re: b.sNominal.re * scales[l]!, im: b.sNominal.im * scales[l]! } })),
    })),
  };
}

function compareInterval(kernel: BatchKernel, board: Board, scales: readonly number[], interval: number): void {
  const general = solveNetwork(scaledBoard(board, scales));
  const vMax = Math.max(...board.emf.map((e) => Math.hypot(e.re, e.im)));
  // Current scale: the largest line current, floored at the board's rated current (an interval with
  // every load off leaves round-off of the rated scale in the neutral).
  const rated = board.loads.flatMap((l) => l.branches).reduce((s, b) => s + Math.hypot(b.sNominal.re, b.sNominal.im), 0) / board.nominalLineToNeutralV;
  const iMax = Math.max(rated, ...general.lineCurrents.map((i) => Math.hypot(i.re, i.im)));
  const vTol = { rel: REL, abs: REL * vMax };
  const iTol = { rel: REL, abs: REL * iMax };
  const s = kernel.state;
  board.phases.forEach((p, k) => {
    expectComplexClose({ re: s.busRe[k]!, im: s.busIm[k]! }, terminalVoltage(general, p)!, vTol, `${kernel.path} interval ${interval} bus ${p}`);
    expectComplexClose({ re: s.lineRe[k]!, im: s.lineIm[k]! }, general.lineCurrents[k]!, iTol, `${kernel.path} interval ${interval} line ${p}`);
  });
  if (general.neutralCurrent) expectComplexClose({ re: s.neutral[0]!, im: s.neutral[1]! }, general.neutralCurrent, iTol, `${kernel.path} neutral`);
  if (board.hasNeutral) {
    const vn = terminalVoltage(general, 'N');
    if (vn) expectComplexClose({ re: s.reference[0]!, im: s.reference[1]! }, vn, vTol, `${kernel.path} neutral bar`);
  }
  // Laws on the batch state itself: KCL at the neutral (Σ I_line = I_N on a board with a
  // conductor neutral) and power balance (source = loads at the board + conductor losses).
  let sr = 0;
  let si = 0;
  let loadP = 0;
  let loadQ = 0;
  let lossP = 0;
  let lossQ = 0;
  const z = { re: board.sourceImpedance.re + board.lineImpedance.re, im: board.sourceImpedance.im + board.lineImpedance.im };
  board.phases.forEach((_, k) => {
    const ir = s.lineRe[k]!;
    const ii = s.lineIm[k]!;
    sr += ir;
    si += ii;
    const vr = s.busRe[k]! - s.reference[0]!;
    const vi = s.busIm[k]! - s.reference[1]!;
    const i2 = ir * ir + ii * ii;
    loadP += vr * ir + vi * ii;
    loadQ += vi * ir - vr * ii;
    lossP += i2 * z.re;
    lossQ += i2 * z.im;
  });
  if (board.hasNeutral && !board.neutralOpen) {
    expectComplexClose({ re: sr, im: si }, { re: s.neutral[0]!, im: s.neutral[1]! }, iTol, `${kernel.path} KCL at the neutral`);
    const n2 = s.neutral[0]! ** 2 + s.neutral[1]! ** 2;
    lossP += n2 * board.neutralImpedance.re;
    lossQ += n2 * board.neutralImpedance.im;
  }
  let srcP = 0;
  let srcQ = 0;
  board.phases.forEach((_, k) => {
    const e = board.emf[k]!;
    srcP += e.re * s.lineRe[k]! + e.im * s.lineIm[k]!;
    srcQ += e.im * s.lineRe[k]! - e.re * s.lineIm[k]!;
  });
  const sScale = vMax * iMax;
  if (board.hasNeutral) {
    expectClose(srcP, loadP + lossP, { rel: REL, abs: REL * sScale }, `${kernel.path} active power balance`);
    expectClose(srcQ, loadQ + lossQ, { rel: REL, abs: REL * sScale }, `${kernel.path} reactive power balance`);
  }
  // The per-interval figures the summaries read are the general analysis's figures.
  const figures = allocateFigures(1, board.phases.length);
  recordInterval(s, board.sequence, figures, 0);
  const result = analyseSolution(general);
  const sMax = Math.max(1, ...result.phases.map((p) => p.kVA * 1000));
  result.phases.forEach((p, k) => {
    expectClose(figures.phaseV[k]![0]!, p.voltage.magnitude, vTol, `${kernel.path} phase ${p.phase} voltage`);
    expectClose(figures.lineA[k]![0]!, p.current.magnitude, iTol, `${kernel.path} line ${p.phase} current`);
    expectClose(figures.phaseW[k]![0]!, p.kW * 1000, { rel: REL, abs: REL * sMax }, `${kernel.path} phase ${p.phase} W`);
    expectClose(figures.phaseVar[k]![0]!, p.kvar * 1000, { rel: REL, abs: REL * sMax }, `${kernel.path} phase ${p.phase} var`);
  });
  if (result.unbalance) {
    expectClose(figures.unbalancePercent[0]!, result.unbalance.voltageFactorPercent, { rel: 1e-7, abs: 1e-9 }, `${kernel.path} unbalance`);
    // The ANSI C84.1 index, the solve's line-voltage unbalance rate.
    expectClose(figures.lineDeviationPercent[0]!, result.unbalance.lineVoltageRatePercent, { rel: 1e-7, abs: 1e-9 }, `${kernel.path} line-to-line deviation`);
  }
}

describe('batch kernels agree with solveNetwork to 1e-9 relative', () => {
  it('on random boards and random load levels per interval (both paths where the board qualifies)', () => {
    let closedFormBoards = 0;
    fc.assert(
      fc.property(
        boardSpecArb({ maxLoads: 6 }),
        fc.array(fc.array(fc.oneof(fc.double({ min: 0.01, max: 1.2, noNaN: true }), fc.constant(0.5)), { minLength: 6, maxLength: 6 }), { minLength: 4, maxLength: 4 }),
        (spec, intervals) => {
          const board = normaliseBoard(parseBoard(spec));
          const net = compileBatchNetwork(board, perLoadDrivers(board));
          const columns = {
            count: intervals.length,
            re: board.loads.map((_, l) => Float64Array.from(intervals, (row) => row[l]!)),
            im: board.loads.map(() => new Float64Array(intervals.length)),
          };
          const kernels = [createCompiledKernel(net)];
          if (!closedFormBlocker(net)) {
            kernels.push(createClosedFormKernel(net));
            closedFormBoards++;
          }
          const powers = new Float64Array(net.edges.length * 6);
          intervals.forEach((row, i) => {
            edgePowersAt(net, columns, i, powers);
            for (const kernel of kernels) {
              kernel.solve(powers, i);
              compareInterval(kernel, board, row, i);
            }
          });
        },
      ),
    );
    expect(closedFormBoards).toBeGreaterThan(0);
  });

  it('a load that is off leaves its floating star point pinned, and the rest as if it were not there', () => {
    const spec = {
      supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.03, x: 0.05 } },
      loads: [
        { name: 'oven', connection: 'ABC-star', starPoint: 'floating', ohms: { r: 20, x: 5 } },
        { name: 'press', connection: 'A-B', kW: 4, pf: 0.85 },
      ],
    };
    const board = normaliseBoard(parseBoard(spec));
    const net = compileBatchNetwork(board, perLoadDrivers(board));
    const kernel = createCompiledKernel(net);
    const powers = new Float64Array(net.edges.length * 6);
    edgePowersAt(net, { count: 1, re: [Float64Array.of(0), Float64Array.of(1)], im: [Float64Array.of(0), Float64Array.of(0)] }, 0, powers);
    kernel.solve(powers, 0);
    const without = normaliseBoard(parseBoard({ ...spec, loads: [spec.loads[1]] }));
    compareInterval(kernel, without, [1], 0);
  });

  it('the fused constant-impedance pass writes the per-interval closed-form figures (1e-12)', () => {
    let fused = 0;
    fc.assert(
      fc.property(
        boardSpecArb({ maxLoads: 6, systems: ['three-phase-4wire'], models: 'constant-impedance' }),
        fc.array(fc.array(fc.double({ min: 0, max: 1.2, noNaN: true }), { minLength: 6, maxLength: 6 }), { minLength: 3, maxLength: 3 }),
        (spec, intervals) => {
          const board = normaliseBoard(parseBoard(spec));
          const net = compileBatchNetwork(board, perLoadDrivers(board));
          if (!isLinearClosedForm(net)) return;
          fused++;
          const columns = {
            count: intervals.length,
            re: board.loads.map((_, l) => Float64Array.from(intervals, (row) => row[l]!)),
            im: board.loads.map(() => new Float64Array(intervals.length)),
          };
          const fast = allocateFigures(intervals.length, 3);
          solveLinearClosedForm(net, columns, fast);
          const slow = allocateFigures(intervals.length, 3);
          const kernel = createClosedFormKernel(net);
          const powers = new Float64Array(net.edges.length * 6);
          intervals.forEach((_, i) => {
            edgePowersAt(net, columns, i, powers);
            kernel.solve(powers, i);
            recordInterval(kernel.state, board.sequence, slow, i);
          });
          const pairs: [Float64Array, Float64Array, string][] = [
            ...[0, 1, 2].flatMap((k): [Float64Array, Float64Array, string][] => [
              [fast.lineA[k]!, slow.lineA[k]!, `line ${k}`],
              [fast.phaseV[k]!, slow.phaseV[k]!, `voltage ${k}`],
              [fast.phaseW[k]!, slow.phaseW[k]!, `W ${k}`],
              [fast.phaseVar[k]!, slow.phaseVar[k]!, `var ${k}`],
            ]),
            [fast.neutralA, slow.neutralA, 'neutral'],
            [fast.unbalancePercent, slow.unbalancePercent, 'unbalance'],
            [fast.lineDeviationPercent, slow.lineDeviationPercent, 'line-to-line deviation'],
          ];
          for (const [a, b, what] of pairs) {
            const scale = Math.max(1, ...b.map(Math.abs));
            b.forEach((v, i) => expectClose(a[i]!, v, { rel: 1e-12, abs: 1e-12 * scale }, `${what} interval ${i}`));
          }
        },
      ),
    );
    expect(fused).toBeGreaterThan(0);
  });

  it('a P + jQ driver spread over two loads by weight equals those loads rated at the shares', () => {
    const board = normaliseBoard(
      parseBoard({
        supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.02, x: 0.04 } },
        feeder: { line: { r: 0.05, x: 0.01 }, neutral: { r: 0.05, x: 0.01 } },
        loads: [
          { name: 'kiln', connection: 'A-N', kW: 3, pf: 0.9 },
          { name: 'dryer', connection: 'B-C', kW: 5, pf: 0.8, model: 'constant-current' },
        ],
      }),
    );
    const net = compileBatchNetwork(board, [{ name: 'pair', loads: [{ load: 0, coefficient: { re: 0.25, im: 0 } }, { load: 1, coefficient: { re: 0.75, im: 0 } }] }]);
    const kernel = createCompiledKernel(net);
    const powers = new Float64Array(net.edges.length * 6);
    edgePowersAt(net, { count: 1, re: [Float64Array.of(8000)], im: [Float64Array.of(2000)] }, 0, powers);
    kernel.solve(powers, 0);
    // kiln takes 2000 + j500 VA, dryer 6000 + j1500 VA at nominal voltage.
    const expected = {
      ...board,
      loads: board.loads.map((load, l) => ({
        ...load,
        branches: load.branches.map((b) => ({ ...b, sNominal: l === 0 ? { re: 2000, im: 500 } : { re: 6000, im: 1500 } })),
      })),
    };
    compareInterval(kernel, expected, [1, 1], 0);
  });
});

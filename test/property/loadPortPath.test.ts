/**
 * The Newton path's solve through the load ports (loadPortReduction.ts: the fixed
 * part of the network reduced once, at compile time, to the node pairs carrying
 * loads) against the fixed-point iteration, which assembles and factorises the whole
 * nodal matrix every time. The two must reach the same state to well inside the
 * solve tolerance: on random boards (of which a good share must take the ports, so
 * the check is not vacuous), on a board whose loads are rewritten between solves,
 * and with currents injected at nodes (the right-hand side the reduction otherwise
 * knows from compile time).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compileBoard, normaliseBoard, parseBoard, type BoardSpec, type CompiledBoard } from '@trivar/core';
import { boardSpecArb } from './arbitraries/boardSpec.js';

/** As in newtonPath.test.ts: both stop when the error left is estimated below 1e-10 of nominal. */
const AGREE = 1e-9;

/** Largest node-voltage difference (fraction of nominal) between `solve()` and the fixed-point iteration. */
function disagreement(compiled: CompiledBoard): number {
  const net = compiled.network;
  net.solveByFixedPoint();
  const re = Float64Array.from(net.voltageRe);
  const im = Float64Array.from(net.voltageIm);
  net.solve();
  let worst = 0;
  for (let v = 0; v < net.nodeCount; v++) if (net.live[v]) worst = Math.max(worst, Math.hypot(net.voltageRe[v]! - re[v]!, net.voltageIm[v]! - im[v]!) / net.circuit.voltageBase);
  return worst;
}

const threeLoadSpec: BoardSpec = {
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
  feeder: { line: { r: 0.02, x: 0.01 }, neutral: { r: 0.03, x: 0.01 } },
  loads: [
    { name: 'kiln', connection: 'A-N', kW: 9, pf: 0.98, model: 'constant-power' },
    { name: 'signs', connection: 'B-N', kW: 3, pf: 0.95, model: 'constant-power' },
    { name: 'winch', connection: 'C-N', kW: 5, pf: 0.8, model: 'constant-power' },
  ],
};

/**
 * Random four-wire boards whose single-phase loads are moved onto three node pairs that form
 * no loop (a load from each phase to neutral, or A–N, B–N and B–C, …): the boards the written-out
 * three-pair steps take when each pair carries a voltage-dependent load.
 */
const THREE_PAIRS = [
  ['A-N', 'B-N', 'C-N'],
  ['A-N', 'B-N', 'B-C'],
  ['A-N', 'C-N', 'A-B'],
  ['B-N', 'C-N', 'C-A'],
] as const;
const threePairBoardArb = fc.tuple(boardSpecArb({ systems: ['three-phase-4wire'], maxLoads: 9 }), fc.constantFrom(...THREE_PAIRS)).map(
  ([spec, pairs]): BoardSpec => ({
    ...spec,
    loads: spec.loads.filter((load) => load.connection !== 'ABC-star' && load.connection !== 'ABC-delta').map((load, k) => ({ ...load, connection: pairs[k % 3]! })),
  }),
);

describe('Newton through the load ports against the fixed-point iteration', () => {
  it('a three-load board takes the ports and reaches the fixed-point state', () => {
    const compiled = compileBoard(normaliseBoard(parseBoard(threeLoadSpec)));
    expect(disagreement(compiled)).toBeLessThanOrEqual(AGREE);
    expect(compiled.network.solvedThroughPorts).toBe(true);
    expect(compiled.network.method).toBe('newton');
    compiled.network.solveByFixedPoint();
    expect(compiled.network.solvedThroughPorts).toBe(false);
  });

  it('follows load powers rewritten between solves', () => {
    const compiled = compileBoard(normaliseBoard(parseBoard(threeLoadSpec)));
    const net = compiled.network;
    const first = Float64Array.from(net.powerRe);
    fc.assert(
      fc.property(fc.tuple(fc.double({ min: 0.05, max: 3, noNaN: true }), fc.double({ min: 0.05, max: 3, noNaN: true }), fc.double({ min: 0.05, max: 3, noNaN: true })), (scales) => {
        scales.forEach((s, k) => {
          net.powerRe[k] = first[k]! * s;
        });
        expect(disagreement(compiled)).toBeLessThanOrEqual(AGREE);
        expect(net.method).toBe('newton');
        expect(net.solvedThroughPorts).toBe(true);
      }),
      { numRuns: 60 },
    );
  });

  it('with currents injected at the board’s nodes, and again after they are cleared', () => {
    const compiled = compileBoard(normaliseBoard(parseBoard(threeLoadSpec)));
    const net = compiled.network;
    net.solve();
    const clean = Float64Array.from(net.voltageRe);
    fc.assert(
      fc.property(fc.integer({ min: 0, max: net.nodeCount - 1 }), fc.double({ min: -40, max: 40, noNaN: true }), fc.double({ min: -40, max: 40, noNaN: true }), (node, re, im) => {
        net.injectionRe[node] = re;
        net.injectionIm[node] = im;
        expect(disagreement(compiled)).toBeLessThanOrEqual(AGREE);
        expect(net.solvedThroughPorts).toBe(true);
        net.injectionRe[node] = 0;
        net.injectionIm[node] = 0;
        net.solve();
        net.voltageRe.forEach((v, k) => {
          if (net.live[k]) expect(Math.abs(v - clean[k]!)).toBeLessThanOrEqual(AGREE * net.circuit.voltageBase);
        });
      }),
      { numRuns: 40 },
    );
  });

  it('the written-out three-pair steps (threePairPortSteps.ts) give the general loop’s state to the bit', () => {
    // The same board compiled twice, one with the written-out steps taken away: it then runs
    // the general loop through the ports, which the steps must follow operation for operation.
    const general = (compiled: CompiledBoard) => {
      (compiled.network as unknown as { threePairSteps: unknown }).threePairSteps = null;
      return compiled;
    };
    let taken = 0;
    fc.assert(
      fc.property(threePairBoardArb, fc.double({ min: 0.2, max: 4, noNaN: true }), (spec, scale) => {
        const fast = compileBoard(normaliseBoard(spec));
        if ((fast.network as unknown as { threePairSteps: unknown }).threePairSteps === null) return;
        const slow = general(compileBoard(normaliseBoard(spec)));
        for (const net of [fast.network, slow.network]) for (let k = 0; k < net.branchCount; k++) net.powerRe[k] = net.powerRe[k]! * scale;
        const outcome = (net: CompiledBoard['network']) => {
          try {
            net.solve();
            return null;
          } catch (error) {
            return String(error);
          }
        };
        expect(outcome(fast.network)).toBe(outcome(slow.network));
        taken++;
        expect([fast.network.method, fast.network.iterations, fast.network.lastChange]).toEqual([slow.network.method, slow.network.iterations, slow.network.lastChange]);
        expect(Array.from(fast.network.voltageRe)).toEqual(Array.from(slow.network.voltageRe));
        expect(Array.from(fast.network.voltageIm)).toEqual(Array.from(slow.network.voltageIm));
        expect(Array.from(fast.network.admittanceRe)).toEqual(Array.from(slow.network.admittanceRe));
        expect(Array.from(fast.network.admittanceIm)).toEqual(Array.from(slow.network.admittanceIm));
      }),
      { numRuns: 300 },
    );
    expect(taken).toBeGreaterThan(20);
  });

  it('on random boards: the same state, and a good share of them take the ports', () => {
    let ports = 0;
    let newton = 0;
    fc.assert(
      fc.property(boardSpecArb(), (spec) => {
        const compiled = compileBoard(normaliseBoard(spec));
        if (!compiled.network.circuit.branches.some((b) => b.zip.z !== 1)) return;
        let worst: number;
        try {
          worst = disagreement(compiled);
        } catch {
          return; // the same error from both is newtonPath.test.ts's concern
        }
        expect(worst).toBeLessThanOrEqual(AGREE);
        if (compiled.network.method !== 'newton') return;
        newton++;
        if (compiled.network.solvedThroughPorts) ports++;
      }),
      { numRuns: 200 },
    );
    expect(ports).toBeGreaterThan(0.3 * newton);
  });
});

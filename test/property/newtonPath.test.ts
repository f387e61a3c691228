/**
 * The compiled solve's Newton path — Newton's method on the voltage magnitudes of
 * the node pairs that carry voltage-dependent loads (compiledNetwork.ts,
 * `solveByMagnitudes`) — against the fixed-point iteration it stands in for, on
 * random boards, on the same boards loaded to the edge of what their supply can
 * carry and past it, and with the neutral broken. The two must give the same state
 * to well inside the solve tolerance, or the same error. The laws (KCL, Ohm, power
 * balance, each load drawing what its model says) are checked on the states the
 * Newton path produced, so the physics checks of conservation.test.ts are sure to
 * cover it. The converged admittances of these solutions are what the ngspice check
 * (test/reference/ngspice.test.ts) feeds to an independent circuit solver.
 *
 * The largest disagreement is written to test/property/.last-newton-agreement.json.
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { analyseSolution, compileBoard, normaliseBoard, solveCompiledBoard, type BoardSpec, type CompiledBoard } from '@trivar/core';
import { FigureLog } from '../support/figureLog.js';
import { boardSpecArb } from './arbitraries/boardSpec.js';
import { assertCurrentLawHolds, assertElementLawsHold, assertLoadModelsHold, assertPowerBalances, ratedPower } from './laws.js';

const figures = new FigureLog(new URL('./.last-newton-agreement.json', import.meta.url));
afterAll(() => figures.write());

/**
 * Both stop when the error left is estimated below 1e-10 of nominal (the default
 * tolerance), so they may differ by about twice that; 1e-9 leaves room for the
 * fixed-point iteration's estimate on slowly contracting boards.
 */
const AGREE = 1e-9;

type Outcome = { readonly ok: true; readonly re: Float64Array; readonly im: Float64Array; readonly method: string } | { readonly ok: false; readonly message: string };

function outcome(compiled: CompiledBoard, run: () => void): Outcome {
  const net = compiled.network;
  try {
    run();
    return { ok: true, re: Float64Array.from(net.voltageRe), im: Float64Array.from(net.voltageIm), method: net.method };
  } catch (error) {
    return { ok: false, message: (error as Error).message };
  }
}

/** Solves with `solve()` and with the fixed-point iteration alone; they must agree. Returns the method `solve()` used. */
function expectSameState(compiled: CompiledBoard, label: string, at: string): string {
  const net = compiled.network;
  const reference = outcome(compiled, () => net.solveByFixedPoint());
  const solved = outcome(compiled, () => net.solve());
  if (!reference.ok || !solved.ok) {
    expect(solved.ok ? `solved (${solved.method})` : solved.message).toBe(reference.ok ? `solved (${reference.method})` : reference.message);
    return solved.ok ? solved.method : 'error';
  }
  let worst = 0;
  for (let v = 0; v < net.nodeCount; v++) {
    if (!net.live[v]) continue;
    worst = Math.max(worst, Math.hypot(solved.re[v]! - reference.re[v]!, solved.im[v]! - reference.im[v]!) / net.circuit.voltageBase);
  }
  figures.note(`largest node-voltage difference, fraction of nominal (${label})`, worst, at);
  expect(worst).toBeLessThanOrEqual(AGREE);
  return solved.method;
}

/** True when some voltage-dependent branch sits below the low-voltage threshold in the last solve. */
function anyHeld(compiled: CompiledBoard, threshold = 0.7): boolean {
  const net = compiled.network;
  return net.circuit.branches.some((b, k) => {
    if (!net.isBranchActive(k) || b.zip.z === 1) return false;
    return Math.hypot(net.branchVoltageRe(k), net.branchVoltageIm(k)) <= threshold * b.vNominal;
  });
}

/** Multiplies every load power of the compiled network by `factor` of the values it was compiled with. */
function scaleLoads(compiled: CompiledBoard, factor: number): void {
  const net = compiled.network;
  net.circuit.branches.forEach((b, k) => {
    net.powerRe[k] = b.sNominal.re * factor;
    net.powerIm[k] = b.sNominal.im * factor;
  });
}

/**
 * The load factor at the edge of collapse for the fixed-point iteration: the largest
 * factor (to 0.1 %) at which it settles with every load above the low-voltage
 * threshold. Null when even 64× the board's loads stay well clear.
 */
function edgeOfCollapse(compiled: CompiledBoard): number | null {
  const fine = (factor: number) => {
    scaleLoads(compiled, factor);
    try {
      compiled.network.solveByFixedPoint({ maxIterations: 400 });
      return !anyHeld(compiled);
    } catch {
      return false;
    }
  };
  let low = 1;
  let high = 1;
  while (fine(high)) {
    low = high;
    high *= 2;
    if (high > 64) return null;
  }
  if (!fine(low)) return null;
  while (high - low > 1e-3 * low) {
    const mid = (low + high) / 2;
    if (fine(mid)) low = mid;
    else high = mid;
  }
  return low;
}

const hasVoltageDependentLoad = (compiled: CompiledBoard) => compiled.network.circuit.branches.some((b) => b.zip.z !== 1);

describe('Newton on the voltage magnitudes against the fixed-point iteration', () => {
  it('gives the same state on random boards, and the laws hold on it', () => {
    const methods: Record<string, number> = {};
    fc.assert(
      fc.property(boardSpecArb(), (spec: BoardSpec) => {
        const compiled = compileBoard(normaliseBoard(spec));
        const at = JSON.stringify(spec);
        const method = expectSameState(compiled, 'random boards', at);
        if (hasVoltageDependentLoad(compiled)) methods[method] = (methods[method] ?? 0) + 1;
        if (method !== 'newton') return;
        compiled.network.solve();
        const solution = solveCompiledBoard(compiled);
        figures.note('kcl on Newton states', assertCurrentLawHolds(solution), at);
        figures.note('element laws on Newton states', assertElementLawsHold(solution), at);
        figures.note('load model on Newton states (relative to |S0|)', assertLoadModelsHold(solution, 1e-8), at);
        figures.note('power balance on Newton states', assertPowerBalances(analyseSolution(solution), ratedPower(solution.board)), at);
      }),
      { numRuns: 200 },
    );
    // Boards with voltage-dependent loads are solved by Newton, so the checks above are not vacuous.
    const total = Object.values(methods).reduce((a, b) => a + b, 0);
    expect(total).toBeGreaterThan(100);
    expect((methods.newton ?? 0) / total).toBeGreaterThan(0.9);
  });

  it('gives the same state near the edge of collapse, and the same state or error past it', () => {
    let nearEdge = 0;
    const arb = fc.tuple(boardSpecArb({ source: 'non-ideal' }), fc.constantFrom(0.5, 0.9, 0.99, 0.999, 1.001, 1.05, 1.5));
    fc.assert(
      fc.property(arb, ([spec, fraction]) => {
        const compiled = compileBoard(normaliseBoard(spec));
        if (!hasVoltageDependentLoad(compiled)) return;
        const edge = edgeOfCollapse(compiled);
        if (edge === null) return;
        scaleLoads(compiled, edge * fraction);
        expectSameState(compiled, `loads at ${fraction} of the edge of collapse`, JSON.stringify({ spec, factor: edge * fraction }));
        if (fraction >= 0.9 && fraction < 1) nearEdge++;
      }),
      { numRuns: 120 },
    );
    expect(nearEdge).toBeGreaterThan(20);
  });

  it('gives the same state or error with the neutral broken (loads in series through the floating bar)', () => {
    const arb = boardSpecArb({ systems: ['three-phase-4wire', 'split-phase'], generation: false });
    fc.assert(
      fc.property(arb, (spec) => {
        const compiled = compileBoard({ ...normaliseBoard(spec), neutralOpen: true });
        expectSameState(compiled, 'neutral broken', JSON.stringify(spec));
      }),
      { numRuns: 150 },
    );
  });
});

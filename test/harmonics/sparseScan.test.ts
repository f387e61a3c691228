/**
 * The resonance scan's sparse factorisation (network/sparseTerminalImpedance.ts) against the dense
 * pivoted inverse it replaced on large networks (network/terminalImpedance.ts):
 * - property: on random installations of 2–20 boards with banks on up to three boards, every pair's
 *   |Z| at every scanned order and in several bank states agrees to 1e-9 relative either way;
 * - a matrix whose first pivot is exactly zero is declined (the caller then inverts the dense one);
 * - a chain of 100 sub-boards is scanned through the sparse path (the dense one took about a minute).
 * The ngspice agreement of the sparse path is in ngspiceInstallationScan.test.ts (a 16-board riser).
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import {
  createInstallationScanEvaluator,
  parseInstallation,
  resolveInstallationHarmonics,
  scanGrid,
  solveInstallationNetwork,
  studyInstallationHarmonics,
  type BankState,
  type InstallationSpec,
} from '@trivar/core';
import { SparseTerminalImpedance } from '../../packages/core/src/network/sparseTerminalImpedance.js';
import { FigureLog } from '../support/figureLog.js';
import { installationSpecArb } from '../property/arbitraries/installationSpec.js';

const figures = new FigureLog(new URL('./.sparse-scan.json', import.meta.url));
afterAll(() => figures.write());

const withBanksArb = fc
  .tuple(
    installationSpecArb({ systems: ['three-phase-4wire', 'three-phase-3wire', 'split-phase'], minBoards: 2, maxBoards: 20 }),
    fc.array(fc.record({ steps: fc.array(fc.double({ min: 2, max: 40, noNaN: true }), { minLength: 1, maxLength: 3 }), detuned: fc.boolean() }), { minLength: 3, maxLength: 3 }),
    fc.integer({ min: 1, max: 3 }),
  )
  .map(([spec, banks, count]) => {
    const { shape: _shape, ...file } = spec;
    const split = file.supply.system === 'split-phase';
    // The banks go on the last boards of the list: the deepest of the tree, where most feeders are in the path.
    const on = file.boards.slice(-Math.min(count, file.boards.length)).map((b) => b.name);
    return {
      ...file,
      harmonics: {
        scan: { maxOrder: 15, step: 0.25 },
        banks: on.map((board, k) => ({
          board,
          connection: split ? 'line-to-line' : k === 1 ? 'star' : 'delta',
          ratedV: split ? 264 : 440,
          stepsKvar: banks[k]!.steps,
          ...(banks[k]!.detuned ? { detuningPercent: 7 } : {}),
        })),
      },
    } as InstallationSpec;
  });

function prepared(spec: InstallationSpec) {
  try {
    const p = resolveInstallationHarmonics(parseInstallation(spec));
    return { ...p, fundamental: solveInstallationNetwork(p.installation) };
  } catch {
    return null; // an installation that cannot carry its loads at the fundamental
  }
}

describe('sparse scan factorisation', () => {
  it('agrees with the dense pivoted inverse on random installations, every pair, order and several bank states (1e-9 relative)', () => {
    let checked = 0;
    let worst = 0;
    fc.assert(
      fc.property(withBanksArb, (spec) => {
        const p = prepared(spec);
        // Installations that cannot carry their loads, or hold no bank, are skipped and do not count
        // towards numRuns: every counted run compares (a plain return made the count a matter of the seed).
        fc.pre(p !== null && p.bankBoards.length > 0);
        checked++;
        const grid = scanGrid(15, 0.5);
        for (const b of p.bankBoards) {
          const sparse = createInstallationScanEvaluator(p.fundamental, p.models, b, { factorisation: 'sparse' });
          const dense = createInstallationScanEvaluator(p.fundamental, p.models, b, { factorisation: 'dense' });
          const all = (on: (k: number, step: number) => boolean): BankState[] =>
            sparse.banks.map((bank, k) => ({ steps: Array.from({ length: bank.stepCount }, (_, s) => on(k, s)), fixedOn: true }));
          const states = [all(() => true), all((_, s) => s === 0), all((k) => k !== sparse.ownBank), all(() => false)];
          const a = new Float64Array(sparse.pairs.length);
          const d = new Float64Array(dense.pairs.length);
          for (const h of grid) {
            sparse.prepare(h);
            dense.prepare(h);
            for (const state of states) {
              sparse.impedancesIn(state, a, 0);
              dense.impedancesIn(state, d, 0);
              d.forEach((z, k) => {
                // An ideal source at the board holds both terminals: 0 Ω either way.
                const error = z === 0 ? Math.abs(a[k]!) : Math.abs(a[k]! - z) / z;
                worst = Math.max(worst, error);
                expect(error, `board ${b}, pair ${sparse.pairs[k]!.join('-')}, h ${h}: sparse ${a[k]}, dense ${z}`).toBeLessThan(1e-9);
              });
            }
          }
        }
      }),
      { numRuns: 16 },
    );
    figures.note('random installations compared', checked);
    figures.note('worst |Z| relative, sparse against dense', worst);
    expect(checked).toBe(16);
  });

  it('declines a matrix whose first pivot is zero, so the caller inverts the dense one', () => {
    // Y = [[0, −1], [−1, 1]]: 1 S between unknowns 0 and 1, −1 S from 0 to the reference.
    const m = new SparseTerminalImpedance(2, [[0, 1], [0, -1]], [0, 1]);
    const between = Int32Array.from(m.slotsOf(0, 1));
    const shunt = Int32Array.from(m.slotsOf(0, -1));
    m.clearBase();
    m.stampBase(between, 0, 1, 0);
    m.stampBase(shunt, 0, -1, 0);
    m.beginState();
    const re = new Float64Array(1);
    const im = new Float64Array(1);
    expect(m.evaluate([[0, 1]], re, im)).toBe(false);
    // With the shunt at +1 S: Y = [[2, −1], [−1, 1]], Y⁻¹ = [[1, 1], [1, 2]] (det 1), so by hand
    // Z(0,1) = z00 + z11 − 2·z01 = 1 Ω (the 1 Ω element; node 1 has no other path), Z(0,ref) = 1 Ω,
    // Z(1,ref) = 2 Ω (the element in series with the shunt).
    m.clearBase();
    m.stampBase(between, 0, 1, 0);
    m.stampBase(shunt, 0, 1, 0);
    m.beginState();
    const zRe = new Float64Array(3);
    const zIm = new Float64Array(3);
    expect(m.evaluate([[0, 1], [0, -1], [1, -1]], zRe, zIm)).toBe(true);
    [1, 1, 2].forEach((z, k) => {
      expect(zRe[k]).toBeCloseTo(z, 14);
      expect(zIm[k]).toBe(0);
    });
  });

  it('a chain of 100 sub-boards scans through the sparse path, its figures those of the same chain solved dense at the main board', () => {
    const boards: InstallationSpec['boards'] = [{ name: 'B0', loads: [{ name: 'motor', connection: 'ABC-delta', kW: 5, pf: 0.8 }] }];
    for (let i = 1; i < 100; i++)
      boards.push({ name: `B${i}`, fedFrom: `B${i - 1}`, feeder: { lengthM: 2, line: { mm2: 240 }, neutral: { mm2: 240 } }, loads: [{ name: `load ${i}`, connection: (['A-N', 'B-N', 'C-N'] as const)[i % 3]!, kW: 0.5 }] });
    const spec = {
      name: 'chain',
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 630, impedancePercent: 6, xOverR: 6 } },
      boards,
      harmonics: { scan: { maxOrder: 13, step: 0.5 }, banks: [{ board: 'B99', connection: 'delta', ratedV: 440, stepsKvar: [5, 5] }] },
    } as InstallationSpec;
    const start = performance.now();
    const study = studyInstallationHarmonics(spec);
    figures.note('100-board chain, study ms', performance.now() - start);
    expect(study.scans.map((s) => s.board)).toEqual(['B99']);
    const p = prepared(spec)!;
    const b = p.bankBoards[0]!;
    const sparse = createInstallationScanEvaluator(p.fundamental, p.models, b);
    const dense = createInstallationScanEvaluator(p.fundamental, p.models, b, { factorisation: 'dense' });
    const a = new Float64Array(sparse.pairs.length);
    const d = new Float64Array(dense.pairs.length);
    for (const h of [1, 5, 7.3, 13]) {
      sparse.prepare(h);
      dense.prepare(h);
      sparse.impedances([true, false], a, 0);
      dense.impedances([true, false], d, 0);
      d.forEach((z, k) => expect(Math.abs(a[k]! - z) / z).toBeLessThan(1e-9));
    }
  });
});

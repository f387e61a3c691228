/**
 * Conservation laws over random boards: Kirchhoff's current law at every node,
 * Ohm's law on every element, the power balance source = loads + losses, and
 * each load drawing what its voltage-dependence model says.
 *
 * The largest residual of each law is written to test/property/.last-residuals.json
 * (tests may not print); the file is regenerated on every run.
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { analyseSolution, normaliseBoard, solveNetwork, type BoardSpec, type NetworkSolution } from '@trivar/core';
import { FigureLog } from '../support/figureLog.js';
import { boardSpecArb } from './arbitraries/boardSpec.js';
import { assertCurrentLawHolds, assertElementLawsHold, assertLoadModelsHold, assertPowerBalances, assertResultCurrentLawHolds, largestCurrent, ratedPower } from './laws.js';

const figures = new FigureLog(new URL('./.last-residuals.json', import.meta.url));
afterAll(() => figures.write());

const solve = (spec: BoardSpec, neutralOpen = false): NetworkSolution => solveNetwork({ ...normaliseBoard(spec), neutralOpen });

/** Every law of this file on one solved board; records the residuals under `label`. */
function checkAllLaws(spec: BoardSpec, solution: NetworkSolution, label: string): void {
  const at = JSON.stringify(spec);
  figures.note(`kcl (${label})`, assertCurrentLawHolds(solution), at);
  figures.note(`element laws (${label})`, assertElementLawsHold(solution), at);
  const result = analyseSolution(solution);
  figures.note(`power balance (${label})`, assertPowerBalances(result, ratedPower(solution.board)), at);
  figures.note(`result kcl (${label})`, assertResultCurrentLawHolds(result, largestCurrent(solution)), at);
}

describe('conservation laws on random boards', () => {
  it('KCL, Ohm and the power balance hold on every kind of board', () => {
    fc.assert(fc.property(boardSpecArb(), (spec) => checkAllLaws(spec, solve(spec), 'all boards')));
  });

  it('they hold with the neutral conductor broken (constant-impedance loads, 4-wire and split-phase)', () => {
    // An open neutral puts line-to-neutral loads in series through the floating
    // bar; constant-impedance keeps that series circuit free of multiple
    // solutions, and no generation keeps every admittance meeting at the bar in
    // the right half-plane (a generator cancelling a load there is a truly
    // singular circuit, which core rightly refuses).
    const arb = boardSpecArb({ systems: ['three-phase-4wire', 'split-phase'], models: 'constant-impedance', generation: false });
    fc.assert(
      fc.property(arb, (spec) => {
        const solution = solve(spec, true);
        expect(solution.neutralCurrent).toEqual({ re: 0, im: 0 });
        checkAllLaws(spec, solution, 'open neutral');
      }),
    );
  });

  it('the source delivers what loads and impedances absorb, on boards that carry current', () => {
    // Guards the balance law against passing on an empty board: every generated
    // board must really move power, so the residual above is measured on real flows.
    fc.assert(
      fc.property(boardSpecArb(), (spec) => {
        const result = analyseSolution(solve(spec));
        const moved = result.loads.reduce((s, l) => s + l.kVA, 0);
        expect(moved).toBeGreaterThan(0.2);
        // Losses are positive real power in resistances: a source that delivered
        // less active power than the loads took would mean a sign slip somewhere.
        expect(result.losses.totalKW).toBeGreaterThanOrEqual(0);
        expect(result.losses.totalKvar).toBeGreaterThanOrEqual(0);
      }),
    );
  });
});

describe('load models', () => {
  it('each branch draws S0·(z·u² + i·u + p) at its converged voltage', () => {
    // The iteration stops when no node moves by more than 1e-10 of nominal, so
    // the drawn power may lag the model by a few parts in 1e10.
    const rel = 1e-8;
    fc.assert(
      fc.property(boardSpecArb(), (spec) => {
        const solution = solve(spec);
        figures.note('load model (relative to |S0|)', assertLoadModelsHold(solution, rel), JSON.stringify(spec));
      }),
    );
  });
});

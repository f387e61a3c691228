import { describe, expect, it } from 'vitest';
import { compileBoard, normaliseBoard, parseBoard, scaleBoardLoads, solveCompiledBoard, solveNetwork } from '@trivar/core';
import { expectComplexClose } from '../support/tolerance.js';

const board = normaliseBoard(
  parseBoard({
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 2 } },
    feeder: { line: { r: 0.05, x: 0.02 }, neutral: { r: 0.08, x: 0.02 } },
    loads: [
      { name: 'oven', connection: 'A-N', kW: 8, pf: 0.97 },
      { name: 'chiller', connection: 'ABC-delta', kW: 12, pf: 0.82 },
      { name: 'dryer', connection: 'ABC-star', starPoint: 'floating', ohms: { r: 20, x: 6 } },
      { name: 'lamps', connection: 'C-N', kW: 2, pf: 0.9, model: 'constant-current' },
    ],
  }),
);
const tol = { rel: 1e-9, abs: 1e-9 };

describe('compiled board: compile once, solve many', () => {
  it('solves the same as solveNetwork, and again the same on a second solve', () => {
    const compiled = compileBoard(board);
    const once = solveCompiledBoard(compiled);
    const twice = solveCompiledBoard(compiled);
    const fresh = solveNetwork(board);
    once.lineCurrents.forEach((i, k) => {
      expectComplexClose(i, fresh.lineCurrents[k]!, tol, `line ${k}`);
      expect(twice.lineCurrents[k]).toEqual(i);
    });
    expectComplexClose(once.neutralCurrent!, fresh.neutralCurrent!, tol, 'neutral');
  });
  it('folds each source into its line: only the bus, neutral bar and star point are unknowns', () => {
    expect(compileBoard(board).network.unknownCount).toBe(5);
  });
  it('new load powers written into the compiled network give the scaled board’s solution', () => {
    const compiled = compileBoard(board);
    for (let k = 0; k < compiled.network.branchCount; k++) {
      compiled.network.powerRe[k] = compiled.network.powerRe[k]! * 0.4;
      compiled.network.powerIm[k] = compiled.network.powerIm[k]! * 0.4;
    }
    const scaled = solveCompiledBoard(compiled);
    const reference = solveNetwork(scaleBoardLoads(board, { fraction: 0.4 }));
    scaled.lineCurrents.forEach((i, k) => expectComplexClose(i, reference.lineCurrents[k]!, tol, `line ${k}`));
  });
});

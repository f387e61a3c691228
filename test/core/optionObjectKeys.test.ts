/**
 * The option objects of the library's entry points are checked like their first arguments: a misspelt
 * or misplaced key, a list or a word where the options go, or a value out of its range is an InputError
 * naming the option's path and what is taken there, never a study run silently on its defaults (a
 * misspelt `board` put the equipment on the main board).
 */
import { describe, expect, it } from 'vitest';
import {
  compareInstallationCorrections,
  correctInstallation,
  InputError,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseInstallation,
  renderPhasorDiagram,
  solveBoard,
  solveInstallation,
  solveNetwork,
  studyHarmonics,
  studyOpenNeutral,
} from '@trivar/core';

/** An invented cold store: a main board and one sub-board of uneven single-phase loads. */
const coldStore = {
  name: 'Fenmoor cold store',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 200, impedancePercent: 4, xOverR: 4 } },
  boards: [
    { name: 'Intake', feeder: { lengthM: 10, line: { mm2: 95 }, neutral: { mm2: 95 } }, loads: [{ name: 'Compressor', connection: 'ABC-delta', kW: 30, pf: 0.78 }] },
    {
      name: 'Packing hall',
      fedFrom: 'Intake',
      feeder: { lengthM: 40, line: { mm2: 25 }, neutral: { mm2: 25 } },
      loads: [
        { name: 'Wrapper', connection: 'A-N', kW: 6, pf: 0.8 },
        { name: 'Labeller', connection: 'B-N', kW: 3, pf: 0.85 },
        { name: 'Fans', connection: 'ABC-star', kW: 9, pf: 0.75 },
      ],
    },
  ],
};
const installation = normaliseInstallation(parseInstallation(coldStore)).installation;

/** The paths of the InputError a call throws, and its message; fails the test if it answers. */
function refusal(call: () => unknown): { paths: string[]; message: string } {
  try {
    call();
  } catch (e) {
    if (e instanceof InputError) return { paths: e.issues.map((i) => i.path), message: e.message };
    throw e;
  }
  throw new Error('the call answered');
}

describe('correctInstallation options', () => {
  it('a misspelt key is refused at its path, with the key meant', () => {
    const r = refusal(() => correctInstallation(installation, { arrangement: 'star-bank' }, { Board: 'Packing hall' } as never));
    expect(r.paths).toEqual(['options.Board']);
    expect(r.message).toContain('options.Board: expected one of the keys taken here ("board"); nearest: "board"');
  });

  it('measuredAt in the options says it belongs in the study target', () => {
    const r = refusal(() => correctInstallation(installation, { arrangement: 'star-bank' }, { board: 'Packing hall', measuredAt: 'origin' } as never));
    expect(r.paths).toEqual(['options.measuredAt']);
    expect(r.message).toContain('measuredAt belongs in the study: spec.target.measuredAt');
  });

  it('a board name where the options go, or a board that is not text, is refused', () => {
    const named = refusal(() => correctInstallation(installation, { arrangement: 'star-bank' }, 'Packing hall' as never));
    expect(named.paths).toEqual(['options']);
    expect(named.message).toMatch(/options: expected an options object \("board"\), or nothing for the defaults \(received "Packing hall"\)/);
    expect(refusal(() => correctInstallation(installation, { arrangement: 'star-bank' }, { board: 2 } as never)).paths).toEqual(['options.board']);
    expect(refusal(() => compareInstallationCorrections(installation, {}, { boards: 'Intake' } as never)).paths).toEqual(['options.boards']);
  });

  it('good options still place the equipment on the board named', () => {
    const c = correctInstallation(installation, { arrangement: 'star-bank' }, { board: 'Packing hall' });
    expect(c.board).toBe('Packing hall');
    expect(c.boardIndex).toBe(1);
    expect(correctInstallation(installation, { arrangement: 'star-bank' }).board).toBe('Intake');
  });
});

describe('other entry points with option objects', () => {
  const bakery = {
    name: 'Quayside bakery',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
    loads: [
      { name: 'Oven', connection: 'ABC-delta', kW: 20, pf: 0.95 },
      { name: 'Tills', connection: 'A-N', kW: 2, pf: 0.9, spectrum: 'switch-mode' },
    ],
  };

  it('solve options: unknown keys and values out of range are named', () => {
    expect(refusal(() => solveBoard(bakery, { openNuetral: true } as never)).message).toContain('options.openNuetral: expected one of the keys taken here ("tolerance", "maxIterations", "lowVoltageThreshold", "openNeutral"); nearest: "openNeutral"');
    expect(refusal(() => solveInstallation(coldStore, { tolerance: 0.5 })).paths).toEqual(['options.tolerance']);
    expect(refusal(() => solveNetwork(normaliseBoard(parseBoard(bakery)), { lowVoltageThreshold: 1.5 })).message).toContain('options.lowVoltageThreshold: expected a number above 0 and at most 1 (per unit) (received 1.5)');
  });

  it('the solver itself and the broken-neutral study refuse a key they do not take', () => {
    const board = normaliseBoard(parseBoard(bakery));
    expect(refusal(() => solveNetwork(board, { maxIteration: 50 } as never)).message).toContain('options.maxIteration: expected one of the keys taken here ("tolerance", "maxIterations", "lowVoltageThreshold"); nearest: "maxIterations"');
    expect(refusal(() => studyOpenNeutral(board, { openNeutral: true } as never)).paths).toEqual(['options.openNeutral']);
    // openNeutral where it belongs still turns the study on.
    expect(solveBoard(bakery, { openNeutral: true }).openNeutral?.applicable).toBe(true);
  });

  it('harmonic study options: the solve options inside them too', () => {
    expect(refusal(() => studyHarmonics(bakery, { scanOrder: [5, 7] } as never)).message).toContain('nearest: "scanOrders"');
    expect(refusal(() => studyHarmonics(bakery, { solve: { maxIterations: 0 } })).paths).toEqual(['options.solve.maxIterations']);
    expect(refusal(() => studyHarmonics(bakery, { solve: { tol: 1e-9 } } as never)).paths).toEqual(['options.solve.tol']);
  });

  it('diagram options: a misspelt key is named', () => {
    const result = solveBoard(bakery);
    expect(refusal(() => renderPhasorDiagram(result, { tilte: 'x' } as never)).message).toContain('nearest: "title"');
    expect(renderPhasorDiagram(result, { title: 'Quayside bakery' })).toContain('Quayside bakery');
  });
});

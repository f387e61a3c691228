/**
 * The bank the correction study builds, run by the profile simulator: its steps
 * and controller settings carry over, and at full load the simulated controller
 * lifts the board to the study's target.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard, readBoardText, simulateBank, switchingFromBank } from '@trivar/core';

describe('switchingFromBank', () => {
  const spec = parseBoard(readBoardText(readFileSync('examples/riverside-cold-store.yaml', 'utf8')));
  const board = normaliseBoard(spec);
  const report = correctBoard(board, spec.correction!);
  const selection = report.selection!;

  it('carries steps and controller settings over', () => {
    const s = switchingFromBank(selection.steps, selection.controller!);
    const switched = selection.steps.filter((x) => x.output !== null && x.part !== 'fixed');
    expect(s.steps.length + s.notSimulated.length).toBe(switched.length);
    expect(s.settings).toEqual({
      targetPf: selection.controller!.targetBand.minPf,
      responseShare: selection.controller!.settingFraction,
      delaySeconds: selection.controller!.switchingDelayS,
      reconnectSeconds: selection.controller!.reconnectionDelayS,
      // The study's band: its upper PF, or unity where leading is not allowed.
      ...(selection.controller!.targetBand.maxPf !== null ? { upperPf: selection.controller!.targetBand.maxPf } : selection.controller!.targetBand.leadingAllowed ? {} : { upperPf: 1 }),
    });
    s.steps.forEach((step) => expect(step.kvar).toBeGreaterThan(0));
    // Every fixed kvar is either placed for the simulator or reported as not placed.
    expect(s.fixed.reduce((a, f) => a + f.kvar, 0) + s.fixedNotSimulatedKvar).toBeCloseTo(s.fixedKvar, 9);
  });

  it('at steady full load, the simulated controller ends at or above the target power factor', () => {
    const s = switchingFromBank(selection.steps, selection.controller!);
    expect(s.steps.length).toBeGreaterThan(0);
    const n = 60;
    const run = simulateBank({
      board,
      drivers: board.loads.map((l, i) => ({ name: l.name, loads: [{ load: i, coefficient: l.branches.reduce((a, b) => ({ re: a.re + b.sNominal.re, im: a.im + b.sNominal.im }), { re: 0, im: 0 }) }] })),
      columns: { count: n, re: board.loads.map(() => new Float64Array(n).fill(1)), im: board.loads.map(() => new Float64Array(n)) },
      utcMs: Float64Array.from({ length: n }, (_, i) => i * 60_000),
      intervalMs: 60_000,
      steps: s.steps,
      settings: s.settings,
    });
    const last = n - 1;
    let w = 0;
    let q = 0;
    for (let k = 0; k < board.phases.length; k++) {
      w += run.figures.phaseW[k]![last]!;
      q += run.figures.phaseVar[k]![last]!;
    }
    // The fixed part is always on in the built bank; add it as the study does.
    const qAfter = q - s.fixedKvar * 1000;
    expect(w / Math.hypot(w, qAfter)).toBeGreaterThanOrEqual(s.settings.targetPf - 0.01);
    expect(run.connectedKvar[last]).toBeGreaterThan(0);
  });
});

/**
 * The equal-share window of a bank under per-line targets (equalShareWindow.ts): an equal bank of
 * `minKvar` per branch meets every line's target and one a little smaller does not; one of
 * `limitKvar` keeps every line inside its lower bound and one a little larger does not. "A little"
 * is twice the window's resolution (1e-10 of the board's kVA, the band round-off may flip), so the
 * thresholds are where the window says to that precision. Checked by solving each equal bank afresh
 * (a new probe, nothing remembered from the window's own trials) on the shipped single-board
 * examples, star and delta.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoardText, type Board } from '@trivar/core';
import { createProbe, type ProbeState } from '../../packages/core/src/correction/_internal/boardProbe.js';
import { equalShareWindow } from '../../packages/core/src/correction/_internal/equalShareWindow.js';
import { lineBands } from '../../packages/core/src/correction/_internal/lineBands.js';
import { resolveTarget } from '../../packages/core/src/correction/correctionTarget.js';
import { deltaSlots, starSlots, type BranchSlot } from '../../packages/core/src/correction/equipment.js';
import type { LineBand } from '../../packages/core/src/correction/_internal/sizeForLineTargets.js';

const EXAMPLES = ['hillside-workshop', 'corner-bakery', 'riverside-cold-store'];

const boardOf = (name: string): Board => normaliseBoard(parseBoardText(readFileSync(`examples/${name}.yaml`, 'utf8')));

/** The window's own tests, with the same 1e-9 slack per unit of each line's kVA. */
function tests(start: ProbeState, targetBands: readonly LineBand[], limitBands: readonly LineBand[]) {
  const weights = start.lineS.map((s) => Math.max(s, 1e-6 * Math.max(...start.lineS)));
  return {
    meets: (s: ProbeState) => s.lineQ.every((q, k) => !Number.isFinite(targetBands[k]!.high) || q - targetBands[k]!.high * Math.abs(s.lineP[k]!) <= 1e-9 * weights[k]!),
    within: (s: ProbeState) => s.lineQ.every((q, k) => q - limitBands[k]!.low * Math.abs(s.lineP[k]!) >= -1e-9 * weights[k]!),
  };
}

describe('equal-share window', () => {
  for (const name of EXAMPLES)
    for (const [kind, slotsOf] of [
      ['star', (b: Board) => starSlots(b, 'neutral')],
      ['delta', deltaSlots],
    ] as [string, (b: Board) => BranchSlot[]][])
      it(`${name}, ${kind} bank: the thresholds lie where the window puts them`, () => {
        const board = boardOf(name);
        const slots = slotsOf(board);
        const target = resolveTarget({ pf: 0.95 }, board, kind === 'star' ? 'star-bank' : 'delta-bank');
        const sizing = createProbe(board, slots, 'window');
        const start = sizing.at(slots.map(() => 0));
        const targetBands = lineBands(target, start, 'target');
        const limitBands = lineBands(target, start, 'limit');
        const window = equalShareWindow(sizing, start, targetBands, limitBands);
        const scale = start.lineS.reduce((a, b) => a + b, 0);
        const step = 2 * 1e-10 * scale;
        // A fresh probe: every equal bank below is solved, none answered from the window's trials.
        const fresh = createProbe(board, slots, 'check');
        const equal = (t: number) => fresh.at(slots.map(() => t));
        const { meets, within } = tests(start, targetBands, limitBands);
        expect(window.limitKvar).toBeGreaterThan(0);
        expect(within(equal(window.limitKvar))).toBe(true);
        expect(within(equal(window.limitKvar + step))).toBe(false);
        if (window.minKvar !== null) {
          expect(window.minKvar).toBeLessThanOrEqual(window.limitKvar);
          expect(meets(equal(window.minKvar))).toBe(true);
          expect(meets(equal(window.minKvar - step))).toBe(false);
        }
      });
});

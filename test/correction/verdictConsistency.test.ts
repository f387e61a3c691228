/**
 * A report never contradicts itself (fast-check over random lagging boards and
 * every arrangement): the status agrees with the re-solved check, the
 * tolerance ends, the balance check and the warnings; a figure said to miss a
 * bound never reads the same as the bound once rounded; the text report fits
 * 100 columns and never prints a negative saving.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { correctBoard, type CorrectionReport, type TargetDefinition } from '@trivar/core';
import { renderCorrectionReport } from '../../packages/cli/src/format/correctionReport.js';
import { laggingBoardArb, runs } from './support/arbitraries.js';

/** Warnings that say the target is (partly) missed: a met verdict may not carry them. */
const MISS_WARNINGS = ['units-below-target', 'tolerance-window', 'units-past-limit', 'tolerance-low', 'tolerance-high'];

function assertConsistent(report: CorrectionReport): void {
  const v = report.verification;
  const codes = report.warnings.map((w) => w.code);
  switch (report.status) {
    case 'meets-target':
      expect(v.check.met).toBe(true);
      expect(v.tolerance.low.check.met).toBe(true);
      expect(v.tolerance.high.check.leadingLines).toEqual([]);
      for (const code of MISS_WARNINGS) expect(codes).not.toContain(code);
      expect(report.reasons).toEqual([]);
      if (report.balance) expect(report.balance.met).toBe(true);
      break;
    case 'meets-target-at-nominal-capacitance':
      expect(v.check.met).toBe(true);
      expect(!v.tolerance.low.check.met || v.tolerance.high.check.leadingLines.length > 0).toBe(true);
      // A branch said to fall "short of the target" would contradict the board meeting it at nominal capacitance.
      expect(codes).not.toContain('units-below-target');
      break;
    case 'already-meets-target':
      expect(report.selection).toBeNull();
      expect(codes).toContain('nothing-to-do');
      break;
    default:
      expect(report.reasons.length).toBeGreaterThan(0);
  }
  // "X, below the target Y" / "X %, above the Y %": X and Y never read the same.
  const texts = [...report.reasons, ...report.warnings.map((w) => w.message), ...v.check.shortfalls];
  for (const text of texts)
    for (const m of text.matchAll(/(\d+\.\d+)(?: \w+)?(?: %)?,? (?:below|above|past) the (?:target |upper bound )?(\d+\.\d+)/g)) expect(m[1], text).not.toBe(m[2]);
  const out = renderCorrectionReport(report);
  for (const line of out.split('\n')) expect(line.length, line).toBeLessThanOrEqual(100);
  expect(out).not.toMatch(/saves -|released -|releases -/);
  expect(out).not.toMatch(/minimise .*QP/);
}

const targetArb = fc.record({
  pf: fc.double({ min: 0.85, max: 0.99, noNaN: true }),
  definition: fc.constantFrom<TargetDefinition>('per-line', 'effective', 'vector', 'positive-sequence'),
});

describe('verdicts agree with the figures and the warnings', () => {
  it('star and delta banks, any target, 3- and 4-wire boards', () => {
    fc.assert(
      fc.property(laggingBoardArb(), targetArb, fc.constantFrom('star-bank' as const, 'delta-bank' as const), fc.boolean(), (board, target, arrangement, light) => {
        assertConsistent(correctBoard(board, { arrangement, target, ...(light ? { lightLoad: { fraction: 0.3 } } : {}) }));
      }),
      { numRuns: runs(25) },
    );
  });

  it('balancing compensators, capacitors only or with reactors', () => {
    fc.assert(
      fc.property(laggingBoardArb({ source: 'ideal' }), fc.double({ min: 0.9, max: 1, noNaN: true }), fc.constantFrom('allowed' as const, 'none' as const), (board, pf, reactors) => {
        assertConsistent(correctBoard(board, { arrangement: 'balancing-compensator', target: { pf }, compensator: { reactors } }));
      }),
      { numRuns: runs(10) },
    );
  });
});

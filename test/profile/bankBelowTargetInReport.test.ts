/**
 * The report's load-over-time section states what `trivar profile` states of a simulated bank that misses
 * its target: the hours below it and why. An invented print shop whose bank was built as two 2.5 kvar steps
 * for a 2.77 kvar need, the second of which never closes.
 */
import { describe, expect, it } from 'vitest';
import { belowTargetWords, checkIntervalSequence, createRowReader, driverColumns, normaliseBoard, parseBoard, planColumns, planDrivers, profileSection, studyProfile } from '@trivar/core';

const SHOP = {
  name: 'Birch Road print shop',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [
    { name: 'Dryers', connection: 'A-N', kW: 10, pf: 0.9, model: 'constant-impedance' },
    { name: 'Compressor', connection: 'B-N', kW: 6, pf: 0.8, model: 'constant-impedance' },
    { name: 'Kettle room', connection: 'C-N', kW: 4, pf: 1, model: 'constant-impedance' },
  ],
  profile: { bank: { steps: [{ kvar: 2.5 }, { kvar: 2.5 }] } },
};

describe('a bank that misses its target, in the report', () => {
  it('the hours below the target and the reason, in the words profile prints', () => {
    const spec = parseBoard(SHOP);
    const board = normaliseBoard(spec);
    const plan = planColumns(board, ['time', 'Dryers [x]', 'Compressor [x]', 'Kettle room [x]']);
    const reader = createRowReader(plan, { timeZone: 'UTC' });
    ['08:00', '08:30', '09:00', '09:30'].forEach((t, k) => reader.push([`2026-04-14T${t}:00Z`, '1', '1', '1'], k + 2));
    const table = checkIntervalSequence(reader.finish(), 'none');
    const input = { board: plan.board, drivers: planDrivers(plan), columns: driverColumns(plan, table.values, table.count), utcMs: table.utcMs, intervalMs: table.intervalMs, profile: spec.profile! };
    const r = studyProfile(input, { bank: true }).result;
    // 2.77 kvar needed; after the first step 0.27 kvar is left, under 0.65 × 2.5 = 1.63 kvar: the second never closes.
    // The first step is in from the start (the bank starts settled; its start-up closing is not counted).
    expect(r.bank!.steps.map((s) => s.closings)).toEqual([0, 0]);
    expect(r.bank!.belowTarget).toEqual({ hours: 2, allStepsInHours: 0, shortOfStepsHours: 0, shortOfStepsOpenKvar: 0, underResponseHours: 2, underResponseChannels: [{ channel: 'ABC', smallestKvar: 2.5 }], stepTooCoarseHours: 0, stepTooCoarseChannels: [], openStepsTooLargeHours: 0, onTheWayHours: 0, openStepsTooLarge: null });
    const words = belowTargetWords(r.bank!)!;
    expect(words).toBe('board PF below 0.95 with the bank: 2.00 h of import — 2.00 h with the shortfall under the switching threshold (0.65 × 2.5 kvar = 1.63 kvar: no step closes for it)');
    const facts = profileSection(r, []).blocks.flatMap((b) => (b.kind === 'facts' ? b.items : []));
    expect(facts).toContainEqual(['Hours below the target with the bank', words]);
  });
});

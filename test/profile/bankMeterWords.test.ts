/** The hours below the target say where they are worked: the bank's board, or where its controller measures upstream. */
import { describe, expect, it } from 'vitest';
import { belowTargetWords, type ProfileBankResult } from '@trivar/core';

const bank = (measuredAt: string | null) =>
  ({
    measuredAt,
    steps: [{ step: 1, channel: 'ABC', kvar: 3, closings: 2, openings: 2, closingsPerYear: 730 }],
    settings: { targetPf: 0.98, upperPf: null, responseShare: 0.67 },
    belowTarget: { hours: 4, allStepsInHours: 4, underResponseHours: 0, stepTooCoarseHours: 0, openStepsTooLargeHours: 0, onTheWayHours: 0, openStepsTooLarge: null },
  }) as unknown as ProfileBankResult;

describe('belowTargetWords', () => {
  it('at the bank\'s own board: the board PF', () => {
    expect(belowTargetWords(bank(null))).toBe('board PF below 0.98 with the bank: 4.00 h of import — 4.00 h with every step in (the bank too small for that load)');
  });
  it('measured at the origin: the PF there, said so', () => {
    expect(belowTargetWords(bank('origin'))).toMatch(/^PF at the origin \(the supply's terminals, where the controller measures\) below 0\.98 with the bank: 4\.00 h of import/);
  });
  it('measured at an upstream board: its incomer, named', () => {
    expect(belowTargetWords(bank('Kiln shed'))).toMatch(/^PF at the incomer of Kiln shed \(where the controller measures\) below 0\.98/);
  });
});

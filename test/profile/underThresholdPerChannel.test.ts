/**
 * The hours a bank of single-phase steps leaves under the switching threshold are explained with each
 * channel's own threshold (responseShare × that channel's smallest step), as the controller judges them:
 * never another phase's smaller step. An invented potting shed: 1 kvar on A, 5 kvar on B.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { belowTargetWords, type ProfileBankResult } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';

const BOARD = 'test/fixtures/profile/potting-shed-phase-steps.yaml';
const DATA = 'test/fixtures/profile/potting-shed-phase-steps.csv';
const TAN_095 = Math.tan(Math.acos(0.95)); // 0.328684

describe('under the switching threshold, per channel', () => {
  it('the pump alone on B: B short by 1.26 kvar, quoted against B\'s 3.25 kvar threshold, not A\'s 0.65 kvar', () => {
    // Pump at half load: 3 kW, 3·0.75 = 2.25 kvar; need 2.25 − 3·0.3287 = 1.264 kvar. That is above A's
    // 0.65 × 1 = 0.65 kvar, so A's threshold cannot explain it; B's own is 0.65 × 5 = 3.25 kvar.
    expect(2.25 - 3 * TAN_095).toBeCloseTo(1.264, 3);
    const dir = mkdtempSync(join(tmpdir(), 'trivar-per-channel-'));
    const data = join(dir, 'pump-alone.csv');
    writeFileSync(data, ['time,Tray washer [x],Irrigation pump [x]', ...['06:00', '06:30', '07:00', '07:30'].map((t) => `2026-05-11T${t},0,0.5`)].join('\n') + '\n');
    const r = runTrivar(['profile', BOARD, '--data', data, '--bank']);
    expect(r.stderr).toBe('');
    const text = r.stdout.replace(/\s+/g, ' ');
    expect(text).toContain(
      'board PF below 0.95 with the bank: 2.00 h of import — 2.00 h with the shortfall on phase B under the switching threshold there (0.65 × 5.0 kvar = 3.25 kvar: no step closes for it)',
    );
    expect(text).not.toContain('0.65 × 1.0 kvar');
    const json = JSON.parse(runTrivar(['profile', BOARD, '--data', data, '--bank', '--json']).stdout);
    expect(json.bank.belowTarget).toMatchObject({ hours: 2, underResponseHours: 2, underResponseChannels: [{ channel: 'B', smallestKvar: 5 }] });
  });

  it('washer and pump both short, each under its own threshold: both thresholds quoted, each with its phase', () => {
    // Washer: 3 kW at PF 0.93, 3·0.3952 = 1.186 kvar, need 0.200 kvar < 0.65 (A). Pump as above, 1.264 < 3.25 (B).
    expect(3 * Math.tan(Math.acos(0.93)) - 3 * TAN_095).toBeCloseTo(0.2, 2);
    const r = runTrivar(['profile', BOARD, '--data', DATA, '--bank', '--json']);
    expect(r.stderr).toBe('');
    const bank = JSON.parse(r.stdout).bank as ProfileBankResult;
    expect(bank.belowTarget).toMatchObject({ hours: 4, underResponseHours: 4, underResponseChannels: [{ channel: 'A', smallestKvar: 1 }, { channel: 'B', smallestKvar: 5 }] });
    expect(belowTargetWords(bank)).toBe(
      "board PF below 0.95 with the bank: 4.00 h of import — 4.00 h with the shortfall under each channel's own switching threshold (0.65 × 1.0 kvar = 0.65 kvar on phase A, 0.65 × 5.0 kvar = 3.25 kvar on phase B: no step closes for it)",
    );
  });

  const handBuilt = (channels: ProfileBankResult['belowTarget']['underResponseChannels'], steps: { channel: string; kvar: number }[]) =>
    ({
      measuredAt: null,
      source: 'board-file-steps',
      steps: steps.map((s, k) => ({ step: k + 1, ...s, closings: 0, openings: 0, closingsPerYear: 0 })),
      placeWords: { ABC: 'three-phase', A: 'on phase A', B: 'on phase B', C: 'on phase C' },
      settings: { targetPf: 0.95, upperPf: null, responseShare: 0.67 },
      belowTarget: { hours: 1, allStepsInHours: 0, underResponseHours: 1, underResponseChannels: channels, stepTooCoarseHours: 0, openStepsTooLargeHours: 0, onTheWayHours: 0, openStepsTooLarge: null },
      settledShortTrial: null,
    }) as unknown as ProfileBankResult;

  it('channels with one threshold share it; a shortfall no step answers to is not put down to a threshold', () => {
    const steps = [{ channel: 'A', kvar: 2 }, { channel: 'B', kvar: 2 }, { channel: 'B', kvar: 4 }];
    expect(belowTargetWords(handBuilt([{ channel: 'A', smallestKvar: 2 }, { channel: 'B', smallestKvar: 2 }], steps))).toBe(
      'board PF below 0.95 with the bank: 1.00 h of import — 1.00 h with the shortfall on phase A and on phase B under the switching threshold there (0.67 × 2.0 kvar = 1.34 kvar each: no step closes for it)',
    );
    // Steps on A and B, the board short on C alone.
    expect(belowTargetWords(handBuilt([], steps))).toBe(
      "board PF below 0.95 with the bank: 1.00 h of import — 1.00 h short of the target on lines no step answers to (every step's own reading at or above the target)",
    );
    // Three-phase steps beside a phase step: the board's channel is named as the whole board.
    expect(belowTargetWords(handBuilt([{ channel: 'ABC', smallestKvar: 5 }], [{ channel: 'ABC', kvar: 5 }, { channel: 'A', kvar: 1 }]))).toContain(
      '1.00 h with the shortfall on the whole board under the switching threshold there (0.67 × 5.0 kvar = 3.35 kvar: no step closes for it)',
    );
  });

  it('a split-phase board: each line-to-neutral step named the board\'s way, never "phase" or "three-phase"', () => {
    // Invented: a creek cabin, a 1.5 kW fan at PF 0.93 on one line (0.10 kvar short, under 0.65) and a 3 kW pump
    // at PF 0.8 at half load on the other (1.5 kW, 1.125 − 0.493 = 0.63 kvar short, under 3.25).
    const dir = mkdtempSync(join(tmpdir(), 'trivar-per-channel-'));
    const board = join(dir, 'creek-cabin.yaml');
    writeFileSync(
      board,
      [
        'name: Creek cabin',
        'supply: { system: split-phase, voltage: { lineToNeutral: 120 }, frequencyHz: 60 }',
        'loads:',
        '  - { name: Fan, connection: A-N, kW: 1.5, pf: 0.93 }',
        '  - { name: Pump, connection: B-N, kW: 3, pf: 0.8 }',
        'profile: { bank: { steps: [{ kvar: 1, phase: A }, { kvar: 5, phase: B }] } }',
        '',
      ].join('\n'),
    );
    const data = join(dir, 'cabin.csv');
    writeFileSync(data, 'time,Fan [x],Pump [x]\n2026-05-11T06:00,1,0.5\n2026-05-11T06:30,1,0.5\n');
    const text = runTrivar(['profile', board, '--data', data, '--bank']).stdout.replace(/\s+/g, ' ');
    expect(text).toContain(
      "1.00 h with the shortfall under each channel's own switching threshold (0.65 × 1.0 kvar = 0.65 kvar line-to-neutral on A, 0.65 × 5.0 kvar = 3.25 kvar line-to-neutral on B: no step closes for it)",
    );
  });
});


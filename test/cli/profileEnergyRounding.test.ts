/** The energy table of `trivar profile`: round-off cleared before rounding, so lines read as the board's figures do. */
import { describe, expect, it } from 'vitest';
import type { ProfileSummary } from '@trivar/core';
import { energyTable } from '../../packages/cli/src/format/profileReport.js';
import { thousands } from '../../packages/cli/src/format/textTable.js';
import { labellerOf } from '@trivar/core';

/** A dairy's four hours: lines A and C at 1.875 kvar (7.5 kvarh, as the sums come out of the solver), B at 3.75. */
const energy = (scale: number) =>
  ({
    energy: {
      phases: [
        { phase: 'A', kWh: 16 * scale, kvarh: 7.499999999999998 * scale },
        { phase: 'B', kWh: 19 * scale, kvarh: 15.000000000000002 * scale },
        { phase: 'C', kWh: 10 * scale, kvarh: 7.499999999999998 * scale },
      ],
      kWhImport: 45 * scale,
      kvarhLagging: 30 * scale,
      kWhExport: 0,
      kvarhLeading: 0,
      billingPf: 0.8321,
    },
  }) as unknown as ProfileSummary;

describe('energy figures', () => {
  it('7.499999999999998 rounds as 7.5 does', () => {
    expect(thousands(7.499999999999998)).toBe('8');
    expect(thousands(74_999.99999999999)).toBe('75,000');
    expect(thousands(-0.2)).toBe('0');
  });
  it('a small record: one decimal, so the lines add up to the board as printed (7.5 + 15.0 + 7.5 = 30.0)', () => {
    const table = energyTable(energy(1), labellerOf('A/B/C'));
    expect(table).toMatch(/^ {2}line A +16\.0 +7\.5$/m);
    expect(table).toMatch(/^ {2}line B +19\.0 +15\.0$/m);
    expect(table).toMatch(/^ {2}line C +10\.0 +7\.5$/m);
    expect(table).toMatch(/^ {2}board, imported +45\.0 +30\.0 lag$/m);
  });
  it('figures of 100 and more: whole units, round-off cleared first (7,499.999… reads 7,500)', () => {
    const table = energyTable(energy(1000), labellerOf('A/B/C'));
    expect(table).toMatch(/^ {2}line A +16,000 +7,500$/m);
    expect(table).toMatch(/^ {2}board, imported +45,000 +30,000 lag$/m);
  });
});

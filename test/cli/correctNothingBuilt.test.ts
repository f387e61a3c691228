/**
 * A bank no unit of the catalogue suits buys nothing: the report said "chosen for least cost … (cost 0.0)"
 * for a bank of 0 units. With nothing bought it now states no cost and no least-cost claim.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard } from '@trivar/core';
import { renderCorrectionReport } from '../../packages/cli/src/format/correctionReport.js';

// A cider barn (invented) on a 240/120 V split-phase service; the typical North-American units are
// rated 240 V and up, which deliver too little on its 120 V legs.
const ciderBarn = () =>
  normaliseBoard(
    parseBoard({
      name: 'Hollin cider barn',
      supply: { system: 'split-phase', voltage: { lineToLine: 240 }, frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2.5, xOverR: 2 } },
      loads: [
        { name: 'Press motor', connection: 'L1-N', kW: 3, pf: 0.7 },
        { name: 'Transfer pump', connection: 'L1-L2', kW: 5, pf: 0.75 },
        { name: 'Cold room', connection: 'L2-N', kW: 1.5, pf: 0.95 },
      ],
    }),
  );

describe('a line-to-neutral bank no typical unit suits', () => {
  const report = correctBoard(ciderBarn(), { arrangement: 'star-bank' });
  const text = renderCorrectionReport(report);

  it('buys nothing and says so, with no cost and no least-cost claim', () => {
    expect(report.selection!.units).toBe(0);
    expect(report.selection!.unbuildable).not.toBeNull();
    expect(text).toContain('no unit bought, so no build and no cost to state');
    expect(text).not.toContain('chosen for least cost');
    expect(text).not.toMatch(/\(cost 0\.0\)/);
  });
});

describe('the CT primary\'s schema description', () => {
  it('names the switched steps\' states among those the CT is sized on, in both shipped schemas', async () => {
    const { readFileSync } = await import('node:fs');
    for (const file of ['board.schema.json', 'installation.schema.json']) {
      const text = readFileSync(new URL(`../../packages/core/${file}`, import.meta.url), 'utf8');
      expect(text).toContain('before or after correction or in any state of the switched steps, whichever is largest');
      expect(text).not.toContain('before or after correction, whichever is larger');
    }
  });
});

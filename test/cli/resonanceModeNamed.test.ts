/**
 * A resonance line or report that names the lowest order first must say which order (mode) is near a watched
 * harmonic, not only the harmonic: the hillside workshop's star bank (invented example) has modes at 8.03 (clear
 * of every band: the 7th's ends at 7.7, the 9th's starts at 8.1) and 12.64 (within 10 % of the 13th: 11.7–14.3).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { correctBoard, normaliseBoard, parseBoard, readBoardText } from '@trivar/core';
import { resonanceSection } from '../../packages/core/src/render/report/correctionSection.js';
import { runTrivar } from './runTrivar.js';

const ARGS = ['correct', 'examples/hillside-workshop.yaml', '--arrangement', 'star-bank'];

describe('the mode near a harmonic order is named', () => {
  const v = (JSON.parse(runTrivar([...ARGS, '--json']).stdout) as { verification: { resonanceOrders: number[]; resonanceNearOrders: number[] } }).verification;

  it('the JSON: the lowest mode clear, the second near the 13th', () => {
    expect(v.resonanceOrders[0]!).toBeGreaterThan(7.7);
    expect(v.resonanceOrders[0]!).toBeLessThan(8.1);
    expect(Math.abs(v.resonanceOrders[1]! - 13)).toBeLessThanOrEqual(1.3);
    expect(v.resonanceNearOrders).toEqual([13]);
  });

  it('trivar correct: "within 10 % of order 13 (12.64)", the mode given beside the order', () => {
    const text = runTrivar(ARGS).stdout.replace(/\s+/g, ' ');
    expect(text).toContain(`within 10 % of order 13 (${v.resonanceOrders[1]!.toFixed(2)});`);
  });

  it('trivar report: the warning names the mode, not "the resonance" just named as the lowest', () => {
    const { correction: _c, ...spec } = readBoardText(readFileSync('examples/hillside-workshop.yaml', 'utf8')) as Record<string, unknown>;
    const report = correctBoard(normaliseBoard(parseBoard(spec)), { arrangement: 'star-bank', target: { pf: 0.95 } });
    const section = resonanceSection(report)!;
    const warning = section.blocks.find((b) => b.kind === 'list' && b.tone === 'warning') as { readonly items: readonly string[] };
    expect(warning.items[0]).toContain(`${report.verification.resonanceOrders[1]!.toFixed(2)} (the 13th)`);
    expect(warning.items[0]).not.toMatch(/The resonance lies within/);
  });
});

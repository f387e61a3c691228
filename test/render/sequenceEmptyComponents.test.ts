/**
 * A sequence component that is none (round-off read as zero) is said in its panel, not drawn as
 * zero-length phasors with A/B/C labels and a heading of "0.000 V".
 */
import { describe, expect, it } from 'vitest';
import { renderSequenceDiagram, solveBoard } from '@trivar/core';

describe('sequence diagram of a balanced board', () => {
  // A barn roof's PV array (invented): a balanced three-phase export, so no zero or negative sequence.
  const result = solveBoard({
    name: 'barn roof PV',
    supply: { voltage: '400/230', frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
    loads: [{ name: 'PV array', connection: 'ABC-star', kW: -30 }],
  });
  const svg = renderSequenceDiagram(result);

  it('says "none" in the empty panels, with no "0.000" heading', () => {
    expect(result.sequences!.current.negative.magnitude).toBe(0);
    const empty = [...svg.matchAll(/class="phasor-label empty-component" data-component="(\w+)"/g)].map((m) => m[1]);
    expect(empty.length).toBeGreaterThanOrEqual(2);
    expect(empty).toContain('negative');
    expect(svg).toContain('>negative: none<');
    expect(svg).not.toMatch(/negative 0\.000 [VA]/);
  });
});

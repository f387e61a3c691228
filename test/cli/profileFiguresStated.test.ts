/**
 * `trivar profile` says what its figures rest on: no "-0" printed, and (further down) the cases where a
 * figure could mislead are stated in words.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const SHED = 'test/fixtures/profile/orchard-packing-shed.yaml';
const SHED_DATA = 'test/fixtures/profile/orchard-packing-shed.csv';

describe('trivar profile figures', () => {
  it('a line whose reactive energy nets to a small negative figure prints 0, never "-0"', () => {
    // Line A: +0.2 kvar then -0.6 kvar for half an hour each: -0.2 kvarh, which rounds to 0.
    const r = runTrivar(['profile', SHED, '--data', SHED_DATA]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^ {2}line A +3 +0$/m);
    expect(r.stdout).not.toMatch(/(^|[\s(])-0(?![.\d])/m);
    const json = JSON.parse(runTrivar(['profile', SHED, '--data', SHED_DATA, '--json']).stdout);
    expect(json.before.energy.phases[0].kvarh).toBeCloseTo(-0.2, 6);
  });
});

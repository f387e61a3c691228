/**
 * `measuredAt: origin` is the supply's terminals. A board named "origin" would make the word name two
 * places, each a different reading (the service cable lies between them), so the study refuses it,
 * naming the field and the word, whether the point comes from the file or from --measured-at.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from '../cli/runTrivar.js';

/** An invented yard: a main board feeding a shed with a large lagging motor. */
const yard = (mainName: string, correction = '') =>
  [
    'name: Yard',
    'supply: { system: three-phase-4wire, voltage: "230/400", frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } }',
    'boards:',
    `  - name: ${mainName}`,
    '    feeder: { lengthM: 60, line: { mm2: 95 }, neutral: { mm2: 95 } }',
    '    loads: [ { name: Lights, connection: A-N, kW: 5, pf: 0.9 } ]',
    '  - name: Shed',
    `    fedFrom: ${mainName}`,
    '    feeder: { lengthM: 80, line: { mm2: 25 }, neutral: { mm2: 25 } }',
    '    loads: [ { name: Motor, connection: ABC-delta, kW: 30, pf: 0.72 } ]',
    correction,
  ].join('\n');
const AMBIGUOUS = 'expected a metering point that names one place: "origin" is the word for the supply\'s terminals';

describe('a board named "origin"', () => {
  it('the two places the word could mean read differently: the supply’s terminals and the main board’s incomer', () => {
    const at = (point: string) => JSON.parse(runTrivar(['correct', '-', '--board', 'Shed', '--arrangement', 'delta-bank', '--measured-at', point, '--json'], yard('Origin')).stdout);
    const origin = at('origin');
    const board = at('Origin');
    expect(origin.report.verification.metering.point).toBe('origin');
    expect(board.report.verification.metering.point).toBe('Origin');
    // The service cable's losses are metered at the origin and not at the board it feeds.
    expect(origin.report.verification.metering.kW.before).toBeGreaterThan(board.report.verification.metering.kW.before);
  });

  it('--measured-at origin is refused as a command line that does not fit the file (exit 2), naming the option and the word', () => {
    const r = runTrivar(['correct', '-', '--board', 'Shed', '--arrangement', 'delta-bank', '--measured-at', 'origin'], yard('origin'));
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(`--measured-at: ${AMBIGUOUS}`);
    expect(r.stdout).toBe('');
  });

  it('measuredAt: origin in the file is refused at correction.target.measuredAt', () => {
    const r = runTrivar(['correct', '-'], yard('origin', 'correction: { board: Shed, arrangement: delta-bank, target: { measuredAt: origin } }'));
    expect(r.code).toBe(3);
    expect(r.stderr).toContain(`target.measuredAt: ${AMBIGUOUS}`);
  });

  it('a board file named "origin" measured at origin: refused, not read as the board itself', () => {
    const board = [
      'name: origin',
      'supply: { system: three-phase-4wire, voltage: "230/400", frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } }',
      'feeder: { lengthM: 60, line: { mm2: 95 }, neutral: { mm2: 95 } }',
      'loads: [ { name: Motor, connection: ABC-delta, kW: 30, pf: 0.72 } ]',
      'correction: { arrangement: delta-bank, target: { measuredAt: origin } }',
    ].join('\n');
    const r = runTrivar(['correct', '-'], board);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain(AMBIGUOUS);
  });

  it('the board may still be named so where no metering point is asked for', () => {
    expect(runTrivar(['solve', '-'], yard('origin')).code).toBe(0);
  });
});

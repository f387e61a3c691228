/**
 * A board of an installation with its own voltage limits (`boards[i].voltageLimits`): used
 * by that board's checks in every study that judges voltages (the solve's warnings and
 * verdict, the correction study's verification and its effect on every board), while the
 * other boards keep the installation's; bad input is refused at its field path.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { correctInstallation, normaliseInstallation, parseInstallation, readBoardText, solveInstallation, validateInstallation, type InstallationResult } from '@trivar/core';

const riserText = readFileSync(new URL('../../examples/maple-court-riser.yaml', import.meta.url), 'utf8');
type Spec = { boards: Record<string, unknown>[] } & Record<string, unknown>;
/** The riser with `limits[name]` written on the board of that name. */
const riser = (limits: Record<string, unknown>): Spec => {
  const spec = readBoardText(riserText) as Spec;
  return { ...spec, boards: spec.boards.map((b) => (limits[b.name as string] === undefined ? b : { ...b, voltageLimits: limits[b.name as string] })) };
};
const boardOf = (r: InstallationResult, name: string) => r.boards.find((b) => b.name === name)!.result;

describe('a board with its own voltage limits', () => {
  // Floor 4 sits lowest, about 96.9 % of nominal (the file's own figures): inside EN 50160's −10 %,
  // outside a utilisation-point range of −1 % chosen here for sensitive equipment.
  const solved = solveInstallation(riser({ 'Floor 4': { underPercent: 1, overPercent: 1 } }));

  it('is judged against them: verdict, warnings and the limits shown agree', () => {
    const floor4 = boardOf(solved, 'Floor 4');
    expect(floor4.voltageCheck.limits).toMatchObject({ preset: 'custom', underPercent: 1, overPercent: 1 });
    expect(floor4.voltageCheck.verdict).toBe('under');
    expect(floor4.warnings.some((w) => w.code === 'board-undervoltage')).toBe(true);
    expect(floor4.conventions.voltageLimits.underPercent).toBe(1);
  });

  it('leaves every other board on the installation’s limits (EN 50160 by default)', () => {
    for (const b of solved.boards.filter((x) => x.name !== 'Floor 4')) {
      expect(b.result.voltageCheck.limits.preset).toBe('en50160-supply');
      expect(b.result.voltageCheck.verdict).toBe('within');
      expect(b.result.warnings.some((w) => w.code.includes('undervoltage'))).toBe(false);
    }
  });

  it('on the main board, does not spread to the boards it feeds', () => {
    const r = solveInstallation(riser({ 'Main switchboard': 'c84-service-a' }));
    expect(boardOf(r, 'Main switchboard').voltageCheck.limits.preset).toBe('c84-service-a');
    for (const b of r.boards.slice(1)) expect(b.result.voltageCheck.limits.preset).toBe('en50160-supply');
  });

  it('takes the place of the file’s conventions.voltageLimits for that board only', () => {
    const spec = { ...riser({ 'Plant room': 'uk-supply' }), conventions: { voltageLimits: 'c84-service-b' } };
    const r = solveInstallation(spec);
    expect(boardOf(r, 'Plant room').voltageCheck.limits.preset).toBe('uk-supply');
    expect(boardOf(r, 'Floor 1').voltageCheck.limits.preset).toBe('c84-service-b');
  });

  it('is what the correction study verifies against, on the bank board and in its effect on every board', () => {
    const spec = riser({ 'Floor 4': { underPercent: 1, overPercent: 1 } });
    const installation = normaliseInstallation(parseInstallation(spec)).installation;
    const c = correctInstallation(installation, { arrangement: 'star-bank', target: { pf: 0.99 } }, { board: 'Floor 4' });
    expect(c.report.verification.before.voltageCheck.limits.underPercent).toBe(1);
    expect(c.report.verification.before.voltageCheck.verdict).toBe('under');
    const floor4 = c.effect.boards.find((b) => b.name === 'Floor 4')!;
    expect(floor4.loadsOutsideVoltageBand.before).toBeGreaterThan(0);
    for (const b of c.effect.boards.filter((x) => x.name !== 'Floor 4')) expect(b.loadsOutsideVoltageBand.before).toBe(0);
  });

  it('is the same voltage whether or not the board has its own limits (limits judge, they never change the solve)', () => {
    const plain = solveInstallation(riser({}));
    solved.boards.forEach((b, i) => b.result.phases.forEach((p, k) => expect(p.voltage).toEqual(plain.boards[i]!.result.phases[k]!.voltage)));
  });
});

describe('bad per-board limits', () => {
  it.each([
    { limits: 'en50160', code: 'invalid_value', path: 'boards[5].voltageLimits', words: 'en50160-supply' },
    { limits: 7, code: 'invalid_value', path: 'boards[5].voltageLimits', words: 'or an object' },
    { limits: { underPercent: 60, overPercent: 5 }, code: 'out_of_range', path: 'boards[5].voltageLimits.underPercent', words: '<= 50' },
    { limits: { underPercent: 5 }, code: 'missing', path: 'boards[5].voltageLimits.overPercent', words: 'a number' },
    { limits: { underPercent: 5, overPercent: 5, band: 3 }, code: 'unknown_key', path: 'boards[5].voltageLimits.band', words: 'keys taken here ("underPercent", "overPercent")' },
  ])('$path: $code', ({ limits, code, path, words }) => {
    const result = validateInstallation(riser({ 'Floor 4': limits }));
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues).toHaveLength(1);
    expect(result.issues[0]).toMatchObject({ code, path });
    expect(result.issues[0]!.message).toContain(words);
  });
});

/**
 * `measureAt: "main"` and `"each"` are words of the study; a board may carry the same name. Where it is a
 * sub-board (or, for "each", any board of several) the word could mean either, and the study is refused at
 * `measureAt`, saying what to write instead; the main board called "main" is no clash (both readings are its
 * incomer). An invented two-board gallery.
 */
import { describe, expect, it } from 'vitest';
import { InputError, normaliseInstallation, parseInstallation, rebalanceInstallation } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const gallery = (mainName: string, subName: string) => ({
  name: 'Saltmarsh gallery',
  supply: { voltage: '230/400', frequencyHz: 50, transformer: { kVA: 160, impedancePercent: 4, xOverR: 3 } },
  boards: [
    {
      name: mainName,
      feeder: { lengthM: 10, line: { mm2: 70 }, neutral: { mm2: 70 } },
      loads: [
        { name: 'Cafe', connection: 'A-N', kW: 6 },
        { name: 'Shop', connection: 'A-N', kW: 3 },
      ],
    },
    {
      name: subName,
      fedFrom: mainName,
      feeder: { lengthM: 30, line: { mm2: 16 }, neutral: { mm2: 16 } },
      loads: [
        { name: 'Hall 1 lights', connection: 'A-N', kW: 2.5 },
        { name: 'Hall 2 lights', connection: 'A-N', kW: 2.5 },
        { name: 'Hall 3 lights', connection: 'B-N', kW: 1 },
      ],
    },
  ],
});

function issuesOf(mainName: string, subName: string, study: unknown) {
  const { installation } = normaliseInstallation(parseInstallation(gallery(mainName, subName)));
  try {
    rebalanceInstallation(installation, study, { moveTable: false });
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    return (error as InputError).issues;
  }
  return [];
}

describe('measureAt words against board names', () => {
  it('"main" with a sub-board called main is refused at measureAt, naming the main board to write instead', () => {
    const [issue, ...rest] = issuesOf('Gallery board', 'main', { measureAt: 'main' });
    expect(rest).toEqual([]);
    expect(issue).toMatchObject({ code: 'ambiguous_board', path: 'measureAt' });
    expect(issue!.message).toBe(
      'measureAt: expected the main board\'s own name, "Gallery board", for the main incomer: "main" is also the name of board "main", and could mean either; to score at that board, rename it (received "main")',
    );
    // The main board's own name is the unambiguous spelling: scored at its incomer.
    const { installation } = normaliseInstallation(parseInstallation(gallery('Gallery board', 'main')));
    expect(rebalanceInstallation(installation, { measureAt: 'Gallery board' }, { moveTable: false }).boards.measured).toEqual(['Gallery board']);
  });

  it('letter case and spaces do not hide the clash: a sub-board " Each " refuses "each"', () => {
    const [issue] = issuesOf('Gallery board', ' Each ', { measureAt: 'each' });
    expect(issue).toMatchObject({ code: 'ambiguous_board', path: 'measureAt' });
    expect(issue!.message).toContain('to leave it out for every incomer (the default): "each" is also the name of board " Each "');
  });

  it('the main board called main is no clash, nor a word the study does not use', () => {
    const { installation } = normaliseInstallation(parseInstallation(gallery('main', 'Halls')));
    expect(rebalanceInstallation(installation, { measureAt: 'main' }, { moveTable: false }).boards.measured).toEqual(['main']);
    expect(issuesOf('Gallery board', 'main', {})).toEqual([]);
  });

  it('trivar rebalance --measure-at main: exit 2 and the message at --measure-at', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-measure-'));
    const file = join(dir, 'gallery.json');
    writeFileSync(file, JSON.stringify(gallery('Gallery board', 'main')));
    const r = runTrivar(['rebalance', file, '--measure-at', 'main']);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('--measure-at: expected the main board\'s own name, "Gallery board", for the main incomer');
  });
});

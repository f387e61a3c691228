/** A hand calculation is checked on one board file: on an installation both commands refuse it and say what to do instead. */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const works = 'examples/tannery-lane-works.yaml';
const figures = 'examples/hand-figures/riverside-cold-store.yaml';

describe('hand figures on an installation file', () => {
  it('trivar report --hand-figures: exit 3 as from trivar check (the file is the wrong kind), why, and checking one board at a time with its own file', () => {
    const r = runTrivar(['report', works, '--hand-figures', figures]);
    expect(r.code).toBe(3);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('--hand-figures: a hand calculation is checked on a single board file, one board and its own loads');
    expect(r.stderr).toContain('Check one board at a time');
    expect(r.stderr).toContain('trivar check <that file> <hand figures>');
  });

  it('trivar check: exit 3 (the file is the wrong kind), with the same way forward', () => {
    const r = runTrivar(['check', works, figures]);
    expect(r.code).toBe(3);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain(`${works}: a hand calculation is checked on a single board file`);
    expect(r.stderr).toContain('write that board as a board file of its own');
  });
});

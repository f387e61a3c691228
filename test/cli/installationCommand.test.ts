import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readBoardText, solveInstallation } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';

const file = 'examples/maple-court-riser.yaml';
const library = () => solveInstallation(readBoardText(readFileSync(`${ROOT}${file}`, 'utf8')));

describe('trivar solve on an installation (built binary)', () => {
  it('prints one summary row per board and per feeder, with the library figures', () => {
    const r = runTrivar(['solve', file]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const result = library();
    for (const f of result.feeders) {
      const row = r.stdout.split('\n').find((l) => l.trimStart().startsWith(`${f.board}  `) && l.includes(f.from ?? 'supply'))!;
      expect(row, f.board).toContain(f.lines[0]!.current.magnitude.toFixed(1));
      expect(row).toContain(f.voltageDropPercent.toFixed(2));
    }
    expect(r.stdout).toContain(`lowest voltage ${result.totals.lowestVoltagePercent.toFixed(1)} % of nominal, at ${result.totals.lowestVoltageBoard} (${result.totals.lowestVoltageAt})`);
    expect(r.stdout).toContain('licensed professional');
    // The summary does not repeat every board's full figures.
    expect(r.stdout).not.toContain('Symmetrical components');
  });
  it('--board adds that board’s full report; --all-boards every board’s', () => {
    const one = runTrivar(['solve', file, '--board', 'Floor 4']);
    expect(one.code).toBe(0);
    expect(one.stdout).toContain('━━ Floor 4 (fed from Floor 3) ━━');
    expect(one.stdout.match(/Symmetrical components/g)).toHaveLength(1);
    const all = runTrivar(['solve', file, '--all-boards']);
    expect(all.stdout.match(/Symmetrical components/g)).toHaveLength(library().boards.length);
  });
  it('fits 100 columns, summary and full figures alike', () => {
    for (const args of [[], ['--all-boards'], ['--all-boards', '--open-neutral']]) {
      const r = runTrivar(['solve', file, ...args]);
      expect(r.code).toBe(0);
      expect(Math.max(...r.stdout.split('\n').map((l) => [...l].length))).toBeLessThanOrEqual(100);
    }
  });
  it('--json prints exactly the library result', () => {
    const r = runTrivar(['solve', file, '--json']);
    expect(JSON.parse(r.stdout)).toEqual(JSON.parse(JSON.stringify(library())));
  });
  it('an unknown --board is a usage error (exit 2: the command line names it) naming the boards', () => {
    const r = runTrivar(['solve', file, '--board', 'Floor 9']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('"Floor 4"');
  });
  it('a bad installation names the field', () => {
    const text = readFileSync(`${ROOT}${file}`, 'utf8').replace('fedFrom: Floor 3', 'fedFrom: Floor 30');
    const r = runTrivar(['solve', '-'], text);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('boards[5].fedFrom: expected the name of a board in this installation');
  });
});

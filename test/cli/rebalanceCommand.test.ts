import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoardText, readBoardText, rebalanceBoard, scaleBoardLoads, solveBoardModel, solveInstallation } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';
import { expectClose } from '../support/tolerance.js';

const flats = 'examples/larkspur-court-flats.yaml';
const riser = 'examples/maple-court-riser.yaml';

describe('trivar rebalance (built binary)', () => {
  it('prints a work order, before/after per condition, the bound and the cautions', () => {
    const r = runTrivar(['rebalance', flats, '--no-table']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Work order \(\d+ moves?\)/);
    expect(r.stdout).toContain('Condition "evening peak"');
    expect(r.stdout).toContain('Condition "sunny noon"');
    expect(r.stdout).toMatch(/proven best|above the best possible/);
    expect(r.stdout).toContain('qualified electrician');
  });

  it('--json is the library report', () => {
    const r = runTrivar(['rebalance', flats, '--json', '--move-limit', '3', '--no-table']);
    expect(r.code).toBe(0);
    const spec = parseBoardText(readFileSync(`${ROOT}${flats}`, 'utf8'));
    const expected = rebalanceBoard(normaliseBoard(spec), { ...spec.rebalance, moveLimit: 3 }, { moveTable: false });
    expect(JSON.parse(r.stdout)).toEqual(JSON.parse(JSON.stringify(expected)));
    expect(expected.moves.length).toBeLessThanOrEqual(3);
  });

  it('--write saves the moved board, which re-solves to the reported currents; the input is untouched', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-rebalance-'));
    const input = join(dir, 'flats.yaml');
    const text = readFileSync(`${ROOT}${flats}`, 'utf8');
    writeFileSync(input, text);
    const out = join(dir, 'flats-moved.yaml');
    const r = runTrivar(['rebalance', input, '--json', '--no-table', '--write', out]);
    expect(r.code).toBe(0);
    expect(readFileSync(input, 'utf8')).toBe(text);
    const report = JSON.parse(r.stdout) as ReturnType<typeof rebalanceBoard>;
    const written = readFileSync(out, 'utf8');
    expect(written).toContain('# Invented example'); // comments kept
    // Solve the written board in the "evening peak" condition: PV off, everything else as rated.
    const spec = parseBoardText(written);
    const board = scaleBoardLoads(normaliseBoard(spec), { fraction: 1, perLoad: { 'Roof PV flat 3': 0, 'Roof PV flat 8': 0 } });
    const evening = report.conditions.find((c) => c.name === 'evening peak')!.solved.after;
    solveBoardModel(board).phases.forEach((p, k) => expectClose(p.current.magnitude, evening.lineA[k]!, { rel: 1e-9, abs: 1e-9 }, `line ${p.phase}`));
    // The moved board is already the best: a second run moves nothing.
    const again = runTrivar(['rebalance', out, '--json', '--no-table']);
    expect(JSON.parse(again.stdout).moves).toEqual([]);
  });

  it('on an installation: the work order names each board; --write saves the installation, which re-solves to the reported currents', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-rebalance-'));
    const input = join(dir, 'riser.yaml');
    const text = readFileSync(`${ROOT}${riser}`, 'utf8');
    writeFileSync(input, text);
    const out = join(dir, 'riser-moved.yaml');
    const shown = runTrivar(['rebalance', input, '--move-limit', '4', '--no-table']);
    expect(shown.code).toBe(0);
    expect(shown.stdout).toMatch(/board\s+list no\.\s+circuit\s+now on\s+move to/);
    expect(shown.stdout).toContain('Before and after: incomer currents (A) and unbalance (%), installation re-solved');
    const r = runTrivar(['rebalance', input, '--move-limit', '4', '--no-table', '--json', '--write', out]);
    expect(r.code).toBe(0);
    expect(readFileSync(input, 'utf8')).toBe(text);
    const report = JSON.parse(r.stdout) as ReturnType<typeof rebalanceBoard>;
    expect(report.moves.length).toBeGreaterThan(0);
    expect(report.moves.length).toBeLessThanOrEqual(4);
    for (const m of report.moves) expect(shown.stdout).toMatch(new RegExp(`${m.board}\\s+${m.listPosition}\\s+${m.name}\\s+${m.from}\\s+${m.to}`));
    const written = readFileSync(out, 'utf8');
    expect(written).toContain('# Invented example');
    const solved = solveInstallation(readBoardText(written));
    for (const c of report.conditions) {
      const board = solved.boards.find((b) => b.name === c.board)!.result;
      board.phases.forEach((p, k) => expectClose(p.current.magnitude, c.solved.after.lineA[k]!, { rel: 1e-9, abs: 1e-9 }, `${c.board} line ${p.phase}`));
      expectClose(board.neutral!.current.magnitude, c.solved.after.neutralA!, { rel: 1e-9, abs: 1e-9 }, `${c.board} neutral`);
    }
    const refused = runTrivar(['rebalance', input, '--write', input]);
    expect(refused.code).toBe(2);
  });

  it('--data: the peak intervals and a spread of typical ones become the load conditions', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-rebalance-'));
    const csv = join(dir, 'quay.csv');
    const rows = ['time,flats A [kW],flats B [kW],flats C [kW],chargers [x],heat pumps [x],Roof PV [x]'];
    for (let i = 0; i < 48; i++) {
      const hour = i / 2;
      const evening = hour >= 17 && hour < 22 ? 1 : 0.3;
      const sun = hour >= 10 && hour < 16 ? 0.8 : 0;
      rows.push(`2025-03-04T${String(Math.floor(hour)).padStart(2, '0')}:${i % 2 ? '30' : '00'}Z,${(9 * evening).toFixed(2)},${(5 * evening).toFixed(2)},${(12 * evening).toFixed(2)},${hour >= 18 ? 1 : 0},0.5,${sun}`);
    }
    writeFileSync(csv, `${rows.join('\n')}\n`);
    const r = runTrivar(['rebalance', 'examples/quay-street-flats.yaml', '--data', csv, '--spread', '3', '--json', '--no-table']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const report = JSON.parse(r.stdout) as ReturnType<typeof rebalanceBoard>;
    const names = report.conditions.map((c) => c.name);
    for (const why of ['peak line A', 'peak line B', 'peak line C', 'peak neutral', 'peak import', 'peak export', 'quantile 50 %'])
      expect(names.some((n) => n.includes(why))).toBe(true);
    expectClose(report.conditions.reduce((s, c) => s + c.weight, 0), 24, { rel: 1e-12, abs: 1e-12 }, 'hours of the data');
    expect(report.solvedScore.after).toBeLessThan(report.solvedScore.before);
    // The riser has no load of those names: the header is refused column by column.
    const riserData = runTrivar(['rebalance', riser, '--data', csv]);
    expect(riserData.code).toBe(3);
    expect(riserData.stderr).toMatch(/header, column 2 \("flats A \[kW\]"\): expected a load name on one board, "<board>\/<load>"/);
  });

  it('--data on an installation: the incomer peaks, each sub-board feeder peak and the quantiles become the conditions', () => {
    const r = runTrivar(['rebalance', 'examples/osier-mill-studios.yaml', '--data', 'examples/osier-mill-day.csv', '--json', '--no-table']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const report = JSON.parse(r.stdout) as ReturnType<typeof rebalanceBoard>;
    const names = [...new Set(report.conditions.map((c) => c.name))];
    for (const why of ['peak line A', 'peak line B', 'peak line C', 'peak neutral', 'peak current at Pottery', 'peak current at Print room', 'peak import'])
      expect(names.some((n) => n.includes(why)), why).toBe(true);
    // One day of data: the weights of the distinct conditions add up to 24 h.
    const weights = new Map(report.conditions.map((c) => [c.name, c.weight]));
    expectClose([...weights.values()].reduce((s, w) => s + w, 0), 24, { rel: 1e-12, abs: 1e-12 }, 'hours of the data');
    expect(report.solvedScore.after).toBeLessThanOrEqual(report.solvedScore.before);
  });

  it('options that contradict each other or the file are a usage error (exit 2) naming both, before any study runs', () => {
    const refused = (args: string[], input?: string) => {
      const r = runTrivar(['rebalance', ...args], input);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.split('\n').filter((l) => l !== '')).toHaveLength(1);
      return r.stderr;
    };
    // Both set the load conditions: before, --data won and --scenarios was dropped without a word.
    expect(refused([flats, '--scenarios', '--data', 'no-such.csv'])).toContain('--scenarios and --data both set the load conditions');
    // Options of interval data, with none given: before, left unused.
    expect(refused([flats, '--spread', '3'])).toContain('--spread picks typical intervals from the interval data: give --data <csv> too');
    expect(refused([flats, '--time-zone', 'Europe/Dublin', '--scenarios'])).toContain('--time-zone with --scenarios:');
    // The fewest-moves choice prints the table --no-table asks to skip: before, the table came out anyway.
    expect(refused([flats, '--near-best', '5', '--no-table'])).toContain('--no-table with --near-best:');
    const nearBestInFile = readFileSync(`${ROOT}${flats}`, 'utf8').replace('lineCapacityA: 160', 'lineCapacityA: 160\n  nearBestPercent: 5');
    expect(refused(['-', '--no-table'], nearBestInFile)).toContain('--no-table with rebalance.nearBestPercent in the board file: ');
    // A move limit below the moves the file's pins force: both named.
    const forced = readFileSync(`${ROOT}${flats}`, 'utf8').replace('pinned: [Fire alarm panel]', 'pinned: [Fire alarm panel, { circuit: Flat 1, on: B-N }]');
    expect(refused(['-', '--move-limit', '0'], forced)).toContain('--move-limit, with rebalance.pinned in the board file: expected at least 1: that many circuits are pinned');
    // A figure the board cannot have.
    expect(refused(['examples/pine-hollow-cabin.yaml', '--aim', 'current-unbalance'])).toContain('--aim: expected unbalance figures only on a three-phase board');
  });

  it('options that choose among an installation\'s boards are refused on a board file (they were silently ignored)', () => {
    for (const args of [
      ['--measure-at', 'main'],
      ['--boards', 'main'],
    ]) {
      const r = runTrivar(['rebalance', flats, ...args]);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.stderr).toContain(`${args[0]} chooses among an installation's boards`);
    }
  });

  it('--method exact --json: the method asked, the budget reached and the same notes as the text (it said local-search, no note)', () => {
    const quay = 'examples/quay-street-flats.yaml';
    const r = runTrivar(['rebalance', quay, '--method', 'exact', '--json']);
    expect(r.code).toBe(0);
    const report = JSON.parse(r.stdout) as ReturnType<typeof rebalanceBoard>;
    expect([report.methodAsked, report.method, report.proven]).toEqual(['exact', 'exact', false]);
    expect(report.search).toMatchObject({ nodeBudget: 2_000_000, budgetReached: true });
    expect(report.search.nodes).toBeGreaterThan(2_000_000);
    const note = 'The exact search stopped at its budget of 2,000,000 nodes; the answer is the best found and its gap comes from the lower bound.';
    expect(report.notes).toContain(note);
  });

  it('the work order shows the file\'s circuit numbers beside the list position, and what each move does to the breaker (it showed list no. 1, 2, 6 only)', () => {
    const text = `name: RB2
supply: { system: three-phase-4wire, voltage: { lineToLine: 208 }, frequencyHz: 60 }
loads:
  - { name: Oven, circuit: "1", connection: A-N, kW: 3, pf: 1 }
  - { name: Kettle, circuit: "3", connection: A-N, kW: 2, pf: 1 }
  - { name: Dryer, circuit: "5-7", connection: A-B, kW: 5, pf: 1 }
  - { name: Lights, circuit: "9", connection: A-N, kW: 1.5, pf: 0.9 }
  - { name: Pump, circuit: "11", connection: A-N, kW: 1.4, pf: 0.8 }
  - { name: Spare, circuit: "13", connection: B-N, kW: 0.1, pf: 1 }
`;
    const r = runTrivar(['rebalance', '-', '--no-table'], text);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/no\.\s+list no\.\s+circuit\s+now on\s+move to\s+breaker/);
    expect(r.stdout).toMatch(/ 1 +1 +Oven +A-N +C-N +new position and no\. \(1 is on A\)/);
    expect(r.stdout).toMatch(/ 3 +2 +Kettle +A-N +B-N +check: no\. 3 is on B already/);
    expect(r.stdout).toMatch(/ 13 +6 +Spare +B-N +C-N +new position and no\. \(13 is on A\)/);
    expect(r.stdout).toContain('"Oven" (circuit 1), "Spare" (circuit 13) take breaker positions on their new lines');
  });

  it('a moved 2-pole breaker names every position it takes: listed "1,3", or "14" with the position below it', () => {
    const text = `name: print shop
supply: { system: three-phase-4wire, voltage: { lineToLine: 208 }, frequencyHz: 60 }
loads:
  - { name: dryer, circuit: "1,3", poles: 2, connection: A-B, kW: 4.5, pf: 1 }
  - { name: welder, circuit: "9", poles: 2, connection: C-A, kW: 3, pf: 0.7 }
  - { name: kettle, circuit: "14", poles: 2, connection: A-B, kW: 3, pf: 1 }
rebalance:
  pinned: [{ circuit: dryer, on: B-C }, { circuit: welder, on: B-C }, { circuit: kettle, on: C-A }]
`;
    const r = runTrivar(['rebalance', '-', '--no-table'], text);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/ 1,3 +1 +dryer +A-B +B-C +new positions and nos\. \(1,3 are on A-B\)/);
    expect(r.stdout).toMatch(/ 9 +2 +welder +C-A +B-C +check: nos\. 9 and 11 below it are on B-C already/);
    expect(r.stdout).toMatch(/ 14 +3 +kettle +A-B +C-A +new positions and nos\. \(14 and 16 below it are on A-B\)/);
  });

  it('a single-phase board: nothing to rebalance, said plainly, no scores, exit 0 (it printed two scores that disagreed)', () => {
    const r = runTrivar(['rebalance', '-'], 'name: Single\nsupply: { system: single-phase, voltage: { lineToNeutral: 230 }, frequencyHz: 50 }\nloads:\n  - { name: W1, connection: A-N, kW: 3, pf: 0.9 }\n');
    expect(r.code).toBe(0);
    expect(r.stdout).toBe('Single\nA single-phase supply has one line: every circuit is on it and there is no other to move one to, so\nthere is nothing to rebalance.\n');
  });

  it('refuses to write over its input', () => {
    const r = runTrivar(['rebalance', flats, '--write', flats]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--write .*board file being read/);
  });

  it('bad study values: an option\'s is the command line\'s (exit 2, naming the option), the file\'s names its field (exit 3)', () => {
    const r = runTrivar(['rebalance', flats, '--move-limit', '-1']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('(options given: --move-limit -1): --move-limit: expected a number >= 0 (received -1)');
    const text = readFileSync(`${ROOT}${flats}`, 'utf8').replace('lineCapacityA: 160', 'lineCapacityA: 160\n  moveLimit: -1');
    const file = runTrivar(['rebalance', '-', '--near-best', '2'], text);
    expect(file.code).toBe(3);
    expect(file.stderr).toMatch(/rebalance\.moveLimit: expected a number >= 0 \(received -1\)/);
    const aim = runTrivar(['rebalance', flats, '--aim', 'neutrall']);
    expect(aim.code).toBe(2);
    expect(aim.stderr).toMatch(/largest-line, neutral/);
  });
});

describe('trivar rebalance --help', () => {
  it('is pinned by a snapshot', () => {
    const r = runTrivar(['rebalance', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatchSnapshot();
  });
});

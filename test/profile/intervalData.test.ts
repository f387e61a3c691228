/**
 * Interval data: header plan, cell errors by row and column, time zones and
 * daylight-saving changes, duplicates and gaps (reported, filled only on request).
 * DST dates for Europe/Dublin 2025 (last Sunday of March / October, 01:00 UTC)
 * are from the EU summer-time rule (Directive 2000/84/EC; from memory).
 */
import { describe, expect, it } from 'vitest';
import {
  checkIntervalSequence,
  createRowReader,
  driverColumns,
  InputError,
  normaliseBoard,
  parseBoard,
  planColumns,
  planDrivers,
  studyProfile,
  type InputIssue,
} from '@trivar/core';

const board = normaliseBoard(
  parseBoard({
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
    loads: [
      { name: 'kiln', connection: 'A-N', kW: 3, pf: 0.9 },
      { name: 'lathe', connection: 'ABC-delta', kW: 6, pf: 0.8 },
      { name: 'lamp', connection: 'B-N', kW: 1, pf: 1 },
    ],
  }),
);

function issuesOf(run: () => unknown): readonly InputIssue[] {
  try {
    run();
  } catch (e) {
    if (e instanceof InputError) return e.issues;
    throw e;
  }
  throw new Error('expected an InputError');
}

function read(header: string[], rows: string[][], timeZone = 'UTC') {
  const plan = planColumns(board, header);
  const reader = createRowReader(plan, { timeZone });
  rows.forEach((r, k) => reader.push(r, k + 2));
  return { plan, raw: reader.finish() };
}

describe('interval-data header', () => {
  it.each([
    [['time', 'kiln kW'], 'bad_header', 'header, column 2 ("kiln kW")'],
    [['time', 'kiln [MW]'], 'bad_header', 'header, column 2 ("kiln [MW]")'],
    [['time', 'oven [kW]'], 'unknown_target', 'header, column 2 ("oven [kW]")'],
    [['time', 'kiln [kW]', 'kiln [kW]'], 'duplicate_column', 'header, column 3 ("kiln [kW]")'],
    [['time', 'kiln [kvar]'], 'bad_quantities', 'header ("kiln")'],
    [['time', 'lathe [A]', 'lathe [pf]'], 'bad_quantities', 'header ("lathe [A]")'],
  ])('%j → %s at %s', (header, code, path) => {
    const issues = issuesOf(() => planColumns(board, header));
    expect(issues.map((i) => [i.code, i.path])).toContainEqual([code, path]);
  });

  it('names loads no column drives, and metered phases become loads of their own', () => {
    const plan = planColumns(board, ['time', 'kiln [x]', 'phase C [kW]', 'phase C [kvar]']);
    expect(plan.undriven).toEqual(['lathe', 'lamp']);
    expect(plan.board.loads.map((l) => l.name)).toEqual(['kiln', 'lathe', 'lamp', 'metered phase C']);
  });
});

describe('interval-data cells', () => {
  it('reports each bad cell with its row and column, all in one pass', () => {
    const issues = issuesOf(() =>
      read(
        ['time', 'kiln [kW]', 'kiln [pf]'],
        [
          ['2025-05-01 00:00', '1.2', '0.9'],
          ['2025-05-01 00:01', 'abc', '0.9'],
          ['2025-05-01 00:02', '1.0', '1.3'],
          ['01/05/2025 00:03', '1.0', '0.9'],
          ['2025-05-01 00:04', '1.0'],
          ['2025-05-01 00:05', '', '0.9'],
        ],
      ),
    );
    expect(issues.map((i) => [i.code, i.path])).toEqual([
      ['bad_value', 'row 3, column 2 ("kiln [kW]")'],
      ['bad_value', 'row 4, column 3 ("kiln [pf]")'],
      ['bad_time', 'row 5, column 1 ("time")'],
      ['bad_row', 'row 6'],
      ['bad_value', 'row 7, column 2 ("kiln [kW]")'],
    ]);
    expect(issues[1]!.message).toMatch(/0 < \|pf\| <= 1/);
    expect(issues[4]!.message).toMatch(/empty cell is not read as zero/);
  });

  it('a figure that would overflow the solve is refused at its cell (1e308 kW ended in "non-finite voltages" at an interval number)', () => {
    const issues = issuesOf(() =>
      read(
        ['time', 'kiln [kW]', 'kiln [pf]', 'lamp [x]'],
        [
          ['2025-05-01 00:00', '1.2', '0.9', '1'],
          ['2025-05-01 00:01', '1e308', '0.9', '1'],
          ['2025-05-01 00:02', '-2e6', '0.9', '5000'],
          ['2025-05-01 00:03', '1e6', '0.9', '1000'],
        ],
      ),
    );
    expect(issues.map((i) => [i.code, i.path])).toEqual([
      ['bad_value', 'row 3, column 2 ("kiln [kW]")'],
      ['bad_value', 'row 4, column 2 ("kiln [kW]")'],
      ['bad_value', 'row 4, column 4 ("lamp [x]")'],
    ]);
    expect(issues[0]!.message).toContain('at most 1,000,000 in size for [kW]');
    expect(issues[2]!.message).toContain('at most 1,000 in size for [x]');
  });

  it('reads kW + pf with a negative pf as leading, and A + pf at the nominal phase voltage', () => {
    const { plan, raw } = read(['time', 'kiln [kW]', 'kiln [pf]', 'lamp [A]', 'lamp [pf]'], [['2025-05-01T00:00Z', '3', '-0.8', '10', '0.6']]);
    const cols = driverColumns(plan, raw.values, raw.count);
    expect(cols.re[0]![0]).toBeCloseTo(3000, 9);
    expect(cols.im[0]![0]).toBeCloseTo(-2250, 9); // Q = −P·tan(acos 0.8)
    const vln = 400 / Math.sqrt(3);
    expect(cols.re[1]![0]).toBeCloseTo(10 * vln * 0.6, 9);
    expect(cols.im[1]![0]).toBeCloseTo(10 * vln * 0.8, 9);
    expect(planDrivers(plan).map((d) => d.name)).toEqual(['kiln', 'lamp']);
  });
});

describe('time zones and daylight saving', () => {
  const header = ['time', 'kiln [x]'];
  const at = (t: string) => [t, '1'];

  it('a wall-clock time skipped when clocks go forward is an error at its row', () => {
    const issues = issuesOf(() => read(header, [at('2025-03-30 00:59'), at('2025-03-30 01:30'), at('2025-03-30 02:00')], 'Europe/Dublin'));
    expect(issues.map((i) => [i.code, i.path])).toEqual([['nonexistent_time', 'row 3, column 1 ("time")']]);
  });

  it('across the spring change, local 00:59 → 02:00 is one minute', () => {
    const { raw } = read(header, [at('2025-03-30 00:58'), at('2025-03-30 00:59'), at('2025-03-30 02:00'), at('2025-03-30 02:01')], 'Europe/Dublin');
    expect([...raw.utcMs].map((u) => new Date(u).toISOString().slice(11, 16))).toEqual(['00:58', '00:59', '01:00', '01:01']);
    expect(checkIntervalSequence(raw).report.gaps.count).toBe(0);
  });

  it('the hour written twice when clocks go back is placed by row order: no duplicates, no gaps', () => {
    const rows = [at('2025-10-26 00:30'), at('2025-10-26 01:00'), at('2025-10-26 01:30'), at('2025-10-26 01:00'), at('2025-10-26 01:30'), at('2025-10-26 02:00')];
    const { raw } = read(header, rows, 'Europe/Dublin');
    // Summer time (UTC+1) until 01:00 UTC, then winter time (UTC+0).
    expect([...raw.utcMs].map((u) => new Date(u).toISOString().slice(11, 16))).toEqual(['23:30', '00:00', '00:30', '01:00', '01:30', '02:00']);
    expect(raw.ambiguousTimes).toBe(4);
    const table = checkIntervalSequence(raw);
    expect(table.report.duplicates.count).toBe(0);
    expect(table.report.gaps.count).toBe(0);
    expect(table.intervalMs).toBe(1_800_000);
  });

  it('an explicit offset wins over the zone, and Z means UTC', () => {
    const { raw } = read(header, [at('2025-07-01T12:00:00+02:00'), at('2025-07-01T10:01:00Z')], 'America/Chicago');
    expect([...raw.utcMs]).toEqual([Date.UTC(2025, 6, 1, 10, 0), Date.UTC(2025, 6, 1, 10, 1)]);
  });
});

describe('gaps and duplicates', () => {
  const header = ['time', 'kiln [kW]'];
  const rows = [
    ['2025-05-01 00:00', '1'],
    ['2025-05-01 00:15', '2'],
    ['2025-05-01 00:15', '9'],
    ['2025-05-01 01:00', '5'], // 00:30 and 00:45 missing
    ['2025-05-01 01:15', '6'],
  ];

  it('are reported and, by default, the gap is left out and the first duplicate kept', () => {
    const { raw } = read(header, rows);
    const t = checkIntervalSequence(raw);
    expect(t.intervalMs).toBe(900_000);
    expect(t.count).toBe(4);
    expect([...t.values[0]!]).toEqual([1, 2, 5, 6]);
    expect(t.report.duplicates).toEqual({ count: 1, rows: [4] });
    expect(t.report.gaps).toMatchObject({ count: 1, missingIntervals: 2, missingHours: 0.5 });
    expect(t.report.filledIntervals).toBe(0);
  });

  it('hold repeats the last reading; linear interpolates; both flag what they made', () => {
    const { raw } = read(header, rows);
    const hold = checkIntervalSequence(raw, 'hold');
    expect([...hold.values[0]!]).toEqual([1, 2, 2, 2, 5, 6]);
    expect([...hold.filled]).toEqual([0, 0, 1, 1, 0, 0]);
    const linear = checkIntervalSequence(raw, 'linear');
    expect([...linear.values[0]!]).toEqual([1, 2, 3, 4, 5, 6]);
    expect(linear.report).toMatchObject({ fill: 'linear', filledIntervals: 2 });
  });

  it('rows out of time order are an error naming the row', () => {
    const { raw } = read(header, [rows[0]!, rows[3]!, rows[1]!]);
    const issues = issuesOf(() => checkIntervalSequence(raw));
    expect(issues.map((i) => [i.code, i.path])).toEqual([['out_of_order', 'row 4, column 1']]);
  });
});

describe('interval-data years and zones', () => {
  const header = ['time', 'kiln [kW]'];

  it.each([
    ['0050-06-01T00:00', '0050-06-01T00:15'],
    ['0099-12-31T23:45', '0100-01-01T00:00'],
    ['1899-12-31 23:45', '1899-12-31 23:50'],
  ])('a year before 1900 (%s) is refused at its row, not read as 19xx', (first, second) => {
    const issues = issuesOf(() => read(header, [[first, '1'], [second, '1']]));
    expect(issues.map((i) => [i.code, i.path])).toEqual([
      ['bad_time', 'row 2, column 1 ("time")'],
      ['bad_time', 'row 3, column 1 ("time")'],
    ]);
    expect(issues[0]!.expected).toMatch(/^a date and time in 1900 or later/);
  });

  it('1900 itself is read as 1900', () => {
    const { raw } = read(header, [['1900-01-01 00:00', '1'], ['1900-01-01 00:15', '1']]);
    expect(new Date(raw.utcMs[0]!).toISOString()).toBe('1900-01-01T00:00:00.000Z');
    expect(raw.utcMs[1]! - raw.utcMs[0]!).toBe(15 * 60_000);
  });

  it.each(['Mars/Olympus', 5])('a time zone the system does not know (%s): InputError at timeZone, from the reader and the study', (zone) => {
    const plan = planColumns(board, header);
    const [issue] = issuesOf(() => createRowReader(plan, { timeZone: zone as string }));
    expect([issue!.code, issue!.path]).toEqual(['unknown_time_zone', 'timeZone']);
    expect(issue!.message).toMatch(/^timeZone: expected an IANA time zone this system knows/);
    const { raw } = read(header, [['2025-05-01 00:00', '1'], ['2025-05-01 00:15', '1']]);
    const input = { board: plan.board, drivers: planDrivers(plan), columns: driverColumns(plan, raw.values, raw.count), utcMs: raw.utcMs.slice(0, raw.count), intervalMs: 15 * 60_000 };
    expect(issuesOf(() => studyProfile(input, { timeZone: zone as string }))[0]!.path).toBe('timeZone');
  });
});

describe('interval-data numbers', () => {
  it.each(['0x10', '0b11', '0o7', '1_000', 'Infinity', '.'])('"%s" is refused at its row and column, not read as a number', (cell) => {
    const issues = issuesOf(() => read(['time', 'kiln [kW]'], [['2025-05-01 00:00', '1'], ['2025-05-01 00:01', cell]]));
    expect(issues.map((i) => [i.code, i.path, i.received])).toEqual([['bad_value', 'row 3, column 2 ("kiln [kW]")', JSON.stringify(cell)]]);
    expect(issues[0]!.expected).toMatch(/^a number written in decimal/);
  });

  it('decimal forms are read as written: " 2 ", "-.5", "+3", "1e3", "1."', () => {
    const cells = [' 2 ', '-.5', '+3', '1e3', '1.'];
    const { raw } = read(['time', 'kiln [kW]'], cells.map((c, k) => [`2025-05-01 00:0${k}`, c]));
    expect(Array.from(raw.values[0]!.subarray(0, raw.count))).toEqual([2, -0.5, 3, 1000, 1]);
  });
});

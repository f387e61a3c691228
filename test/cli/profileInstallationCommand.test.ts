/**
 * `trivar profile` on an installation file: the invented Osier Mill studios (an intake board,
 * a pottery across the yard on a long 16 mm² feeder with its own ±5 % band, a print room fed
 * from the pottery) with one day of half-hourly readings (examples/osier-mill-day.csv).
 * The peak interval's figures are checked against solveInstallation on the same loads.
 */
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readBoardText, solveInstallation } from '@trivar/core';
import { ROOT, runTrivar, type RunResult } from './runTrivar.js';

const FILE = 'examples/osier-mill-studios.yaml';
const DATA = 'examples/osier-mill-day.csv';
let text: RunResult;
let json: RunResult;
let dir = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trivar-profile-installation-'));
  text = runTrivar(['profile', FILE, '--data', DATA]);
  json = runTrivar(['profile', FILE, '--data', DATA, '--json']);
});

/** The file with each load at the 20:00 reading (kilns on, the mill winding down). */
function stateAt2000(): unknown {
  const spec = readBoardText(readFileSync(`${ROOT}${FILE}`, 'utf8')) as { boards: { loads: { name: string; kW: number; pf?: number }[] }[] };
  // The 20:00 row: kilns 1 (x), Compressor 0.05 (x), Cafe 0.30 kW, lighting 0.5 (x), the rest 0.
  const row = readFileSync(`${ROOT}${DATA}`, 'utf8').split('\n').find((l) => l.startsWith('2026-03-10T20:00'))!;
  expect(row).toBe('2026-03-10T20:00,1,0.05,0.30,0.5,0,0,0');
  const at: Record<string, (kW: number) => number> = {
    'Large kiln': (kW) => kW,
    'Small kiln': (kW) => kW,
    Compressor: (kW) => 0.05 * kW,
    Cafe: () => 0.3,
    'Workshop lighting': (kW) => 0.5 * kW,
  };
  return { ...spec, profile: undefined, boards: spec.boards.map((b) => ({ ...b, loads: b.loads.filter((l) => at[l.name]).map((l) => ({ ...l, kW: at[l.name]!(l.kW) })) })) };
}

describe('trivar profile on an installation', () => {
  it('prints a row per board and each board against its own band', () => {
    expect(text.stderr).toBe('');
    expect(text.code).toBe(0);
    expect(text.stdout).toMatch(/^Osier Mill studios — load over time, every board$/m);
    expect(text.stdout).toMatch(/^ {2}48 intervals of 1800 s, 2026-03-10 00:00 to 2026-03-10 23:30 \(UTC\)$/m);
    expect(text.stdout).toMatch(/^ {2}Mill intake +supply +[\d.]+ +200 .* 90-110 /m);
    expect(text.stdout).toMatch(/^ {2}Pottery +Mill intake +[\d.]+ +68 .* 95-105 /m);
    expect(text.stdout).toMatch(/^ {2}Print room +Pottery +[\d.]+ +36 .* 90-110 /m);
    expect(text.stdout).toContain('Pottery — currents in the feeder from Mill intake');
    expect(text.stdout).toContain("below 95 % voltage: 0 h · above 105 %: 0 h (the board's limits, custom)");
    expect(text.stdout).toContain('Calendar months at the supply (Mill intake)');
  });

  it('the peak interval agrees with solveInstallation on the same loads, board by board', () => {
    expect(json.code).toBe(0);
    const r = JSON.parse(json.stdout);
    expect(r.boards.map((b: { board: string; fedFrom: string | null }) => [b.board, b.fedFrom])).toEqual([
      ['Mill intake', null],
      ['Pottery', 'Mill intake'],
      ['Print room', 'Pottery'],
    ]);
    const solved = solveInstallation(stateAt2000());
    // Line A peaks at 20:00 at the intake and in the pottery feeder (the large kiln is on line A).
    for (const [b, name] of [
      [0, 'Mill intake'],
      [1, 'Pottery'],
    ] as const) {
      const lineA = r.boards[b].before.conductors[0];
      expect(lineA.maxAt).toBe('2026-03-10 20:00');
      const feeder = solved.feeders.find((f) => f.board === name)!;
      expect(lineA.maxA).toBeCloseTo(feeder.lines[0]!.current.magnitude, 6);
      const bus = solved.boards.find((x) => x.name === name)!.result;
      const lowestA = r.boards[b].before.voltages[0];
      expect(lowestA.minAt).toBe('2026-03-10 20:00');
      expect(lowestA.minPercent).toBeCloseTo(bus.phases[0]!.voltagePercent, 6);
    }
    // The pottery's own ±5 %, the installation's EN 50160 elsewhere.
    expect(r.boards.map((b: { limits: { voltageLowPercent: number; voltageHighPercent: number } }) => [b.limits.voltageLowPercent, b.limits.voltageHighPercent])).toEqual([
      [90, 110],
      [95, 105],
      [90, 110],
    ]);
    // Billing at the supply only: the tariff's demand charge on the intake, none on the sub-boards.
    expect(r.boards[0].before.months[0].demandCharge).toBeGreaterThan(0);
    expect(r.boards[1].before.months[0].demandCharge).toBeNull();
  });

  it('a bank on the pottery is measured at its incomer and every board is summarised with it', () => {
    const r = runTrivar(['profile', FILE, '--data', DATA, '--bank', '--board', 'Pottery', '--pf', '0.98', '--json']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.bank.board).toBe('Pottery');
    expect(out.boards.every((b: { after: unknown }) => b.after !== null)).toBe(true);
    // The bank's own summary is the pottery's, with the bank in.
    expect(out.bank.after).toEqual(out.boards[1].after);
    // Capacitors on the pottery lift the pottery's billing power factor, and the supply's with it.
    expect(out.boards[1].after.energy.billingPf).toBeGreaterThan(out.boards[1].before.energy.billingPf);
    expect(out.boards[0].after.energy.kvarhLagging).toBeLessThan(out.boards[0].before.energy.kvarhLagging);
  });

  it('--correction-bank simulates the bank trivar correct designs on the board the correction section names', () => {
    const file = join(dir, 'with-correction.yaml');
    writeFileSync(file, `${readFileSync(`${ROOT}${FILE}`, 'utf8')}correction:\n  arrangement: star-bank\n  board: Pottery\n  target: { pf: 0.95 }\n`);
    const designed = runTrivar(['correct', file, '--json']);
    expect(designed.code).toBe(0);
    const selection = JSON.parse(designed.stdout).report.selection;
    const r = runTrivar(['profile', file, '--data', `${ROOT}${DATA}`, '--correction-bank', '--json']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const bank = JSON.parse(r.stdout).bank;
    expect(bank.board).toBe('Pottery');
    expect(bank.source).toBe('correction-study');
    expect(bank.design).toEqual({ arrangement: 'star-bank', words: 'star bank', recommended: false });
    expect(bank.steps.map((s: { step: number }) => s.step)).toEqual(selection.steps.map((s: { output: number }) => s.output));
    expect(runTrivar(['profile', file, '--data', `${ROOT}${DATA}`, '--correction-bank', '--pf', '0.9']).stderr).toContain('--pf sets the target');
    // No correction section: the correction study's defaults on the main board, as trivar correct takes them.
    const bare = runTrivar(['profile', FILE, '--data', DATA, '--correction-bank', '--json']);
    expect(bare.stderr).toBe('');
    const defaults = JSON.parse(bare.stdout).bank;
    const correctDefaults = JSON.parse(runTrivar(['correct', FILE, '--json']).stdout);
    expect(defaults.design).toMatchObject({ arrangement: correctDefaults.comparison.recommended, recommended: true, defaultsWords: 'target PF 0.95 on every line, never leading, every arrangement compared' });
    expect(runTrivar(['profile', FILE, '--data', DATA, '--correction-bank']).stdout.replace(/\s+/g, ' ')).toContain("with the correction study's defaults (the file has no correction section): target PF 0.95 on every line, never leading, every arrangement compared");
  });

  it('--correction-bank with no arrangement named: the one trivar correct recommends, and the report says so', () => {
    const file = join(dir, 'recommended.yaml');
    writeFileSync(file, `${readFileSync(`${ROOT}${FILE}`, 'utf8')}correction:\n  board: Mill intake\n  target: { pf: 0.95 }\n`);
    const compared = JSON.parse(runTrivar(['correct', file, '--json']).stdout);
    const recommended = compared.comparison.recommended;
    const r = runTrivar(['profile', file, '--data', `${ROOT}${DATA}`, '--correction-bank', '--json']);
    expect(r.code).toBe(0);
    const words = recommended === 'balancing-compensator' ? 'balancing compensator' : recommended.replace('-', ' ');
    expect(JSON.parse(r.stdout).bank.design).toEqual({ arrangement: recommended, words, recommended: true });
    const text = runTrivar(['profile', file, '--data', `${ROOT}${DATA}`, '--correction-bank']).stdout;
    expect(text.replace(/\s+/g, ' ')).toContain(`the ${words} trivar correct recommends for this board (the board file's correction section names no arrangement), as it designs it`);
  });

  it('the controller reads where the target says: the correction target\'s measuredAt, or profile.bank.measuredAt', () => {
    const file = join(dir, 'metered.yaml');
    writeFileSync(file, `${readFileSync(`${ROOT}${FILE}`, 'utf8')}correction:\n  arrangement: star-bank\n  board: Pottery\n  target: { pf: 0.95, measuredAt: origin }\n`);
    const j = runTrivar(['profile', file, '--data', `${ROOT}${DATA}`, '--correction-bank', '--json']);
    expect(j.stderr).toBe('');
    expect(j.code).toBe(0);
    const bank = JSON.parse(j.stdout).bank;
    expect(bank.board).toBe('Pottery');
    expect(bank.meter.point).toBe('origin');
    // The origin carries the intake's current: its peak line A is the intake's (the same service cable).
    const out = JSON.parse(j.stdout);
    expect(bank.meter.before.conductors[0].maxA).toBeCloseTo(out.boards[0].before.conductors[0].maxA, 9);
    const t = runTrivar(['profile', file, '--data', `${ROOT}${DATA}`, '--correction-bank']);
    expect(t.stdout).toContain(
      `the controller measures at the origin (the supply's terminals, before the service cable), not at Pottery: billing power factor there ${bank.meter.before.energy.billingPf.toFixed(3)} → ${bank.meter.after.energy.billingPf.toFixed(3)}`,
    );
    // The CSV files carry the origin too: its summary rows and, first, its interval columns.
    const summary = join(dir, 'metered-summary.csv');
    const intervals = join(dir, 'metered-intervals.csv');
    expect(runTrivar(['profile', file, '--data', `${ROOT}${DATA}`, '--correction-bank', '--summary-csv', summary, '--intervals-csv', intervals]).code).toBe(0);
    const pf = readFileSync(summary, 'utf8').split('\n').find((l) => l.startsWith('origin,billing power factor,period,'))!.split(',');
    expect(Number(pf[3])).toBeCloseTo(bank.meter.before.energy.billingPf, 6);
    expect(Number(pf[4])).toBeCloseTo(bank.meter.after.energy.billingPf, 6);
    const head = readFileSync(intervals, 'utf8').split('\n')[0]!.split(',');
    expect(head.slice(0, 3)).toEqual(['time', 'origin: line A A', 'origin: line B A']);
    expect(head).toContain('origin: PF with bank');
    // profile.bank.measuredAt for a bank sized from the profile; a board the bank is not fed through is refused by its field.
    const sized = join(dir, 'metered-sized.yaml');
    writeFileSync(sized, readFileSync(`${ROOT}${FILE}`, 'utf8').replace(/^profile:$/m, 'profile:\n  bank: { measuredAt: Mill intake }'));
    const s = runTrivar(['profile', sized, '--data', `${ROOT}${DATA}`, '--bank', '--board', 'Pottery', '--json']);
    expect(s.code).toBe(0);
    expect(JSON.parse(s.stdout).bank.meter.point).toBe('Mill intake');
    const downstream = join(dir, 'metered-downstream.yaml');
    writeFileSync(downstream, readFileSync(`${ROOT}${FILE}`, 'utf8').replace(/^profile:$/m, 'profile:\n  bank: { measuredAt: Pottery }'));
    const wrong = runTrivar(['profile', downstream, '--data', `${ROOT}${DATA}`, '--bank', '--board', 'Mill intake']);
    expect(wrong.code).not.toBe(0);
    expect(wrong.stderr).toContain('profile.bank.measuredAt');
    expect(wrong.stderr).not.toMatch(/at .*\.js:\d+/);
    // A board file's controller reads its own incomer: a target measured at the origin is refused, not ignored.
    const board = join(dir, 'quay-origin.yaml');
    writeFileSync(board, readFileSync(`${ROOT}examples/quay-street-flats.yaml`, 'utf8').replace('target: { pf: 0.97, maxLaggingPf: 0.995 }', 'target: { pf: 0.97, maxLaggingPf: 0.995, measuredAt: origin }'));
    const data = join(dir, 'quay-day.csv');
    writeFileSync(data, 'time,flats A [kW]\n2025-01-01 00:00,3.2\n2025-01-01 00:01,3.1\n');
    const single = runTrivar(['profile', board, '--data', data, '--correction-bank']);
    expect(single.code).toBe(2);
    expect(single.stderr).toContain('target.measuredAt');
    expect(single.stderr).toContain('installation file with this one board');
    const sizedBoard = join(dir, 'quay-bank-origin.yaml');
    writeFileSync(sizedBoard, readFileSync(`${ROOT}examples/quay-street-flats.yaml`, 'utf8').replace('bank: { targetPf: 0.97,', 'bank: { measuredAt: origin, targetPf: 0.97,'));
    const own = runTrivar(['profile', sizedBoard, '--data', data, '--bank']);
    expect(own.code).not.toBe(0);
    expect(own.stderr).toContain('profile.bank.measuredAt');
    expect(own.stderr).toContain('installation file with this one board');
  });

  it('writes the summary and per-interval CSV with a board to every row and column set', () => {
    const summary = join(dir, 'summary.csv');
    const intervals = join(dir, 'intervals.csv');
    const r = runTrivar(['profile', FILE, '--data', DATA, '--summary-csv', summary, '--intervals-csv', intervals]);
    expect(r.code).toBe(0);
    const peak = JSON.parse(json.stdout).boards[1].before.conductors[0].maxA;
    const rows = readFileSync(summary, 'utf8').trim().split('\n');
    expect(rows[0]).toBe('board,figure,where,before,after,unit');
    const potteryPeak = rows.find((l) => l.startsWith('Pottery,peak current,line A,'))!.split(',');
    expect(Number(potteryPeak[3])).toBeCloseTo(peak, 5);
    const lines = readFileSync(intervals, 'utf8').trim().split('\n');
    expect(lines).toHaveLength(49);
    const head = lines[0]!.split(',');
    expect(head.slice(0, 3)).toEqual(['time', 'Mill intake: line A A', 'Mill intake: line B A']);
    const column = head.indexOf('Pottery: line A A');
    const at2000 = lines.find((l) => l.startsWith('2026-03-10 20:00'))!.split(',');
    expect(Number(at2000[column])).toBeCloseTo(peak, 2);
  });

  it('refuses unknown and ambiguous load names, naming the column', () => {
    const bad = join(dir, 'bad.csv');
    writeFileSync(bad, 'time,Kiln [x],Pottery/Press [x]\n2026-03-10T00:00,1,1\n');
    const r = runTrivar(['profile', FILE, '--data', bad]);
    expect(r.code).not.toBe(0);
    expect(r.stderr).toMatch(/column 2 \("Kiln \[x\]"\)/);
    expect(r.stderr).toMatch(/column 3 \("Pottery\/Press \[x\]"\)/);
    const twice = join(dir, 'twice.yaml');
    // A second board with a load of the same name makes the bare name ambiguous.
    writeFileSync(twice, readFileSync(`${ROOT}${FILE}`, 'utf8').replace('- { name: Drying cabinet,', '- { name: Cafe,'));
    const amb = runTrivar(['profile', twice, '--data', `${ROOT}${DATA}`]);
    expect(amb.code).not.toBe(0);
    expect(amb.stderr).toContain('load "Cafe" on board "Mill intake" (write "Mill intake/Cafe") and load "Cafe" on board "Print room" (write "Print room/Cafe")');
    expect(amb.stderr).toMatch(/column 4 \("Cafe \[kW\]"\)/);
  });

  it('without --data runs profile.scenarios through every board, the text and JSON agreeing', () => {
    const t = runTrivar(['profile', FILE]);
    expect(t.stderr).toBe('');
    expect(t.code).toBe(0);
    const j = runTrivar(['profile', FILE, '--json']);
    expect(j.code).toBe(0);
    const r = JSON.parse(j.stdout) as { hours: number; boards: { board: string; fedFrom: string | null; scenarios: { name: string; hours: number; lineA: number[]; kW: number; pf: number | null }[]; billingPf: number }[] };
    expect(t.stdout).toMatch(/^Osier Mill studios — scenarios \(8760 h\), every board$/m);
    expect(r.boards.map((b) => b.board)).toEqual(['Mill intake', 'Pottery', 'Print room']);
    // Each board's table: its rows are the JSON's figures as printed.
    for (const b of r.boards) {
      const block = t.stdout.split(`${b.board} — currents in the ${b.fedFrom === null ? 'supply to the main board' : `feeder from ${b.fedFrom}`}`)[1]!;
      for (const s of b.scenarios) {
        const row = new RegExp(`^  ${s.name} +${s.hours} +${s.lineA.map((a) => a.toFixed(1)).join(' +')} .* ${s.kW.toFixed(1)} .* ${s.pf === null ? '-' : s.pf.toFixed(3)}$`, 'm');
        expect(block).toMatch(row);
      }
      expect(block).toContain(`billing power factor ${b.billingPf.toFixed(3)}`);
    }
    expect(t.stdout).toContain('every scenario within 95-105 % (the board\'s limits, custom)');
    // The firing night: the large kiln on line A through the pottery's feeder.
    expect(r.boards[1]!.scenarios[0]!.lineA[0]).toBeGreaterThan(35);
  });

  it('scenarios: a load no board has is named by its field; options for interval data are refused', () => {
    const bad = join(dir, 'bad-scenario.yaml');
    writeFileSync(bad, readFileSync(`${ROOT}${FILE}`, 'utf8').replace('loads: { Workshop lighting: 0.05 }', 'loads: { Workshop lamps: 0.05 }'));
    const r = runTrivar(['profile', bad]);
    expect(r.code).not.toBe(0);
    expect(r.stderr).toContain('profile.scenarios[2].loads.Workshop lamps');
    expect(r.stderr).not.toMatch(/at .*\.js:\d+/);
    const charts = runTrivar(['profile', FILE, '--charts', join(dir, 'scenario-charts')]);
    expect(charts.code).toBe(2);
    expect(charts.stderr).toContain('--charts works on interval data');
    const none = join(dir, 'no-scenarios.yaml');
    writeFileSync(none, readFileSync(`${ROOT}${FILE}`, 'utf8').split('  # Without --data')[0]!);
    const noData = runTrivar(['profile', none]);
    expect(noData.code).toBe(2);
    expect(noData.stderr).toContain('give the interval data with --data <file.csv>, or scenarios under profile.scenarios');
  });

  it('names the option that does not fit', () => {
    const r = runTrivar(['profile', FILE, '--data', DATA, '--bank', '--board', 'Kiln shed']);
    expect(r.code).not.toBe(0);
    expect(r.stderr).toContain('--board');
    expect(r.stderr).toContain('"Pottery"');
  });

  it('--charts writes three charts per board and the feeder loading, their legends carrying the JSON figures', () => {
    const out = join(dir, 'charts');
    const r = runTrivar(['profile', FILE, '--data', DATA, '--bank', '--board', 'Pottery', '--charts', out, '--json']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const result = JSON.parse(r.stdout) as {
      boards: { board: string; before: { conductors: { conductor: string; maxA: number; ratingA: number | null }[]; energy: { billingPf: number } }; after: { energy: { billingPf: number } } }[];
    };
    expect(readdirSync(out).sort()).toEqual(['feeder-loading.svg', 'mill-intake', 'pottery', 'print-room']);
    const legends = (svg: string) => [...svg.matchAll(/<text x="[\d.]+" y="[\d.]+">([^<]*\(peak [^<]*|[^<]*billing PF [^<]*)<\/text>/g)].map((m) => m[1]!);
    const peakOf = (legend: string) => Number(/peak ([\d.]+)/.exec(legend)![1]);
    for (const [folder, b] of [['mill-intake', 0], ['pottery', 1], ['print-room', 2]] as const) {
      const board = result.boards[b]!;
      expect(readdirSync(join(out, folder)).sort()).toEqual(['currents.svg', 'load-duration.svg', 'power-factor.svg']);
      const currents = readFileSync(join(out, folder, 'currents.svg'), 'utf8');
      expect(currents).toMatch(/^<svg [^>]*>[\s\S]*<\/svg>\n$/);
      expect(currents).toContain(`<text x="58" y="20" font-size="13" font-weight="bold">${board.board}: line and neutral current`);
      // One legend per conductor, in the JSON's order, each peak the JSON's to the 0.1 A printed.
      const peaks = legends(currents);
      expect(peaks.map((l) => l.split(' (')[0])).toEqual(board.before.conductors.map((c) => (c.conductor === 'N' ? 'neutral' : `line ${c.conductor}`)));
      peaks.forEach((l, k) => expect(Math.abs(peakOf(l) - board.before.conductors[k]!.maxA)).toBeLessThanOrEqual(0.05));
      expect(legends(readFileSync(join(out, folder, 'load-duration.svg'), 'utf8'))).toEqual(peaks);
      const pf = legends(readFileSync(join(out, folder, 'power-factor.svg'), 'utf8'));
      expect(pf).toEqual([`before (billing PF ${board.before.energy.billingPf.toFixed(3)})`, `with bank (billing PF ${board.after.energy.billingPf.toFixed(3)})`]);
    }
    // The feeder loading: each board's busiest incomer line against its rating (200, 68 and 36 A in the file).
    const loading = legends(readFileSync(join(out, 'feeder-loading.svg'), 'utf8'));
    expect(loading.map((l) => l.replace(/ \(.*/, ''))).toEqual(['Mill intake', 'Pottery', 'Print room']);
    loading.forEach((l, b) => {
      const lines = result.boards[b]!.before.conductors.filter((c) => c.conductor !== 'N');
      const rating = lines[0]!.ratingA!;
      expect(l).toContain(`% of ${rating} A)`);
      expect(Math.abs(peakOf(l) - (100 * Math.max(...lines.map((c) => c.maxA))) / rating)).toBeLessThanOrEqual(0.05);
    });
  });
});

/** `trivar report` and `trivar diagram` run as a user would (built binary). */
import { execFileSync, spawnSync } from 'node:child_process';
import { closeSync, copyFileSync, existsSync, linkSync, openSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT, runTrivar } from './runTrivar.js';
import { isBoardExample } from '../support/boardExamples.js';

/** Every example file: boards and installations alike, and whatever examples are added later. */
const allExamples = readdirSync(join(ROOT, 'examples')).filter((f) => /\.ya?ml$/.test(f));
const isBoardFile = isBoardExample(join(ROOT, 'examples'));
const scratch = () => mkdtempSync(join(tmpdir(), 'trivar-report-'));

describe('trivar report', () => {
  it("the correction section carries the controller settings trivar correct prints (CT, C/k and its setting, band, delays)", () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-ctl-'));
    expect(runTrivar(['report', 'examples/riverside-cold-store.yaml', '--format', 'md', '-o', join(dir, 'r.md')]).code).toBe(0);
    const md = readFileSync(join(dir, 'r.md'), 'utf8');
    const c = (JSON.parse(runTrivar(['correct', 'examples/riverside-cold-store.yaml', '--json']).stdout) as { selection: { controller: { ctPrimaryA: number; ctBasis: { placeWords: string; currentWords: string }; responseThresholdA: number; responseSettingA: number; outputsUsed: number; outputs: number; switchingDelayS: number } } }).selection.controller;
    expect(md).toContain(`- **Controller outputs:** ${c.outputsUsed} of ${c.outputs} used`);
    expect(md).toContain(`- **Current transformer:** ${c.ctPrimaryA}/5 A at ${c.ctBasis.placeWords}; the next standard primary at or above 1.25 × ${c.ctBasis.currentWords}; use yours if it differs`);
    expect(md).toContain(`- **Response threshold (C/k):** ${c.responseThresholdA.toFixed(3)} A for the smallest step`);
    expect(md).toContain(`set ${c.responseSettingA.toFixed(3)} A (0.65 × C/k)`);
    expect(md).toContain(`- **Switching:** delay ${c.switchingDelayS} s`);
  });

  it('--time-zone without --profile-data is refused (it reads only the interval data), not ignored', () => {
    const r = runTrivar(['report', 'examples/riverside-cold-store.yaml', '--time-zone', 'Europe/Dublin']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--time-zone reads the times of the interval data: give --profile-data <csv> too');
  });

  it('the loop below covers the installation example', () => {
    expect(allExamples).toContain('maple-court-riser.yaml');
    expect(allExamples.filter((f) => !isBoardFile(f)).length).toBeGreaterThanOrEqual(1);
  });

  it.each(allExamples)('writes an HTML report for every example: %s', (file) => {
    const out = join(scratch(), 'report.html');
    const r = runTrivar(['report', `examples/${file}`, '-o', out]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const html = readFileSync(out, 'utf8');
    expect(html).toMatch(/^<!DOCTYPE html>/);
    const ids = isBoardFile(file) ? ['installation', 'schedule', 'results'] : ['installation', 'feeders', 'totals'];
    for (const id of [...ids, 'assumptions', 'standards', 'cautions']) expect(html).toContain(`<section id="${id}">`);
    if (!isBoardFile(file)) {
      // One section per board of the installation, each with its panel schedule and phasor diagram.
      const solved = JSON.parse(runTrivar(['solve', `examples/${file}`, '--json']).stdout) as { boards: { name: string }[] };
      for (const b of solved.boards) expect(html).toContain(`<h2>Board: ${b.name}</h2>`);
      expect(html.match(/data-view="phasors"/g)).toHaveLength(solved.boards.length);
      expect(html).toContain('data-view="one-line"');
    }
  });

  it('--format md on an installation writes the one-line drawing and one phasor drawing per board', () => {
    const dir = scratch();
    const r = runTrivar(['report', 'examples/maple-court-riser.yaml', '--format', 'md', '-o', join(dir, 'riser.md')]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(readdirSync(dir).sort()).toEqual([
      'riser-board-floor-1-phasors.svg',
      'riser-board-floor-2-phasors.svg',
      'riser-board-floor-3-phasors.svg',
      'riser-board-floor-4-phasors.svg',
      'riser-board-main-switchboard-phasors.svg',
      'riser-board-plant-room-phasors.svg',
      'riser-one-line.svg',
      'riser.md',
    ]);
    const md = readFileSync(join(dir, 'riser.md'), 'utf8');
    expect(md).toMatch(/^## Feeders$/m);
    expect(md).toContain('](riser-one-line.svg)');
  });

  it('--hand-figures adds the hand check, with the figures trivar check gives', () => {
    const dir = scratch();
    const args = ['examples/riverside-cold-store.yaml', 'examples/hand-figures/riverside-cold-store.yaml'];
    const r = runTrivar(['report', args[0]!, '--hand-figures', args[1]!, '-o', join(dir, 'r.html')]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const html = readFileSync(join(dir, 'r.html'), 'utf8');
    const section = html.split('<section id="hand-check">')[1]!.split('</section>')[0]!;
    const check = JSON.parse(runTrivar(['check', ...args, '--json']).stdout) as {
      lines: { phase: string; currentA: { textbook: number; solved: number; difference: number } }[];
      effects: { title: string }[];
      textbook: { phase: string; requiredKvar: number }[];
    };
    for (const l of check.lines)
      expect(section).toContain(`<td>${l.phase}</td><td>current A</td><td class="num">`);
    for (const l of check.lines) expect(section).toContain(`<td class="num">${l.currentA.solved.toFixed(1)}</td>`);
    for (const e of check.effects) expect(section).toContain(`<td>${e.title}</td>`);
    for (const p of check.textbook) expect(section).toContain(`<td class="num">${p.requiredKvar.toFixed(2)}</td>`);
    expect(section).toContain('data-view="triangles"');
    // Its cautions join the report's.
    expect(html.split('<section id="cautions">')[1]).toContain('Any bank or compensator must be designed to the local codes');
    // Bad figures name the figures file; installations refuse the option with a reason.
    const bad = join(dir, 'bad.yaml');
    writeFileSync(bad, 'capacitors: [{ branch: A-Q, kvar: 5 }]\n');
    const b = runTrivar(['report', args[0]!, '--hand-figures', bad, '-o', join(dir, 'b.html')]);
    expect(b.code).toBe(3);
    expect(b.stderr).toContain(`the hand figures in "${bad}"`);
    expect(b.stderr).toContain('capacitors[0].branch');
    // Exit 3, as trivar check gives for the same installation: the file is the wrong kind for a hand check.
    const i = runTrivar(['report', 'examples/maple-court-riser.yaml', '--hand-figures', args[1]!, '-o', join(dir, 'i.html')]);
    expect(i.code).toBe(3);
    expect(i.stderr).toContain('single board file');
    // The figures file is an input: never overwritten.
    expect(runTrivar(['report', args[0]!, '--hand-figures', bad, '-o', bad]).code).toBe(2);
  });

  it('includes the correction study of the board file, or leaves it out with --no-correction', () => {
    const dir = scratch();
    expect(runTrivar(['report', 'examples/riverside-cold-store.yaml', '-o', join(dir, 'a.html')]).code).toBe(0);
    expect(runTrivar(['report', 'examples/riverside-cold-store.yaml', '--no-correction', '-o', join(dir, 'b.html')]).code).toBe(0);
    expect(readFileSync(join(dir, 'a.html'), 'utf8')).toContain('<section id="correction">');
    expect(readFileSync(join(dir, 'b.html'), 'utf8')).not.toContain('<section id="correction">');
  });

  it('a correction section without an arrangement: every arrangement compared and the one trivar correct recommends, in full', () => {
    // The print shop's file gives only the target, a light load and the controller: trivar correct compares.
    const out = join(scratch(), 'shop.html');
    const r = runTrivar(['report', 'examples/cedar-falls-print-shop.yaml', '-o', out]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const section = readFileSync(out, 'utf8').split('<section id="correction">')[1]!.split('</section>')[0]!;
    type Outcome = { arrangement: string; report: { status: string; selection: { deliveredKvar: number } | null } | null };
    const compared = JSON.parse(runTrivar(['correct', 'examples/cedar-falls-print-shop.yaml', '--json']).stdout) as { recommended: string; outcomes: Outcome[] };
    // A 277/480 V board: its star bank is a wye bank, as North-American reports name it.
    const names: Record<string, string> = { 'star-bank': 'Wye bank', 'delta-bank': 'Delta bank', 'balancing-compensator': 'Balancing compensator' };
    for (const o of compared.outcomes) expect(section).toContain(`<td>${names[o.arrangement]}</td>`);
    const chosen = compared.outcomes.find((o) => o.arrangement === compared.recommended)!.report!;
    expect(section).toContain(`Recommended — ${names[compared.recommended]!.toLowerCase()}:`);
    // The recommended arrangement in full: its summary and the units it builds.
    expect(section).toContain(`${chosen.selection!.deliveredKvar.toFixed(1)} kvar delivered`);
    expect(section).toContain('<dt>Outcome</dt>');
  });

  it('includes the harmonic study when the board file has one, or leaves it out with --no-harmonics', () => {
    const dir = scratch();
    expect(runTrivar(['report', 'examples/mill-street-offices.yaml', '-o', join(dir, 'a.html')]).code).toBe(0);
    expect(runTrivar(['report', 'examples/mill-street-offices.yaml', '--no-harmonics', '-o', join(dir, 'b.html')]).code).toBe(0);
    const a = readFileSync(join(dir, 'a.html'), 'utf8');
    expect(a).toContain('<section id="harmonics">');
    expect(a).toContain('data-view="impedance-scan"');
    expect(readFileSync(join(dir, 'b.html'), 'utf8')).not.toContain('<section id="harmonics">');
  });

  it('an installation with harmonic data: the overview and a section per board, figures as trivar harmonics gives them', () => {
    const dir = scratch();
    const r = runTrivar(['report', 'examples/harrow-yard-studios.yaml', '--format', 'md', '-o', join(dir, 'harrow.md')]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(readdirSync(dir)).toContain('harrow-board-workshop-impedance-scan.svg');
    const md = readFileSync(join(dir, 'harrow.md'), 'utf8');
    const study = JSON.parse(runTrivar(['harmonics', 'examples/harrow-yard-studios.yaml', '--json']).stdout) as {
      boards: { board: string; lines: { current: { rms: number } }[]; neutral: { current: { rms: number } }; triplenNeutralA: number }[];
      scans: { board: string; scan: { combinations: unknown[] } }[];
    };
    const overview = md.slice(md.indexOf('## Harmonics and resonance'), md.indexOf('## Harmonics — '));
    for (const b of study.boards) {
      expect(md).toMatch(new RegExp(`^## Harmonics — ${b.board}$`, 'm'));
      const largest = Math.max(...b.lines.map((l) => l.current.rms));
      // The overview row: board, busbar V THD, 519 verdict, largest feeder current, its THD, neutral A, triplen A.
      const row = overview.split('\n').find((l) => l.startsWith(`| ${b.board} |`))!;
      expect(row).toContain(`| ${largest.toFixed(1)} `);
      expect(row).toContain(`| ${b.neutral.current.rms.toFixed(1)} | ${b.triplenNeutralA.toFixed(1)} |`);
    }
    // The bank's scan on its board's section: one row per bank state.
    const workshop = md.slice(md.indexOf('## Harmonics — Workshop'), md.indexOf('## Harmonics — Studios ground'));
    const scanRows = workshop.slice(workshop.indexOf('**Resonance with the supply seen from Workshop')).split('\n\n')[1]!.split('\n').slice(2);
    expect(scanRows).toHaveLength(study.scans.find((s) => s.board === 'Workshop')!.scan.combinations.length);
    expect(workshop).toMatch(/- \*\*Duty verdict:\*\* within limits in every state/);
    // Its cautions close the report.
    expect(md.slice(md.indexOf('## Safety cautions'))).toMatch(/Caution:/);
    const html = join(dir, 'b.html');
    expect(runTrivar(['report', 'examples/harrow-yard-studios.yaml', '--no-harmonics', '-o', html]).code).toBe(0);
    expect(readFileSync(html, 'utf8')).not.toContain('-harmonics">');
  });

  it('a collapsed board or installation: the report is written and says so, and the exit status is trivar solve’s (4)', () => {
    const dir = scratch();
    const SUPPLY = 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50';
    const board = join(dir, 'board.yaml');
    writeFileSync(board, `${SUPPLY}, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } }\nloads: [{ name: plant, connection: ABC-delta, kW: 5000, pf: 0.9 }]\n`);
    const installation = join(dir, 'installation.yaml');
    writeFileSync(
      installation,
      `${SUPPLY} }\nboards:\n  - { name: Main, loads: [{ name: lights, connection: A-N, kW: 1 }] }\n  - { name: Far shed, fedFrom: Main, feeder: { lengthM: 500, line: { mm2: 2.5 }, neutral: { mm2: 2.5 } }, loads: [{ name: plant, connection: ABC-delta, kW: 200, pf: 0.9 }] }\n`,
    );
    for (const [file, where] of [[board, ''], [installation, 'Far shed: ']] as const) {
      const solve = runTrivar(['solve', file]);
      const out = join(dir, `${where ? 'installation' : 'board'}.html`);
      const r = runTrivar(['report', file, '-o', out]);
      expect(solve.code).toBe(4);
      expect(r.code).toBe(solve.code);
      // The same message as trivar solve's, naming the board in an installation.
      expect(r.stderr).toBe(solve.stderr);
      expect(r.stderr).toMatch(new RegExp(`^error: no viable operating point: the supply cannot carry these loads: ${where}the board voltage has collapsed`));
      expect(readFileSync(out, 'utf8')).toMatch(/Supply collapse: the supply cannot carry these loads/);
      // To standard output and as Markdown alike.
      const stdout = runTrivar(['report', file]);
      expect(stdout.code).toBe(4);
      expect(stdout.stdout).toMatch(/^<!DOCTYPE html>[^]*Supply collapse[^]*<\/html>\n?$/);
      const md = runTrivar(['report', file, '--format', 'md', '-o', join(dir, 'r.md')]);
      expect(md.code).toBe(4);
      expect(readFileSync(join(dir, 'r.md'), 'utf8')).toMatch(/Supply collapse/);
    }
    // A board that stands: exit 0, nothing on standard error.
    const fine = runTrivar(['report', 'examples/maple-court-riser.yaml', '-o', join(dir, 'fine.html')]);
    expect([fine.code, fine.stderr]).toEqual([0, '']);
  });

  it('--profile-data adds the load-over-time section with its charts, figures as trivar profile gives them', () => {
    const dir = scratch();
    const data = join(dir, 'quay.csv');
    execFileSync(process.execPath, [`${ROOT}scripts/generate-profile-example.mjs`, data, '--days', '3'], { cwd: ROOT });
    const r = runTrivar(['report', 'examples/quay-street-flats.yaml', '--profile-data', data, '-o', join(dir, 'r.html')]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const html = readFileSync(join(dir, 'r.html'), 'utf8');
    expect(html).toContain('<section id="profile">');
    for (const chart of ['profile-currents', 'profile-power-factor', 'profile-load-duration']) expect(html).toContain(`data-figure="${chart}"`);
    const profile = JSON.parse(runTrivar(['profile', 'examples/quay-street-flats.yaml', '--data', data, '--json']).stdout) as { before: { conductors: { conductor: string; maxA: number }[] } };
    const section = html.split('<section id="profile">')[1]!.split('</section>')[0]!;
    for (const c of profile.before.conductors) expect(section).toContain(`<td>${c.conductor}</td><td class="num">${c.maxA.toFixed(1)}</td>`);
    // The data file is an input too.
    expect(runTrivar(['report', 'examples/quay-street-flats.yaml', '--profile-data', data, '-o', data]).code).toBe(2);
  });

  it('--profile-data on an installation: an overview and a section per board, every figure the profile JSON\'s', () => {
    const dir = scratch();
    const FILE = 'examples/osier-mill-studios.yaml';
    const DATA = 'examples/osier-mill-day.csv';
    const r = runTrivar(['report', FILE, '--profile-data', DATA, '-o', join(dir, 'mill.html')]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const html = readFileSync(join(dir, 'mill.html'), 'utf8');
    const profile = JSON.parse(runTrivar(['profile', FILE, '--data', DATA, '--json']).stdout) as {
      boards: { board: string; fedFrom: string | null; before: { conductors: { conductor: string; maxA: number; maxAt: string }[]; energy: { billingPf: number; kWhImport: number } } }[];
    };
    const sectionOf = (id: string) => html.split(`<section id="${id}">`)[1]!.split('</section>')[0]!;
    const overview = sectionOf('profile');
    expect(overview).toContain('data-figure="profile-feeder-loading"');
    for (const [b, id] of [[0, 'board-mill-intake'], [1, 'board-pottery'], [2, 'board-print-room']] as const) {
      const board = profile.boards[b]!;
      const lines = board.before.conductors.filter((c) => c.conductor !== 'N');
      // The overview's row: the board, what feeds it, its busiest incomer line as the JSON has it.
      expect(overview).toContain(`<tr><td>${board.board}</td><td>${board.fedFrom ?? 'supply'}</td><td class="num">${Math.max(...lines.map((c) => c.maxA)).toFixed(1)}</td>`);
      const section = sectionOf(`profile-${id}`);
      expect(section).toContain(`<h2>Load over time — ${board.board}</h2>`);
      for (const c of board.before.conductors) expect(section).toContain(`<tr><td>${c.conductor}</td><td class="num">${c.maxA.toFixed(1)}</td><td>${c.maxAt}</td>`);
      expect(section).toContain(`<dt>Billing power factor</dt><dd>${board.before.energy.billingPf.toFixed(3)}</dd>`);
      expect(section).toContain(`<dt>Energy imported / exported</dt><dd>${board.before.energy.kWhImport.toFixed(0)} kWh`);
      for (const chart of ['currents', 'power-factor', 'load-duration']) expect(section).toContain(`data-figure="profile-${id}-${chart}"`);
    }
    // The pottery judged against its own ±5 %.
    expect(sectionOf('profile-board-pottery')).toContain('Hours below 95 % / above 105 %');
    // Markdown: every chart a file beside the report, named by its board.
    const md = runTrivar(['report', FILE, '--profile-data', DATA, '--format', 'md', '-o', join(dir, 'mill.md')]);
    expect(md.code).toBe(0);
    const files = readdirSync(dir);
    for (const name of ['mill-profile-feeder-loading.svg', 'mill-profile-board-pottery-currents.svg', 'mill-profile-board-print-room-load-duration.svg']) expect(files).toContain(name);
  });

  it('--format md writes the Markdown and its SVG figures beside it', () => {
    const dir = scratch();
    const r = runTrivar(['report', 'examples/riverside-cold-store.yaml', '--format', 'md', '-o', join(dir, 'store.md')]);
    expect(r.code).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(['store-correction-phasors.svg', 'store-correction-triangles.svg', 'store-phasors.svg', 'store-sequences.svg', 'store.md']);
    expect(readFileSync(join(dir, 'store.md'), 'utf8')).toContain('](store-phasors.svg)');
  });

  it('the format follows the report file\'s extension; a --format that contradicts it is refused', () => {
    const dir = scratch();
    const md = runTrivar(['report', 'examples/corner-bakery.yaml', '-o', join(dir, 'bakery.md')]);
    expect(md.code).toBe(0);
    expect(readFileSync(join(dir, 'bakery.md'), 'utf8')).toMatch(/^# /);
    expect(readdirSync(dir)).toContain('bakery-phasors.svg');
    const htm = runTrivar(['report', 'examples/corner-bakery.yaml', '-o', join(dir, 'bakery.HTM')]);
    expect(htm.code).toBe(0);
    expect(readFileSync(join(dir, 'bakery.HTM'), 'utf8')).toMatch(/^<!doctype html>/i);
    const mdInHtml = runTrivar(['report', 'examples/corner-bakery.yaml', '--format', 'md', '-o', join(dir, 'clash.html')]);
    expect(mdInHtml.code).toBe(2);
    expect(mdInHtml.stderr).toContain('--format md writes Markdown, but the report file');
    expect(mdInHtml.stderr).toContain('(.html)');
    const htmlInMd = runTrivar(['report', 'examples/corner-bakery.yaml', '--format', 'html', '-o', join(dir, 'clash.md')]);
    expect(htmlInMd.code).toBe(2);
    expect(htmlInMd.stderr).toContain('(.md)');
    expect(readdirSync(dir).filter((f) => f.startsWith('clash'))).toEqual([]);
    // No extension that names a format: HTML unless --format says otherwise.
    expect(runTrivar(['report', 'examples/corner-bakery.yaml', '-o', join(dir, 'plain.txt')]).code).toBe(0);
    expect(readFileSync(join(dir, 'plain.txt'), 'utf8')).toMatch(/^<!doctype html>/i);
  });

  it('never overwrites its input', () => {
    const dir = scratch();
    const board = join(dir, 'board.yaml');
    copyFileSync(join(ROOT, 'examples/corner-bakery.yaml'), board);
    const before = readFileSync(board, 'utf8');
    const r = runTrivar(['report', board, '-o', join(dir, '.', 'board.yaml')]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('it is an input file');
    expect(readFileSync(board, 'utf8')).toBe(before);
    // Nor through a figure of a Markdown report: "board.md" would write board-phasors.svg, so name the input that.
    const clash = join(dir, 'b-phasors.svg');
    writeFileSync(clash, before);
    expect(runTrivar(['report', clash, '--format', 'md', '-o', join(dir, 'b.md')]).code).toBe(2);
    expect(readFileSync(clash, 'utf8')).toBe(before);
  });

  it('never overwrites a board the shell redirected to standard input (`- < board.yaml`)', () => {
    const dir = scratch();
    const board = join(dir, 'board.yaml');
    copyFileSync(join(ROOT, 'examples/corner-bakery.yaml'), board);
    const before = readFileSync(board, 'utf8');
    for (const args of [
      ['report', '-', '-o', board],
      ['diagram', '-', '-o', board],
      ['rebalance', '-', '--write', board],
    ]) {
      const stdin = openSync(board, 'r');
      try {
        const r = spawnSync(process.execPath, [join(ROOT, 'packages/cli/bin/trivar.js'), ...args], { cwd: dir, stdio: [stdin, 'pipe', 'pipe'], encoding: 'utf8' });
        expect(r.status, args.join(' ')).toBe(2);
        expect(r.stderr, args.join(' ')).toMatch(/standard input/);
      } finally {
        closeSync(stdin);
      }
      expect(readFileSync(board, 'utf8')).toBe(before);
    }
    // Another file on standard input, or a pipe: the output is written as usual.
    const other = join(dir, 'other.yaml');
    copyFileSync(board, other);
    const stdin = openSync(other, 'r');
    try {
      const r = spawnSync(process.execPath, [join(ROOT, 'packages/cli/bin/trivar.js'), 'diagram', '-', '-o', join(dir, 'out.svg')], { cwd: dir, stdio: [stdin, 'pipe', 'pipe'], encoding: 'utf8' });
      expect(r.status).toBe(0);
    } finally {
      closeSync(stdin);
    }
    expect(readFileSync(join(dir, 'out.svg'), 'utf8')).toMatch(/^<svg/);
    expect(runTrivar(['diagram', '-', '-o', join(dir, 'piped.svg')], before).code).toBe(0);
  });

  it('refuses "-" as an output file name instead of writing a file called "-"', () => {
    const dir = scratch();
    for (const args of [
      ['report', join(ROOT, 'examples/corner-bakery.yaml'), '-o', '-'],
      ['diagram', join(ROOT, 'examples/corner-bakery.yaml'), '-o', '-'],
      ['rebalance', join(ROOT, 'examples/corner-bakery.yaml'), '--write', '-'],
    ]) {
      const r = spawnSync(process.execPath, [join(ROOT, 'packages/cli/bin/trivar.js'), ...args], { cwd: dir, encoding: 'utf8' });
      expect(r.status, args.join(' ')).toBe(2);
      expect(r.stderr, args.join(' ')).toContain('refusing to write a file named "-"');
      expect(existsSync(join(dir, '-')), args.join(' ')).toBe(false);
    }
  });

  it('never overwrites its input through a hard link, nor one output with another, nor crashes on a bad output place', () => {
    const dir = scratch();
    const board = join(dir, 'board.yaml');
    copyFileSync(join(ROOT, 'examples/corner-bakery.yaml'), board);
    const before = readFileSync(board, 'utf8');
    const hard = join(dir, 'also-board.yaml');
    linkSync(board, hard);
    for (const args of [
      ['report', board, '-o', hard],
      ['diagram', board, '-o', hard],
      ['rebalance', board, '--write', hard],
    ]) {
      const r = runTrivar(args);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.stderr, args.join(' ')).toMatch(/it is an input file|that is the board file being read/);
      expect(readFileSync(board, 'utf8')).toBe(before);
    }
    // A folder, or a folder that does not exist, as the rebalanced file: a clear error, no stack.
    for (const [target, why] of [
      [dir, 'it is a directory'],
      [join(dir, 'no-such-folder', 'out.yaml'), 'its folder does not exist'],
    ] as const) {
      const r = runTrivar(['rebalance', board, '--write', target]);
      expect(r.code).toBe(2);
      expect(r.stderr).toContain(why);
      expect(r.stderr).not.toMatch(/internal error|\bat \S+ \(/);
    }
    // A device that fails while writing (a full disk) is exit 6, as the other outputs' failures are.
    if (existsSync('/dev/full')) {
      const full = runTrivar(['report', board, '-o', '/dev/full']);
      expect(full.code).toBe(6);
      expect(full.stderr).toContain('no space left on the device');
    }
    // Two outputs of one command on one file: the second would silently replace the first.
    const data = join(ROOT, 'examples/osier-mill-day.csv');
    const profileBoard = join(ROOT, 'examples/osier-mill-studios.yaml');
    const twice = runTrivar(['profile', profileBoard, '--data', data, '--summary-csv', join(dir, 's.csv'), '--intervals-csv', join(dir, '.', 's.csv')]);
    expect(twice.code).toBe(2);
    expect(twice.stderr).toContain('is written by this command too');
    // Charts into a path that is a file.
    writeFileSync(join(dir, 'afile'), 'x');
    const charts = runTrivar(['profile', profileBoard, '--data', data, '--charts', join(dir, 'afile')]);
    expect(charts.code).toBe(2);
    expect(charts.stderr).toContain('is a file');
    expect(charts.stderr).not.toMatch(/internal error/);
  });

  it('an invalid board: exit 3 with the field path, and no report file written', () => {
    const dir = scratch();
    const board = join(dir, 'bad.yaml');
    writeFileSync(board, readFileSync(join(ROOT, 'examples/corner-bakery.yaml'), 'utf8').replace('frequencyHz: 50', 'frequencyHz: 45'));
    const r = runTrivar(['report', board, '-o', join(dir, 'r.html')]);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('supply.frequencyHz');
    expect(readdirSync(dir)).toEqual(['bad.yaml']);
  });

  it('Markdown needs an output file; an unwritable one is a clear error', () => {
    const r = runTrivar(['report', 'examples/corner-bakery.yaml', '--format', 'md']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('-o');
    const w = runTrivar(['report', 'examples/corner-bakery.yaml', '-o', join(scratch(), 'no-such-dir', 'r.html')]);
    expect(w.code).toBe(2);
    expect(w.stderr).toContain('its folder does not exist');
  });
});

describe('trivar diagram', () => {
  it('prints the phasor diagram to standard output', () => {
    const r = runTrivar(['diagram', 'examples/corner-bakery.yaml']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^<svg [^>]*data-view="phasors"/);
  });

  it.each([
    ['sequence', 'examples/hillside-workshop.yaml'],
    ['triangles', 'examples/riverside-cold-store.yaml'],
  ])('--view %s writes the chosen view to a file', (view, file) => {
    const out = join(scratch(), 'd.svg');
    expect(runTrivar(['diagram', file, '--view', view, '-o', out]).code).toBe(0);
    expect(readFileSync(out, 'utf8')).toContain(`data-view="${view}"`);
  });

  it('explains what a view needs when the board cannot give it', () => {
    const t = runTrivar(['diagram', 'examples/corner-bakery.yaml', '--view', 'triangles']);
    expect(t.code).toBe(2);
    expect(t.stderr).toContain('needs a correction study');
    const s = runTrivar(['diagram', 'examples/harbour-cottages.yaml', '--view', 'sequence']);
    expect(s.code).toBe(2);
    expect(s.stderr).toContain('three-phase');
    expect(runTrivar(['diagram', 'examples/corner-bakery.yaml', '--view', 'pie']).code).toBe(2);
  });
});

describe('trivar diagram on an installation', () => {
  it('draws the main board by default and the board --board names, as the solved installation gives them', () => {
    const solved = JSON.parse(runTrivar(['solve', 'examples/maple-court-riser.yaml', '--json']).stdout) as { boards: { name: string; result: { phases: { current: { magnitude: number } }[] } }[] };
    const magnitudes = (svg: string) => [...svg.matchAll(/data-quantity="current" data-phase="[ABC]" data-state="only" data-magnitude="([\d.]+)"/g)].map((m) => Number(m[1]));
    const main = runTrivar(['diagram', 'examples/maple-court-riser.yaml']);
    expect(main.code).toBe(0);
    expect(main.stdout).toContain('Main switchboard · 0°');
    expect(magnitudes(main.stdout)).toEqual(solved.boards[0]!.result.phases.map((p) => Number(p.current.magnitude.toPrecision(3))));
    const top = runTrivar(['diagram', 'examples/maple-court-riser.yaml', '--board', 'Floor 4']);
    expect(top.code).toBe(0);
    expect(top.stdout).toContain('Floor 4 · 0°');
    const floor4 = solved.boards.find((b) => b.name === 'Floor 4')!;
    expect(magnitudes(top.stdout)).toEqual(floor4.result.phases.map((p) => Number(p.current.magnitude.toPrecision(3))));
    const seq = runTrivar(['diagram', 'examples/maple-court-riser.yaml', '--board', 'Plant room', '--view', 'sequence']);
    expect(seq.code).toBe(0);
    expect(seq.stdout).toContain('data-view="sequence"');
  });

  it('--view one-line draws the installation', () => {
    const r = runTrivar(['diagram', 'examples/maple-court-riser.yaml', '--view', 'one-line']);
    expect(r.code).toBe(0);
    expect(r.stdout.match(/<g class="board"/g)).toHaveLength(6);
  });

  it('says what does not fit: unknown board, one-line of a single board, --board on a board file, correction views', () => {
    const u = runTrivar(['diagram', 'examples/maple-court-riser.yaml', '--board', 'Floor 9']);
    expect(u.code).toBe(2);
    expect(u.stderr).toContain('--board: expected a board of this installation: "Main switchboard", "Plant room"');
    const o = runTrivar(['diagram', 'examples/corner-bakery.yaml', '--view', 'one-line']);
    expect(o.code).toBe(2);
    expect(o.stderr).toContain('installation');
    expect(runTrivar(['diagram', 'examples/corner-bakery.yaml', '--board', 'x']).code).toBe(3);
    const t = runTrivar(['diagram', 'examples/maple-court-riser.yaml', '--view', 'triangles']);
    expect(t.code).toBe(2);
    expect(t.stderr).toContain('correction study');
  });
});

describe('correction at a board of an installation', () => {
  /** Tannery Lane with the bank on its press-shop board (the file's correction.board). */
  function tanneryWithBank(): string {
    const file = join(scratch(), 'tannery.yaml');
    writeFileSync(file, `${readFileSync(join(ROOT, 'examples/tannery-lane-works.yaml'), 'utf8')}correction: { board: Press shop, arrangement: delta-bank, target: { pf: 0.95 } }\n`);
    return file;
  }
  type Effect = { board: string; boards: { name: string; vectorPf: { before: number; after: number } }[]; supply: { pf: { before: number; after: number } } };

  it('the report shows the study at that board and its effect on every board, as trivar correct gives them', () => {
    const file = tanneryWithBank();
    const out = join(dirname(file), 'r.html');
    const r = runTrivar(['report', file, '-o', out]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const html = readFileSync(out, 'utf8');
    expect(html).toContain('<h2>Correction recommendation — Press shop</h2>');
    const corrected = JSON.parse(runTrivar(['correct', file, '--json']).stdout) as { board: string; effect: Effect; report: { selection: { deliveredKvar: number } } };
    expect(corrected.board).toBe('Press shop');
    const correction = html.split('<section id="correction">')[1]!.split('</section>')[0]!;
    expect(correction).toContain(`${corrected.report.selection.deliveredKvar.toFixed(1)} kvar delivered`);
    const effect = html.split('<section id="correction-effect">')[1]!.split('</section>')[0]!;
    for (const b of corrected.effect.boards) {
      const pf = `${b.vectorPf.before.toFixed(3)} → ${b.vectorPf.after.toFixed(3)}`;
      expect(effect).toMatch(new RegExp(`<td>${b.name}( \\(equipment here\\))?</td><td class="num">${pf}</td>`));
    }
    expect(effect).toContain('<td>Press shop (equipment here)</td>');
    expect(effect).toContain(`${corrected.effect.supply.pf.before.toFixed(3)} → ${corrected.effect.supply.pf.after.toFixed(3)}`);
    // --no-correction leaves it out.
    expect(runTrivar(['report', file, '--no-correction', '-o', out]).code).toBe(0);
    expect(readFileSync(out, 'utf8')).not.toContain('<section id="correction');
  });

  it('a correction section naming a board and no arrangement: the arrangements compared there, the recommended one in full and its effect', () => {
    const file = join(scratch(), 'tannery.yaml');
    writeFileSync(file, `${readFileSync(join(ROOT, 'examples/tannery-lane-works.yaml'), 'utf8')}correction: { board: Offices }\n`);
    const out = join(dirname(file), 'r.html');
    const r = runTrivar(['report', file, '-o', out]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const html = readFileSync(out, 'utf8');
    expect(html).toContain('<h2>Correction recommendation — Offices</h2>');
    const compared = JSON.parse(runTrivar(['correct', file, '--json']).stdout) as { board: string; comparison: { recommended: string; outcomes: { arrangement: string; report: { selection: { deliveredKvar: number } | null } }[] }; effect: Effect };
    expect(compared.board).toBe('Offices');
    const correction = html.split('<section id="correction">')[1]!.split('</section>')[0]!;
    expect(correction).toContain('Arrangements compared');
    const chosen = compared.comparison.outcomes.find((o) => o.arrangement === compared.comparison.recommended)!.report;
    expect(correction).toContain(`${chosen.selection!.deliveredKvar.toFixed(1)} kvar delivered`);
    const effect = html.split('<section id="correction-effect">')[1]!.split('</section>')[0]!;
    expect(effect).toContain('<td>Offices (equipment here)</td>');
    expect(effect).toContain(`${compared.effect.supply.pf.before.toFixed(3)} → ${compared.effect.supply.pf.after.toFixed(3)}`);
  });

  it('trivar diagram --with-correction and --view triangles draw the equipment board, or the board --board names', () => {
    const file = tanneryWithBank();
    const overlay = runTrivar(['diagram', file, '--with-correction']);
    expect(overlay.code).toBe(0);
    expect(overlay.stdout).toContain('Press shop · 0°');
    expect(overlay.stdout).toContain('data-state="after"');
    const main = runTrivar(['diagram', file, '--view', 'triangles', '--board', 'Main switchboard']);
    expect(main.code).toBe(0);
    expect(main.stdout).toContain('data-view="triangles"');
    // The main incomer carries the press shop: its line currents fall with the bank there.
    const before = [...main.stdout.matchAll(/data-state="before"[^>]*data-magnitude="([\d.]+)"/g)].map((m) => Number(m[1]));
    const after = [...main.stdout.matchAll(/data-state="after"[^>]*data-magnitude="([\d.]+)"/g)].map((m) => Number(m[1]));
    expect(before.length).toBeGreaterThan(0);
    expect(Math.max(...after)).toBeLessThan(Math.max(...before));
  });
});

describe('help', () => {
  it.each(['diagram', 'report'])('%s --help is pinned', (command) => {
    const r = runTrivar([command, '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatchSnapshot();
  });
});

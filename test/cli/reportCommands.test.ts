/** `trivar report` and `trivar diagram` run as a user would (built binary). */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, writeFileSync, copyFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT, runTrivar } from './runTrivar.js';
import { isBoardExample } from '../support/boardExamples.js';

const exampleFiles = readdirSync(join(ROOT, 'examples')).filter(isBoardExample(join(ROOT, 'examples')));
const scratch = () => mkdtempSync(join(tmpdir(), 'trivar-report-'));

describe('trivar report', () => {
  it.each(exampleFiles)('writes an HTML report for every example: %s', (file) => {
    const out = join(scratch(), 'report.html');
    const r = runTrivar(['report', `examples/${file}`, '-o', out]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const html = readFileSync(out, 'utf8');
    expect(html).toMatch(/^<!DOCTYPE html>/);
    for (const id of ['installation', 'schedule', 'results', 'assumptions', 'standards', 'cautions']) expect(html).toContain(`<section id="${id}">`);
  });

  it('includes the correction study of the board file, or leaves it out with --no-correction', () => {
    const dir = scratch();
    expect(runTrivar(['report', 'examples/riverside-cold-store.yaml', '-o', join(dir, 'a.html')]).code).toBe(0);
    expect(runTrivar(['report', 'examples/riverside-cold-store.yaml', '--no-correction', '-o', join(dir, 'b.html')]).code).toBe(0);
    expect(readFileSync(join(dir, 'a.html'), 'utf8')).toContain('<section id="correction">');
    expect(readFileSync(join(dir, 'b.html'), 'utf8')).not.toContain('<section id="correction">');
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

  it('--format md writes the Markdown and its SVG figures beside it', () => {
    const dir = scratch();
    const r = runTrivar(['report', 'examples/riverside-cold-store.yaml', '--format', 'md', '-o', join(dir, 'store.md')]);
    expect(r.code).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(['store-correction-phasors.svg', 'store-correction-triangles.svg', 'store-phasors.svg', 'store-sequences.svg', 'store.md']);
    expect(readFileSync(join(dir, 'store.md'), 'utf8')).toContain('](store-phasors.svg)');
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

describe('help', () => {
  it.each(['diagram', 'report'])('%s --help is pinned', (command) => {
    const r = runTrivar([command, '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatchSnapshot();
  });
});

/**
 * A board that already meets its target: `trivar correct` says so with the figures it rests on,
 * not with sizing, bank and before → after tables that all read zero or "x → x", nor with the
 * cautions for installing capacitors. The JSON keeps the whole study.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { runTrivar } from './runTrivar.js';

const CABIN = 'examples/pine-hollow-cabin.yaml';

describe('nothing to add', () => {
  it('the comparison: one verdict naming every arrangement studied, the lines as solved, the general caution only', () => {
    const r = runTrivar(['correct', CABIN]);
    expect(r.code).toBe(0);
    // Read with the report's line wrapping undone.
    expect(r.stdout.replace(/\s+/g, ' ')).toContain('NOTHING TO DO: the board already meets the target — every arrangement studied (line-to-neutral bank, line-to-line bank) would add nothing');
    expect(r.stdout).toContain('Lines as solved, without equipment');
    expect(r.stdout).not.toMatch(/Arrangements compared|Sizing|→|Capacitors hold their charge|does not check harmonics/);
    expect(r.stdout).toContain('checked by a licensed professional');
    // The figures shown are the study's own: each line's PF as the JSON has it, to 3 decimals.
    const json = JSON.parse(runTrivar(['correct', CABIN, '--json']).stdout);
    const report = json.outcomes[0].report;
    expect(report.status).toBe('already-meets-target');
    // The study itself gives only the caution that holds without equipment: JSON and text agree.
    expect(report.cautions).toHaveLength(1);
    expect(report.cautions[0]).toMatch(/^These figures come from the model you entered/);
    for (const line of report.verification.lines) {
      const row = r.stdout.split('\n').find((l) => l.startsWith(`  ${line.phase}  `))!;
      expect(row.trim().split(/ {2,}/).at(-1)).toBe(`${line.pf.before.toFixed(3)} lag`);
      expect(line.pf.before).toBeGreaterThanOrEqual(report.target.pf);
    }
  });
  it('one arrangement asked for: the same compact answer, naming it', () => {
    const r = runTrivar(['correct', CABIN, '--arrangement', 'delta-bank']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('NOTHING TO DO: the board already meets the target — a line-to-line bank would add nothing');
    expect(r.stdout).not.toMatch(/Bank as built|Checks|Warnings/);
  });
  it('a board that does need equipment keeps the full report', () => {
    const r = runTrivar(['correct', 'examples/corner-bakery.yaml', '--arrangement', 'delta-bank']);
    expect(r.stdout).toMatch(/Sizing \(continuous, before choosing units\)[\s\S]*Lines, before → after[\s\S]*Capacitors hold their charge/);
  });
});

describe('the per-line target says which voltage each line is read on', () => {
  it('to the neutral bar where the board has one; to the virtual neutral on a 3-wire board', () => {
    const withNeutral = runTrivar(['correct', CABIN, '--arrangement', 'star-bank']).stdout;
    expect(withNeutral).toMatch(/S = V·I\* per line \(voltage\s+to the neutral bar\)/);
    expect(withNeutral).not.toMatch(/virtual neutral/);
    const threeWire = runTrivar(
      ['correct', '-', '--arrangement', 'delta-bank'],
      'supply: { system: three-phase-3wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } }\nloads: [{ name: press, connection: ABC-delta, kW: 15, pf: 0.75 }, { name: welder, connection: A-B, kW: 5, pf: 0.6 }]\n',
    ).stdout;
    expect(threeWire).toMatch(/per line \(voltage\s+to the virtual neutral: the board has no neutral\)/);
    expect(threeWire).not.toMatch(/neutral bar/);
  });
});

describe('the report of a board or installation with nothing to add', () => {
  // HTML to standard output: the correction section and what the report leaves out.
  const sectionOf = (html: string) => html.slice(html.indexOf('<section id="correction"'), html.indexOf('<section id="assumptions"'));
  it('a board: the verdict with every arrangement studied and the lines as solved; no drawings, equipment or capacitor cautions', () => {
    const text = `${readFileSync(CABIN, 'utf8')}correction: { target: { pf: 0.95 } }\n`;
    const r = runTrivar(['report', '-'], text);
    expect(r.code).toBe(0);
    const section = sectionOf(r.stdout);
    expect(section).toContain('every arrangement studied (line-to-neutral bank, line-to-line bank) would add nothing');
    expect(section).toContain('Each line as solved, without equipment');
    expect(section).not.toMatch(/<svg|Equipment to install|before and after/);
    expect(r.stdout).not.toMatch(/Capacitors hold their charge|Harmonics and resonance|IEC 60831-1/);
  });
  it('an installation whose board draws nothing: the reason, and no table of every board before → after', () => {
    const text = `${readFileSync('test/fixtures/hostile/idle-plant-room.yaml', 'utf8')}correction: { board: Plant room, target: { pf: 0.95 } }\n`;
    const r = runTrivar(['report', '-'], text);
    expect(r.code).toBe(0);
    const section = sectionOf(r.stdout);
    expect(section).toContain('would add nothing');
    expect(section).toContain('the board draws no active power');
    expect(r.stdout).not.toMatch(/Capacitors hold their charge|→/);
  });
});

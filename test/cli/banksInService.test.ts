/**
 * What `trivar solve` and `trivar correct` say about the banks an installation file lists under
 * `harmonics.banks` (in service at the fundamental), on the shipped Ferrybank joinery example.
 * Figures are checked against the library's result for the same file, not against numbers written here.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readBoardText, solveInstallation } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';

const FILE = 'examples/ferrybank-joinery.yaml';
const library = solveInstallation(readBoardText(readFileSync(`${ROOT}${FILE}`, 'utf8')));

describe('trivar solve on an installation with banks listed', () => {
  it('takes them in service, states each with what it delivers, and --json is the library result', () => {
    const json = runTrivar(['solve', FILE, '--json']);
    expect(json.code).toBe(0);
    const data = JSON.parse(json.stdout) as typeof library;
    expect(data.banksInService).toEqual(library.banksInService);
    expect(data.banksInService.map((b) => [b.board, b.ratedKvarInService, b.stepsInService])).toEqual([
      ['Machine shop', 120, [1, 2, 3]],
      ['Finishing shop', 50, [1, 2]],
    ]);
    const text = runTrivar(['solve', FILE]).stdout;
    const flat = text.replace(/\s+/g, ' ');
    for (const b of library.banksInService) expect(flat).toContain(`${b.board} ${b.ratedKvarInService} kvar rated`);
    expect(flat).toContain(`${library.banksInService[1]!.deliveredKvar.toFixed(2)} kvar delivered`);
    expect(flat).toContain('every step on unless the entry’s stepsInService names the steps');
    // The finishing shop's bank delivers more than its loads draw, and the report says so.
    const finishing = library.boards.find((b) => b.name === 'Finishing shop')!.result;
    expect(finishing.totals.kvar).toBeLessThan(0);
    const delivered = library.banksInService[1]!.deliveredKvar;
    expect(flat).toContain(`! Finishing shop: its capacitor bank in service (harmonics.banks) delivers ${delivered.toFixed(2)} kvar, more than the ${(finishing.totals.kvar + delivered).toFixed(2)} kvar its own circuits draw`);
    for (const line of text.split('\n')) expect(line.length, line).toBeLessThanOrEqual(100);
  });
});

describe('trivar correct on a board of that installation', () => {
  it('sizes with the other board’s bank in, states it and the bank it replaces, and every board’s before includes it', () => {
    const args = ['correct', FILE, '--board', 'Machine shop', '--arrangement', 'delta-bank'];
    const text = runTrivar(args);
    expect(text.code).toBe(0);
    const flat = text.stdout.replace(/\s+/g, ' ');
    expect(flat).toContain('Banks in service in every solve, before and after, as the file lists them under harmonics.banks');
    expect(flat).toContain('Finishing shop 50 kvar rated (every step: 25+25 kvar; 440 V units).');
    expect(flat).toContain("The file's bank on Machine shop (steps 30+30+60 kvar, 440 V units) is left out: the equipment takes its place.");
    const data = JSON.parse(runTrivar([...args, '--json']).stdout);
    expect(data.otherBanksInService.map((b: { board: string }) => b.board)).toEqual(['Finishing shop']);
    expect(data.replacedBank).toMatchObject({ stepsKvar: [30, 30, 60], ratedV: 440 });
    // Before the equipment: the file as trivar solve takes it with the machine shop's bank out (no step in service).
    const file = readBoardText(readFileSync(`${ROOT}${FILE}`, 'utf8')) as { harmonics: { banks: Record<string, unknown>[] } };
    file.harmonics.banks[0]!.stepsInService = [];
    const withoutOwn = solveInstallation(file);
    for (const board of withoutOwn.boards) {
      const before = data.effect.boards.find((b: { name: string }) => b.name === board.name).incomerKvar.before;
      const solved = board.result.phases.reduce((s, p) => s + p.kvar, 0);
      expect(Math.abs(before - solved), board.name).toBeLessThan(1e-6 * Math.max(1, Math.abs(solved)));
    }
    expect(data.effect.boards.find((b: { name: string }) => b.name === 'Finishing shop').incomerKvar.before).toBeLessThan(0);
    expect(text.stdout).toMatch(/└ Finishing shop\s+\S+\s+\S+\s+\S+\s+\S+\s+\S+\s+-\d+\.\d\d→-\d+\.\d\d/);
    for (const line of text.stdout.split('\n')) expect(line.length, line).toBeLessThanOrEqual(100);
  });

  it('at the main board, where both banks already make the incomer lead, says so before the study', () => {
    const r = runTrivar(['correct', FILE, '--arrangement', 'star-bank']);
    const flat = r.stdout.replace(/\s+/g, ' ');
    expect(flat).toMatch(/! With those banks in service, lines A, B, C already lead at the incomer of Main board before any equipment \(PF 0\.\d{3} leading at the lowest\)/);
    expect(flat).toContain('more capacitance is in service there than its loads take. Capacitors cannot raise a leading PF');
  });
});

describe('trivar report on that installation with a correction section', () => {
  it('heads the correction with the banks taken in service and the one replaced, as trivar correct states them', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-banks-'));
    const file = join(dir, 'ferrybank-with-correction.yaml');
    const text = readFileSync(`${ROOT}${FILE}`, 'utf8');
    writeFileSync(file, `${text}correction: { board: Machine shop, arrangement: delta-bank, target: { pf: 0.95, measuredAt: origin } }\n`);
    const html = runTrivar(['report', file]);
    expect(html.code).toBe(0);
    const flat = html.stdout.replace(/<[^>]+>/g, ' ').replace(/&#39;|&#x27;/g, "'").replace(/\s+/g, ' ');
    const correct = runTrivar(['correct', file]).stdout.replace(/\s+/g, ' ');
    for (const sentence of ['Banks in service in every solve, before and after, as the file lists them under harmonics.banks', "The file's bank on Machine shop (steps 30+30+60 kvar, 440 V units) is left out: the equipment takes its place."]) {
      expect(correct).toContain(sentence);
      expect(flat).toContain(sentence);
    }
  }, 60_000);
});

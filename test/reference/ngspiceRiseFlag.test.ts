/**
 * What a flagged voltage rise means on the board, against an independent solver: with the board's loads
 * off and every step of the delta bank in, the network is linear (EMFs, the transformer and feeder, three
 * capacitors), so ngspice's AC analysis of a netlist written here by hand from the file's figures — not
 * from core's model — gives the voltages `flagReading.noLoad.everyStepInPercent` must reproduce.
 * Board: the invented gravel pit crusher board (test/fixtures/hostile/gravel-pit-crusher.yaml).
 * Skipped without ngspice unless CI=true (then a missing ngspice fails).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { cAbs, cSub } from '../support/complexMath.js';
import { probeNgspice, runAc } from '../support/ngspice.js';
import { runTrivar } from '../cli/runTrivar.js';

const ngspice = probeNgspice();
const mustRun = process.env.CI === 'true';
const BOARD = 'test/fixtures/hostile/gravel-pit-crusher.yaml';

describe.skipIf(!ngspice && !mustRun)(`the unloaded board with every step in, against ngspice (${ngspice ?? 'not installed: skipped'})`, () => {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-spice-rise-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('ngspice is installed (required on CI)', () => expect(ngspice).not.toBeNull());

  it.skipIf(!ngspice)('delta bank: the highest voltage with the loads off, line-to-neutral and line-to-line, to 1e-6 of nominal', () => {
    const report = JSON.parse(runTrivar(['correct', BOARD, '--arrangement', 'delta-bank', '--json']).stdout);
    const reading = report.verification.voltageRise.flagReading;
    expect(reading).not.toBeNull();
    // The file: 400 V, 50 Hz; transformer 160 kVA, 6 %, X/R 5; feeder 180 m of 0.125 + j0.08 ohm/km.
    const f = 50;
    const omega = 2 * Math.PI * f;
    const zt = (0.06 * 400 ** 2) / 160e3;
    const rt = zt / Math.sqrt(1 + 25);
    const xt = 5 * rt;
    const rf = 0.125 * 0.18;
    const xf = 0.08 * 0.18;
    const e = 400 / Math.sqrt(3);
    const lines = ['* gravel pit crusher board, loads off, delta bank in'];
    ['a', 'b', 'c'].forEach((p, k) => {
      lines.push(`VE${p} s${p} 0 DC 0 AC ${e} ${-120 * k}`);
      lines.push(`R${p} s${p} m${p} ${rt + rf}`);
      lines.push(`L${p} m${p} ${p} ${(xt + xf) / omega}`);
    });
    // The bank as built, every step in, at nominal capacitance (its branches' µF as the study reports them).
    const node: Record<string, string> = { A: 'a', B: 'b', C: 'c' };
    report.verification.branches.forEach((b: { branch: string; capacitanceUF: number }, k: number) => {
      const [from, to] = b.branch.split('-');
      lines.push(`C${k} ${node[from!]} ${node[to!]} ${b.capacitanceUF * 1e-6}`);
    });
    const spice = runAc(lines.join('\n'), f, ['v(a)', 'v(b)', 'v(c)'], dir, 'rise');
    const v = ['a', 'b', 'c'].map((p) => spice.get(`v(${p})`)!);
    // The board's own voltages as its check judges them on a 4-wire board: to the neutral (no neutral current
    // flows: the neutral bar sits at the star point) against 230 V, and line to line against 400 V.
    const percents = [...v.map((x) => (100 * cAbs(x)) / 230), ...[0, 1, 2].map((k) => (100 * cAbs(cSub(v[k]!, v[(k + 1) % 3]!))) / 400)];
    expect(Math.abs(reading.noLoad.everyStepInPercent - Math.max(...percents))).toBeLessThan(1e-6);
    // Without the bank the board holds the EMF: 400/√3 against 230 V.
    expect(reading.noLoad.withoutPercent).toBeCloseTo((100 * e) / 230, 9);
  });
});

/**
 * Installation files a hostile user or a practising engineer writes, through the built binary:
 * control characters in board names on every text report, and the faults found in that pass.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const SUPPLY = 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } }';
const noStack = (stderr: string) => expect(stderr).not.toMatch(/\n\s+at .+[:(]\d+/);
const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e]/;

/** A riser whose sub-board's name holds a bell, a right-to-left override and a NUL. */
const controlNamed = JSON.stringify({
  name: 'Riser',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
  boards: [
    { name: 'Main', loads: [{ name: 'Lights', connection: 'A-N', kW: 2, pf: 0.95 }] },
    { name: 'Plant\u0007room\u202e\u0000x', fedFrom: 'Main', feeder: { lengthM: 18, line: { mm2: 16 }, neutral: { mm2: 16 } }, loads: [{ name: 'Pump\u001b[2J', connection: 'C-N', kW: 6 }] },
  ],
});

describe('control characters in board names', () => {
  it('solve --all-boards shows the board escaped, and does not fail', () => {
    const r = runTrivar(['solve', '-', '--all-boards'], controlNamed);
    noStack(r.stderr);
    expect(r.code).toBe(0);
    expect(r.stdout).not.toMatch(CONTROL);
    expect(r.stdout).toContain('━━ Plant\\u{7}room\\u{202E}\\0x (fed from Main) ━━');
  });
  it('harmonics (also --all-boards) and rebalance escape them in the text report', () => {
    for (const args of [['harmonics', '-'], ['harmonics', '-', '--all-boards'], ['rebalance', '-']]) {
      const r = runTrivar(args, controlNamed);
      noStack(r.stderr);
      expect(r.code).toBe(0);
      expect(r.stdout).not.toMatch(CONTROL);
      expect(r.stdout).toContain('Plant\\u{7}room\\u{202E}\\0x');
    }
    const all = runTrivar(['harmonics', '-', '--all-boards'], controlNamed);
    expect(all.stdout).toContain('━━ Plant\\u{7}room\\u{202E}\\0x');
  });
});

/**
 * The sequence view of a board with no sequence components is one refusal: the same message and exit status
 * (2: the view asked for does not fit the file) whether or not a correction is drawn with it. With
 * --with-correction it was exit 3 and another message, after the correction study had run.
 *
 * Invented: the Orchard Rise pump shed (120/240 V split-phase, a correction section), and Cedar Gap farm
 * (a 120/240 V installation of two boards).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const PUMP_SHED = `name: Orchard Rise pump shed
supply: { system: split-phase, voltage: { lineToNeutral: 120 }, frequencyHz: 60 }
feeder:
  line: { lengthM: 20, rOhmPerKm: 1.0, xOhmPerKm: 0.5, ratingA: 100 }
  neutral: { lengthM: 20, rOhmPerKm: 1.0, xOhmPerKm: 0.5, ratingA: 100 }
loads:
  - { name: Irrigation pump, connection: A-N, kW: 2.4, pf: 0.7 }
  - { name: Welder, connection: A-B, kW: 4.8, pf: 0.75 }
correction:
  target: { pf: 0.95 }
`;

const FARM = `name: Cedar Gap farm
supply: { voltage: 120/240, frequencyHz: 60 }
boards:
  - name: Farmhouse
    loads: [ { name: Dryer, connection: A-B, kW: 5 } ]
  - name: Barn
    fedFrom: Farmhouse
    feeder: { line: { lengthM: 60, rOhmPerKm: 1.0, xOhmPerKm: 0.1 }, neutral: { lengthM: 60, rOhmPerKm: 1.0, xOhmPerKm: 0.1 } }
    loads: [ { name: Welder, connection: A-B, kW: 6, pf: 0.8 } ]
correction:
  board: Barn
  target: { pf: 0.95 }
`;

const REFUSAL = 'error: the sequence view needs a three-phase board; this one is split-phase\n';

describe('the sequence view of a split-phase board', () => {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-sequence-view-'));
  const write = (name: string, text: string) => {
    const file = join(dir, name);
    writeFileSync(file, text);
    return file;
  };

  it.each([
    ['a board file', () => write('pump-shed.yaml', PUMP_SHED), [] as string[]],
    ['an installation, its main board', () => write('farm.yaml', FARM), []],
    ['an installation, a sub-board', () => write('farm-barn.yaml', FARM), ['--board', 'Barn']],
  ])('%s: exit 2 and the same message, with or without --with-correction', (_, file, extra) => {
    const path = file();
    const plain = runTrivar(['diagram', path, '--view', 'sequence', ...extra]);
    const corrected = runTrivar(['diagram', path, '--view', 'sequence', '--with-correction', ...extra]);
    for (const r of [plain, corrected]) {
      expect(r.code).toBe(2);
      expect(r.stderr).toBe(REFUSAL);
      expect(r.stdout).toBe('');
    }
  });
});

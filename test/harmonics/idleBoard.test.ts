/**
 * A board that carries nothing in a harmonic study reads no current, no THD and no power factor:
 * round-off is not data (noiseFloor.ts). An empty shed at the end of a split-phase service read
 * 4e-15 A, "I THD 5.0 %" and a true PF of -0.050.
 */
import { describe, expect, it } from 'vitest';
import { studyInstallationHarmonics } from '@trivar/core';

// An invented split-phase farmhouse service: a kitchen and workshop panel, and a shed fed from it with nothing on.
const spec = {
  name: 'farmhouse',
  supply: { voltage: '120/240', frequencyHz: 60, transformer: { kVA: 25, impedancePercent: 2.5, xOverR: 2 } },
  boards: [
    { name: 'house panel', loads: [{ name: 'range', connection: 'A-B', kW: 8 }, { name: 'kitchen outlets', connection: 'A-N', kW: 1.5, pf: 0.9 }] },
    { name: 'empty shed', fedFrom: 'house panel', feeder: { lengthFt: 80, line: { awg: '10' }, neutral: { awg: '10' } }, loads: [] },
  ],
};

describe('an idle board in a harmonic study', () => {
  it('reads zero current and no THD or power factor', () => {
    const r = studyInstallationHarmonics(spec);
    const shed = r.boards.find((b) => b.board === 'empty shed')!;
    for (const line of shed.lines) {
      expect(line.current.rms).toBe(0);
      expect(line.current.thdPercent).toBeNull();
      expect(line.truePf).toBeNull();
      expect(line.displacementPf).toBeNull();
      expect(line.displacementSense).toBe('none');
    }
    // No current: no PF and no sense (the sense fields were added beside the figures; nothing flows, so 'none').
    expect(shed.powerFactor).toEqual({ true: null, displacement: null, displacementSense: 'none', fundamentalKW: 0, fundamentalKvar: 0 });
    // The loaded board beside it still reads its figures.
    const house = r.boards.find((b) => b.board === 'house panel')!;
    expect(house.lines[0]!.current.rms).toBeGreaterThan(30);
    expect(house.powerFactor.true).toBeGreaterThan(0.9);
  });
});

describe('the neutral sizing note', () => {
  it('is given where triplens are a real share of the neutral, and left out where they are not', () => {
    const withTriplens = studyInstallationHarmonics({
      name: 'office floor',
      supply: { voltage: '400/230', frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
      boards: [{ name: 'floor board', loads: [{ name: 'desks', connection: 'A-N', kW: 6, pf: 0.95, spectrum: 'switch-mode' }, { name: 'kettle', connection: 'B-N', kW: 2 }] }],
    });
    const n = withTriplens.boards[0]!.neutral!;
    expect(n.triplenSharePercent!).toBeGreaterThan(10);
    expect(n.practice).toMatch(/triplen currents of all three phases/);
    const linear = studyInstallationHarmonics({
      name: 'workshop',
      supply: { voltage: '400/230', frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
      boards: [{ name: 'bench board', loads: [{ name: 'heater', connection: 'A-N', kW: 6 }, { name: 'drive', connection: 'ABC-delta', kW: 11, pf: 0.9, spectrum: 'six-pulse-drive' }] }],
    });
    const m = linear.boards[0]!.neutral!;
    expect(m.triplenSharePercent ?? 0).toBeLessThan(10);
    expect(m.practice).toBeNull();
  });
});

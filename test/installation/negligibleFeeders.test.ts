/**
 * A feeder of a fraction of a millimetre (a typo, or "zero" written as 0.001 ft) is a direct
 * connection: below NEGLIGIBLE_OHMS its nodes are merged. Kept as an element, its admittance left the
 * load iteration unable to settle (correct failed with "the loads may exceed what the supply can
 * deliver") or, at 1e-12 ft, made the matrix singular.
 */
import { describe, expect, it } from 'vitest';
import { compareCorrections, normaliseInstallation, parseInstallation, solveInstallation, boardOfInstallation } from '@trivar/core';
import { NEGLIGIBLE_OHMS } from '../../packages/core/src/network/installationCircuit.js';

// An invented open-delta farm supply: a barn board and a well house beside it.
const farm = (wellFeeder: Record<string, unknown> | undefined) => ({
  name: 'Open delta farm',
  supply: {
    system: 'three-phase-3wire',
    voltage: { lineToLine: 240 },
    frequencyHz: 60,
    openDelta: { 'A-B': { kVA: 50, impedancePercent: 2.5, xOverR: 2 }, 'B-C': { kVA: 25, impedancePercent: 3, xOverR: 2 } },
  },
  boards: [
    {
      name: 'Barn main',
      feeder: { lengthFt: 150, line: { kcmil: 250, material: 'aluminum' } },
      loads: [
        { name: 'Grain dryer fan', connection: 'ABC-delta', kW: 15, pf: 0.85 },
        { name: 'Shop heaters', connection: 'A-B', kW: 10 },
        { name: 'Milk cooler', connection: 'B-C', kW: 4, pf: 0.8 },
      ],
    },
    { name: 'Well house', fedFrom: 'Barn main', ...(wellFeeder ? { feeder: wellFeeder } : {}), loads: [{ name: 'Pump', connection: 'ABC-delta', kW: 5.5, pf: 0.83 }] },
  ],
});

describe('feeders below a microhm are direct connections', () => {
  const busbar = solveInstallation(farm(undefined));
  for (const lengthFt of [0.001, 1e-12]) {
    it(`a ${lengthFt} ft feeder solves as the busbar does, to 1e-6`, () => {
      const r = solveInstallation(farm({ lengthFt, line: { awg: '8' } }));
      r.boards.forEach((b, i) =>
        b.result.phases.forEach((p, k) => {
          const ref = busbar.boards[i]!.result.phases[k]!;
          expect(Math.abs(p.voltage.magnitude - ref.voltage.magnitude) / ref.voltage.magnitude).toBeLessThan(1e-6);
          expect(Math.abs(p.current.magnitude - ref.current.magnitude)).toBeLessThan(1e-6 * Math.max(1, ref.current.magnitude));
        }),
      );
    });
  }

  it('a correction on the main board with such a feeder below it is studied (no failure to settle)', () => {
    const installation = normaliseInstallation(parseInstallation(farm({ lengthFt: 0.001, line: { awg: '8' } }))).installation;
    const c = compareCorrections(boardOfInstallation(installation, 0), {});
    expect(c.recommended).not.toBeNull();
    expect(c.meetsTarget).toBe(true);
  });

  it('a feeder of a few microhms stays an element: its drop is still computed', () => {
    // 0.05 ft of 8 AWG copper is about 4e-5 ohm, well above the threshold.
    expect(0.05 * 0.000778).toBeGreaterThan(10 * NEGLIGIBLE_OHMS);
    const r = solveInstallation(farm({ lengthFt: 0.05, line: { awg: '8' } }));
    const feeder = r.feeders.find((f) => f.board === 'Well house')!;
    expect(Math.abs(feeder.voltageDropPercent)).toBeGreaterThan(0);
  });
});

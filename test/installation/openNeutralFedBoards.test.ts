/**
 * A broken neutral in a board's feeder is broken for every board fed from it: the study lists their
 * line-to-neutral circuits too (named with their board), read off the same solve of the installation.
 */
import { describe, expect, it } from 'vitest';
import { solveInstallation } from '@trivar/core';

const supply = { voltage: '208Y/120', frequencyHz: 60 } as const;
const feeder = { lengthFt: 10, line: { awg: '2' }, neutral: { awg: '2' } } as const;
const lamp = { name: 'Lamp A', connection: 'A-N', kW: 1, model: 'constant-impedance' } as const;
const heater = { name: 'Heater B', connection: 'B-N', kW: 1, model: 'constant-impedance' } as const;

describe('open neutral on an installation', () => {
  it('the service neutral broken: the sub-board circuit is listed and sees what a hand calculation gives', () => {
    const r = solveInstallation(
      { supply, boards: [{ name: 'Main', feeder, loads: [lamp] }, { name: 'Sub', fedFrom: 'Main', feeder, loads: [heater] }] },
      { openNeutral: true },
    );
    const study = r.boards[0]!.result.openNeutral!;
    expect(study.applicable).toBe(true);
    expect(study.loads.map((l) => l.name)).toEqual(['Lamp A', 'Heater B (Sub)']);
    expect(study.loads[1]!.board).toBe('Sub');
    // Hand check: two equal 14.4 Ω heaters in series across 208 V (A to B) see 104 V each; the
    // feeders' few milliohms move that by well under a volt.
    for (const l of study.loads) expect(l.voltage).toBeCloseTo(104, 0);
    expect(study.highestPercent).toBeCloseTo((100 * study.loads[1]!.voltage) / 120, 1); // of the 208Y/120 system's 120 V nominal
  });
  it('a board with no line-to-neutral circuits of its own still has a study when a board it feeds has them', () => {
    const r = solveInstallation(
      {
        supply,
        boards: [
          { name: 'Main', feeder, loads: [{ name: 'Welder', connection: 'A-B', kW: 3 }] },
          { name: 'Sub', fedFrom: 'Main', feeder, loads: [lamp, heater] },
        ],
      },
      { openNeutral: true },
    );
    const study = r.boards[0]!.result.openNeutral!;
    expect(study.applicable).toBe(true);
    expect(study.loads.map((l) => l.name)).toEqual(['Lamp A (Sub)', 'Heater B (Sub)']);
    // The sub-board's own study lists its circuits without a board name.
    expect(r.boards[1]!.result.openNeutral!.loads.map((l) => l.name)).toEqual(['Lamp A', 'Heater B']);
  });

  it('"every load as a constant impedance" converts the loads of the boards fed too (they kept their constant power)', () => {
    // Constant-power heaters on two sub-boards, the service neutral broken: as impedances, 3 kW and 1 kW at
    // 120 V are 4.8 Ω and 14.4 Ω in series across 240 V, so 60 V and 180 V (hand figures).
    const tiny = { line: { r: 0.001, x: 0 }, neutral: { r: 0.001, x: 0 } };
    const board = (name: string, connection: 'A-N' | 'B-N', kW: number) => ({ name, fedFrom: 'Main', feeder: tiny, loads: [{ name: `Heater ${name}`, connection, kW }] });
    const r = solveInstallation(
      { supply: { voltage: '120/240', frequencyHz: 60, impedance: { r: 0.001, x: 0.001 } }, boards: [{ name: 'Main', feeder: tiny, loads: [] }, board('Sub A', 'A-N', 3), board('Sub B', 'B-N', 1)] },
      { openNeutral: true },
    );
    const study = r.boards[0]!.result.openNeutral!;
    const asZ = study.impedanceModel!.loads.map((l) => l.voltage);
    expect(asZ[0]).toBeCloseTo(60, 0);
    expect(asZ[1]).toBeCloseTo(180, 0);
    // The reached state keeps the loads' own model, so it differs, and the study says the answer depends on it.
    expect(study.dependsOnLoadModel).toBe(true);
    expect(study.loads[1]!.voltage).toBeGreaterThan(200);
  });
});

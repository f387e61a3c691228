/**
 * Conductor resistances against published tables: every size the library holds.
 *
 * IEC 60228 Table 2, class 2 stranded conductors, maximum DC resistance at 20 °C, Ω/km,
 * plain copper and aluminium, as reproduced at
 *   mycableengineering.com/knowledge-base/iec-60228-dc-resistance (copper and aluminium),
 *   kabelmetal-indonesia.com "Conductor specification in according to IEC 60228", Table A.2
 *     (copper and aluminium; its Table A.1, class 1 solid, differs from 185 mm² up: 0.101, not 0.0991),
 *   uecables.com "Power copper conductors according to IEC 60228" (copper, and the
 *     temperature factors: 0.833 at 70 °C).
 * All three agree on every value below.
 * NEC Chapter 9 Table 8, uncoated copper and aluminum, DC resistance at 75 °C, Ω/kft, stranded
 * rows (14–8 AWG also have solid rows: Cu 3.07, 1.93, 1.21, 0.764; Al 12–8 3.18, 2.00, 1.26), as
 * reproduced at sfasoft.com "Conductor Properties" (solid and stranded rows) and
 * electrical-design-tutor.com "Conductor Resistance" (NEC 2011 Table 8, the stranded rows).
 * Temperature: the Table 8 note's R2 = R1(1 + α(T2 − 75)), α = 0.00323 Cu, 0.00330 Al,
 * checked against the formula itself; IEC 60228 Annex B's factor at 70 °C (0.833) as above.
 */
import { describe, expect, it } from 'vitest';
import { conductorResistance, solveInstallation } from '@trivar/core';

const kft = 1000 / 0.3048 / 1000; // Ω/kft → Ω/km

/** IEC 60228 Table 2, class 2, Ω/km at 20 °C: [mm², copper, aluminium] (null: not in the table). */
const IEC_60228_TABLE_2: readonly [number, number | null, number | null][] = [
  [1.5, 12.1, null], [2.5, 7.41, null], [4, 4.61, null], [6, 3.08, null], [10, 1.83, 3.08], [16, 1.15, 1.91],
  [25, 0.727, 1.2], [35, 0.524, 0.868], [50, 0.387, 0.641], [70, 0.268, 0.443], [95, 0.193, 0.32], [120, 0.153, 0.253],
  [150, 0.124, 0.206], [185, 0.0991, 0.164], [240, 0.0754, 0.125], [300, 0.0601, 0.1], [400, 0.047, 0.0778],
  [500, 0.0366, 0.0605], [630, 0.0283, 0.0469], [800, null, 0.0367], [1000, null, 0.0291],
];

/** NEC Chapter 9 Table 8, uncoated stranded, Ω/kft at 75 °C: [size, copper, aluminum (null: not held)]. */
const NEC_TABLE_8: readonly [{ awg: string } | { kcmil: number }, number, number | null][] = [
  [{ awg: '14' }, 3.14, null], [{ awg: '12' }, 1.98, 3.25], [{ awg: '10' }, 1.24, 2.04], [{ awg: '8' }, 0.778, 1.28],
  [{ awg: '6' }, 0.491, 0.808], [{ awg: '4' }, 0.308, 0.508], [{ awg: '3' }, 0.245, 0.403], [{ awg: '2' }, 0.194, 0.319],
  [{ awg: '1' }, 0.154, 0.253], [{ awg: '1/0' }, 0.122, 0.201], [{ awg: '2/0' }, 0.0967, 0.159], [{ awg: '3/0' }, 0.0766, 0.126],
  [{ awg: '4/0' }, 0.0608, 0.1], [{ kcmil: 250 }, 0.0515, 0.0847], [{ kcmil: 300 }, 0.0429, 0.0707], [{ kcmil: 350 }, 0.0367, 0.0605],
  [{ kcmil: 400 }, 0.0321, 0.0529], [{ kcmil: 500 }, 0.0258, 0.0424], [{ kcmil: 600 }, 0.0214, 0.0353], [{ kcmil: 700 }, 0.0184, 0.0303],
  [{ kcmil: 750 }, 0.0171, 0.0282], [{ kcmil: 800 }, 0.0161, 0.0265], [{ kcmil: 900 }, 0.0143, 0.0235], [{ kcmil: 1000 }, 0.0129, 0.0212],
];

describe('cable library against the published tables', () => {
  it.each(IEC_60228_TABLE_2)('IEC 60228 class 2, %f mm²: Cu %s, Al %s Ω/km at 20 °C', (mm2, cu, al) => {
    for (const [metal, value] of [['copper', cu], ['aluminium', al]] as const) {
      const r = conductorResistance({ mm2 }, metal, 20);
      if (value === null) {
        expect(r, `${mm2} mm² ${metal}`).toBeNull();
        continue;
      }
      expect(r!.tableValue).toBe(value);
      expect(r!.ohmPerKm).toBeCloseTo(value, 12);
      expect(r!.table).toBe('IEC 60228 class 2');
    }
  });
  it.each(NEC_TABLE_8)('NEC Table 8, %o: Cu %s, Al %s Ω/kft at 75 °C (stranded)', (size, cu, al) => {
    for (const [metal, value] of [['copper', cu], ['aluminium', al]] as const) {
      const r = conductorResistance(size, metal, 75);
      if (value === null) {
        expect(r).toBeNull();
        continue;
      }
      expect(r!.tableValue).toBe(value);
      expect(r!.ohmPerKm).toBeCloseTo(value * kft, 12);
    }
  });
  it('holds no size the published tables above do not list', () => {
    for (const mm2 of [0.5, 1, 3, 5, 20, 90, 200, 1200]) expect(conductorResistance({ mm2 }, 'copper'), `${mm2} mm²`).toBeNull();
    for (const awg of ['0', '5', '7', '9', '11', '16', '18', '0000', '5/0']) expect(conductorResistance({ awg }, 'copper'), `${awg} AWG`).toBeNull();
    for (const kcmil of [200, 450, 1250]) expect(conductorResistance({ kcmil }, 'aluminium'), `${kcmil} kcmil`).toBeNull();
  });
  it('corrects for temperature as each table says, and defaults to 70 °C (mm²) / 75 °C (AWG)', () => {
    const cu95 = conductorResistance({ mm2: 95 }, 'copper')!;
    expect(cu95.temperatureC).toBe(70);
    expect(cu95.temperatureFactor).toBeCloseTo(1 + 0.00393 * 50, 12);
    // IEC 60228 Annex B reproduction: factor 0.833 to bring a 70 °C reading to 20 °C.
    expect(1 / cu95.temperatureFactor).toBeCloseTo(0.833, 2);
    const awg = conductorResistance({ awg: '1/0' }, 'copper', 20)!;
    expect(awg.ohmPerKm / (0.122 * kft)).toBeCloseTo(1 + 0.00323 * (20 - 75), 12);
    expect(conductorResistance({ awg: '1/0' }, 'copper')!.temperatureC).toBe(75);
  });
  it('a feeder from the library carries the table resistance times length, and a doubled neutral half of it', () => {
    const result = solveInstallation({
      supply: { system: 'three-phase-4wire', voltage: { lineToNeutral: 230 }, frequencyHz: 50 },
      boards: [
        { name: 'Main', loads: [] },
        {
          name: 'Workshop',
          fedFrom: 'Main',
          feeder: { lengthM: 50, line: { mm2: 35, temperatureC: 20 }, neutral: { mm2: 35, temperatureC: 20, parallel: 2 } },
          loads: [{ name: 'kiln', connection: 'A-N', ohms: { r: 10, x: 0 } }],
        },
      ],
    });
    // One resistive loop: 10 Ω + line 0.524·0.05 + neutral 0.524·0.05/2, reactance 0.08·0.05·1.5.
    const r = 10 + 0.524 * 0.05 * 1.5;
    const x = 0.08 * 0.05 * 1.5;
    const current = 230 / Math.hypot(r, x);
    expect(result.feeders[1]!.lines[0]!.current.magnitude).toBeCloseTo(current, 9);
    expect(result.feeders[1]!.lossesKW * 1000).toBeCloseTo(current * current * 0.524 * 0.05 * 1.5, 6);
    expect(result.feeders[1]!.description).toBe('35 mm² Cu, 50 m at 20 °C; neutral 35 mm² Cu ×2, 50 m at 20 °C');
  });
});

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
 * NEC Chapter 9 Table 9 (600 V, three single conductors in conduit, 60 Hz), "XL (reactance) for all
 * wires", PVC/aluminium-conduit column, Ω/kft, as reproduced at sfasoft.com "A.C. for 600 Volt" and
 * studylib.net "AC Resistance and Reactance" (NEC Table 9; every size), and brunsengineering.com
 * "NEC Table 9" (14 AWG–350 kcmil); its Ω/km column for 14 AWG–1/0 as reproduced on scribd
 * ("Table 9 Alternating-Current Resistance and Reactance", NEC 2008). All agree on every value below.
 * mm² reactance: the per-conductor formula X = 0.0628·ln(2s/(a·d)) mΩ/m at 50 Hz for multicore cable
 * (IET Guidance Note, "Calculation of Reactance" appendix, as reproduced at 1library.net; coefficient
 * a for 7-, 19- and 37-wire conductors 0.724, 0.758, 0.768 from the same page); the conductor
 * diameters and insulation thicknesses used with it are typical values, from memory.
 */
import { describe, expect, it } from 'vitest';
import { conductorReactance, conductorResistance, DEFAULT_CABLE_REACTANCE_OHM_PER_KM, solveInstallation } from '@trivar/core';

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

/** NEC Chapter 9 Table 9, XL for all wires, Ω/kft at 60 Hz: [size, PVC/Al conduit, steel conduit]. */
const NEC_TABLE_9_XL: readonly [{ awg: string } | { kcmil: number }, number, number][] = [
  [{ awg: '14' }, 0.058, 0.073], [{ awg: '12' }, 0.054, 0.068], [{ awg: '10' }, 0.05, 0.063], [{ awg: '8' }, 0.052, 0.065],
  [{ awg: '6' }, 0.051, 0.064], [{ awg: '4' }, 0.048, 0.06], [{ awg: '3' }, 0.047, 0.059], [{ awg: '2' }, 0.045, 0.057],
  [{ awg: '1' }, 0.046, 0.057], [{ awg: '1/0' }, 0.044, 0.055], [{ awg: '2/0' }, 0.043, 0.054], [{ awg: '3/0' }, 0.042, 0.052],
  [{ awg: '4/0' }, 0.041, 0.051], [{ kcmil: 250 }, 0.041, 0.052], [{ kcmil: 300 }, 0.041, 0.051], [{ kcmil: 350 }, 0.04, 0.05],
  [{ kcmil: 400 }, 0.04, 0.049], [{ kcmil: 500 }, 0.039, 0.048], [{ kcmil: 600 }, 0.039, 0.048], [{ kcmil: 750 }, 0.038, 0.048],
  [{ kcmil: 1000 }, 0.037, 0.046],
];
/** Table 9's own Ω/km column, PVC/Al conduit, 14 AWG–1/0 (scribd reproduction). */
const NEC_TABLE_9_XL_PER_KM: readonly [string, number][] = [
  ['14', 0.19], ['12', 0.177], ['10', 0.164], ['8', 0.171], ['6', 0.167], ['4', 0.157], ['3', 0.154], ['2', 0.148], ['1', 0.151], ['1/0', 0.144],
];

describe('cable reactance', () => {
  it.each(NEC_TABLE_9_XL)('NEC Table 9, %o: XL %s Ω/kft in PVC/aluminium conduit at 60 Hz', (size, pvc, steel) => {
    const x = conductorReactance(size, 60)!;
    expect(x.ohmPerKm).toBeCloseTo(pvc * kft, 12);
    expect(x.source).toContain('Table 9');
    expect(x.source).toContain('PVC or aluminium conduit');
    const inSteel = conductorReactance(size, 60, 'steel')!;
    expect(inSteel.ohmPerKm).toBeCloseTo(steel * kft, 12);
    expect(inSteel.source).toContain('steel conduit');
    // The steel wall adds 19–27 % to every row (a check that both columns were copied correctly).
    expect(steel / pvc).toBeGreaterThan(1.19);
    expect(steel / pvc).toBeLessThan(1.27);
  });
  it.each(NEC_TABLE_9_XL_PER_KM)("NEC Table 9's Ω/km column, %s AWG: %s Ω/km, within the rounding of the two columns", (awg, perKm) => {
    // Each column rounded to 0.001 of its own unit: they may differ by 0.0005·kft + 0.0005 Ω/km.
    expect(Math.abs(conductorReactance({ awg }, 60)!.ohmPerKm - perKm)).toBeLessThanOrEqual(0.0005 * kft + 0.0005);
  });
  it('700, 800 and 900 kcmil (not in Table 9) lie on the line between the neighbouring rows', () => {
    expect(conductorReactance({ kcmil: 700 }, 60)!.ohmPerKm).toBeCloseTo((0.039 + (0.038 - 0.039) * (100 / 150)) * kft, 12);
    expect(conductorReactance({ kcmil: 800 }, 60)!.ohmPerKm).toBeCloseTo((0.038 + (0.037 - 0.038) * (50 / 250)) * kft, 12);
    expect(conductorReactance({ kcmil: 900 }, 60)!.source).toContain('interpolated');
    // The steel column between 750 (0.048) and 1000 (0.046) kcmil.
    expect(conductorReactance({ kcmil: 800 }, 60, 'steel')!.ohmPerKm).toBeCloseTo((0.048 + (0.046 - 0.048) * (50 / 250)) * kft, 12);
  });
  it('scales with frequency: Table 9 at 50 Hz is 5/6 of its 60 Hz value, the mm² default at 60 Hz 6/5 of 0.08', () => {
    expect(conductorReactance({ awg: '2' }, 50)!.ohmPerKm).toBeCloseTo((0.045 * kft * 5) / 6, 12);
    expect(conductorReactance({ mm2: 95 }, 50)!.ohmPerKm).toBe(DEFAULT_CABLE_REACTANCE_OHM_PER_KM);
    expect(conductorReactance({ mm2: 95 }, 60)!.ohmPerKm).toBeCloseTo(0.096, 12);
  });
  it('the AWG reactances lie in 0.12–0.19 Ω/km at 60 Hz, above the old flat 0.08', () => {
    for (const [size] of NEC_TABLE_9_XL) {
      const x = conductorReactance(size, 60)!.ohmPerKm;
      expect(x).toBeGreaterThan(0.12);
      expect(x).toBeLessThan(0.191);
    }
  });
  it.each([
    // [what, conductor diameter d mm, insulation mm, coefficient a] — typical dimensions, from memory.
    ['2.5 mm² PVC, 7 wires', 2.0, 0.8, 0.724, 0.1],
    ['95 mm² XLPE, 19 wires', 11.4, 1.1, 0.758, 0.072],
    ['240 mm² XLPE, 37 wires', 18.2, 1.7, 0.768, 0.071],
  ] as const)('the mm² default (0.08 Ω/km at 50 Hz) against the reactance formula for %s', (_, d, insulation, a, expected) => {
    // Touching cores: axial separation s = d + 2 × insulation.
    const x = 0.0628 * Math.log((2 * (d + 2 * insulation)) / (a * d));
    expect(x).toBeCloseTo(expected, 2);
    // The default is within 25 % of every one of them.
    expect(Math.abs(DEFAULT_CABLE_REACTANCE_OHM_PER_KM - x) / x).toBeLessThan(0.25);
  });
});

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
  /** A 120 V heater of 2 Ω on a board 200 ft from the main over 1/0 AWG copper line and neutral. */
  const awgShop = (conduit?: 'steel') =>
    solveInstallation({
      supply: { system: 'three-phase-4wire', voltage: { lineToNeutral: 120 }, frequencyHz: 60 },
      boards: [
        { name: 'Main', loads: [] },
        {
          name: 'Shop',
          fedFrom: 'Main',
          feeder: { lengthFt: 200, line: { awg: '1/0', ...(conduit && { conduit }) }, neutral: { awg: '1/0', ...(conduit && { conduit }) } },
          loads: [{ name: 'heater', connection: 'A-N', ohms: { r: 2, x: 0 } }],
        },
      ],
    });
  it('an AWG feeder on a 60 Hz board carries Table 8 resistance and Table 9 reactance times length', () => {
    // Line and neutral in series: 2 × 0.2 kft × (0.122 Ω/kft at 75 °C + j0.044 Ω/kft).
    const r = 2 + 2 * 0.2 * 0.122;
    const x = 2 * 0.2 * 0.044;
    expect(awgShop().feeders[1]!.lines[0]!.current.magnitude).toBeCloseTo(120 / Math.hypot(r, x), 9);
  });
  it("the same feeder in steel conduit takes Table 9's steel column (0.055 Ω/kft for 1/0) and says so", () => {
    const result = awgShop('steel');
    const r = 2 + 2 * 0.2 * 0.122;
    const x = 2 * 0.2 * 0.055;
    expect(result.feeders[1]!.lines[0]!.current.magnitude).toBeCloseTo(120 / Math.hypot(r, x), 9);
    expect(result.feeders[1]!.description).toContain('steel conduit');
  });
});

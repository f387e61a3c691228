/**
 * Capacitor units are sold for the system's nominal voltage: on a 480Y/277 board (model source
 * 480/√3 = 277.1 V) 277 V single-phase units pass North-American practice's "rating ≥ nominal + 0 %"
 * (common practice, no source; METHODS.md §10), and the table's "V nom" is 277 V, the figure on
 * the drawing. Invented board: a cannery's HID lighting at PF 0.75.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard, solveBoard } from '@trivar/core';

const cannery = (voltage: unknown) => ({
  name: 'Cannery lighting board',
  supply: { system: 'three-phase-4wire', voltage, frequencyHz: 60, transformer: { kVA: 500, impedancePercent: 5.75, xOverR: 5 } },
  loads: [
    { name: 'HID lighting A', connection: 'A-N', kW: 30, pf: 0.75 },
    { name: 'HID lighting B', connection: 'B-N', kW: 28, pf: 0.75 },
    { name: 'HID lighting C', connection: 'C-N', kW: 26, pf: 0.75 },
  ],
});
const catalogue = [
  { name: 'unit 277 V 5 kvar', kind: 'single-phase', ratedKvar: 5, ratedV: 277, ratedHz: 60 },
  { name: 'unit 277 V 10 kvar', kind: 'single-phase', ratedKvar: 10, ratedV: 277, ratedHz: 60 },
] as const;

describe('units rated at the system nominal voltage', () => {
  it.each(['480Y/277', { lineToLine: 480 }])('a 480Y/277 board (%o) takes 277 V units for a star bank', (voltage) => {
    const board = normaliseBoard(parseBoard(cannery(voltage)));
    const report = correctBoard(board, { arrangement: 'star-bank', target: { pf: 0.95 }, catalogue: [...catalogue] });
    expect(report.status).toBe('meets-target');
    const rows = report.selection!.selections;
    expect(rows.map((b) => b.nominalV)).toEqual([277, 277, 277]);
    // 277 V + 0 %, and the highest solved voltage (about 276 V on this loaded board) / 1.10 below it.
    for (const b of rows) expect(b.requiredRatedV).toBe(277);
  });

  it('the low-voltage rule names the voltage a rating is taken at where it is not the printed nominal', () => {
    // A 330 m run of 16 mm² copper to a dryer heater drags phase A to about 161 V: 70.0 % of 230 V, 69.8 % of 230.9 V.
    const r = solveBoard({
      name: 'Far barn board',
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
      feeder: { line: { lengthM: 330, rOhmPerKm: 1.15, xOhmPerKm: 0.08, ratingA: 200 }, neutral: { lengthM: 330, rOhmPerKm: 1.15, xOhmPerKm: 0.08, ratingA: 200 } },
      loads: [
        { name: 'Grain dryer heater', connection: 'A-N', kW: 30, pf: 1, model: 'constant-impedance' },
        { name: 'Yard lights', connection: 'A-N', kW: 0.2, pf: 0.95, model: 'constant-power' },
      ],
    });
    const w = r.warnings.find((x) => x.code === 'load-below-model-threshold')!;
    expect(w.message).toMatch(/sees 69\.\d % of the 230\.9 V its rating is taken at, below the 70 %/);
    expect(r.phases[0]!.voltage.magnitude / 230).toBeGreaterThan(0.7 * 0.995);
  });
});

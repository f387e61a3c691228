/**
 * The drop column on a 3-wire board is taken from each phase's open-circuit voltage to the centroid of
 * the EMFs, the point its phase voltage is read against: a 3-wire board never sees the EMFs' zero-sequence
 * part, so unequal EMFs alone show no drop. Invented: a vineyard press house on an open delta whose
 * three open-circuit voltages were measured unequal.
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, solveBoardModel } from '@trivar/core';

const emf = { A: { V: 286, angleDeg: 0 }, B: { V: 279, angleDeg: -120 }, C: { V: 268, angleDeg: 121 } };
const pressHouse = (kW: number) =>
  normaliseBoard(
    parseBoard({
      name: 'Vineyard press house',
      supply: {
        system: 'three-phase-3wire',
        voltage: { lineToLine: 480 },
        frequencyHz: 60,
        emf,
        openDelta: { 'A-B': { kVA: 30, impedancePercent: 3, xOverR: 2 }, 'B-C': { kVA: 30, impedancePercent: 3, xOverR: 2 } },
      },
      loads: [{ name: 'Must pump', connection: 'ABC-delta', kW, pf: 0.85, model: 'constant-impedance' }],
    }),
  );

const phasor = (v: number, d: number) => ({ re: v * Math.cos((d * Math.PI) / 180), im: v * Math.sin((d * Math.PI) / 180) });
const e = [phasor(286, 0), phasor(279, -120), phasor(268, 121)];
// The EMFs' centroid, worked here: (ΣE)/3.
const centroid = { re: (e[0]!.re + e[1]!.re + e[2]!.re) / 3, im: (e[0]!.im + e[1]!.im + e[2]!.im) / 3 };
const openCircuit = e.map((x) => Math.hypot(x.re - centroid.re, x.im - centroid.im));
// The system nominal every % of nominal is taken against: 480Y/277, the written 480 V's pair.
const nominal = 277;

describe('drop on a 3-wire board with unequal EMFs', () => {
  it('the centroid is several volts off zero, so the EMFs alone would read as drops of ±2 %', () => {
    expect(Math.hypot(centroid.re, centroid.im)).toBeGreaterThan(4);
    expect(Math.max(...e.map((x, k) => Math.abs(Math.hypot(x.re, x.im) - openCircuit[k]!)))).toBeGreaterThan(3);
  });

  it('with a 1 W load every phase voltage is its open-circuit voltage to the centroid, and every drop is zero', () => {
    const r = solveBoardModel(pressHouse(0.001));
    r.phases.forEach((p, k) => {
      expect(p.voltage.magnitude).toBeCloseTo(openCircuit[k]!, 3);
      expect(Math.abs(p.voltageDropPercent)).toBeLessThan(1e-3);
    });
  });

  it('loaded, each drop is |E − centroid| − |V| in % of the nominal 277 V', () => {
    const r = solveBoardModel(pressHouse(24));
    r.phases.forEach((p, k) => expect(p.voltageDropPercent).toBeCloseTo((100 * (openCircuit[k]! - p.voltage.magnitude)) / nominal, 9));
    // The load draws current on every line, so every phase drops (none rises by the EMFs' offset).
    expect(Math.min(...r.phases.map((p) => p.voltageDropPercent))).toBeGreaterThan(0);
  });
});

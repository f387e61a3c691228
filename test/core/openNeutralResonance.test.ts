/**
 * A broken neutral with a capacitor on one line and an inductive load on another: the floating neutral
 * leaves the triangle of line voltages (series resonance), the loads see several times the line-to-line
 * voltage, and the cautions say so with the figure instead of "up to the line-to-line voltage".
 * Invented scenario: a scout hut whose hall lamps carry a 3 kvar correction capacitor on L1, an extract
 * fan on L2 and a tea urn on L3, fed by 25 m of cable.
 * Hand check: Millman's theorem for a star of impedances with its star point open, every load a
 * constant impedance at its rating (400/√3 V), each in series with its line conductor.
 */
import { describe, expect, it } from 'vitest';
import { readBoardText, solveBoard } from '@trivar/core';

type C = { re: number; im: number };
const c = (re: number, im = 0): C => ({ re, im });
const add = (a: C, b: C) => c(a.re + b.re, a.im + b.im);
const sub = (a: C, b: C) => c(a.re - b.re, a.im - b.im);
const mul = (a: C, b: C) => c(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
const div = (a: C, b: C) => {
  const d = b.re * b.re + b.im * b.im;
  return c((a.re * b.re + a.im * b.im) / d, (a.im * b.re - a.re * b.im) / d);
};
const abs = (a: C) => Math.hypot(a.re, a.im);
const polar = (m: number, deg: number) => c(m * Math.cos((deg * Math.PI) / 180), m * Math.sin((deg * Math.PI) / 180));

const hut = (l1: string) =>
  [
    'name: Larchfield scout hut',
    'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
    'feeder:',
    '  line: { lengthM: 25, rOhmPerKm: 0.8, xOhmPerKm: 0.08 }',
    '  neutral: { lengthM: 25, rOhmPerKm: 0.8, xOhmPerKm: 0.08 }',
    'loads:',
    `  - ${l1}`,
    '  - { name: Extract fan, connection: B-N, kW: 0.7, kvar: 3.2, model: constant-impedance }',
    '  - { name: Tea urn, connection: C-N, kW: 2, model: constant-impedance }',
    'studies: { openNeutral: true }',
    '',
  ].join('\n');
const CAPACITOR = '{ name: Hall lamp capacitor, connection: A-N, kW: 0.03, kvar: -3, model: constant-impedance }';
const LAMPS = '{ name: Hall lamps, connection: A-N, kW: 0.8, kvar: 0.3, model: constant-impedance }';

/** Millman: the open star's neutral and each load's voltage, every load a constant impedance. */
function handFigures(loads: readonly { kW: number; kvar: number }[]) {
  const ln = 400 / Math.sqrt(3);
  const zLine = c(0.8 * 0.025, 0.08 * 0.025);
  const emf = [0, -120, 120].map((deg) => polar(ln, deg));
  // S = V²/Z* at the rated voltage: Z = V² / conj(S).
  const zLoad = loads.map((l) => div(c(ln * ln), c(l.kW * 1000, -l.kvar * 1000)));
  const y = zLoad.map((z) => div(c(1), add(z, zLine)));
  const vN = div(
    emf.reduce((s, e, k) => add(s, mul(e, y[k]!)), c(0)),
    y.reduce((s, yk) => add(s, yk), c(0)),
  );
  const loadV = emf.map((e, k) => abs(mul(sub(e, vN), div(zLoad[k]!, add(zLoad[k]!, zLine)))));
  const boardV = emf.map((e, k) => sub(e, mul(mul(sub(e, vN), y[k]!), zLine)));
  const lineToLine = Math.max(...[0, 1, 2].map((k) => abs(sub(boardV[k]!, boardV[(k + 1) % 3]!))));
  return { bar: abs(vN), loadV, lineToLine };
}

describe('broken neutral with a capacitor and an inductive load on different lines', () => {
  const study = solveBoard(readBoardText(hut(CAPACITOR))).openNeutral!;
  const hand = handFigures([
    { kW: 0.03, kvar: -3 },
    { kW: 0.7, kvar: 3.2 },
    { kW: 2, kvar: 0 },
  ]);

  it('reaches the figures Millman gives: every load far above the line-to-line voltage', () => {
    expect(study.applicable).toBe(true);
    expect(study.barVoltage!.magnitude).toBeCloseTo(hand.bar, 1);
    study.loads.forEach((l, k) => expect(l.voltage).toBeCloseTo(hand.loadV[k]!, 1));
    // The capacitor sees most, about 1.9 times the line-to-line voltage.
    expect(hand.loadV[0]! / hand.lineToLine).toBeCloseTo(1.9, 1);
    expect(Math.max(...hand.loadV)).toBe(hand.loadV[0]);
  });

  it('the caution gives the figure and the resonance, not "up to the line-to-line voltage"', () => {
    const [first, second, third] = study.cautions;
    expect(study.cautions.join(' ')).not.toContain('up to the line-to-line voltage');
    expect(first).toContain(`here "Hall lamp capacitor" would see ${hand.loadV[0]!.toFixed(1)} V, ${(hand.loadV[0]! / hand.lineToLine).toFixed(1)} times the ${hand.lineToLine.toFixed(1)} V between the board's lines`);
    expect(first).toContain('capacitive and inductive loads on different phases are in series resonance through the floating neutral');
    expect(first).toContain('in TN-C-S installations exposed metalwork can become live');
    expect(second).toContain('Never switch, fuse or disconnect the neutral (PEN) on its own');
    expect(third).toMatch(/^Capacitors on line-to-neutral circuits \(power-factor correction of single-phase equipment, the EMI filters of electronic equipment\) can resonate/);
  });

  it('with resistive lamps instead of the capacitor the neutral stays inside the triangle: the usual caution holds', () => {
    const lamps = '{ name: Hall lamps, connection: A-N, kW: 0.8, model: constant-impedance }';
    const fan = '{ name: Extract fan, connection: B-N, kW: 0.7, kvar: 3.2, model: constant-impedance }';
    const plain = solveBoard(readBoardText(hut(lamps).replace(fan, fan.replace('kvar: 3.2', 'kvar: 0.2')))).openNeutral!;
    const hand = handFigures([
      { kW: 0.8, kvar: 0 },
      { kW: 0.7, kvar: 0.2 },
      { kW: 2, kvar: 0 },
    ]);
    plain.loads.forEach((l, k) => expect(l.voltage).toBeCloseTo(hand.loadV[k]!, 1));
    expect(Math.max(...hand.loadV)).toBeLessThan(hand.lineToLine);
    expect(plain.cautions[0]).toContain('line-to-neutral equipment on the lightly loaded phases can see up to the line-to-line voltage and be destroyed');
    expect(plain.cautions).toHaveLength(2);
  });

  it('lagging loads of unlike power factors can also go past it, a little: the figure, with no resonance or capacitor words', () => {
    const s = solveBoard(readBoardText(hut(LAMPS))).openNeutral!;
    const hand = handFigures([
      { kW: 0.8, kvar: 0.3 },
      { kW: 0.7, kvar: 3.2 },
      { kW: 2, kvar: 0 },
    ]);
    s.loads.forEach((l, k) => expect(l.voltage).toBeCloseTo(hand.loadV[k]!, 1));
    const k = hand.loadV.indexOf(Math.max(...hand.loadV));
    // Millman's weights are complex where the power factors differ, so the neutral can leave the triangle.
    expect(hand.loadV[k]! / hand.lineToLine).toBeCloseTo(1.05, 2);
    expect(s.cautions[0]).toContain(`here "${s.loads[k]!.name}" would see ${hand.loadV[k]!.toFixed(1)} V, above the ${hand.lineToLine.toFixed(1)} V between the board's lines)`);
    expect(s.cautions.join(' ')).not.toMatch(/resonan|Capacitors/);
    expect(s.cautions).toHaveLength(2);
  });

  it('a split-phase board in North-American words: legs, and the grounding tail kept', () => {
    const cabin = [
      'name: Juniper ridge cabin',
      'supply: { voltage: 120/240, frequencyHz: 60 }',
      'feeder:',
      '  line: { lengthFt: 80, awg: "2" }',
      '  neutral: { lengthFt: 80, awg: "2" }',
      'loads:',
      '  - { name: Lamp filter capacitor, connection: L1-N, kW: 0.02, kvar: -2, model: constant-impedance }',
      '  - { name: Well pump, connection: L2-N, kW: 0.5, kvar: 2.4, model: constant-impedance }',
      'studies: { openNeutral: true }',
      '',
    ].join('\n');
    const s = solveBoard(readBoardText(cabin)).openNeutral!;
    expect(Math.max(...s.loads.map((l) => l.voltage))).toBeGreaterThan(240);
    expect(s.cautions[0]).toMatch(/^A lost neutral is a hazardous condition: line-to-neutral equipment can see more than the line-to-line voltage/);
    expect(s.cautions[0]).toContain('on different legs are in series resonance');
    expect(s.cautions[0]).toContain('the neutral current can return through the grounding and bonding');
    expect(s.cautions[2]).toContain('inductive loads on the other legs');
  });
});

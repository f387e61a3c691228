/**
 * solveFixedNetwork (the harmonic study's linear solve) against the general solver: with the
 * load admittances the general solve converged to and no current sources, both solve the same
 * linear network, so line and neutral currents must agree — also behind unequal source
 * impedances and a zero-sequence star-point return, where Y·(E − V) is not the line current.
 */
import { describe, expect, it } from 'vitest';
import { type BoardSpec, normaliseBoard, solveFixedNetwork, solveNetwork } from '@trivar/core';
import { cAbs, cSub } from '../support/complexMath.js';

const loads: BoardSpec['loads'] = [
  { name: 'Heater', connection: 'A-N', kW: 6, pf: 1, model: 'constant-impedance' },
  { name: 'Motor', connection: 'ABC-delta', kW: 5, pf: 0.8, model: 'constant-impedance' },
  { name: 'Lighting', connection: 'C-N', kW: 1.5, pf: 0.9, model: 'constant-impedance' },
];
const supplies: [string, BoardSpec['supply']][] = [
  ['Z0 ≠ Z1', { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.02, x: 0.06 }, zeroSequence: { r: 0.05, x: 0.2 } }],
  ['per-phase impedances', { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { A: { r: 0.02, x: 0.05 }, B: { r: 0.04, x: 0.08 }, C: { r: 0.01, x: 0.03 } } }],
  ['common impedance', { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.02, x: 0.06 } }],
];

describe('solveFixedNetwork agrees with solveNetwork on a linear board', () => {
  for (const [label, supply] of supplies)
    it(label, () => {
      const board = normaliseBoard({ name: label, supply, loads });
      const general = solveNetwork(board);
      const fixed = solveFixedNetwork(board, { admittances: general.branches.map((l) => l.map((b) => b.admittance)) });
      const scale = Math.max(...general.lineCurrents.map(cAbs));
      general.lineCurrents.forEach((i, k) => expect(cAbs(cSub(fixed.lineCurrents[k]!, i))).toBeLessThan(1e-9 * scale));
      expect(cAbs(cSub(fixed.neutralCurrent!, general.neutralCurrent!))).toBeLessThan(1e-9 * scale);
    });
});

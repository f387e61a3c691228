/**
 * Invented boards of the kinds a practising engineer meets, each of which once
 * drew an answer that could not be built or that contradicted itself. Used by
 * fieldBoards.test.ts with the verdicts they must get now.
 */
import type { Board } from '@trivar/core';
import { makeBoard } from './boards.js';

/** 120/208 V office panel (60 Hz): lighting, receptacles and two rooftop units, uneven over the phases. */
export const officePanel208: Board = makeBoard(
  'three-phase-4wire',
  [
    { name: 'rooftop unit 1', connection: 'ABC-delta', kW: 7.5, pf: 0.8 },
    { name: 'rooftop unit 2', connection: 'ABC-delta', kW: 5, pf: 0.78 },
    { name: 'lighting A', connection: 'A-N', kW: 2.4, pf: 0.9 },
    { name: 'receptacles B', connection: 'B-N', kW: 1.8, pf: 0.85 },
    { name: 'copier and kitchen C', connection: 'C-N', kW: 2.2, pf: 0.82 },
  ],
  { lineToLine: 208, frequencyHz: 60, transformer: { kVA: 75, impedancePercent: 3.5, xOverR: 3 } },
);

/** 230/400 V block of flats with rooftop PV on phase B. */
export const flatsWithPv: Board = makeBoard(
  'three-phase-4wire',
  [
    { name: 'flats A', connection: 'A-N', kW: 9, pf: 0.92 },
    { name: 'flats B', connection: 'B-N', kW: 7, pf: 0.9 },
    { name: 'flats C', connection: 'C-N', kW: 8, pf: 0.93 },
    { name: 'lift', connection: 'ABC-delta', kW: 6, pf: 0.75 },
    { name: 'PV inverter', connection: 'B-N', kW: -5, pf: 1 },
  ],
  { transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
);

/** 400 V 3-wire workshop: a welder across A-B and a few motors. */
export const workshop400: Board = makeBoard(
  'three-phase-3wire',
  [
    { name: 'spot welder', connection: 'A-B', kW: 12, pf: 0.7 },
    { name: 'lathe', connection: 'ABC-delta', kW: 7.5, pf: 0.8 },
    { name: 'extractor', connection: 'ABC-delta', kW: 4, pf: 0.78 },
  ],
  { transformer: { kVA: 160, impedancePercent: 4, xOverR: 3 } },
);

/** 277/480 V North-American plant board. */
export const plant480: Board = makeBoard(
  'three-phase-4wire',
  [
    { name: 'air compressor', connection: 'ABC-delta', kW: 55, pf: 0.8 },
    { name: 'conveyor drives', connection: 'ABC-delta', kW: 30, pf: 0.78 },
    { name: 'lighting', connection: 'A-N', kW: 6, pf: 0.9 },
  ],
  { lineToLine: 480, frequencyHz: 60, transformer: { kVA: 500, impedancePercent: 5.75, xOverR: 6 } },
);

/** 347/600 V North-American plant board. */
export const plant600: Board = makeBoard(
  'three-phase-4wire',
  [
    { name: 'chiller', connection: 'ABC-delta', kW: 90, pf: 0.82 },
    { name: 'pumps', connection: 'ABC-delta', kW: 37, pf: 0.8 },
    { name: 'lighting', connection: 'B-N', kW: 8, pf: 0.9 },
  ],
  { lineToLine: 600, frequencyHz: 60, transformer: { kVA: 750, impedancePercent: 5.75, xOverR: 6 } },
);

/** 30 kW resistive load across A-B of a 400 V 3-wire board: the Steinmetz case. */
export const steinmetzBoard: Board = makeBoard('three-phase-3wire', [{ name: 'kiln', connection: 'A-B', kW: 30, pf: 1, model: 'constant-impedance' }], {
  transformer: { kVA: 200, impedancePercent: 4, xOverR: 3 },
});

/** One resistive load from A to the neutral of a 4-wire board. */
export const heaterOnA: Board = makeBoard('three-phase-4wire', [{ name: 'storage heater', connection: 'A-N', kW: 10, pf: 1, model: 'constant-impedance' }], {
  transformer: { kVA: 200, impedancePercent: 4, xOverR: 3 },
});

/** A resistive 4-wire board: PF already 1, only unbalance to remove. */
export const resistiveBoard: Board = makeBoard(
  'three-phase-4wire',
  [
    { name: 'ovens', connection: 'ABC-star', kW: 30, pf: 1, model: 'constant-impedance' },
    { name: 'water heater', connection: 'A-N', kW: 6, pf: 1, model: 'constant-impedance' },
  ],
  { transformer: { kVA: 200, impedancePercent: 4, xOverR: 3 } },
);

/** 120/240 V house (60 Hz): well pump and heat pump across the two lines, a few 120 V circuits. */
export const house240: Board = makeBoard(
  'split-phase',
  [
    { name: 'heat pump', connection: 'A-B', kW: 4.5, pf: 0.82 },
    { name: 'well pump', connection: 'A-B', kW: 1.1, pf: 0.75 },
    { name: 'kitchen', connection: 'A-N', kW: 1.5, pf: 0.95 },
    { name: 'freezer and laundry', connection: 'B-N', kW: 0.8, pf: 0.7 },
  ],
  { lineToNeutral: 120, frequencyHz: 60, transformer: { kVA: 25, impedancePercent: 2.5, xOverR: 2 } },
);

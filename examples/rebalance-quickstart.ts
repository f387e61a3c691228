// Library use of the rebalancing study (shown in the README; test/examples/rebalanceQuickstart.test.ts
// checks every //=> value). Invented board: a small office floor whose sockets all ended up on phase A.
// The second call scores with a caller's own objective: the neutral current counted twice, plus the
// largest line current — any score works as long as it never falls when a figure grows. The last
// call works on an installation (invented: a yard board feeding two workshop units) with its own score.
import { normaliseBoard, normaliseInstallation, parseBoard, parseInstallation, rebalanceBoard, rebalanceInstallation, type ConditionFigures } from '@trivar/core';

const board = normaliseBoard(
  parseBoard({
    name: 'Office floor 2',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
    loads: [
      { name: 'Sockets east', connection: 'A-N', kW: 3.2, pf: 0.95 },
      { name: 'Sockets west', connection: 'A-N', kW: 2.9, pf: 0.95 },
      { name: 'Kitchenette', connection: 'A-N', kW: 3.5, pf: 1 },
      { name: 'Lighting', connection: 'B-N', kW: 1.8, pf: 0.92, sense: 'leading' },
      { name: 'Server cupboard', connection: 'C-N', kW: 2.2, pf: 0.98 },
      { name: 'Split AC', connection: 'A-B', kW: 4, pf: 0.85 },
    ],
  }),
);

const report = rebalanceBoard(board, { pinned: ['Server cupboard'] });

export const proven = report.proven; //=> true
export const workOrder = report.moves.map((m) => `${m.listPosition} ${m.name}: ${m.from} → ${m.to}`); //=> ["1 Sockets east: A-N → C-N","3 Kitchenette: A-N → B-N"]
export const neutralAfter = report.conditions[0]!.solved.after.neutralA!.toFixed(2); //=> "3.03"

const ownScore = (conditions: readonly ConditionFigures[]) =>
  Math.max(...conditions.map((c) => 2 * (c.neutralA ?? 0) + c.largestLineA));
const custom = rebalanceBoard(board, { moveLimit: 1 }, { objective: ownScore });

export const customMoves = custom.moves.map((m) => m.name); //=> ["Kitchenette"]

const { installation } = normaliseInstallation(
  parseInstallation({
    name: 'Mews workshops',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
    boards: [
      { name: 'Yard board', loads: [{ name: 'Yard lights', connection: 'A-N', kW: 0.8, pf: 0.95 }] },
      {
        name: 'Unit 1',
        fedFrom: 'Yard board',
        feeder: { lengthM: 25, line: { mm2: 16 }, neutral: { mm2: 16 } },
        loads: [
          { name: 'Kiln', connection: 'A-N', kW: 6, pf: 1 },
          { name: 'Wheels', connection: 'B-N', kW: 1.5, pf: 0.8 },
        ],
      },
      {
        name: 'Unit 2',
        fedFrom: 'Yard board',
        feeder: { lengthM: 40, line: { mm2: 16 }, neutral: { mm2: 16 } },
        loads: [
          { name: 'Saw bench', connection: 'A-N', kW: 3, pf: 0.85 },
          { name: 'Dust extractor', connection: 'A-N', kW: 2.2, pf: 0.82 },
          { name: 'Heaters', connection: 'C-N', kW: 2, pf: 1 },
        ],
      },
    ],
  }),
);

// Only Unit 2's circuits may move; the score adds the squared neutral currents of every feeder
// (one figure per board incomer and load condition), so the worst feeder counts most.
const neutralSquares = (figures: readonly ConditionFigures[]) => figures.reduce((s, f) => s + (f.neutralA ?? 0) ** 2, 0);
const mews = rebalanceInstallation(installation, { boards: ['Unit 2'] }, { objective: neutralSquares });

export const mewsOrder = mews.moves.map((m) => `${m.board} ${m.listPosition} ${m.name}: ${m.from} → ${m.to}`); //=> ["Unit 2 1 Saw bench: A-N → C-N","Unit 2 2 Dust extractor: A-N → B-N","Unit 2 3 Heaters: C-N → B-N"]
export const mewsNeutrals = mews.conditions.map((c) => `${c.board} ${c.solved.after.neutralA!.toFixed(1)}`); //=> ["Yard board 7.9","Unit 1 19.0","Unit 2 14.7"]

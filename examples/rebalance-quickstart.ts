// Library use of the rebalancing study (shown in the README; test/examples/rebalanceQuickstart.test.ts
// checks every //=> value). Invented board: a small office floor whose sockets all ended up on phase A.
// The second call scores with a caller's own objective: the neutral current counted twice, plus the
// largest line current — any score works as long as it never falls when a figure grows.
import { normaliseBoard, parseBoard, rebalanceBoard, type ConditionFigures } from '@trivar/core';

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
export const workOrder = report.moves.map((m) => `${m.circuit} ${m.name}: ${m.from} → ${m.to}`); //=> ["1 Sockets east: A-N → C-N","3 Kitchenette: A-N → B-N"]
export const neutralAfter = report.conditions[0]!.solved.after.neutralA!.toFixed(2); //=> "3.03"

const ownScore = (conditions: readonly ConditionFigures[]) =>
  Math.max(...conditions.map((c) => 2 * (c.neutralA ?? 0) + c.largestLineA));
const custom = rebalanceBoard(board, { moveLimit: 1 }, { objective: ownScore });

export const customMoves = custom.moves.map((m) => m.name); //=> ["Kitchenette"]

// Library use of the correction study (shown in the README; test/examples/quickstart.test.ts checks every //=> value).
// Invented board: a packing hall with lagging motor loads spread unevenly over the phases.
// Units come from the built-in typical list; the lines land above 0.95 because the bank must still
// meet the target with capacitance 5 % below rated.
import { correctBoard, normaliseBoard, parseBoard } from '@trivar/core';

const board = normaliseBoard(
  parseBoard({
    name: 'Packing hall',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
    loads: [
      { name: 'Conveyors', connection: 'ABC-delta', kW: 22, pf: 0.76 },
      { name: 'Wrapping line', connection: 'A-N', kW: 6, pf: 0.7 },
      { name: 'Labellers', connection: 'C-N', kW: 3, pf: 0.8 },
    ],
  }),
);

const report = correctBoard(board, { arrangement: 'delta-bank', target: { pf: 0.95 } });

export const status = report.status; //=> "meets-target"
export const deliveredKvar = report.selection!.deliveredKvar.toFixed(2); //=> "19.85"
export const nameplateKvar = report.selection!.nameplateKvar.toFixed(2); //=> "24.17"
export const linePfAfter = report.verification.lines.map((l) => l.pf.after?.toFixed(3)); //=> ["0.972","0.979","0.968"]
export const neutralAmps = report.verification.neutralCurrentA!.after.toFixed(1); //=> "29.9"

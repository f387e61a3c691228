// Library quick start (shown in the README; test/examples/quickstart.test.ts checks every //=> value).
// Invented board: a corner shop with a 2.3 kW water heater on phase A and a 6 kW oven across B-C.
// Hand check: I_A = 2300/230.9 = 9.96 A, I_B = I_C = 6000/400 = 15 A; I1 = (9.96 + 2·15·cos30°)/3 = 11.98 A,
// I2 = (9.96 − 25.98)/3 = −5.34 A → 44.6 %; Ie = √((9.96² + 2·15² + 9.96²)/3) = 14.70 A, Se = 3·230.9·14.70 → PF 0.815.
import { solveBoard } from '@trivar/core';

const result = solveBoard({
  name: 'Corner shop',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [
    { name: 'Water heater', connection: 'A-N', kW: 2.3, pf: 1 },
    { name: 'Oven', connection: 'B-C', kW: 6, pf: 1 },
  ],
});

export const neutralAmps = result.neutral!.current.magnitude.toFixed(2); //=> "9.96"
export const lineAmps = result.phases.map((p) => p.current.magnitude.toFixed(2)); //=> ["9.96","15.00","15.00"]
export const currentUnbalance = result.unbalance!.currentNegativePercent.toFixed(1); //=> "44.6"
export const effectivePf = result.powerFactor.effective!.pf!.toFixed(3); //=> "0.815"

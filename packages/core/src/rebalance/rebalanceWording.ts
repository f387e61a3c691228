/** Every sentence a rebalancing report carries, in one place. */
import type { PhaseLabel } from '../board/conventions/phaseNames.js';

export const REBALANCE_CAUTIONS: readonly string[] = [
  'Moving a circuit is work on live-capable equipment: isolate and prove dead first; the work is for a qualified electrician under local codes and licensed practice.',
  'Circuits that share a neutral (multi-wire branch circuits) must stay on different lines, and keep their common disconnect: check before moving either.',
  'Keep residual-current and arc-fault devices with their circuits, and update the circuit chart and labels after the work.',
  'Figures assume the stated load conditions; measure the line and neutral currents after the work.',
];

export const REBALANCE_NOTES = {
  nothingToMove: 'No circuit on this board can move (three-phase, pinned, or the supply offers no other connection).',
  alreadyBest: 'The present wiring is already the best found: no moves.',
  solvedNotBetter: (before: number, after: number) =>
    `The network re-solve scores the moved board ${after.toFixed(3)} against ${before.toFixed(3)} now: not better, so keep the present wiring (voltage drop or load models differ from the fast model here).`,
  modelDiffers: (percent: number) =>
    `The network re-solve differs from the fast model by up to ${percent.toFixed(1)} % of a line current (impedances and load models); the solved figures are the ones to trust.`,
  budgetReached: (nodes: number) =>
    `The exact search stopped at its budget of ${nodes} nodes; the answer is the best found and its gap comes from the lower bound.`,
  noBound: 'The custom score broke the rule that it never falls when a figure grows, so no lower bound is reported.',
  capacityNotMet: (moveLimit: number, provenImpossible: boolean, excesses: readonly string[]) =>
    `${provenImpossible ? 'No assignment' : 'No assignment found'} with at most ${moveLimit} move${moveLimit === 1 ? '' : 's'} keeps every line within its capacity${provenImpossible ? ' (proven by the lower bound)' : ''}; this answer exceeds it least: ${excesses.join('; ')}.`,
  excess: (e: { board: string; condition: string; line: PhaseLabel; currentA: number; capacityA: number; overA: number }, withBoard: boolean) =>
    `line ${e.line}${withBoard ? ` at "${e.board}"` : ''} in "${e.condition}" carries ${e.currentA.toFixed(1)} A, ${e.overA.toFixed(1)} A over its ${e.capacityA.toFixed(0)} A capacity`,
  overCapacityNow: (board: string | null, line: PhaseLabel, amps: number, capacity: number, condition: string) =>
    `The present wiring puts ${amps.toFixed(1)} A on line ${line}${board ? ` at "${board}"` : ''} in "${condition}", above its ${capacity.toFixed(0)} A capacity.`,
} as const;

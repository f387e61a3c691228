/** Per-load readings of a solved board: branch figures, totals, line current drawn, star-point shift. */
import { abs, add, conj, mul, scale, sub, sum, toPhasor, ZERO, type ComplexValue } from '../complex.js';
import type { LoadBranch, PhaseId } from '../board/boardModel.js';
import { judgedBranchNominal } from '../board/nominalVoltages.js';
import { terminalVoltage, type BranchState, type NetworkSolution } from '../network/solveNetwork.js';
import { powerParts, powerReading } from './powerReading.js';
import type { BranchReading, LoadReading } from './boardResult.js';

/** Current a load draws from one phase terminal: Σ of its branch currents leaving that terminal. */
function lineCurrentOfLoad(branches: readonly LoadBranch[], states: readonly BranchState[], phase: PhaseId): ComplexValue {
  let total = ZERO;
  branches.forEach((b, k) => {
    if (b.from === phase) total = add(total, states[k]!.current);
    if (b.to === phase) total = sub(total, states[k]!.current);
  });
  return total;
}

/**
 * The one voltage a circuit's row quotes, in `trivar solve` and in the report alike: the branch whose
 * voltage is furthest from its nominal, above or below (the first such branch on a tie). A circuit with
 * one branch is that branch.
 */
export function worstBranch(load: Pick<LoadReading, 'branches'>): BranchReading {
  return load.branches.reduce((a, b) => (Math.abs(b.voltagePercent - 100) > Math.abs(a.voltagePercent - 100) ? b : a));
}

const terminalLabel = (t: string) => (t.startsWith('star:') ? 'star' : t);

export function readLoads(solution: NetworkSolution, busVoltages: readonly ComplexValue[]): LoadReading[] {
  const { board } = solution;
  const centroid = scale(sum(busVoltages), 1 / busVoltages.length);
  return board.loads.map((load, li) => {
    const states = solution.branches[li]!;
    const powers = states.map((st) => mul(st.voltage, conj(st.current)));
    const branches = load.branches.map(
      (b, bi): BranchReading => ({
        from: terminalLabel(b.from),
        to: terminalLabel(b.to),
        voltage: toPhasor(states[bi]!.voltage),
        voltagePercent: (100 * abs(states[bi]!.voltage)) / judgedBranchNominal(board, b),
        current: toPhasor(states[bi]!.current),
        ...powerParts(powers[bi]!),
      }),
    );
    const star = load.branches.find((b) => b.to.startsWith('star:'))?.to;
    const starV = star ? terminalVoltage(solution, star) : null;
    return {
      name: load.name,
      connection: load.connection,
      model: load.model,
      origin: load.origin,
      branches,
      ...powerReading(sum(powers)),
      currentA: Math.max(...board.phases.map((phase) => abs(lineCurrentOfLoad(load.branches, states, phase)))),
      starPointShift: starV ? toPhasor(sub(starV, centroid)) : null,
      energised: states.some((s) => s.energised),
      ...(load.pfAssumed ? { pfAssumed: true as const } : {}),
      circuit: load.schedule?.circuit ?? null,
      breakerA: load.schedule?.breakerA ?? null,
      poles: load.schedule?.poles ?? null,
      continuous: load.schedule?.continuous ?? true,
    };
  });
}

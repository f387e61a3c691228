/**
 * What-if: the neutral conductor between source and board is broken. Every
 * line-to-neutral load is then in series with the others through the floating
 * neutral bar (Millman's theorem gives its voltage); this reports what each one sees.
 */
import { abs, toPhasor } from '../complex.js';
import { NumericalError } from '../errors.js';
import type { Board, PhaseId } from '../board/boardModel.js';
import { solveNetwork, terminalVoltage, type NetworkSolution, type SolveOptions } from '../network/solveNetwork.js';
import type { OpenNeutralLoadReading, OpenNeutralStudy } from './boardResult.js';
import { OPEN_NEUTRAL_CAUTIONS, WARNING_THRESHOLDS } from './boardWarnings.js';

export function studyOpenNeutral(board: Board, options?: SolveOptions): OpenNeutralStudy {
  const notApplicable = (note: string): OpenNeutralStudy => ({
    applicable: false,
    note,
    barVoltage: null,
    loads: [],
    highestPercent: null,
    lowestPercent: null,
    cautions: [],
  });
  if (!board.hasNeutral) return notApplicable('a three-phase-3wire board has no neutral conductor to lose');
  if (board.system === 'single-phase') return notApplicable('on a single-phase 2-wire board a broken neutral simply de-energises every load');
  let broken: NetworkSolution;
  try {
    broken = solveNetwork({ ...board, neutralOpen: true }, options);
  } catch (error) {
    // The what-if failing must not hide the main result; say why instead.
    if (error instanceof NumericalError) return notApplicable(`the board with a broken neutral has no solution: ${error.message}`);
    throw error;
  }
  const band = WARNING_THRESHOLDS.voltageBandPercent;
  const loads: OpenNeutralLoadReading[] = [];
  board.loads.forEach((load, li) =>
    load.branches.forEach((b, bi) => {
      if (b.to !== 'N' && b.from !== 'N') return;
      const state = broken.branches[li]![bi]!;
      if (!state.energised) return;
      const percent = (100 * abs(state.voltage)) / b.vNominal;
      loads.push({
        name: load.name,
        phase: (b.to === 'N' ? b.from : b.to) as PhaseId,
        voltage: abs(state.voltage),
        voltagePercent: percent,
        flag: percent > 100 + band ? 'over' : percent < 100 - band ? 'under' : 'ok',
      });
    }),
  );
  if (loads.length === 0) return notApplicable('no line-to-neutral loads on this board, so a broken neutral changes nothing');
  const bar = terminalVoltage(broken, 'N');
  const percents = loads.map((l) => l.voltagePercent);
  return {
    applicable: true,
    note: null,
    barVoltage: bar ? toPhasor(bar) : null,
    loads,
    highestPercent: Math.max(...percents),
    lowestPercent: Math.min(...percents),
    cautions: OPEN_NEUTRAL_CAUTIONS,
  };
}

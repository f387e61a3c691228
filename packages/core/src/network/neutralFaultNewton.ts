/**
 * Newton solves of one board with a fault in series with its neutral conductor, the circuit built
 * once. Following a neutral break (analysis/followNeutralBreak.ts) solves the board at a few dozen
 * fault resistances; the boards differ only in the admittance of the element between the neutral bar
 * and what feeds it (absent with the neutral open), so the node numbering, sources and load branches
 * are the same for all. Each solve is the one `solveNetworkByNewton` does on the faulted board, with
 * that element's admittance computed as the circuit builder computes it: the same voltages to the
 * bit. A state's whole solution is read only when asked for.
 */
import { add, complex, inverse, type ComplexValue } from '../complex.js';
import type { Board } from '../board/boardModel.js';
import { REFERENCE } from './circuit.js';
import { buildInstallationCircuit } from './installationCircuit.js';
import { installationOf } from './installationModel.js';
import type { NetworkSolution } from './solveNetwork.js';
import { newtonSettings, newtonSolution, newtonVoltages, type NewtonOptions, type NewtonVoltages } from './solveNetworkByNewton.js';
import { assertBoardModel } from '../board/modelGuards.js';

/** The board with a fault resistance added in series with its neutral conductor (or the neutral open when `ohms` is null). */
export function withNeutralFault(board: Board, ohms: number | null): Board {
  assertBoardModel(board);
  if (ohms === null) return { ...board, neutralOpen: true };
  return { ...board, neutralOpen: false, neutralImpedance: add(board.neutralImpedance, complex(ohms, 0)) };
}

export interface NeutralFaultNewton {
  /** Newton from `start` (node voltages of the board's circuit) with `ohms` in series with the neutral, or the neutral open (null). */
  solve(ohms: number | null, start: readonly (ComplexValue | null)[], options: NewtonOptions): NewtonVoltages;
  /** The whole solution of a state `solve` settled on. */
  read(ohms: number | null, settled: Extract<NewtonVoltages, { converged: true }>, options: NewtonOptions): NetworkSolution;
}

/** @param board a board with a neutral conductor */
export function neutralFaultNewton(board: Board): NeutralFaultNewton {
  // Any resistance gives the faulted boards' node numbering (the neutral bar a node of its own, as it is when open).
  const faulted = withNeutralFault(board, 1);
  const { installation, boardIndex } = installationOf(faulted);
  const layout = buildInstallationCircuit(installation);
  const topology = layout.topologies[boardIndex]!;
  const element =
    boardIndex === 0
      ? layout.circuit.elements.findIndex((e) => e.from === topology.neutralNode && e.to === REFERENCE)
      : (layout.feederElements[boardIndex]?.neutral ?? -1);
  if (element < 0) throw new RangeError('neutralFaultNewton: the board has no neutral conductor to put a fault in');
  const vBase = board.nominalLineToNeutralV;
  return {
    solve: (ohms, start, options) =>
      newtonVoltages(layout.circuit, vBase, start, newtonSettings(options), {
        element,
        // As buildInstallationCircuit computes it for withNeutralFault(board, ohms).
        admittance: ohms === null ? null : inverse(add(board.neutralImpedance, complex(ohms, 0))),
      }),
    read: (ohms, settled, options) => newtonSolution(withNeutralFault(board, ohms), settled, newtonSettings(options).threshold),
  };
}

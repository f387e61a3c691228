/**
 * @trivar/core — exact solver for uneven single-phase loads on three-phase and
 * split-phase low-voltage boards. Every public function and type is named here.
 */

// Complex values and phasors
export type { ComplexValue, Phasor } from './complex.js';
export { toPhasor, polar, degToRad, radToDeg } from './complex.js';

// Errors
export type { InputIssue } from './errors.js';
export { InputError, NumericalError, formatPath } from './errors.js';

// Board files
export type {
  BoardSpec,
  LoadSpec,
  SupplySpec,
  ConductorSpec,
  ImpedanceSpec,
  SystemKind,
  ConnectionSpec,
  LoadModelName,
} from './board/boardSchema.js';
export { boardSchema } from './board/boardSchema.js';
export type { BoardValidation } from './board/validateBoard.js';
export { validateBoard, parseBoard, readBoardText, parseBoardText } from './board/validateBoard.js';
export { boardJsonSchema } from './board/boardJsonSchema.js';
export { acceptedConnections } from './board/boardRules.js';
export type { Board, BoardLoad, LoadBranch, Terminal, ZipFractions, PhaseId } from './board/boardModel.js';
export { normaliseBoard } from './board/normaliseBoard.js';

// Solving
export type { SolveOptions, NetworkSolution, BranchState } from './network/solveNetwork.js';
export { solveNetwork, terminalVoltage } from './network/solveNetwork.js';
export type { SolveBoardOptions } from './solveBoard.js';
export { solveBoard, solveBoardModel } from './solveBoard.js';

// Analysis
export type * from './analysis/boardResult.js';
export type { SequenceSet } from './analysis/symmetricalComponents.js';
export { sequenceComponents } from './analysis/symmetricalComponents.js';
export { deviationFromAveragePercent, unbalanceFactorFromLineMagnitudes } from './analysis/unbalanceIndices.js';
export type { BoardPowerDefinitions, ApparentPowerReading } from './analysis/powerDefinitions.js';
export { boardPowerDefinitions, effectiveQuantities } from './analysis/powerDefinitions.js';
export { analyseSolution, powerReading } from './analysis/analyseSolution.js';
export { studyOpenNeutral } from './analysis/studyOpenNeutral.js';
export { WARNING_THRESHOLDS } from './analysis/boardWarnings.js';

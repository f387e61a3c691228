/**
 * Moving between a board and the installation it belongs to. Every board a
 * study works on is a `Board`; a sub-board's `Board` carries the supply's
 * system and EMFs (so voltage drops count from the source), its own feeder in
 * the line and neutral fields, no source impedance of its own, and its place in
 * the installation — which is how a correction sized on a sub-board re-solves
 * the whole installation.
 */
import { abs, add, scale, ZERO, type ComplexValue } from '../complex.js';
import type { BankInService, Board, BoardLoad, Installation } from '../board/boardModel.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { assertInstallationModel, assertBoardModel } from '../board/modelGuards.js';
import { InputError, inputIssue } from '../errors.js';

const mean = (zs: readonly ComplexValue[]) => scale(zs.reduce(add, ZERO), 1 / Math.max(zs.length, 1));

/** The installation a board is part of, with the board's own (possibly edited) loads and feeder in place. */
export function installationOf(board: Board): { installation: Installation; boardIndex: number } {
  assertBoardModel(board);
  const place = board.installation;
  if (!place) return { installation: { name: board.name, main: board, subBoards: [] }, boardIndex: 0 };
  const { installation, boardIndex } = place;
  if (boardIndex === 0) {
    const { installation: _place, ...main } = board;
    return { installation: { ...installation, main }, boardIndex };
  }
  const subBoards = installation.subBoards.map((sb, i) =>
    i + 1 !== boardIndex
      ? sb
      : {
          ...sb,
          loads: board.loads,
          feeder: {
            ...sb.feeder,
            lineImpedances: board.lineImpedances ?? board.phases.map(() => board.lineImpedance),
            neutralImpedance: board.neutralImpedance,
            neutralOpen: board.neutralOpen,
          },
        },
  );
  return { installation: { ...installation, subBoards }, boardIndex };
}

/** Board number `index` of an installation as a `Board` (0 = the main board). */
export function boardOfInstallation(installation: Installation, index: number): Board {
  assertInstallationModel(installation);
  if (!Number.isInteger(index) || index < 0 || index > installation.subBoards.length)
    throw new InputError([inputIssue('out_of_range', 'index', `a board number from 0 (the main board) to ${installation.subBoards.length}`, index)], 'the index argument is not a board of this installation');
  const main = installation.main;
  const place = installation.subBoards.length > 0 ? { installation: { ...installation, main }, boardIndex: index } : undefined;
  if (index === 0) return place ? { ...main, installation: place } : main;
  const sb = installation.subBoards[index - 1]!;
  const { sourceImpedances: _s, sourceStarImpedance: _z, openDeltaCorner: _o, sourceUnits: _u, lineImpedances: _l, lineRatingsA: _r, installation: _i, feederUnequalLengths: _f, ...supply } = main;
  return {
    ...supply,
    name: sb.name,
    // A sub-board sees the transformer only through the boards above it: its own loading is its feeder's.
    transformerKVA: null,
    sourceImpedance: ZERO,
    lineImpedance: mean(sb.feeder.lineImpedances),
    lineImpedances: sb.feeder.lineImpedances,
    neutralImpedance: sb.feeder.neutralImpedance,
    neutralOpen: sb.feeder.neutralOpen,
    // No neutral reaches it: a 3-wire board, its phase voltages read to the centroid of the line voltages.
    ...(sb.feeder.withoutNeutral ? { ...(main.system === 'three-phase-4wire' ? { system: 'three-phase-3wire' as const } : {}), hasNeutral: false, withoutNeutral: true as const } : {}),
    lineRatingA: sb.feeder.lineRatingA,
    ...(sb.feeder.lineRatingsA ? { lineRatingsA: sb.feeder.lineRatingsA } : {}),
    neutralRatingA: sb.feeder.neutralRatingA,
    ...(sb.feeder.unequalLengths ? { feederUnequalLengths: sb.feeder.unequalLengths } : {}),
    loads: sb.loads,
    ...(sb.voltageLimits ? { conventions: { ...conventionsOf(main), voltageLimits: sb.voltageLimits } } : {}),
    installation: place!,
  };
}

/** The installation with board `b`'s loads replaced (0 = the main board). */
export function withBoardLoads(installation: Installation, b: number, loads: readonly BoardLoad[]): Installation {
  if (b === 0) return { ...installation, main: { ...installation.main, loads } };
  return { ...installation, subBoards: installation.subBoards.map((sb, i) => (i + 1 === b ? { ...sb, loads } : sb)) };
}

/** Rated output of a bank's parts in service (fixed part and steps in service) at rated voltage, kvar. */
export const ratedKvarInService = (bank: BankInService): number => bank.fixedKvar + bank.stepsInService.reduce((s, k) => s + bank.stepsKvar[k - 1]!, 0);

/**
 * The installation without the file's bank in service on board `b` (its parts taken off that board),
 * the other banks still in: what a correction study on that board starts from, its equipment taking
 * that bank's place.
 */
export function withoutBankOn(installation: Installation, b: number): Installation {
  assertInstallationModel(installation);
  const record = installation.banksInService?.find((r) => r.boardIndex === b);
  if (!record) return installation;
  const parts = new Set(record.loads);
  const loads = boardOfInstallation(installation, b).loads.filter((_, k) => !parts.has(k));
  return { ...withBoardLoads(installation, b, loads), banksInService: installation.banksInService!.filter((r) => r !== record) };
}

/**
 * Series impedance from the source EMF to a board, per line (the mean of the phases where they differ):
 * the source, the service feeder, and every feeder on the way down. What the short-circuit power at the
 * board is computed from (loads left out, as usual for S_sc).
 */
export function supplyPathImpedance(board: Board): ComplexValue {
  const place = board.installation;
  if (!place || place.boardIndex === 0) return add(board.sourceImpedance, board.lineImpedance);
  const { installation } = place;
  const main = installation.main;
  let z = add(main.sourceImpedance, main.lineImpedances ? mean(main.lineImpedances) : main.lineImpedance);
  for (let b = place.boardIndex; b !== 0; b = installation.subBoards[b - 1]!.fedFrom) {
    // The board's own feeder as the board carries it (a study may have edited it), the others from the installation.
    const feeder = b === place.boardIndex ? (board.lineImpedances ?? [board.lineImpedance]) : installation.subBoards[b - 1]!.feeder.lineImpedances;
    z = add(z, mean(feeder));
  }
  return z;
}

/**
 * The same path line by line, in the order of `phases`: each line's own source impedance (a bank of
 * unequal units, an open delta's windings) and its own conductor of every feeder on the way. On an open
 * delta the line at the windings' common corner has no winding in its path: with three wires that
 * per-line form is exact, since each winding carries the current of the one line it alone feeds.
 * `supplyPathImpedance` gives one figure for all the lines, the mean of each part.
 */
export function supplyPathImpedancesPerLine(board: Board): ComplexValue[] {
  const place = board.installation;
  const main = !place || place.boardIndex === 0 ? board : place.installation.main;
  const lineOf = (zs: readonly ComplexValue[] | undefined, flat: ComplexValue, k: number) => zs?.[k] ?? flat;
  return board.phases.map((_, k) => {
    let z = add(lineOf(main.sourceImpedances, main.sourceImpedance, k), lineOf(main.lineImpedances, main.lineImpedance, k));
    if (!place || place.boardIndex === 0) return z;
    for (let b = place.boardIndex; b !== 0; b = place.installation.subBoards[b - 1]!.fedFrom) {
      const feeder = b === place.boardIndex ? (board.lineImpedances ?? [board.lineImpedance]) : place.installation.subBoards[b - 1]!.feeder.lineImpedances;
      z = add(z, lineOf(feeder, feeder[0]!, k));
    }
    return z;
  });
}

/**
 * Series impedance of the neutral from a board back to the source star point: the board's own
 * feeder neutral, every feeder neutral on the way up, the service feeder's, and the source's
 * star-point impedance (its zero-sequence part, which a neutral current flows through). Null on a
 * board no neutral reaches.
 */
export function neutralPathImpedance(board: Board): ComplexValue | null {
  if (!board.hasNeutral) return null;
  const place = board.installation;
  if (!place || place.boardIndex === 0) return add(board.neutralImpedance, board.sourceStarImpedance ?? ZERO);
  const { installation } = place;
  const main = installation.main;
  let z = add(main.neutralImpedance, main.sourceStarImpedance ?? ZERO);
  for (let b = place.boardIndex; b !== 0; b = installation.subBoards[b - 1]!.fedFrom) {
    z = add(z, b === place.boardIndex ? board.neutralImpedance : installation.subBoards[b - 1]!.feeder.neutralImpedance);
  }
  return z;
}

/**
 * The impedance a short circuit at the board, and a bank's current, meet on the way back to the source.
 * On a single-phase 2-wire board the only loop is the line out and the neutral back (the source's
 * impedance, as a single-phase source is modelled, sits in the line): line path + neutral path. On
 * split-phase and three-phase boards the figure is the line path alone, as a line-to-line fault or a
 * balanced bank sees it: their currents sum to zero and leave the neutral out (capacitorPathReactance.ts
 * weighs the neutral in for a bank whose currents do not).
 */
export function shortCircuitPathImpedance(board: Board): ComplexValue {
  const line = supplyPathImpedance(board);
  const neutral = board.system === 'single-phase' ? neutralPathImpedance(board) : null;
  return neutral ? add(line, neutral) : line;
}

/** Short-circuit power at the board, n·V²/|Z| of shortCircuitPathImpedance, VA; null where the path has no impedance (an ideal source). */
export function boardShortCircuitVA(board: Board): number | null {
  const z = abs(shortCircuitPathImpedance(board));
  return z === 0 ? null : (board.phases.length * board.nominalLineToNeutralV ** 2) / z;
}

/**
 * The short-circuit power the supply path's reactance alone gives, n·V²/X_path, VA: what a parallel
 * resonance of shunt capacitors with the supply is worked from, h = √(X_C/X_path) = √(S_sc,X/Q_C).
 * The classic √(S_sc/Q_C) takes S_sc from |Z|, which is right only where X ≫ R: behind a long or small
 * cable feeder R is not small, |Z| overstates the path's inductance and names too low an order (a bank
 * whose scan peaks near the 11th estimated at 8.4). The resistance damps the peak; it hardly moves it.
 * X_path is shortCircuitPathImpedance's: the line and the neutral on a single-phase board.
 * null where the path has no reactance (an ideal source, or resistance only).
 */
export function reactanceShortCircuitVA(board: Board): number | null {
  const x = shortCircuitPathImpedance(board).im;
  return x > 0 ? (board.phases.length * board.nominalLineToNeutralV ** 2) / x : null;
}

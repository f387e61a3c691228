/**
 * Correction on an installation: the equipment goes on one board (the main
 * board unless named), is sized and verified there by the ordinary study — a
 * board with a place in an installation re-solves the whole installation at
 * every step — and its effect on every board and on the supply is read from
 * two solves of the whole installation, without and with the equipment.
 */
import type { Installation } from '../board/boardModel.js';
import { InputError, inputIssue } from '../errors.js';
import { boardOfInstallation } from '../network/installationModel.js';
import { correctBoard } from './correctBoard.js';
import { compareCorrections, type CorrectionComparison } from './compareCorrections.js';
import type { CorrectionReport } from './correctionResult.js';
import { installationEffect, type InstallationEffect } from './installationEffect.js';

export interface CorrectInstallationOptions {
  /** Name of the board the equipment goes on. @defaultValue the main board */
  readonly board?: string;
}

interface PlacedCorrection {
  readonly installation: string;
  /** The board the equipment is on; the target is judged at its incomer unless `measuredAt` says otherwise. */
  readonly board: string;
  /** 0 for the main board, i + 1 for `installation.subBoards[i]`. */
  readonly boardIndex: number;
  /** Where the target is measured when not at the board's incomer (`target.measuredAt`): `origin` or a board's name. */
  readonly measuredAt?: string;
}

export interface InstallationCorrection extends PlacedCorrection {
  /** The study on the equipment's board (the `before`/`after` of its verification are that board's). */
  readonly report: CorrectionReport;
  /** Every board and the supply, without and with the equipment as verified. */
  readonly effect: InstallationEffect;
}

export interface InstallationComparison extends PlacedCorrection {
  readonly comparison: CorrectionComparison;
  /** The recommended arrangement's effect on every board; null when none is recommended. */
  readonly effect: InstallationEffect | null;
}

const names = (installation: Installation) => [installation.main.name, ...installation.subBoards.map((b) => b.name)];

/**
 * Board number of the board called `name` (0 = main board).
 * @param option how the caller names the option, for the error (`board`, or a CLI's `--board`)
 * @throws {InputError} code `unknown_board` naming the option and every board of the installation
 */
export function installationBoardIndex(installation: Installation, name: string | undefined, option = 'board'): number {
  if (name === undefined) return 0;
  const all = names(installation);
  const index = all.indexOf(name);
  if (index >= 0) return index;
  const expected = `a board of this installation: ${all.map((n) => JSON.stringify(n)).join(', ')}`;
  throw new InputError([{ ...inputIssue('unknown_board', option, expected, name), message: `${option}: expected ${expected} (received ${JSON.stringify(name)})` }], 'the options do not fit the installation');
}

/** The metering point of a study, where it is not the equipment's board. */
export const measuredAt = (report: CorrectionReport): { measuredAt?: string } => (report.verification.metering ? { measuredAt: report.verification.metering.point } : {});

/** The board the equipment goes on, with its place, and how the result names it. */
export function placeCorrection(installation: Installation, options: CorrectInstallationOptions | undefined) {
  const boardIndex = installationBoardIndex(installation, options?.board);
  const board = boardOfInstallation(installation, boardIndex);
  return { board, placed: { installation: installation.name, board: board.name, boardIndex } };
}

/**
 * Sizes, builds and verifies correction on one board of an installation and reports its effect on every board.
 * @param installation from `normaliseInstallation(parseInstallation(file)).installation` (a one-board
 *   installation works too)
 * @param spec the correction study (as for `correctBoard`; an arrangement is required)
 * @returns the study on the equipment's board and the before/after of every board, feeder and the supply
 * @throws {InputError} for an unknown board name or a study that is not valid for the board
 * @throws {NumericalError} if a solve fails, or (reason `collapsed`) when the supply cannot carry the loads
 * @example
 * const c = correctInstallation(installation, { arrangement: 'star-bank' }, { board: 'Floor 1' });
 * c.effect.boards[0].vectorPf.after // PF at the main incomer with the bank on Floor 1
 */
export function correctInstallation(installation: Installation, spec: unknown, options?: CorrectInstallationOptions): InstallationCorrection {
  const { board, placed } = placeCorrection(installation, options);
  const report = correctBoard(board, spec);
  return { ...placed, ...measuredAt(report), report, effect: installationEffect(board, report.verification.equipment) };
}

/**
 * Every arrangement on one board of an installation, compared (as `compareCorrections`), with the
 * recommended one's effect on every board.
 * @throws {InputError} for an unknown board name or a study that is not valid for the board
 * @throws {NumericalError} if a solve fails, or (reason `collapsed`) when the supply cannot carry the loads
 */
export function compareInstallationCorrections(installation: Installation, spec: unknown, options?: CorrectInstallationOptions): InstallationComparison {
  const { board, placed } = placeCorrection(installation, options);
  const comparison = compareCorrections(board, spec);
  const chosen = comparison.outcomes.find((o) => o.arrangement === comparison.recommended)?.report;
  const studied = comparison.outcomes.find((o) => o.report !== null)?.report;
  return { ...placed, ...(studied ? measuredAt(studied) : {}), comparison, effect: chosen ? installationEffect(board, chosen.verification.equipment) : null };
}

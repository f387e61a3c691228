/**
 * Correction on an installation: the equipment goes on one board (the main
 * board unless named), is sized and verified there by the ordinary study — a
 * board with a place in an installation re-solves the whole installation at
 * every step — and its effect on every board and on the supply is read from
 * two solves of the whole installation, without and with the equipment.
 */
import type { BankInService, Installation, PhaseId } from '../board/boardModel.js';
import type { BankInServiceReading } from '../analysis/installationResult.js';
import type { PhaseNaming } from '../board/conventions/phaseNames.js';
import { InputError, inputIssue } from '../errors.js';
import { boardOfInstallation, ratedKvarInService, withoutBankOn } from '../network/installationModel.js';
import { correctBoard } from './correctBoard.js';
import { compareCorrections, type CorrectionComparison } from './compareCorrections.js';
import type { CorrectionReport } from './correctionResult.js';
import { installationEffect, type InstallationEffect } from './installationEffect.js';
import { assertInstallationModel } from '../board/modelGuards.js';
import { checkOptionKeys, checkTextArgument } from '../_internal/argumentChecks.js';

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
  /**
   * The file's bank on the equipment's board, which the equipment takes the place of: left out of every
   * solve (the banks in service on other boards stay in, `effect.before.banksInService`); null when none.
   */
  readonly replacedBank: ReplacedBank | null;
  /** The file's banks on other boards, in service at the fundamental in every solve of the study and its effect. */
  readonly otherBanksInService: readonly OtherBankInService[];
}

/** A bank of the file on another board, in service (what it delivers: `effect.before.banksInService`). */
export type OtherBankInService = Omit<BankInServiceReading, 'deliveredKvar'>;

/** A bank of the file left out because the study's equipment takes its place. */
export interface ReplacedBank {
  readonly connection: 'delta' | 'star';
  readonly ratedV: number;
  readonly stepsKvar: readonly number[];
  readonly fixedKvar: number;
  readonly detuningPercent: number;
}

/**
 * Lines that already lead where the target is judged before any equipment, with the banks in service:
 * more capacitance is in service there than the loads take, and a capacitor bank cannot raise a leading
 * PF (where every line leads below its minimum, the capacitor studies end infeasible: correctBoard.ts).
 */
export interface LeadingWithBanks {
  /** Where the target is judged: the equipment's board, or the metering point (`origin` or a board). */
  readonly point: string;
  readonly lines: readonly { readonly phase: PhaseId; readonly pf: number | null }[];
  /** How the file names the lines, for sentences. */
  readonly phaseNames: PhaseNaming;
}

export interface InstallationCorrection extends PlacedCorrection {
  /** The study on the equipment's board (the `before`/`after` of its verification are that board's). */
  readonly report: CorrectionReport;
  /** Null unless banks are in service on other boards and a line leads where the target is judged before any equipment. */
  readonly leadingWithBanks: LeadingWithBanks | null;
  /** Every board and the supply, without and with the equipment as verified. */
  readonly effect: InstallationEffect;
}

export interface InstallationComparison extends PlacedCorrection {
  readonly comparison: CorrectionComparison;
  /** As `InstallationCorrection.leadingWithBanks`, from the arrangements' common before. */
  readonly leadingWithBanks: LeadingWithBanks | null;
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
  assertInstallationModel(installation);
  if (name === undefined) return 0;
  const all = names(installation);
  const index = all.indexOf(name);
  if (index >= 0) return index;
  const expected = `a board of this installation: ${all.map((n) => JSON.stringify(n)).join(', ')}`;
  throw new InputError([{ ...inputIssue('unknown_board', option, expected, name), message: `${option}: expected ${expected} (received ${JSON.stringify(name)})` }], 'the options do not fit the installation');
}

/** With banks in service on other boards, the lines that lead where the target is judged before any equipment; null when none. */
export function leadingWithBanks(placed: { board: string; otherBanksInService: readonly unknown[] }, report: CorrectionReport | null | undefined): LeadingWithBanks | null {
  if (!report || placed.otherBanksInService.length === 0) return null;
  const v = report.verification;
  const before = v.metering ? v.metering.before : v.before;
  const lines = before.phases.filter((p) => p.sense === 'leading').map((p) => ({ phase: p.phase, pf: p.pf }));
  return lines.length ? { point: v.metering ? v.metering.point : placed.board, lines, phaseNames: before.conventions.phaseNames } : null;
}

/** The metering point of a study, where it is not the equipment's board. */
export const measuredAt = (report: CorrectionReport): { measuredAt?: string } => (report.verification.metering ? { measuredAt: report.verification.metering.point } : {});

/** Keys of the study a caller may put in the options by mistake, and where each belongs. */
const STUDY_KEYS: Readonly<Record<string, string>> = {
  measuredAt: 'measuredAt belongs in the study: spec.target.measuredAt ("origin" or a board\'s name)',
  arrangement: 'arrangement belongs in the study: spec.arrangement',
  target: 'target belongs in the study: spec.target',
};

/**
 * The options checked before anything is placed: a misspelt or misplaced key would otherwise put the
 * equipment on the main board, or measure where the caller did not ask, without a word.
 * @throws {InputError} naming `options`, `options.<key>` or `options.board`
 */
function checkCorrectInstallationOptions(options: unknown): asserts options is CorrectInstallationOptions | undefined {
  checkOptionKeys(options, 'options', ['board'], STUDY_KEYS);
  if (options?.board !== undefined) checkTextArgument(options.board, 'options.board', 'the name of a board of the installation (text)');
}

/**
 * The board the equipment goes on, with its place, and how the result names it. Banks the installation
 * has in service (`withBanksInService`) stay in on the other boards; one on this board is taken out,
 * the equipment taking its place.
 */
export function placeCorrection(installation: Installation, options: CorrectInstallationOptions | undefined) {
  checkCorrectInstallationOptions(options);
  const boardIndex = installationBoardIndex(installation, options?.board);
  const replaced = installation.banksInService?.find((r) => r.boardIndex === boardIndex);
  const inService = withoutBankOn(installation, boardIndex);
  const board = boardOfInstallation(inService, boardIndex);
  const replacedBank: ReplacedBank | null = replaced
    ? { connection: replaced.connection, ratedV: replaced.ratedV, stepsKvar: replaced.stepsKvar, fixedKvar: replaced.fixedKvar, detuningPercent: replaced.detuningPercent }
    : null;
  const all = names(installation);
  const otherBanksInService = (inService.banksInService ?? []).map((r) => otherBank(r, all[r.boardIndex]!));
  return { board, placed: { installation: installation.name, board: board.name, boardIndex, replacedBank, otherBanksInService } };
}

function otherBank(bank: BankInService, board: string): OtherBankInService {
  const { boardIndex: _b, loads: _l, ...rest } = bank;
  return { board, ...rest, ratedKvarInService: ratedKvarInService(bank) };
}

/**
 * Sizes, builds and verifies correction on one board of an installation and reports its effect on every board.
 * @param installation from `normaliseInstallation(parseInstallation(file)).installation` (a one-board
 *   installation works too), with the file's banks in service where it lists any (`withBanksInService`):
 *   those on other boards are in every solve, the one on this board is replaced by the equipment
 * @param spec the correction study (as for `correctBoard`; an arrangement is required)
 * @returns the study on the equipment's board and the before/after of every board, feeder and the supply
 * @throws {InputError} for an unknown board name or a study that is not valid for the board
 * @throws {NumericalError} if a solve fails, or (reason `collapsed`) when the supply cannot carry the loads
 * @example
 * const c = correctInstallation(installation, { arrangement: 'star-bank' }, { board: 'Floor 1' });
 * c.effect.boards[0].vectorPf.after // PF at the main incomer with the bank on Floor 1
 */
export function correctInstallation(installation: Installation, spec: unknown, options?: CorrectInstallationOptions): InstallationCorrection {
  assertInstallationModel(installation);
  const { board, placed } = placeCorrection(installation, options);
  const report = correctBoard(board, spec);
  return { ...placed, ...measuredAt(report), report, leadingWithBanks: leadingWithBanks(placed, report), effect: installationEffect(board, report.verification.equipment) };
}

/**
 * Every arrangement on one board of an installation, compared (as `compareCorrections`), with the
 * recommended one's effect on every board.
 * @throws {InputError} for an unknown board name or a study that is not valid for the board
 * @throws {NumericalError} if a solve fails, or (reason `collapsed`) when the supply cannot carry the loads
 */
export function compareInstallationCorrections(installation: Installation, spec: unknown, options?: CorrectInstallationOptions): InstallationComparison {
  assertInstallationModel(installation);
  const { board, placed } = placeCorrection(installation, options);
  const comparison = compareCorrections(board, spec);
  const chosen = comparison.outcomes.find((o) => o.arrangement === comparison.recommended)?.report;
  const studied = comparison.outcomes.find((o) => o.report !== null)?.report;
  return { ...placed, ...(studied ? measuredAt(studied) : {}), comparison, leadingWithBanks: leadingWithBanks(placed, studied), effect: chosen ? installationEffect(board, chosen.verification.equipment) : null };
}

/**
 * The capacitor banks an installation file lists (`harmonics.banks`) are
 * installed equipment: at the fundamental they are in service, as loads of
 * their boards, whenever the installation is solved (`trivar solve`, and the
 * correction of equipment on another board). Their state is the file's: every
 * step on unless the entry's `stepsInService` names the steps on — the entry
 * carries no controller, and every step on is the state a controller reaches
 * at the loads as written when they need it, and the state with the most
 * capacitance in service (the one that can make a board lead).
 */
import type { BankInService, Installation } from '../board/boardModel.js';
import { InputError, inputIssue, type InputIssue, quoteText } from '../errors.js';
import { boardOfInstallation, withBoardLoads } from '../network/installationModel.js';
import { addInstalledBank, installedBankLayout } from './harmonicModel.js';
import type { InstallationBankSpec } from './harmonicsSpec.js';
import { assertInstallationModel } from '../board/modelGuards.js';
import { bankRatingIssue, boardNominalPair } from '../board/bankRatingCheck.js';

const boardNames = (installation: Installation) => [installation.main.name, ...installation.subBoards.map((sb) => sb.name)];

/**
 * Board number of each bank: each names a board of the installation, at most one bank per board, on a
 * connection the supply's system takes (installedBankLayout), its `stepsInService` naming steps it has, each once.
 * @throws {InputError} naming each entry's field (`harmonics.banks[1].board`, `harmonics.banks[0].stepsInService[2]`)
 */
export function bankBoardsOf(banks: readonly InstallationBankSpec[] | undefined, installation: Installation): number[] {
  const names = boardNames(installation);
  const issues: InputIssue[] = [];
  const boardOf: number[] = [];
  const seen = new Map<number, number>();
  (banks ?? []).forEach((bank, i) => {
    const path = `harmonics.banks[${i}]`;
    const b = names.indexOf(bank.board);
    boardOf.push(b);
    if (b < 0) issues.push(inputIssue('unknown_board', `${path}.board`, `the name of a board in this installation: ${names.map((n) => JSON.stringify(n)).join(', ')}`, bank.board));
    else if (seen.has(b)) issues.push(inputIssue('duplicate', `${path}.board`, `one bank per board (harmonics.banks[${seen.get(b)}] is already on ${quoteText(bank.board)})`, bank.board));
    else seen.set(b, i);
    const layout = installedBankLayout(installation.main, bank.connection);
    if (!layout.ok) issues.push(inputIssue('not_applicable', `${path}.connection`, layout.expected, bank.connection));
    // Banks handed in without parseInstallation: the file's rating rule (harmonicsRules.ts), here too.
    const rating = bankRatingIssue(bank, boardNominalPair(installation.main), `${path}.ratedV`);
    if (rating) issues.push(rating);
    (bank.stepsInService ?? []).forEach((step, k) => {
      const at = `${path}.stepsInService[${k}]`;
      if (step > bank.stepsKvar.length) issues.push(inputIssue('too_big', at, `a step of this bank: 1 to ${bank.stepsKvar.length} (stepsKvar has ${bank.stepsKvar.length})`, step));
      else if (bank.stepsInService!.indexOf(step) !== k) issues.push(inputIssue('duplicate', at, 'each step once', step));
    });
  });
  if (issues.length) throw new InputError(issues, 'the banks listed under harmonics.banks do not fit the installation');
  return boardOf;
}

/** Step numbers (from 1) of the bank's steps in service. */
export const stepsInServiceOf = (bank: InstallationBankSpec): number[] => bank.stepsInService ? [...bank.stepsInService].sort((a, b) => a - b) : bank.stepsKvar.map((_, k) => k + 1);

/**
 * The installation with the file's banks in service at the fundamental: each bank's fixed part and
 * steps in service added to its board as constant-impedance loads (a detuned step at its effective
 * susceptance B_C/(1 − p)), and recorded in `banksInService`. An installation that already has banks
 * in service is returned as it is.
 * @param banks the installation file's `harmonics.banks`
 * @throws {InputError} as `bankBoardsOf`
 * @example
 * const inService = withBanksInService(normaliseInstallation(spec).installation, spec.harmonics?.banks);
 * inService.banksInService?.[0].loads //=> the bank's parts among its board's loads
 */
export function withBanksInService(installation: Installation, banks: readonly InstallationBankSpec[] | undefined): Installation {
  assertInstallationModel(installation);
  if (installation.banksInService || !banks?.length) return installation;
  const boards = bankBoardsOf(banks, installation);
  let result = installation;
  const records: BankInService[] = banks.map((bank, i) => {
    const b = boards[i]!;
    const steps = stepsInServiceOf(bank);
    const board = boardOfInstallation(result, b);
    const added = addInstalledBank(board, { ...bank, stepsKvar: steps.map((s) => bank.stepsKvar[s - 1]!) });
    // Each part named by its own step number, whichever steps are in service.
    const names = [...(added.model.fixedLoad === null ? [] : ['bank fixed part']), ...steps.map((s) => `bank step ${s}`)];
    const loads = added.board.loads.map((load, k) => (k < board.loads.length ? load : { ...load, name: names[k - board.loads.length]! }));
    result = withBoardLoads(result, b, loads);
    return {
      boardIndex: b,
      connection: bank.connection,
      ratedV: bank.ratedV,
      stepsKvar: bank.stepsKvar,
      stepsInService: steps,
      fixedKvar: bank.fixedKvar ?? 0,
      detuningPercent: bank.detuningPercent ?? 0,
      loads: names.map((_, k) => board.loads.length + k),
    };
  });
  return { ...result, banksInService: records };
}

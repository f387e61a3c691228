/** How the file's capacitor banks in service at the fundamental are named in reports (solve, correct, HTML). */
import type { Installation } from '../board/boardModel.js';
import { ratedKvarInService } from '../network/installationModel.js';
import type { BankInServiceReading } from './installationResult.js';
import { assertInstallationModel } from '../board/modelGuards.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';

/** The state assumed, in one clause: which banks, which steps. */
export const BANKS_IN_SERVICE_BASIS = 'as the file lists them under harmonics.banks, every step on unless the entry’s stepsInService names the steps';

const kvar = (x: number) => (Number.isInteger(x) ? String(x) : x.toFixed(2));

/**
 * "Finishing shop 50 kvar rated (every step: 25+25 kvar; 440 V units)", with what it delivers when given.
 * @example
 * bankInServiceWords({ board: 'Paint shed', connection: 'delta', ratedV: 440, stepsKvar: [10, 10], stepsInService: [2], fixedKvar: 0, detuningPercent: 0, ratedKvarInService: 10 })
 * //=> 'Paint shed 10 kvar rated (step 2 of 10+10 kvar; 440 V units)'
 */
export function bankInServiceWords(b: Omit<BankInServiceReading, 'deliveredKvar'>, deliveredKvar?: number): string {
  checkObjectArgument(b, 'b', 'a bank in service as a result lists it (result.banksInService[i])', ['stepsKvar', 'stepsInService', 'fixedKvar', 'ratedV']);
  const all = b.stepsKvar.map(kvar).join('+');
  const n = b.stepsInService.length;
  const steps = n === b.stepsKvar.length ? `every step: ${all} kvar` : n ? `step${n === 1 ? '' : 's'} ${b.stepsInService.join('+')} of ${all} kvar` : `no step of ${all} kvar`;
  const parts = [b.fixedKvar > 0 ? `fixed ${kvar(b.fixedKvar)} kvar, ${steps}` : steps, `${kvar(b.ratedV)} V units`, ...(b.detuningPercent > 0 ? [`detuned ${kvar(b.detuningPercent)} %`] : [])];
  const delivered = deliveredKvar === undefined ? '' : `, ${deliveredKvar.toFixed(2)} kvar delivered`;
  return `${b.board} ${kvar(b.ratedKvarInService)} kvar rated (${parts.join('; ')})${delivered}`;
}

/** A bank the file lists in service, named by its board (what `bankInServiceWords` reads), without a solved reading. */
export type ListedBankInService = Omit<BankInServiceReading, 'deliveredKvar'>;

/** The installation's banks in service, each named by its board, in the order the file lists them. */
export function listedBanksInService(installation: Installation): ListedBankInService[] {
  assertInstallationModel(installation);
  const names = [installation.main.name, ...installation.subBoards.map((b) => b.name)];
  return (installation.banksInService ?? []).map((record) => {
    const { boardIndex, loads: _parts, ...bank } = record;
    return { ...bank, board: names[boardIndex]!, ratedKvarInService: ratedKvarInService(record) };
  });
}

/**
 * Index of each bank part among an installation's loads listed board by board, main first (the
 * order `flattenLoads` gives): the loads profile and rebalance hold at their rating.
 */
export function bankPartIndices(installation: Installation): number[] {
  const counts = [installation.main.loads.length, ...installation.subBoards.map((b) => b.loads.length)];
  const first = counts.map((_, b) => counts.slice(0, b).reduce((s, n) => s + n, 0));
  return (installation.banksInService ?? []).flatMap((bank) => bank.loads.map((k) => first[bank.boardIndex]! + k));
}

/**
 * What a correction on an installation says about the file's banks: those in service on other boards,
 * the one on the equipment's board it replaces, and a metering point they already make lead. Shared by
 * the text report and the HTML report.
 */
import { labelIn } from '../board/conventions/phaseNames.js';
import { BANKS_IN_SERVICE_BASIS, bankInServiceWords } from '../analysis/banksInServiceWords.js';
import { meteringPointWords } from './correctionWording.js';
import type { LeadingWithBanks, OtherBankInService, ReplacedBank } from './correctInstallation.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';

export interface BanksPlacement {
  readonly board: string;
  readonly otherBanksInService: readonly OtherBankInService[];
  readonly replacedBank: ReplacedBank | null;
  readonly leadingWithBanks: LeadingWithBanks | null;
}

/** The sentences, each null when there is nothing to say; `leading` is a warning. */
export function banksPlacementWords(c: BanksPlacement): { readonly inService: string | null; readonly replaced: string | null; readonly leading: string | null } {
  checkObjectArgument(c, 'c', "a correction's placement of banks (correctInstallation(...).banksPlacement)", ['otherBanksInService', 'replacedBank']);
  const inService = c.otherBanksInService.length
    ? `Banks in service in every solve, before and after, ${BANKS_IN_SERVICE_BASIS}: ${c.otherBanksInService.map((b) => bankInServiceWords(b)).join('; ')}.`
    : null;
  const r = c.replacedBank;
  const replaced = r
    ? `The file's bank on ${c.board} (${[...(r.fixedKvar > 0 ? [`fixed ${r.fixedKvar} kvar`] : []), `steps ${r.stepsKvar.join('+')} kvar`].join(', ')}, ${r.ratedV} V units) is left out: the equipment takes its place.`
    : null;
  return { inService, replaced, leading: leadingWords(c) };
}

function leadingWords(c: BanksPlacement): string | null {
  const l = c.leadingWithBanks;
  if (!l) return null;
  const where = l.point === c.board ? `the incomer of ${c.board}` : meteringPointWords(l.point);
  const lowest = l.lines.reduce((a, b) => ((b.pf ?? 1) < (a.pf ?? 1) ? b : a));
  const one = l.lines.length === 1;
  const names = l.lines.map((x) => labelIn(l.phaseNames, x.phase)).join(', ');
  return `With those banks in service, line${one ? '' : 's'} ${names} already lead${one ? 's' : ''} at ${where} before any equipment (PF ${lowest.pf === null ? '-' : lowest.pf.toFixed(3)} leading at the lowest): more capacitance is in service there than its loads take. Capacitors cannot raise a leading PF, so no capacitor bank meets the target there; take steps of those banks out (stepsInService in the file, or their controllers' settings) and study again.`;
}

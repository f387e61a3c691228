/** Cross-field rules of the harmonic fields of a board file, run with the board's own rules (boardFile/). */
import { inputIssue, type InputIssue } from '../errors.js';
import type { BoardBaseSpec } from '../board/boardSchema.js';
import { systemHasNeutral } from '../board/systemTopology.js';
import { labellerOf, type PhaseNaming } from '../board/conventions/phaseNames.js';
import type { HarmonicLoadSpec } from './harmonicsSpec.js';
import type { SupplySpec } from '../board/boardSchema.js';
import { nominalVoltagesOf } from '../board/nominalVoltages.js';
import { bankRatingIssue, type RatedBank } from '../board/bankRatingCheck.js';

/** What the rule reads: the supply and the loads with their harmonic fields. */
type BoardWithHarmonicLoads = Pick<BoardBaseSpec, 'supply'> & { readonly loads: readonly HarmonicLoadSpec[] };

/**
 * Harmonic fields of a load: a spectrum makes it a current source at harmonic
 * orders, so a linear form does not apply; a floating star of fixed impedance
 * keeps its own star point, which current sources alone would leave undefined.
 */
export function ruleHarmonicFields(board: BoardWithHarmonicLoads, naming: PhaseNaming): InputIssue[] {
  const issues: InputIssue[] = [];
  const label = labellerOf(naming);
  board.loads.forEach((load, i) => {
    const path = `loads[${i}]`;
    if (load.spectrum === undefined || load.spectrum === 'linear') return;
    if (load.linearForm !== undefined)
      issues.push(inputIssue('conflict', `${path}.linearForm`, 'linearForm only on loads without a spectrum (a non-linear load is a current source at harmonic orders)', load.linearForm));
    const floating = load.connection === 'ABC-star' && (load.starPoint === 'floating' || !systemHasNeutral(board.supply.system));
    const fixedImpedance = load.ohms !== undefined || load.model === 'constant-impedance' || load.zip?.z === 1;
    if (floating && fixedImpedance)
      issues.push(inputIssue('not_applicable', `${path}.spectrum`, `a spectrum on ${label('ABC-delta')} loads or stars tied to the neutral (describe a floating-star (wye) non-linear load as ${label('ABC-delta')})`, 'a floating star'));
  });
  return issues;
}

/**
 * A board file's bank (`harmonics.bank`): its rated voltage near the voltage across its capacitors
 * (bankRatingCheck.ts). A board of an installation has no such section; its banks are the installation's.
 */
export function ruleInstalledBankRating(board: { readonly supply: SupplySpec; readonly harmonics?: { readonly bank?: RatedBank | undefined } | undefined }): InputIssue[] {
  const bank = board.harmonics?.bank;
  const issue = bank ? bankRatingIssue(bank, nominalVoltagesOf(board.supply), 'harmonics.bank.ratedV') : null;
  return issue ? [issue] : [];
}

/** An installation file's banks (`harmonics.banks[i]`), each as `ruleInstalledBankRating`: every board shares the supply's nominal voltages. */
export function ruleInstallationBankRatings(spec: { readonly supply: SupplySpec; readonly harmonics?: { readonly banks?: readonly RatedBank[] | undefined } | undefined }): InputIssue[] {
  const nominal = nominalVoltagesOf(spec.supply);
  return (spec.harmonics?.banks ?? []).flatMap((bank, i) => {
    const issue = bankRatingIssue(bank, nominal, `harmonics.banks[${i}].ratedV`);
    return issue ? [issue] : [];
  });
}

/**
 * The capacitor practice a board follows, and how long a unit's discharge device takes, by practice, to
 * bring it down to a safe voltage after it is switched off: the shortest time before a switched step may
 * be put back on (closing onto a charged unit out of phase gives a large inrush and overvoltage). One
 * definition, read by the correction study's controller settings and by the profile's simulated bank.
 */
import type { Practice } from './correctionSpec.js';
import { checkNumberArgument } from '../_internal/argumentChecks.js';

export interface CapacitorDischarge {
  readonly seconds: number;
  /** The rule the time follows, for a report: "IEC 60831-1: 75 V or less within 3 min". */
  readonly rule: string;
}

/** Methods notes §9; both rules from memory. */
export const CAPACITOR_DISCHARGE: Readonly<Record<Practice, CapacitorDischarge>> = {
  iec: { seconds: 180, rule: 'IEC 60831-1: 75 V or less within 3 min' },
  'north-american': { seconds: 60, rule: 'NEC 460.6: 50 V or less within 1 min' },
};

/** Practice a board follows when none is given: 60 Hz boards are taken as North-American, 50 Hz as IEC (a rule of thumb; set `practice` where it is wrong). */
export function defaultPractice(frequencyHz: number): Practice {
  checkNumberArgument(frequencyHz, 'frequencyHz', 'a frequency, Hz, above 0', (x) => x > 0);
  return frequencyHz === 60 ? 'north-american' : 'iec';
}

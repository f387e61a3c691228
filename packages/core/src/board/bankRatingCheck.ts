/**
 * A capacitor bank's rated voltage against the voltage its capacitors see: line to neutral in a star,
 * line to line in a delta, raised to U/(1 − p) behind a detuning reactor. Output goes as (U/U_N)², so a
 * rating typed 28 for 280 makes a 30 kvar bank deliver 2000 kvar, and 40000 for 400 makes it deliver
 * nothing; both ran to a report with exit 0. The bounds are here, in one place, with their reasons.
 */
import type { Board } from './boardModel.js';
import { inputIssue, type InputIssue } from '../errors.js';

/** Ratings judged as a multiple of the voltage across the capacitors (common practice, no source). */
export const BANK_RATING_BOUNDS = {
  /**
   * Below this, units would run above 1.25 × their rating all the time: past the 1.20 × the IEC 60831-1
   * overvoltage table allows for 5 minutes (from memory), so no bank runs there, and it is a typo. Refused.
   * Between this and 1 the study runs and its capacitor-duty check judges the units.
   */
  refuseBelow: 0.8,
  /**
   * Above this, the units deliver under a quarter of their rated kvar (Q ∝ U²): possible (delta-rated units
   * used in a star on the same supply are 1.73 ×, and pass), but rarely meant. Warned.
   */
  warnAbove: 2,
  /** Above this, under 1/16 of the rated kvar: no one builds that; a slipped decimal (4000 for 400). Refused. */
  refuseAbove: 4,
} as const;

/** The bank as the check reads it: its connection and detuning. */
export interface RatedBank {
  readonly connection: 'delta' | 'star';
  readonly ratedV: number;
  readonly detuningPercent?: number | undefined;
}

/**
 * The nominal fundamental voltage across each capacitor of the bank, V: line to neutral (star) or line to
 * line (delta; the single line pair on a split-phase board), divided by 1 − p where the bank is detuned.
 * NaN where the supply's voltage is missing (the board's rules report that).
 */
export function voltageAcrossCapacitors(nominal: { readonly ln: number; readonly ll: number | null }, bank: Pick<RatedBank, 'connection' | 'detuningPercent'>): number {
  const branch = bank.connection === 'star' ? nominal.ln : (nominal.ll ?? nominal.ln);
  return branch / (1 - (bank.detuningPercent ?? 0) / 100);
}

/** The words for where the voltage comes from: "line to neutral", "line to line, raised by the 7 % detuning reactor…". */
function acrossWords(bank: Pick<RatedBank, 'connection' | 'detuningPercent'>): string {
  const p = bank.detuningPercent ?? 0;
  const branch = bank.connection === 'star' ? 'line to neutral' : 'line to line';
  return p > 0 ? `${branch}, raised by the ${p} % detuning reactor to U/(1 − p)` : branch;
}

const volts = (v: number) => `${v.toFixed(1)} V`;
/** A multiple as read: 68, or 1.65 where whole numbers would hide it. */
const timesWords = (x: number) => (x >= 10 ? x.toFixed(0) : x.toFixed(2));

/**
 * The issue at `path` (`harmonics.bank.ratedV`, `harmonics.banks[0].ratedV`) for a rating far below or far
 * above the voltage across the capacitors (BANK_RATING_BOUNDS); null where the rating is plausible.
 */
export function bankRatingIssue(bank: RatedBank, nominal: { readonly ln: number; readonly ll: number | null }, path: string): InputIssue | null {
  const across = voltageAcrossCapacitors(nominal, bank);
  if (!(Number.isFinite(across) && across > 0 && Number.isFinite(bank.ratedV))) return null;
  const ratio = bank.ratedV / across;
  if (ratio >= BANK_RATING_BOUNDS.refuseBelow && ratio <= BANK_RATING_BOUNDS.refuseAbove) return null;
  const low = across * BANK_RATING_BOUNDS.refuseBelow;
  const high = across * BANK_RATING_BOUNDS.refuseAbove;
  const why =
    ratio < BANK_RATING_BOUNDS.refuseBelow
      ? `at ${bank.ratedV} V the units would run at ${ratio > 0 ? (1 / ratio).toFixed(2) : '∞'} × their rating and deliver ${timesWords(1 / ratio ** 2)} × their rated kvar`
      : `at ${bank.ratedV} V the units would deliver ${(100 / ratio ** 2).toFixed(2)} % of their rated kvar`;
  return inputIssue(
    'implausible_rating',
    path,
    `the rated voltage of the capacitors, from ${volts(low)} to ${volts(high)} (${BANK_RATING_BOUNDS.refuseBelow} to ${BANK_RATING_BOUNDS.refuseAbove} × the ${volts(across)} across each capacitor: ${acrossWords(bank)}); ${why}. Units are normally rated at or a little above the voltage across them`,
    bank.ratedV,
  );
}

/**
 * A rating well above the voltage across the capacitors (warnAbove to refuseAbove): the bank delivers a
 * small share of its nameplate. Null otherwise.
 * @param across the nominal voltage across each capacitor, V (voltageAcrossCapacitors)
 */
export function bankRatingWarning(bank: RatedBank, across: number): { code: string; message: string; value: number; threshold: number } | null {
  const ratio = bank.ratedV / across;
  if (!(ratio > BANK_RATING_BOUNDS.warnAbove)) return null;
  return {
    code: 'bank-rated-far-above',
    message: `the bank's capacitors are rated ${bank.ratedV} V, ${ratio.toFixed(2)} × the ${volts(across)} across each (${acrossWords(bank)}): they deliver ${(100 / ratio ** 2).toFixed(0)} % of their rated kvar. Check the rating against the nameplate`,
    value: ratio,
    threshold: BANK_RATING_BOUNDS.warnAbove,
  };
}

/** The nominal pair of a normalised board, as `voltageAcrossCapacitors` reads it. */
export const boardNominalPair = (board: Pick<Board, 'nominalLineToNeutralV' | 'nominalLineToLineV'>) => ({ ln: board.nominalLineToNeutralV, ll: board.nominalLineToLineV });

/** `bankRatingWarning` for a bank on a board with the nominal pair `nominal`. */
export function bankRatingWarningOn(bank: RatedBank, nominal: { readonly ln: number; readonly ll: number | null }) {
  const across = voltageAcrossCapacitors(nominal, bank);
  return Number.isFinite(across) && across > 0 ? bankRatingWarning(bank, across) : null;
}

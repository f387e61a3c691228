import type { Board } from '../board/boardModel.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { labellerOf } from '../board/conventions/phaseNames.js';
import type { CapacitorDischarge } from '../correction/capacitorDischarge.js';
import type { StepChannel } from './bankController.js';
import { PROFILE_DEFAULTS } from './profileDefaults.js';
import { checkNumberArgument } from '../_internal/argumentChecks.js';

/** Cautions printed with every profile result. */
export const PROFILE_CAUTIONS: readonly string[] = [
  'Figures are computed from the interval data and the board model; logger accuracy, CT ratios and clock errors carry straight through.',
  'A neutral that carries more than its rating in any interval overheats in service; check conductor sizing against local wiring rules.',
  'Capacitor banks store charge after switching off: reconnection before discharge, leading power factor at light load, and resonance with the supply are hazards. Installation and settings are for licensed practitioners under local codes.',
];

/**
 * What a simulated bank assumes inside an interval, where the interval length matters: the data gives
 * each interval's average only, so the load is taken as steady through it.
 */
export function switchingWithinIntervalWords(intervalSeconds: number, delaySeconds: number, reconnectSeconds: number): string {
  const t = `${intervalSeconds} s intervals`;
  if (delaySeconds === 0)
    return `each interval's load is taken as steady through it; with no switching delay the controller settles at the start of each of the ${t} (a step back in no sooner than ${reconnectSeconds} s after it went off)`;
  const moves = Math.floor(intervalSeconds / delaySeconds);
  if (intervalSeconds <= delaySeconds)
    return `each interval's load is taken as steady through it; with ${t} and a ${delaySeconds} s delay the controller makes at most one move per interval, shown from the interval after it`;
  return `each interval's load is taken as steady through it; with ${t} and a ${delaySeconds} s delay the controller makes up to ${moves} moves within one (a step back in no sooner than ${reconnectSeconds} s after it went off), and the interval shows the steps in service for most of it`;
}

/**
 * When the busiest step's contactor reaches its typical life (`what`: how the sentence names that life),
 * in words: "reaches that in 11.4 years", or past the horizon (PROFILE_DEFAULTS.contactorLifeHorizonYears)
 * "does not reach that within 50 years", since a switching rate measured over the data says nothing of
 * the equipment centuries on.
 */
export function contactorLifeWords(years: number | null, what = 'that'): string | null {
  if (years !== null) checkNumberArgument(years, 'years', 'a number of years at least 0, or null', (x) => x >= 0);
  if (years === null) return null;
  const horizon = PROFILE_DEFAULTS.contactorLifeHorizonYears;
  return years > horizon ? `does not reach ${what} within ${horizon} years` : `reaches ${what} in ${years.toFixed(1)} years`;
}

/** A reconnection time set below the practice's discharge time: what it risks, and what to set. */
export function shortReconnectWords(reconnectSeconds: number, discharge: CapacitorDischarge): string {
  return `profile.bank.reconnectSeconds ${reconnectSeconds} s is shorter than the ${discharge.seconds} s discharge time (${discharge.rule}): the simulation follows the file, but a controller set so switches steps back onto capacitors that may still be charged (inrush, overvoltage, contactor and capacitor damage). Set at least ${discharge.seconds} s unless the units' discharge devices are rated for the shorter time.`;
}

/**
 * Where a simulated step sits, in the board's words (simulateBank places them): a three-phase step on a
 * three-phase board; on a split-phase (or single-phase) board the board-wide step is a capacitor from each
 * line to the neutral, so it is said so, never "three-phase"; a step across two lines is line to line.
 */
export function stepPlaceWords(board: Board, channel: StepChannel): string {
  const label = labellerOf(conventionsOf(board).phaseNames);
  const threePhase = board.phases.length === 3;
  if (channel.includes('-')) return `across ${label(channel)}`;
  if (channel === 'ABC') {
    if (threePhase) return 'three-phase';
    return board.phases.length === 1 ? 'line to neutral' : `line-to-neutral on ${board.phases.map(label).join(' and ')}`;
  }
  return threePhase ? `on phase ${label(channel)}` : `line-to-neutral on ${label(channel)}`;
}

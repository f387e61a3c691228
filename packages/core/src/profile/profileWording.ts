import type { Board } from '../board/boardModel.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { labellerOf } from '../board/conventions/phaseNames.js';
import type { CapacitorDischarge } from '../correction/capacitorDischarge.js';
import type { StepChannel } from './bankController.js';
import { MIN_RESPONSE_SHARE, PROFILE_DEFAULTS } from './profileDefaults.js';
import { checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';
import type { SequenceReport } from './checkIntervalSequence.js';
import type { ProfileSummary } from './summariseFigures.js';
import type { ProfileBankResult } from './studyProfile.js';
import type { BelowTarget } from './belowTargetHours.js';
import type { NeverClosedStep } from './stepsNeverClosed.js';
import { groupDigits } from '../_internal/groupDigits.js';

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

/**
 * Below this many hours of data a rate of closings per year is an extrapolation worth saying so: under a
 * week, the record holds neither a week's working pattern nor a season's (common practice, no source).
 */
export const EXTRAPOLATION_BELOW_HOURS = 168;

/**
 * What the closings per year rest on: the hours of data (gaps left out) scaled to a 365-day year, with the
 * bank taken as settled at the first interval's load (its start-up switching not counted); a record under
 * a week is said to be an extrapolation.
 */
export function closingsBasisWords(dataHours: number): string {
  checkNumberArgument(dataHours, 'dataHours', 'the hours of data, a number at least 0', (x) => x >= 0);
  const h = dataHours < 10 ? dataHours.toFixed(2) : groupDigits(Math.round(dataHours * 10) / 10);
  const start = "the bank taken as settled at the first interval's load (its start-up switching not counted)";
  if (Math.abs(dataHours - 8760) < 1e-6) return `per year: the closings over the ${h} h of data (365 days); ${start}`;
  if (dataHours < EXTRAPOLATION_BELOW_HOURS) return `per year: extrapolated from only ${h} h of data, under a week, so it says little of a year's switching; ${start}`;
  return `per year: the closings over ${h} h of data, scaled to 8,760 h (365 days); ${start}`;
}

/**
 * Steps closing more often than the operations a year a capacitor is commonly rated for: which, how often,
 * what it does to the equipment, and what switches less. `responseShare` is the switching threshold's share
 * of the smallest step.
 */
export function frequentSwitchingWords(
  steps: readonly { readonly step: number; readonly kvar: number; readonly closingsPerYear: number }[],
  limit: number,
  dataHours: number,
  responseShare: number,
): string {
  const over = steps.filter((s) => s.closingsPerYear > limit).sort((a, b) => b.closingsPerYear - a.closingsPerYear);
  const named = over.slice(0, 3).map((s) => `step ${s.step} (${s.kvar.toFixed(1)} kvar) ${groupDigits(Math.round(s.closingsPerYear))}`);
  const more = over.length > 3 ? ` and ${over.length - 3} more` : '';
  const short = dataHours < EXTRAPOLATION_BELOW_HOURS ? ` (extrapolated from ${dataHours < 10 ? dataHours.toFixed(2) : Math.round(dataHours)} h of data)` : '';
  return `closings a year above the ${groupDigits(limit)} operations a year a capacitor step is commonly rated for (IEC 60831-1 practice): ${named.join(', ')}${more}${short}. Each closing is an inrush into the capacitor and its contactor, which then wear out early; a longer switching delay, a higher switching threshold (now ${responseShare} × the smallest step) or more, smaller steps switch less`;
}

/**
 * Why a bank's largest voltage rise is none: no step was ever connected, or the board's voltage does not
 * move with its load (the supply taken as ideal, with no impedance to the board).
 */
export function noVoltageRiseWords(everConnected: boolean): string {
  return everConnected
    ? "no voltage rise from the bank: the board's voltage does not move with its load here (the supply is taken as ideal, with no impedance up to the board)"
    : 'no voltage rise from the bank: no step is connected in any interval';
}

/**
 * Why a bank sized from the profile has fewer steps than profile.bank.stepCount allows on a channel: that
 * many of the size cover the need, or the controller rehearsed over the profile did better with fewer,
 * larger steps (sizeBankSteps).
 */
export function fewerStepsWords(place: string, count: number, stepCount: number, reason: 'need-covered' | 'rehearsed' | 'catalogue', delaySeconds: number): string {
  const steps = `${count} ${place} step${count === 1 ? '' : 's'}, not the ${stepCount} allowed (profile.bank.stepCount)`;
  if (reason === 'need-covered') return `${steps}: ${count === 1 ? 'one step covers' : `${count} steps of that size cover`} the need`;
  if (reason === 'catalogue')
    return `${steps}: more, smaller steps of a size off the 2.5 kvar catalogue grid did slightly better over the profile (less than 10 % less kvarh short of the target and leading), not enough to leave the catalogue sizes`;
  return `${steps}: the controller rehearsed over the profile (one step at a time${delaySeconds > 0 ? `, a move every ${delaySeconds} s` : ''}) left the board less short of the target and less leading, in kvarh, with fewer, larger steps than with more, smaller ones`;
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

/** Why `profile --bank` sized and simulated no bank: the reason a caller can test, and the words it prints. */
export interface NoBankSized {
  readonly reason: 'no-current' | 'no-lagging-reactive-power' | 'target-held';
  readonly words: string;
}

/**
 * The words for a bank sized from the profile that came to no steps. `belowShare` is the share of importing
 * intervals below the target (0–1); `coverShare` the share the sizing holds at the target.
 */
export function noBankWords(reason: NoBankSized['reason'], targetPf: number, belowShare: number, coverShare: number): string {
  if (reason === 'no-current') return 'no bank sized or simulated: no current flows in any interval of the data (every load off), so there is nothing for a bank to correct';
  if (reason === 'no-lagging-reactive-power')
    return 'no bank sized or simulated: the loads draw no lagging reactive power in any interval (resistive, or leading), so capacitors would only carry the power factor towards leading';
  const pct = (x: number) => `${Math.round(x * 1000) / 10} %`;
  return `no bank sized or simulated: the power factor is below the target ${targetPf} in ${pct(belowShare)} of the importing intervals, within the ${pct(1 - coverShare)} the sizing leaves uncovered (profile.bank.coverShare ${coverShare})`;
}

/**
 * The sized steps cannot reach the target at the need: the last step's share of it is under the response
 * threshold. A lower threshold does not help, since the step that then closes over-corrects by more than the
 * threshold and switches straight back out (hunting).
 */
export function targetOutOfReachWords(place: string, needKvar: number, stepKvar: number, responseShare: number, targetPf: number): string {
  const k = (x: number, places: number) => `${x.toFixed(places)} kvar`;
  return `the ${place} steps of ${k(stepKvar, 1)} cannot hold PF ${targetPf} at the ${k(needKvar, 1)} need they were sized for: the controller closes a step only while the need left exceeds ${responseShare} × ${k(stepKvar, 1)} = ${k(responseShare * stepKvar, 2)}, and at no step size tried does the last step's share of the need pass that (a lower threshold would close it only to switch it straight back out); expect the power factor below the target at that load — a need this small is usually met by a fixed capacitor, or left (common practice, no source)`;
}

/**
 * What the interval data's sequence showed, a sentence each: gaps and what was done with them, repeated times,
 * wall-clock times in the hour clocks go back, steps that are not whole intervals. `trivar profile` prints
 * these and the report's load-over-time section states them, in these words.
 * @param fillOption name the option that fills gaps (`trivar profile --fill-gaps`) where the caller has it
 */
export function intervalSequenceWords(s: SequenceReport, fillOption = true): string[] {
  checkObjectArgument(s, 's', 'the interval sequence of a profile result (result.sequence)', ['gaps', 'fill']);
  checkObjectArgument(s.gaps, 's.gaps', 'the gaps of an interval sequence { count, missingIntervals, missingHours }', ['count']);
  const count = (x: number) => groupDigits(Math.round(x) || 0);
  const hours = (h: number) => (h === 0 ? '0' : h < 10 ? h.toFixed(2) : h.toFixed(1));
  const words = [
    s.gaps.count
      ? `${s.gaps.count} gap${s.gaps.count === 1 ? '' : 's'}, ${count(s.gaps.missingIntervals)} intervals (${hours(s.gaps.missingHours)} h) missing: ${
          s.fill === 'none' ? `left out of every figure${fillOption ? ' (--fill-gaps hold or linear fills them)' : ''}` : `filled by ${s.fill === 'hold' ? 'holding the last reading' : 'linear interpolation'} (${count(s.filledIntervals)} intervals made)`
        }`
      : 'no gaps',
  ];
  if (s.duplicates.count)
    words.push(`${s.duplicates.count} repeated time${s.duplicates.count === 1 ? '' : 's'}: the first reading kept (row${s.duplicates.rows.length === 1 ? '' : 's'} ${s.duplicates.rows.join(', ')}${s.duplicates.count > s.duplicates.rows.length ? ', ...' : ''})`);
  if (s.ambiguousTimes) words.push(`${s.ambiguousTimes} wall-clock times fall in the repeated hour when clocks go back: placed in row order`);
  if (s.irregularSteps)
    words.push(
      `${s.irregularSteps === 1 ? 'one step' : `${count(s.irregularSteps)} steps`} between rows ${s.irregularSteps === 1 ? 'is' : 'are'} not a whole number of intervals: each row counts for the time from its stamp to the next row (the last row one interval), so energy, hours and demand follow the clock, not the row count`,
    );
  return words;
}

/**
 * Above this share of made-up intervals the record is more fill than reading: a held or interpolated value
 * repeats one moment for hours or days, and its energy, hours and demand outweigh what the meter saw.
 * A tenth: past it the fill can move the energy by more than a meter's own error of a few percent and
 * change the month's peak (common practice, no source).
 */
export const MADE_UP_SHARE_WARNING = 0.1;

/**
 * The gap fill made up more than MADE_UP_SHARE_WARNING of the intervals: a warning with the counts (made up
 * and read) and the longest gap; none otherwise. `trivar profile` and the report print it with the others.
 */
export function madeUpIntervalsWarnings(s: SequenceReport | null | undefined): string[] {
  if (!s || s.fill === 'none' || s.filledIntervals <= 0) return [];
  const read = s.rowsRead - s.duplicates.count;
  const total = read + s.filledIntervals;
  const share = s.filledIntervals / total;
  if (share <= MADE_UP_SHARE_WARNING) return [];
  const longest = s.gaps.longest[0];
  const span = longest ? (longest.missingIntervals * s.intervalSeconds) / 3600 : 0;
  const spanWords = span >= 48 ? `${(span / 24).toFixed(1)} days` : `${span < 10 ? span.toFixed(2) : span.toFixed(1)} h`;
  return [
    `${groupDigits(s.filledIntervals)} of the ${groupDigits(total)} intervals (${(share * 100).toFixed(1)} %) are made up by the gap fill (${s.fill === 'hold' ? 'the last reading held' : 'linear interpolation'}) and ${groupDigits(read)} were read${longest ? `; the longest gap is ${spanWords}` : ''}: above ${MADE_UP_SHARE_WARNING * 100} % made up, every energy, hour, demand and bank figure leans on invented readings; fill only short gaps, or study the stretches that were read`,
  ];
}

/**
 * A neutral above its limit in any interval, in words (as `trivar solve` warns of one solve): the hours, the
 * peak and when, the limit and where it comes from. `fromStudy`: the limit is the file's profile.limits.neutralA,
 * not the neutral's rating. `board` names the board on an installation.
 */
export function neutralOverLimitWarnings(summary: ProfileSummary, fromStudy: boolean, board?: string): string[] {
  const n = summary.conductors.find((c) => c.conductor === 'N');
  if (!n || n.ratingA === null || n.hoursAboveLimit === null || n.hoursAboveLimit <= 0) return [];
  const limit = fromStudy ? `the study's ${n.ratingA} A neutral limit (profile.limits.neutralA)` : `its ${n.ratingA} A rating`;
  const hours = n.hoursAboveLimit < 10 ? n.hoursAboveLimit.toFixed(2) : n.hoursAboveLimit.toFixed(1);
  return [
    `${board ? `${board}: ` : ''}neutral current above ${limit} for ${hours} h of the ${summary.hours < 10 ? summary.hours.toFixed(2) : summary.hours.toFixed(1)} h, peak ${n.maxA.toFixed(1)} A at ${n.maxAt}${fromStudy ? '' : ': a neutral carrying more than its rating overheats; check its size against local wiring rules'}`,
  ];
}

/** A figure rounded down to `decimals`: a limit stated as "under x" must not be rounded past. */
const floorTo = (x: number, decimals: number) => Math.floor(x * 10 ** decimals + 1e-9) / 10 ** decimals;

/**
 * The hours the controller held a state short of the target with steps still open, each too large for what
 * was left (BelowTarget.openStepsTooLarge), and what would cure them: the further step (one per channel
 * stuck) and the lower threshold rehearsed over the profile by the same controller (settledShortTrial.ts),
 * with the hours each brings to the target and the hours below the target in all with it, each beside its own
 * remedy. A step that merely closes there is no cure: the need left after it may still sit under every open
 * step's threshold; nor is one that leaves more hours below the target in all. A result without the trial says
 * only what would close.
 */
function openStepsTooLargeWords(b: ProfileBankResult, hours: (h: number) => string, settledHours: number): string {
  const share = b.settings.responseShare;
  const r = b.belowTarget.openStepsTooLarge;
  const head = `${hours(settledHours)} h settled short of the target with the steps still open each too large for what is left`;
  if (!r) return head;
  const left = Math.abs(r.mostNeedKvar - r.leastNeedKvar) < 0.005 ? `${r.leastNeedKvar.toFixed(2)} kvar` : `${r.leastNeedKvar.toFixed(2)} to ${r.mostNeedKvar.toFixed(2)} kvar`;
  const mixed = b.steps.some((s) => s.channel !== b.steps[0]!.channel);
  const placeOf = (channel: string) => (mixed ? ` (${b.placeWords[channel] ?? channel})` : '');
  const place = r.channel !== null ? placeOf(r.channel) : '';
  const setting = b.source === 'correction-study' ? "the controller's C/k setting" : 'profile.bank.responseShare';
  const facts =
    `${head}: ${left} still needed${place}, while a step closes only for a need above ${share.toFixed(2)} × its kvar, ` +
    `${(share * r.smallestOpenKvar).toFixed(2)} kvar for the smallest step still open (${r.smallestOpenKvar.toFixed(1)} kvar)`;
  const trial = b.settledShortTrial;
  if (!trial) {
    const step = floorTo(r.closingStepKvar, 1);
    const lowerShare = floorTo(r.closingShare, 2);
    const threshold =
      // "under x" with x the least share accepted would offer nothing a file can hold.
      lowerShare > MIN_RESPONSE_SHARE && lowerShare < share ? `, or a switching threshold under ${lowerShare.toFixed(2)} × the step (${setting}; ${MIN_RESPONSE_SHARE} at the least, lower and it hunts)` : '';
    return facts + (step > 0 ? ` — a further step under ${step.toFixed(1)} kvar${place} would close for it${threshold}` : '');
  }
  const all = trial.settledShortHours;
  const further = trial.furtherSteps.map((s) => `${s.kvar.toFixed(1)} kvar${placeOf(s.channel)}`);
  const bring = (one: boolean) => (one ? 'brings' : 'bring');
  const cures = (reached: number, one = further.length === 1) =>
    reached >= all - 1e-9 ? `${bring(one)} them all to the target` : reached <= 1e-9 ? `${bring(one)} none of them to the target` : `${bring(one)} ${hours(reached)} of the ${hours(all)} h to the target`;
  const steps = further.length === 1 ? `a further ${further[0]} step` : `further steps of ${further.join(' and ')}`;
  const inAll = (below: number, one: boolean) => `${below <= 1e-9 ? 'no hour' : `${hours(below)} h`} below the target in all with ${one ? 'it' : 'them'}, ${hours(trial.hoursBelowWithout)} h without`;
  const sizes = `${trial.triedKvar.count} further step sizes tried (${trial.triedKvar.least.toFixed(1)} to ${trial.triedKvar.most.toFixed(1)} kvar)`;
  // A step is offered only where it lowers the hours below the target in all; its own figure stands beside it.
  const remedy = !trial.lowersHoursBelow
    ? `none of the ${sizes} lowers the hours below the target (${hours(trial.hoursBelowWithout)} h without, at least ${hours(trial.hoursBelowWith)} h with any of them)`
    : trial.reachedHours < all - 1e-9 && !trial.someReachedAll
      ? `none of the ${sizes} brings them all to the target; ${steps} ${cures(trial.reachedHours)} (${inAll(trial.hoursBelowWith, further.length === 1)})`
      : `${steps} ${cures(trial.reachedHours)} (${inAll(trial.hoursBelowWith, further.length === 1)})`;
  const lower = trial.lowerShare;
  const threshold = lower
    ? `; a switching threshold of ${lower.share.toFixed(2)} × the step (${setting}; ${MIN_RESPONSE_SHARE} at the least, lower and it hunts) ${cures(lower.reachedHours, true)} (${inAll(lower.hoursBelowWith, true)})`
    : '';
  return `${facts} — tried over the profile with the same controller: ${remedy}${threshold}`;
}

/**
 * A step never in service over the data (stepsNeverClosed.ts), in words with its figures: why the controller
 * left it open while its lines read short of the target, and what that leaves of the bank. `place` is where it
 * sits in the board's words (stepPlaceWords); `totalKvar` the switched kvar of the whole bank.
 */
export function neverClosedWords(n: NeverClosedStep, place: string, settings: { readonly responseShare: number; readonly upperPf: number | null }, totalKvar: number): string {
  const hours = (x: number) => (x < 10 ? x.toFixed(2) : x.toFixed(1));
  const kvar = n.kvar.toFixed(1);
  const head = `step ${n.step} (${kvar} kvar ${place}) never closed over the data`;
  const unused = `${kvar} of the bank's ${totalKvar.toFixed(1)} kvar unused at these loads`;
  if (n.shortHours <= 0) return `${head}: its lines never read short of the target with the other steps in — ${unused}`;
  const upper = settings.upperPf === null || settings.upperPf >= 1 ? 'unity into leading' : `PF ${settings.upperPf.toFixed(Math.round(settings.upperPf * 100) === settings.upperPf * 100 ? 2 : 3)} lagging`;
  const parts: string[] = [];
  if (n.pastLimitHours > 0 && n.mostRoomKvar !== null) {
    const [room, step] = apartKvar(Math.max(0, n.mostRoomKvar), n.kvar);
    const what = settings.upperPf === null || settings.upperPf >= 1 ? 'lagging' : 'of room before that limit';
    parts.push(`in ${hours(n.pastLimitHours)} h closing it would have carried them past ${upper} at its rated ${step} kvar (${room.startsWith('just') ? room : `at most ${room}`} kvar ${what} there)`);
  }
  if (n.underThresholdHours > 0 && n.mostNeedKvar !== null) {
    const threshold = settings.responseShare * n.kvar;
    const [need, limit] = apartKvar(n.mostNeedKvar, threshold, 2);
    parts.push(`in ${hours(n.underThresholdHours)} h the need there, ${need.startsWith('just') ? need : `at most ${need}`} kvar, stayed under its own threshold (${settings.responseShare.toFixed(2)} × ${kvar} = ${limit} kvar)`);
  }
  if (n.waitingHours > 0) parts.push(`in ${hours(n.waitingHours)} h it could have closed but waited (the delay, its discharge, or another step first)`);
  return `${head}: of the ${hours(n.shortHours)} h its lines read short of the target, ${parts.join('; ')} — ${unused}`;
}

/**
 * Two kvar figures printed with enough decimals (`fewest` to 3) that the smaller reads smaller: a step "against at
 * most" a room must never print as equal to it; closer than that, the smaller reads "just under" the larger.
 */
function apartKvar(small: number, large: number, fewest = 1): [string, string] {
  for (const d of [1, 2, 3].filter((x) => x >= fewest)) if (Number(small.toFixed(d)) < Number(large.toFixed(d))) return [small.toFixed(d), large.toFixed(d)];
  // Closer than three decimals tell apart: said in words, the larger at the usual decimals.
  return [`just under ${large.toFixed(fewest)}`, large.toFixed(fewest)];
}

/**
 * The hours the steps still open on the lines falling short are fewer kvar than the shortfall (none, where every
 * step answering to those lines is in): the bank is too small where the load falls short, whatever else is open.
 */
function shortOfStepsWords(t: BelowTarget, hours: string): string {
  const open = t.shortOfStepsOpenKvar ?? 0;
  return open > 0
    ? `${hours} h with the steps still open on the lines short of the target (at most ${open.toFixed(1)} kvar) fewer than the shortfall, the others answering to lines at their target (the bank too small where that load falls short)`
    : `${hours} h with every step that answers to the lines short of the target in, the steps still open answering to lines at their target (the bank too small where that load falls short)`;
}

/**
 * The hours every step still open on a channel short of the target would carry that channel past the band's
 * upper limit (unity: leading): each such channel's smallest open step against the most room it had there, so
 * a trim too large for the loads it meets is named with its figures.
 */
function stepTooCoarseWords(b: ProfileBankResult, hours: string, upper: string): string {
  const unity = (b.settings.upperPf ?? 1) >= 1;
  const past = unity ? 'past unity into leading' : `past PF ${upper} lagging`;
  const head = `${hours} h with the steps still open on lines short of the target too large for them, at their rated kvar carrying those lines ${past}`;
  const channels = b.belowTarget.stepTooCoarseChannels;
  // A result without the channels (written before they were kept): the head alone.
  if (!channels?.length) return `${head}: steps too coarse for that load`;
  const figures = channels.map((c) => {
    const [room, step] = apartKvar(Math.max(0, c.mostRoomKvar), c.smallestOpenKvar);
    const lines = c.channel === 'ABC' ? 'on the board' : 'on its lines';
    return `${step} kvar ${b.placeWords[c.channel] ?? c.channel} against ${room.startsWith('just') ? room : `at most ${room}`} kvar ${unity ? 'lagging' : `of room before PF ${upper}`} ${lines}`;
  });
  const listed = figures.length > 1 ? `${figures.slice(0, -1).join(', ')} and ${figures[figures.length - 1]}` : figures[0]!;
  return `${head} (${listed}): steps too coarse for that load`;
}

/**
 * The hours with the shortfall under the switching threshold, quoting each channel's own: the controller
 * judges a channel (the board for three-phase steps, a phase or a line pair for the others) against
 * responseShare × that channel's smallest step, so one channel's threshold never explains another's hours.
 */
function underResponseWords(b: ProfileBankResult, hours: string): string {
  const share = b.settings.responseShare;
  const t = b.belowTarget;
  const kvar = (x: number) => `${x.toFixed(1)} kvar`;
  const threshold = (smallest: number) => `${share.toFixed(2)} × ${kvar(smallest)} = ${(share * smallest).toFixed(2)} kvar`;
  // A result without the channels (written before they were kept): the bank's smallest step, right where every step answers to one reading.
  if (t.underResponseChannels === undefined) return `${hours} h with the shortfall under the switching threshold (${threshold(Math.min(...b.steps.map((s) => s.kvar)))}: no step closes for it)`;
  const channels = t.underResponseChannels;
  if (!channels.length) return `${hours} h short of the target on lines no step answers to (every step's own reading at or above the target)`;
  // Three-phase steps alone: the board's threshold, as it always read.
  if (channels.length === 1 && channels[0]!.channel === 'ABC' && b.steps.every((s) => s.channel === 'ABC'))
    return `${hours} h with the shortfall under the switching threshold (${threshold(channels[0]!.smallestKvar)}: no step closes for it)`;
  const placeOf = (channel: StepChannel) => (channel === 'ABC' ? 'on the whole board' : (b.placeWords[channel] ?? channel));
  const sizes = new Set(channels.map((c) => c.smallestKvar));
  if (sizes.size === 1)
    return `${hours} h with the shortfall ${channels.map((c) => placeOf(c.channel)).join(' and ')} under the switching threshold there (${threshold(channels[0]!.smallestKvar)}${channels.length > 1 ? ' each' : ''}: no step closes for it)`;
  return `${hours} h with the shortfall under each channel's own switching threshold (${channels.map((c) => `${threshold(c.smallestKvar)} ${placeOf(c.channel)}`).join(', ')}: no step closes for it)`;
}

/**
 * The hours the board stays below the target with the bank, and why (ProfileBankResult.belowTarget), in one
 * sentence; null where there are none. `trivar profile` prints it and the report states it.
 */
export function belowTargetWords(b: ProfileBankResult): string | null {
  checkObjectArgument(b, 'b', 'the bank of a profile result (result.bank)', ['belowTarget', 'settings']);
  checkObjectArgument(b.belowTarget, 'b.belowTarget', 'the hours below the target { hours, ... }', ['hours']);
  const t = b.belowTarget;
  if (t.hours <= 0) return null;
  const set = b.settings;
  const hours = (h: number) => (h < 10 ? h.toFixed(2) : h.toFixed(1));
  // Three decimals where a band edge needs them (0.995 must not read as 0.99).
  const pf = (x: number) => x.toFixed(Math.round(x * 100) === x * 100 ? 2 : 3);
  const why = [
    ...(t.allStepsInHours > 0 ? [`${hours(t.allStepsInHours)} h with every step in (the bank too small for that load)`] : []),
    ...((t.shortOfStepsHours ?? 0) > 0 ? [shortOfStepsWords(t, hours(t.shortOfStepsHours!))] : []),
    ...(t.underResponseHours > 0 ? [underResponseWords(b, hours(t.underResponseHours))] : []),
    ...(t.stepTooCoarseHours > 0 ? [stepTooCoarseWords(b, hours(t.stepTooCoarseHours), pf(set.upperPf!))] : []),
    ...(t.openStepsTooLargeHours > 0 ? [openStepsTooLargeWords(b, hours, t.openStepsTooLargeHours)] : []),
    ...(t.onTheWayHours > 0 ? [`${hours(t.onTheWayHours)} h with the controller on its way (switching delay, a step waiting out its discharge)`] : []),
  ];
  // Worked where the controller measures: the bank's board, or upstream of it (profile.bank.measuredAt).
  const where = b.measuredAt === null || b.measuredAt === undefined ? 'board PF' : b.measuredAt === 'origin' ? "PF at the origin (the supply's terminals, where the controller measures)" : `PF at the incomer of ${b.measuredAt} (where the controller measures)`;
  return `${where} below ${pf(set.targetPf)} with the bank: ${hours(t.hours)} h of import — ${why.join('; ')}`;
}

/** With a bank's supply resonance: what the estimate leaves out, deferring to a harmonic study and licensed practice. */
export const BANK_RESONANCE_CAUTION =
  "The resonance orders are estimated from the supply path's reactances and the bank's capacitances at nominal voltage, not from the board's harmonic currents: where harmonic-producing loads are on the board, or may be added, a harmonic study decides whether the steps need detuning reactors, and the bank is specified and installed by a licensed professional to the local codes.";

/**
 * The line over the step-state check: where the supply resonance lies near an order that headlines (`clause`,
 * correct's verdict clause), near only orders that do not (the 17th and 19th, or triplens that cannot reach the
 * bank), or near none (null: the clear line says it).
 */
export const bankResonanceHeadline = (clause: string | null, nearAny: boolean): string | null =>
  clause !== null
    ? `the bank's ${clause.replace(/^its /, '')}`
    : nearAny
      ? "the bank's supply resonance lies near a harmonic order only in orders typical spectra carry little of, or that cannot reach the bank (see the warnings)"
      : null;

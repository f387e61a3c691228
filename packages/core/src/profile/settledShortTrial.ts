/**
 * What would bring the hours a bank settles short of its target (BelowTarget.openStepsTooLarge) up to it,
 * rehearsed rather than promised. A further step that closes there need not settle the board at the target:
 * after it closes the need left may still be above its own threshold with the other open steps too large,
 * and a step added to the bank changes which step the controller takes first elsewhere. So each candidate
 * is run over the whole profile by the same simulation, and the hours it brings to the target are counted.
 * A candidate is a remedy only where the hours below the target in all fall: a step that cures the stuck
 * hours and breaks others elsewhere makes the record worse.
 */
import type { StepChannel, SwitchedStep, SwitchingSettings } from './bankController.js';
import type { SettledShortInterval } from './belowTargetHours.js';
import { channelReadingAt, phaseIndexOf, type BankRun } from './simulateBank.js';
import type { PhaseId } from '../board/boardModel.js';
import type { IntervalFigures } from './solveBatch.js';
import { MIN_RESPONSE_SHARE } from './profileDefaults.js';

/** The trial's answer: the further steps that brought most of the settled-short hours to the target. */
export interface SettledShortTrial {
  /** The hours settled short with the bank as it is. */
  readonly settledShortHours: number;
  /** The hours below the target in all with the bank as it is, judged as the candidates are. */
  readonly hoursBelowWithout: number;
  /**
   * A further step on one stuck channel, or one on each together, the best tried (fewest hours below the target in all, then most of the
   * settled-short hours at the target, then least kvar). A remedy only where `hoursBelowWith` < `hoursBelowWithout`.
   */
  readonly furtherSteps: readonly { readonly channel: StepChannel; readonly kvar: number }[];
  /** Of `settledShortHours`, the hours at the target with those steps added. */
  readonly reachedHours: number;
  /** The hours below the target in all with those steps added (the bank as it is may have more elsewhere, or fewer). */
  readonly hoursBelowWith: number;
  /** The further step sizes tried: the least and most, kvar, and how many (on every stuck channel together). */
  readonly triedKvar: { readonly least: number; readonly most: number; readonly count: number };
  /** Whether `furtherSteps` is a remedy: the hours below the target in all fewer with them than without. */
  readonly lowersHoursBelow: boolean;
  /** Whether some size tried, though not the best, brought every settled-short hour to the target. */
  readonly someReachedAll: boolean;
  /**
   * A lower switching threshold (share of the step, simulated at exactly this share), the settled-short hours
   * it brings to the target and the hours below the target in all with it; null where no share the schema
   * accepts (MIN_RESPONSE_SHARE or above) lets a step close, or where it does not lower the hours below the target.
   */
  readonly lowerShare: { readonly share: number; readonly reachedHours: number; readonly hoursBelowWith: number } | null;
}

export interface SettledShortTrialInput {
  readonly steps: readonly SwitchedStep[];
  readonly fixed: readonly SwitchedStep[];
  readonly settings: SwitchingSettings;
  readonly settledShort: readonly SettledShortInterval[];
  /** The threshold share under which an open step closes in every settled-short interval (BelowTarget.openStepsTooLarge.closingShare). */
  readonly closingShare: number;
  readonly simulate: (steps: readonly SwitchedStep[], fixed: readonly SwitchedStep[], settings: SwitchingSettings) => BankRun;
  /** The run of the bank as it is (`steps`, `fixed`, `settings`), the record every candidate is compared with. */
  readonly asIs: BankRun;
  readonly intervalMs: number;
  /** The intervals in the record: a long one is given fewer trial runs. */
  readonly intervals: number;
  /** The bank's board's phases, in the figures' order (a channel's reading is read off them). */
  readonly phases: readonly PhaseId[];
  readonly rowHours: Float64Array | null;
}

/**
 * Candidate sizes per channel: each is a whole run over the profile, so fewer on a long record (about
 * 400,000 interval solves in all), 6 to 40 of them; half that per channel where several are stuck.
 */
const candidateCount = (intervals: number, channels: number) => Math.max(3, Math.floor(Math.max(6, Math.min(40, Math.floor(400_000 / Math.max(1, intervals)))) / channels));

/** kvar rounded up to 0.1 kvar: a size stated to one decimal that is not below the need it meets. */
const upToTenth = (x: number) => Math.ceil(x * 10 - 1e-9) / 10;
/** A figure rounded down to `decimals`: a limit stated as "under x" must not be rounded past. */
const floorTo = (x: number, decimals: number) => Math.floor(x * 10 ** decimals + 1e-9) / 10 ** decimals;

/**
 * Sizes worth trying on one channel: each need left rounded up (a step that meets it closes there while it
 * is under need ÷ share), and an even spread from the least need to the most a step may be and still close
 * for the largest need (most ÷ share); spread evenly over the needs where there are many.
 */
function candidateSizes(needs: readonly number[], share: number, count: number): number[] {
  const sorted = [...needs].sort((a, b) => a - b);
  const least = sorted[0]!;
  const most = sorted[sorted.length - 1]!;
  const top = most / share;
  const half = Math.ceil(count / 2);
  const fromNeeds = Array.from({ length: Math.min(half, sorted.length) }, (_, k) => upToTenth(sorted[Math.round((k * (sorted.length - 1)) / Math.max(1, half - 1))]!));
  const spread = Array.from({ length: count - fromNeeds.length }, (_, k) => upToTenth(least + ((top - least) * k) / (count - fromNeeds.length)));
  return [...new Set([...fromNeeds, ...spread])].filter((x) => x > 0 && x * share < most).sort((a, b) => a - b);
}

/**
 * Runs the bank over the profile with further steps (a single size on one channel, or the best of each
 * stuck channel together) and with a lower threshold, and counts the settled-short hours each brings to the
 * target where the controller measures. Null where there is nothing to try.
 */
export function trySettledShort(input: SettledShortTrialInput): SettledShortTrial | null {
  const { steps, fixed, settings, settledShort } = input;
  if (!settledShort.length) return null;
  const tanTarget = Math.tan(Math.acos(settings.targetPf));
  const h = input.intervalMs / 3_600_000;
  const hoursOf = (i: number) => (input.rowHours ? input.rowHours[i]! : h);
  const below = (f: IntervalFigures, i: number) => {
    let w = 0;
    let q = 0;
    for (let k = 0; k < f.phaseW.length; k++) {
      w += f.phaseW[k]![i]!;
      q += f.phaseVar[k]![i]!;
    }
    return w > 0 && q > w * tanTarget;
  };
  const settledShortHours = settledShort.reduce((a, s) => a + hoursOf(s.index), 0);
  const phaseIndex = phaseIndexOf(input.phases);
  /** The hours of the settled-short intervals at the target (board-wide where the controller measures), the hours
   *  where `channel` reads its own target, and the hours below the target in all. */
  const judge = (run: BankRun, channel: StepChannel | null) => {
    const f = run.meterFigures ?? run.figures;
    let reached = 0;
    let channelReached = 0;
    for (const s of settledShort) {
      if (!below(f, s.index)) reached += hoursOf(s.index);
      if (channel !== null && s.needKvar.has(channel)) {
        const r = channelReadingAt(f, phaseIndex, channel, s.index);
        if (r.var <= Math.max(r.w, 0) * tanTarget) channelReached += hoursOf(s.index);
      }
    }
    let belowAll = 0;
    for (let i = 0; i < f.count; i++) if (below(f, i)) belowAll += hoursOf(i);
    return { reached, channelReached, belowAll };
  };
  type Tried = { readonly furtherSteps: { channel: StepChannel; kvar: number }[]; readonly reached: number; readonly channelReached: number; readonly belowAll: number };
  const tryWith = (further: { channel: StepChannel; kvar: number }[], channel: StepChannel | null): Tried => ({
    furtherSteps: further,
    ...judge(input.simulate([...steps, ...further], fixed, settings), channel),
  });
  const same = (a: number, b: number) => Math.abs(a - b) <= 1e-9;
  // Each channel's step to pair with the others: its own hours at its target first, since where several
  // channels are stuck in one interval no step on one of them brings the board there alone, and the board's
  // count cannot tell the sizes apart.
  const closerOnChannel = (a: Tried, b: Tried | null) =>
    !b ||
    (!same(a.channelReached, b.channelReached)
      ? a.channelReached > b.channelReached
      : !same(a.reached, b.reached)
        ? a.reached > b.reached
        : !same(a.belowAll, b.belowAll)
          ? a.belowAll < b.belowAll
          : total(a) < total(b));
  // What is offered: the whole record first, since a step that cures the stuck hours but leaves more hours
  // below the target elsewhere is no remedy; then the stuck hours it brings to the target; then least kvar.
  const boardWide = (a: Tried, b: Tried | null) =>
    !b || (!same(a.belowAll, b.belowAll) ? a.belowAll < b.belowAll : !same(a.reached, b.reached) ? a.reached > b.reached : total(a) < total(b));
  const total = (t: Tried) => t.furtherSteps.reduce((a, s) => a + s.kvar, 0);

  const needs = new Map<StepChannel, number[]>();
  for (const s of settledShort) for (const [c, need] of s.needKvar) needs.set(c, [...(needs.get(c) ?? []), need]);
  const channels = [...needs.keys()];
  const count = candidateCount(input.intervals, channels.length);
  let sizesTried = 0;
  let best: Tried | null = null;
  const bestOf = new Map<StepChannel, Tried>();
  let someReachedAll = false;
  let least = Infinity;
  let most = 0;
  for (const c of channels) {
    for (const kvar of candidateSizes(needs.get(c)!, settings.responseShare, count)) {
      sizesTried++;
      least = Math.min(least, kvar);
      most = Math.max(most, kvar);
      const t = tryWith([{ channel: c, kvar }], c);
      if (t.reached >= settledShortHours - 1e-9) someReachedAll = true;
      if (closerOnChannel(t, bestOf.get(c) ?? null)) bestOf.set(c, t);
      if (boardWide(t, best)) best = t;
    }
  }
  // Stuck on several channels: each channel's best together, where one alone leaves hours short.
  if (channels.length > 1 && best && best.reached < settledShortHours - 1e-9) {
    const together = tryWith([...bestOf.values()].map((t) => t.furtherSteps[0]!), null);
    if (boardWide(together, best)) best = together;
  }
  if (!best) return null;
  const hoursBelowWithout = judge(input.asIs, null).belowAll;
  // The share printed is the share simulated, and one the schema accepts: two decimals, under the share at which
  // an open step would just close (a step closes only while the need is above share × step).
  const floored = floorTo(input.closingShare, 2);
  const share = input.closingShare - floored < 1e-6 ? floorTo(floored - 0.01, 2) : floored;
  let lowerShare: SettledShortTrial['lowerShare'] = null;
  if (share >= MIN_RESPONSE_SHARE && share < settings.responseShare) {
    const t = judge(input.simulate(steps, fixed, { ...settings, responseShare: share }), null);
    if (t.belowAll < hoursBelowWithout - 1e-9) lowerShare = { share, reachedHours: t.reached, hoursBelowWith: t.belowAll };
  }
  return {
    settledShortHours,
    hoursBelowWithout,
    furtherSteps: best.furtherSteps,
    reachedHours: best.reached,
    hoursBelowWith: best.belowAll,
    lowersHoursBelow: best.belowAll < hoursBelowWithout - 1e-9,
    someReachedAll,
    triedKvar: { least, most, count: sizesTried },
    lowerShare,
  };
}

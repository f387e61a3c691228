/**
 * The hours a board stays below its PF target with the automatic bank, and why. Each such interval is
 * explained by the simulated controller's own state in it: the steps it shows open, what each channel
 * reads there, and the controller's rule (bankController.ts channelRule). So a state the controller holds
 * (nothing left that it may close) is never put down to its delay, and "on its way" means a step would
 * close or open there once the delay runs out or its discharge is done.
 */
import type { PhaseId } from '../board/boardModel.js';
import { channelRule, type StepChannel, type SwitchedStep } from './bankController.js';
import { channelReadingAt, phaseIndexOf } from './simulateBank.js';
import type { IntervalFigures } from './solveBatch.js';

/**
 * Board-total PF below the target while importing (where the controller measures), hours, split by why;
 * the six parts add up to `hours`. A channel is what a step answers to (the board for a three-phase step,
 * its phase or line pair for the others). In each interval the first of these that holds decides: the
 * controller on its way; every step in; the steps still open on the channels short of the target fewer kvar
 * than the board's shortfall (the rest answer to lines at their target); else why those open steps stay out —
 * each would carry its lines past the upper limit, each is kept out by its own threshold, or the channel's
 * shortfall is under its threshold.
 */
export interface BelowTarget {
  readonly hours: number;
  /** Every step of the bank in: the bank too small for that load. */
  readonly allStepsInHours: number;
  /**
   * Steps still open, but those on the channels short of the target add up to less than the board's shortfall
   * (none at all where every step answering to those lines is in): the bank too small where the load falls
   * short, the open steps answering to lines already at their target. Absent from results written before it
   * was told apart (they counted such hours as `allStepsInHours`).
   */
  readonly shortOfStepsHours?: number;
  /** The kvar open on the channels short of the target in those hours, the most of any interval (0: none open there). */
  readonly shortOfStepsOpenKvar?: number;
  /** The shortfall under the controller's response threshold (responseShare × the channel's smallest step): no step closes for it. */
  readonly underResponseHours: number;
  /**
   * The channels short of the target but under their own threshold in those hours, in the steps' order, with
   * their smallest step (the threshold is responseShare × it): the words quote each channel's own.
   */
  readonly underResponseChannels: readonly { readonly channel: StepChannel; readonly smallestKvar: number }[];
  /** With an upper limit: every step still open on a channel short of the target would carry it past that limit (steps too coarse for the band at that load). */
  readonly stepTooCoarseHours: number;
  /**
   * Those channels, in the steps' order: the smallest step open there in those hours and the most kvar the
   * channel could take before its upper limit in any of them (its room), so the words show the step against
   * what it would have to fit. Absent from results written before they were kept.
   */
  readonly stepTooCoarseChannels?: readonly { readonly channel: StepChannel; readonly smallestOpenKvar: number; readonly mostRoomKvar: number }[];
  /**
   * Settled with steps still open, each too large for what is left: the need is above the response threshold,
   * but each open step closes only for a need above responseShare × its own kvar, and that is above the need.
   */
  readonly openStepsTooLargeHours: number;
  /** The controller on its way: a step would close (or an over-corrected channel's step open) once the delay runs out or its discharge is done. */
  readonly onTheWayHours: number;
  /**
   * Where `openStepsTooLargeHours` > 0, what a remedy needs: the least and most kvar left in those intervals;
   * the smallest step open in any of them; the threshold share under which an open step would close in every
   * one (least of need ÷ the smallest open step); the step size under which a further step would close in
   * every one (least of need ÷ responseShare); and the channel where they are all on one, else null.
   * Null where there are no such hours.
   */
  readonly openStepsTooLarge: {
    readonly channel: StepChannel | null;
    readonly leastNeedKvar: number;
    readonly mostNeedKvar: number;
    readonly smallestOpenKvar: number;
    readonly closingShare: number;
    readonly closingStepKvar: number;
  } | null;
}

/**
 * See BelowTarget: board totals decide whether an interval is below the target (import only); the controller's
 * state in it decides why. `stepOn` is each switched step's state per interval (BankRun.stepOn); `phases` the
 * bank's board's phases, in the figures' order; `upperPf` null for a controller without an upper limit;
 * `rowHours` the hours each interval stands for where rows are not all one interval apart (IntervalTable.rowHours).
 * A bank of no switched steps (a fixed part alone) is "every step in".
 */
export function hoursBelowTarget(
  f: IntervalFigures,
  settings: { readonly targetPf: number; readonly upperPf: number | null; readonly responseShare: number },
  bank: { readonly steps: readonly SwitchedStep[]; readonly stepOn: readonly Uint8Array[]; readonly phases: readonly PhaseId[] },
  intervalMs: number,
  rowHours: Float64Array | null = null,
): BelowTarget {
  return belowTargetStates(f, settings, bank, intervalMs, rowHours).belowTarget;
}

/** An interval settled short with its open steps each too large, and the kvar left on each channel stuck there. */
export interface SettledShortInterval {
  readonly index: number;
  readonly needKvar: ReadonlyMap<StepChannel, number>;
}

/** hoursBelowTarget, with the intervals settled short (openStepsTooLarge) listed for a trial of what would cure them. */
export function belowTargetStates(
  f: IntervalFigures,
  settings: { readonly targetPf: number; readonly upperPf: number | null; readonly responseShare: number },
  bank: { readonly steps: readonly SwitchedStep[]; readonly stepOn: readonly Uint8Array[]; readonly phases: readonly PhaseId[] },
  intervalMs: number,
  rowHours: Float64Array | null = null,
): { readonly belowTarget: BelowTarget; readonly settledShort: readonly SettledShortInterval[] } {
  const tanTarget = Math.tan(Math.acos(settings.targetPf));
  const rule = channelRule({ targetPf: settings.targetPf, responseShare: settings.responseShare, delaySeconds: 0, reconnectSeconds: 0, ...(settings.upperPf === null ? {} : { upperPf: settings.upperPf }) });
  const { steps, stepOn } = bank;
  const phaseIndex = phaseIndexOf(bank.phases);
  const channels = [...new Set(steps.map((s) => s.channel))].map((channel) => {
    const members = steps.flatMap((s, k) => (s.channel === channel ? [k] : []));
    return { channel, members, smallestKvar: Math.min(...members.map((k) => steps[k]!.kvar)) };
  });
  const h = intervalMs / 3_600_000;
  // Counted in intervals (each row's share of one where rows are irregular), then made hours.
  let below = 0;
  let allIn = 0;
  let shortOf = 0;
  let shortOfOpenKvar = 0;
  let under = 0;
  let coarse = 0;
  let tooLarge = 0;
  let onTheWay = 0;
  const underChannels = new Set<StepChannel>();
  const coarseChannels = new Map<StepChannel, { smallestOpen: number; mostRoom: number }>();
  const settledShort: SettledShortInterval[] = [];
  let remedy: { channels: Set<StepChannel>; least: number; most: number; smallestOpen: number; share: number; step: number } | null = null;
  for (let i = 0; i < f.count; i++) {
    let w = 0;
    let q = 0;
    for (let k = 0; k < f.phaseW.length; k++) {
      w += f.phaseW[k]![i]!;
      q += f.phaseVar[k]![i]!;
    }
    if (w <= 0 || q <= w * tanTarget) continue;
    const each = rowHours ? rowHours[i]! / h : 1;
    below += each;
    if (steps.every((_, k) => stepOn[k]![i] === 1)) {
      allIn += each;
      continue;
    }
    let moving = false;
    // kvar open on the channels short of the target, and why each of those channels keeps its open steps out.
    let openOnShort = 0;
    const pastBand: { channel: StepChannel; smallestOpen: number; room: number }[] = [];
    const stuck: { channel: StepChannel; need: number; smallestOpen: number; step: number }[] = [];
    const short: StepChannel[] = [];
    for (const c of channels) {
      const g = rule.gauge(channelReadingAt(f, phaseIndex, c.channel, i), c.smallestKvar);
      if (g.need <= 0) {
        // Content, or over-corrected with a step it would take out.
        if (g.wants === 'out' && c.members.some((k) => stepOn[k]![i] === 1 && rule.mayOpen(steps[k]!.kvar, g))) moving = true;
        continue;
      }
      const open = c.members.filter((k) => stepOn[k]![i] !== 1);
      if (!open.length) continue;
      let smallestOpen = Infinity;
      for (const k of open) {
        openOnShort += steps[k]!.kvar;
        smallestOpen = Math.min(smallestOpen, steps[k]!.kvar);
      }
      if (g.wants === 'in' && open.some((k) => rule.mayClose(steps[k]!.kvar, g))) moving = true;
      else if (rule.banded && open.every((k) => steps[k]!.kvar * 1000 > g.room)) pastBand.push({ channel: c.channel, smallestOpen, room: g.room / 1000 });
      else if (g.wants === 'in') {
        // Every open step is kept out by its threshold. In a band too: one within the room is kept out by its
        // threshold alone, so need ÷ responseShare ≤ its kvar ≤ room, and a step past the room is larger still;
        // a further step under need ÷ responseShare is then within the room as well.
        stuck.push({ channel: c.channel, need: g.need / 1000, smallestOpen, step: g.need / 1000 / settings.responseShare });
      } else short.push(c.channel);
    }
    if (moving) onTheWay += each;
    // The open steps that answer to the lines falling short could not make up the board's shortfall even all
    // in (kvar at nominal voltage against the var read, as the controller weighs a step against its need).
    else if (openOnShort * 1000 < q - w * tanTarget) {
      shortOf += each;
      shortOfOpenKvar = Math.max(shortOfOpenKvar, openOnShort);
    } else if (pastBand.length) {
      coarse += each;
      for (const p of pastBand) {
        const seen = coarseChannels.get(p.channel);
        coarseChannels.set(p.channel, seen ? { smallestOpen: Math.min(seen.smallestOpen, p.smallestOpen), mostRoom: Math.max(seen.mostRoom, p.room) } : { smallestOpen: p.smallestOpen, mostRoom: p.room });
      }
    } else if (stuck.length) {
      tooLarge += each;
      settledShort.push({ index: i, needKvar: new Map(stuck.map((s) => [s.channel, s.need])) });
      for (const s of stuck) {
        const share = s.need / s.smallestOpen;
        if (!remedy) remedy = { channels: new Set([s.channel]), least: s.need, most: s.need, smallestOpen: s.smallestOpen, share, step: s.step };
        else {
          remedy.channels.add(s.channel);
          remedy.least = Math.min(remedy.least, s.need);
          remedy.most = Math.max(remedy.most, s.need);
          remedy.smallestOpen = Math.min(remedy.smallestOpen, s.smallestOpen);
          remedy.share = Math.min(remedy.share, share);
          remedy.step = Math.min(remedy.step, s.step);
        }
      }
    } else {
      // The open kvar on short channels covers the shortfall, so some short channel has open steps; none
      // is on its way, past the band or stuck, so each is under its threshold.
      under += each;
      for (const c of short) underChannels.add(c);
    }
  }
  const belowTarget: BelowTarget = {
    hours: below * h,
    allStepsInHours: allIn * h,
    shortOfStepsHours: shortOf * h,
    shortOfStepsOpenKvar: shortOfOpenKvar,
    underResponseHours: under * h,
    underResponseChannels: channels.filter((c) => underChannels.has(c.channel)).map((c) => ({ channel: c.channel, smallestKvar: c.smallestKvar })),
    stepTooCoarseHours: coarse * h,
    stepTooCoarseChannels: channels.filter((c) => coarseChannels.has(c.channel)).map((c) => ({ channel: c.channel, smallestOpenKvar: coarseChannels.get(c.channel)!.smallestOpen, mostRoomKvar: coarseChannels.get(c.channel)!.mostRoom })),
    openStepsTooLargeHours: tooLarge * h,
    onTheWayHours: onTheWay * h,
    openStepsTooLarge: remedy
      ? {
          channel: remedy.channels.size === 1 ? [...remedy.channels][0]! : null,
          leastNeedKvar: remedy.least,
          mostNeedKvar: remedy.most,
          smallestOpenKvar: remedy.smallestOpen,
          closingShare: remedy.share,
          closingStepKvar: remedy.step,
        }
      : null,
  };
  return { belowTarget, settledShort };
}

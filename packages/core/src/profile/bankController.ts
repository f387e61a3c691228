/**
 * An automatic capacitor-bank controller, step by step in time.
 *
 * Each step belongs to a channel: 'ABC' steps answer to the board's total P
 * and Q, a single-phase step to its own phase, a step across two lines to the
 * sum over those two lines (its output divides equally between them). The reactive need of a channel
 * is Q − max(P, 0)·tan φ_target (var; positive = more capacitance wanted).
 * A step switches in when the need exceeds the response threshold
 * (responseShare × the channel's smallest step — the C/k setting) for the
 * switching delay, and out when the channel is over-corrected by more than
 * that threshold for the delay. One step per decision; the largest step that
 * fits the need, ties going to the step that has waited longest (rotation
 * evens the wear). A step that has been switched out may reconnect only after
 * the reconnect (discharge) time.
 *
 * Time runs continuously: `advance` watches the board over a stretch in which
 * the readings hold and makes the first move that falls due in it, at the time
 * it falls due (the delay run out, and for a step going in, its discharge
 * done). A caller re-reads the board after each move and asks again, so within
 * one interval the controller makes as many moves as its delay leaves room for.
 *
 * With an upper limit (`upperPf`, lagging; 1 = unity) the controller holds a
 * band instead of a single target: Q between max(P, 0)·tan φ_upper and
 * max(P, 0)·tan φ_target. A step switches in only if it leaves Q at or above the
 * lower edge (it would not carry the PF past the upper limit or leading), and a
 * step switches out when Q has stayed below that edge for the delay: the
 * smallest connected step that brings Q back to the edge, or the largest if
 * none does. Without an upper limit over-correction is judged against the
 * target alone, as above.
 */
import type { PhaseId } from '../board/boardModel.js';
import { checkListArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

/** 'ABC': a three-phase step; a phase: a step from that line to the neutral; a line pair: a step across two lines. */
export type StepChannel = 'ABC' | PhaseId | LinePair;
export type LinePair = 'A-B' | 'B-C' | 'C-A';
export const isLinePair = (channel: string): channel is LinePair => channel === 'A-B' || channel === 'B-C' || channel === 'C-A';

export interface SwitchedStep {
  /** Output at nominal voltage, kvar (the channel's total: all three phases for 'ABC'). */
  readonly kvar: number;
  readonly channel: StepChannel;
  /** Controller output that drives the step, where a designed bank numbers them. */
  readonly output?: number;
}

export interface SwitchingSettings {
  readonly targetPf: number;
  readonly responseShare: number;
  readonly delaySeconds: number;
  readonly reconnectSeconds: number;
  /**
   * Highest lagging PF the bank may bring a channel to (1 = unity: never leading);
   * omitted: no upper limit (over-correction judged against targetPf alone).
   */
  readonly upperPf?: number;
}

/** What the controller sees on one channel over one interval, W and var. */
export interface ChannelReading {
  readonly w: number;
  readonly var: number;
}

export interface BankController {
  readonly steps: readonly SwitchedStep[];
  /** 1 where a step is connected now. */
  readonly on: Uint8Array;
  /** Closings per step so far (each is one switching operation of the capacitor and its contactor). */
  readonly closings: Int32Array;
  readonly openings: Int32Array;
  /**
   * Watches the board from `fromMs` to `untilMs` with the readings `readingOf(channel)` holding throughout,
   * and makes the first move that falls due by `untilMs` (one step in or out on one channel).
   * @returns the time of that move, or null when none falls due (the timers then run on to `untilMs`)
   */
  advance(fromMs: number, untilMs: number, readingOf: (channel: StepChannel) => ChannelReading): number | null;
  /** Forget pending timers (called across a gap in the data). */
  interrupt(): void;
}

/** A channel's reactive need and room below the upper limit at one reading (var), and which way it wants to switch. */
export interface ChannelGauge {
  readonly need: number;
  readonly room: number;
  readonly wants: 'in' | 'out' | null;
}

/**
 * The switching rule of one channel, apart from timing: its gauge at a reading, and whether a step may
 * close or open there. The controller moves by it, and the hours below the target are explained by it
 * (belowTargetHours.ts), so a state the controller holds is never put down to its delay.
 */
export interface ChannelRule {
  readonly banded: boolean;
  /** `smallestKvar`: the channel's smallest step, whose threshold (responseShare × it) starts any closing. */
  gauge(r: ChannelReading, smallestKvar: number): ChannelGauge;
  /** An open step of `kvar` may close: its own threshold under the need and, in a band, within the room. */
  mayClose(kvar: number, g: Pick<ChannelGauge, 'need' | 'room'>): boolean;
  /** A connected step of `kvar` may open on an over-corrected channel: in a band any may; without one, a step under the excess by its threshold. */
  mayOpen(kvar: number, g: Pick<ChannelGauge, 'need' | 'room'>): boolean;
}

export function channelRule(settings: SwitchingSettings): ChannelRule {
  const tanTarget = Math.tan(Math.acos(settings.targetPf));
  const banded = settings.upperPf !== undefined;
  const tanUpper = banded ? Math.tan(Math.acos(Math.min(1, settings.upperPf!))) : 0;
  const share = settings.responseShare;
  return {
    banded,
    gauge(r, smallestKvar) {
      const p = Math.max(r.w, 0);
      const need = r.var - p * tanTarget;
      // Room before the upper PF limit: how much capacitance can go in without passing it.
      const room = r.var - p * tanUpper;
      const threshold = share * smallestKvar * 1000;
      return { need, room, wants: need > threshold ? 'in' : (banded ? room < 0 : need < -threshold) ? 'out' : null };
    },
    mayClose: (kvar, g) => (!banded || kvar * 1000 <= g.room) && share * kvar * 1000 < g.need,
    mayOpen: (kvar, g) => banded || share * kvar * 1000 < -g.need,
  };
}

/** A move a channel wants: a step in or out, due at `dueMs`. */
interface Wish {
  readonly channel: StepChannel;
  readonly going: 'in' | 'out';
  readonly dueMs: number;
}

export function createBankController(steps: readonly SwitchedStep[], settings: SwitchingSettings): BankController {
  checkListArgument(steps, 'steps', 'a list of switched steps (switchingFromBank(...).steps)', (x) => typeof x === 'object' && x !== null);
  checkObjectArgument(settings, 'settings', "the controller's switching settings (switchingFromBank(...).settings)");
  const n = steps.length;
  const on = new Uint8Array(n);
  const closings = new Int32Array(n);
  const openings = new Int32Array(n);
  const changedAt = new Float64Array(n).fill(Number.NEGATIVE_INFINITY);
  const channels = [...new Set(steps.map((s) => s.channel))];
  const rule = channelRule(settings);
  const banded = rule.banded;
  const delayMs = settings.delaySeconds * 1000;
  const reconnectMs = settings.reconnectSeconds * 1000;
  const inTimer = new Map<StepChannel, number>(channels.map((c) => [c, 0]));
  const outTimer = new Map<StepChannel, number>(channels.map((c) => [c, 0]));
  const ofChannel = new Map<StepChannel, number[]>(channels.map((c) => [c, steps.flatMap((s, k) => (s.channel === c ? [k] : []))]));
  const smallest = new Map<StepChannel, number>(channels.map((c) => [c, Math.min(...steps.filter((s) => s.channel === c).map((s) => s.kvar))]));

  /** The largest step among `candidates` whose threshold fits `need` (var), longest-waiting first. */
  const pick = (candidates: number[], need: number): number => {
    let best = -1;
    for (const s of candidates) {
      if (settings.responseShare * steps[s]!.kvar * 1000 >= need) continue;
      if (best < 0 || steps[s]!.kvar > steps[best]!.kvar || (steps[s]!.kvar === steps[best]!.kvar && changedAt[s]! < changedAt[best]!)) best = s;
    }
    return best;
  };

  /** The smallest of `candidates` whose removal gives back `excess` var, else the largest; longest-connected first. */
  const pickRestoring = (candidates: number[], excess: number): number => {
    let best = -1;
    for (const s of candidates) {
      if (best < 0) {
        best = s;
        continue;
      }
      const k = steps[s]!.kvar * 1000;
      const kb = steps[best]!.kvar * 1000;
      const enough = k >= excess;
      const bestEnough = kb >= excess;
      if (enough !== bestEnough ? enough : k !== kb ? (enough ? k < kb : k > kb) : changedAt[s]! < changedAt[best]!) best = s;
    }
    return best;
  };

  /** A channel's need and room (var) at a reading, and which way it wants to switch: the one rule every decision reads. */
  const gauge = (channel: StepChannel, r: ChannelReading): ChannelGauge => rule.gauge(r, smallest.get(channel)!);

  /** The step a channel would switch out at this gauge, or −1. */
  const goingOut = (channel: StepChannel, need: number, room: number): number => {
    const connected = ofChannel.get(channel)!.filter((s) => on[s] === 1);
    return banded ? pickRestoring(connected, -room) : pick(connected, -need);
  };

  /** A channel's wish at these readings: a move and the earliest time it may happen, or null (content, or no step can move yet). */
  const wishOf = (channel: StepChannel, fromMs: number, r: ChannelReading): Wish | null => {
    const { need, room, wants } = gauge(channel, r);
    if (wants === 'in') {
      const fitting = ofChannel.get(channel)!.filter((s) => !on[s] && rule.mayClose(steps[s]!.kvar, { need, room }));
      if (!fitting.length) return null;
      // The delay, and a step that went out must have discharged before it goes back in.
      const freeAt = Math.min(...fitting.map((s) => changedAt[s]! + reconnectMs));
      return { channel, going: 'in', dueMs: Math.max(fromMs + delayMs - inTimer.get(channel)!, freeAt) };
    }
    if (wants === 'out' && goingOut(channel, need, room) >= 0) return { channel, going: 'out', dueMs: fromMs + delayMs - outTimer.get(channel)! };
    return null;
  };

  /** Runs every channel's timers on by `ms` under these readings (a channel that wants nothing resets its). */
  const runTimers = (ms: number, readings: Map<StepChannel, ChannelReading>) => {
    for (const channel of channels) {
      const { wants } = gauge(channel, readings.get(channel)!);
      inTimer.set(channel, wants === 'in' ? inTimer.get(channel)! + ms : 0);
      outTimer.set(channel, wants === 'out' ? outTimer.get(channel)! + ms : 0);
    }
  };

  const move = (wish: Wish, r: ChannelReading) => {
    const { need, room } = gauge(wish.channel, r);
    const now = wish.dueMs;
    if (wish.going === 'in') {
      const free = ofChannel.get(wish.channel)!.filter((s) => !on[s] && now - changedAt[s]! >= reconnectMs && (!banded || steps[s]!.kvar * 1000 <= room));
      const s = pick(free, need);
      on[s] = 1;
      closings[s]!++;
      changedAt[s] = now;
      inTimer.set(wish.channel, 0);
    } else {
      const s = goingOut(wish.channel, need, room);
      on[s] = 0;
      openings[s]!++;
      changedAt[s] = now;
      outTimer.set(wish.channel, 0);
    }
  };

  return {
    steps,
    on,
    closings,
    openings,
    advance(fromMs, untilMs, readingOf) {
      const readings = new Map(channels.map((c) => [c, readingOf(c)]));
      let first: Wish | null = null;
      for (const channel of channels) {
        const wish = wishOf(channel, fromMs, readings.get(channel)!);
        if (wish && wish.dueMs <= untilMs && (!first || wish.dueMs < first.dueMs)) first = wish;
      }
      runTimers((first?.dueMs ?? untilMs) - fromMs, readings);
      if (!first) return null;
      move(first, readings.get(first.channel)!);
      return first.dueMs;
    },
    interrupt() {
      for (const c of channels) {
        inTimer.set(c, 0);
        outTimer.set(c, 0);
      }
    },
  };
}

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
   * Takes the readings of an interval that started at `startMs` and lasted
   * `durationMs`; switches at its end. `readingOf(channel)` gives the channel's reading.
   */
  observe(startMs: number, durationMs: number, readingOf: (channel: StepChannel) => ChannelReading): void;
  /** Forget pending timers (called across a gap in the data). */
  interrupt(): void;
}

export function createBankController(steps: readonly SwitchedStep[], settings: SwitchingSettings): BankController {
  const n = steps.length;
  const on = new Uint8Array(n);
  const closings = new Int32Array(n);
  const openings = new Int32Array(n);
  const changedAt = new Float64Array(n).fill(Number.NEGATIVE_INFINITY);
  const channels = [...new Set(steps.map((s) => s.channel))];
  const tanTarget = Math.tan(Math.acos(settings.targetPf));
  const banded = settings.upperPf !== undefined;
  const tanUpper = banded ? Math.tan(Math.acos(Math.min(1, settings.upperPf!))) : 0;
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

  return {
    steps,
    on,
    closings,
    openings,
    observe(startMs, durationMs, readingOf) {
      const now = startMs + durationMs;
      for (const channel of channels) {
        const r = readingOf(channel);
        const p = Math.max(r.w, 0);
        const need = r.var - p * tanTarget;
        // Room before the upper PF limit: how much capacitance can go in without passing it.
        const room = r.var - p * tanUpper;
        const threshold = settings.responseShare * smallest.get(channel)! * 1000;
        const mine = ofChannel.get(channel)!;
        const overCorrected = banded ? room < 0 : need < -threshold;
        if (need > threshold) {
          outTimer.set(channel, 0);
          const t = inTimer.get(channel)! + durationMs;
          inTimer.set(channel, t);
          if (t < delayMs) continue;
          const free = mine.filter((s) => !on[s] && now - changedAt[s]! >= reconnectMs && (!banded || steps[s]!.kvar * 1000 <= room));
          const s = pick(free, need);
          if (s >= 0) {
            on[s] = 1;
            closings[s]!++;
            changedAt[s] = now;
            inTimer.set(channel, 0);
          }
        } else if (overCorrected) {
          inTimer.set(channel, 0);
          const t = outTimer.get(channel)! + durationMs;
          outTimer.set(channel, t);
          if (t < delayMs) continue;
          const connected = mine.filter((s) => on[s] === 1);
          const s = banded ? pickRestoring(connected, -room) : pick(connected, -need);
          if (s >= 0) {
            on[s] = 0;
            openings[s]!++;
            changedAt[s] = now;
            outTimer.set(channel, 0);
          }
        } else {
          inTimer.set(channel, 0);
          outTimer.set(channel, 0);
        }
      }
    },
    interrupt() {
      for (const c of channels) {
        inTimer.set(c, 0);
        outTimer.set(c, 0);
      }
    },
  };
}

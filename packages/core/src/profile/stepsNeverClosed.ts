/**
 * The switched steps a simulated bank never had in service over the data, and why, from the controller's own
 * rule (bankController.ts channelRule) read in every interval: while the step's lines read short of the target
 * it either would have carried them past the band's upper limit at its rated kvar, or the need there stayed
 * under its own closing threshold (responseShare × its kvar), or it waited (the delay, its discharge, another
 * step of its channel taken first). A step that never closes is kvar bought for nothing at these loads; the
 * words say so with the figures, so a design handed over from `trivar correct` is not taken as used in full.
 */
import type { PhaseId } from '../board/boardModel.js';
import { channelRule, type StepChannel, type SwitchedStep, type SwitchingSettings } from './bankController.js';
import { channelReadingAt, phaseIndexOf } from './simulateBank.js';
import type { IntervalFigures } from './solveBatch.js';

/** One step never in service over the data, and the hours its lines read short of the target split by why. */
export interface NeverClosedStep {
  /** The controller output (a designed bank) or place in the list (1-based), as the step table numbers it. */
  readonly step: number;
  readonly channel: StepChannel;
  readonly kvar: number;
  /** Hours its channel read short of the target (the need above 0); the three parts below add up to it. */
  readonly shortHours: number;
  /** Of those, hours it would have carried its channel past the upper limit at its rated kvar; and the most room seen then, kvar. */
  readonly pastLimitHours: number;
  readonly mostRoomKvar: number | null;
  /** Of those, hours the need stayed at or under its own threshold (responseShare × its kvar); and the most need seen then, kvar. */
  readonly underThresholdHours: number;
  readonly mostNeedKvar: number | null;
  /** Of those, hours it could have closed by the rule but waited: the delay, its discharge, or another step of its channel first. */
  readonly waitingHours: number;
}

/**
 * The steps of `steps` never shown in service (`stepOn` all 0), each with why; `numbers` are the step
 * numbers the table shows. `f` are the figures the controller read (BankRun.meterFigures ?? figures).
 */
export function stepsNeverClosed(
  f: IntervalFigures,
  settings: SwitchingSettings,
  bank: { readonly steps: readonly SwitchedStep[]; readonly stepOn: readonly Uint8Array[]; readonly numbers: readonly number[]; readonly phases: readonly PhaseId[] },
  intervalMs: number,
  rowHours: Float64Array | null = null,
): NeverClosedStep[] {
  const { steps, stepOn } = bank;
  const idle = steps.flatMap((_, k) => (stepOn[k]!.every((x) => x === 0) ? [k] : []));
  if (!idle.length) return [];
  const rule = channelRule(settings);
  const phaseIndex = phaseIndexOf(bank.phases);
  const h = intervalMs / 3_600_000;
  const smallestOf = (channel: StepChannel) => Math.min(...steps.filter((s) => s.channel === channel).map((s) => s.kvar));
  return idle.map((k) => {
    const step = steps[k]!;
    const smallest = smallestOf(step.channel);
    let short = 0;
    let past = 0;
    let under = 0;
    let waiting = 0;
    let mostRoom: number | null = null;
    let mostNeed: number | null = null;
    for (let i = 0; i < f.count; i++) {
      const g = rule.gauge(channelReadingAt(f, phaseIndex, step.channel, i), smallest);
      if (g.need <= 0) continue;
      const hours = rowHours ? rowHours[i]! : h;
      short += hours;
      if (rule.banded && step.kvar * 1000 > g.room) {
        past += hours;
        mostRoom = Math.max(mostRoom ?? -Infinity, g.room / 1000);
      } else if (!rule.mayClose(step.kvar, g)) {
        under += hours;
        mostNeed = Math.max(mostNeed ?? -Infinity, g.need / 1000);
      } else waiting += hours;
    }
    return {
      step: bank.numbers[k]!,
      channel: step.channel,
      kvar: step.kvar,
      shortHours: short,
      pastLimitHours: past,
      mostRoomKvar: mostRoom,
      underThresholdHours: under,
      mostNeedKvar: mostNeed,
      waitingHours: waiting,
    };
  });
}

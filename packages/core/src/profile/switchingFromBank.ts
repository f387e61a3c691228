/**
 * A bank built by the correction study (`correctBoard`: steps and controller
 * settings) as the profile simulator's steps and settings, so the bank the
 * study chose can be run over a year of intervals.
 *
 * Balanced three-phase steps become one three-phase step of their output at
 * nominal voltage (the simulator connects it as a star to the neutral on a
 * 4-wire board, a delta otherwise — equal output at nominal voltage); a
 * single-phase step on a phase-to-neutral branch stays on its phase. The
 * fixed part is always connected, so it is not a switched step; steps on a
 * line-to-line branch alone have no single-phase channel here and are reported
 * back as not simulated.
 */
import type { BankStep, ControllerSettings } from '../correction/correctionResult.js';
import type { SwitchedStep, SwitchingSettings } from './bankController.js';

export interface SwitchingFromBank {
  readonly steps: readonly SwitchedStep[];
  readonly settings: SwitchingSettings;
  /** Fixed part, kvar at nominal voltage (always on). */
  readonly fixedKvar: number;
  /** Controller outputs of steps the simulator cannot place (line-to-line single steps). */
  readonly notSimulated: readonly number[];
}

export function switchingFromBank(steps: readonly BankStep[], controller: ControllerSettings): SwitchingFromBank {
  const out: SwitchedStep[] = [];
  const notSimulated: number[] = [];
  let fixedKvar = 0;
  for (const s of steps) {
    if (s.part === 'fixed' || s.output === null) {
      fixedKvar += s.kvarAtNominalV;
      continue;
    }
    if (s.kind === 'three-phase') out.push({ kvar: s.kvarAtNominalV, channel: 'ABC' });
    else {
      const m = /^([ABC])-N$/.exec(s.branches[0] ?? '');
      if (m && s.branches.length === 1) out.push({ kvar: s.kvarAtNominalV, channel: m[1] as 'A' | 'B' | 'C' });
      else notSimulated.push(s.output);
    }
  }
  return {
    steps: out,
    settings: {
      targetPf: controller.targetBand.minPf,
      responseShare: controller.settingFraction,
      delaySeconds: controller.switchingDelayS,
      reconnectSeconds: controller.reconnectionDelayS,
    },
    fixedKvar,
    notSimulated,
  };
}

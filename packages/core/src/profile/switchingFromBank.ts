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
 * back as not simulated. The controller keeps the study's PF band: the
 * upper limit (or unity where leading is not allowed) bounds what it switches in.
 */
import type { CapacitorDischarge } from '../correction/capacitorDischarge.js';
import type { BankStep, ControllerSettings } from '../correction/correctionResult.js';
import { isLinePair, type StepChannel, type SwitchedStep, type SwitchingSettings } from './bankController.js';
import { checkListArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

export interface SwitchingFromBank {
  readonly steps: readonly SwitchedStep[];
  readonly settings: SwitchingSettings;
  /** The discharge time the study's reconnection delay allows for, and its rule. */
  readonly discharge: CapacitorDischarge;
  /** Fixed part, kvar at nominal voltage (always on): the total, and its parts by channel for simulateBank. */
  readonly fixedKvar: number;
  readonly fixed: readonly SwitchedStep[];
  /** Controller outputs of steps the simulator cannot place (line-to-line single steps). */
  readonly notSimulated: readonly number[];
  /** Fixed kvar on line-to-line single branches, which the simulator cannot place either. */
  readonly fixedNotSimulatedKvar: number;
  /** Which correction design this is, for the report to name it (set by whoever took it from a study). */
  readonly design?: BankDesign;
  /** The steps as the correction study built them (their branches and connection): the supply resonance is checked on these, not on the simulator's placement. */
  readonly built?: readonly BankStep[];
}

/** The correction study a simulated bank comes from: its arrangement, in the board's words, and whether it was recommended (no arrangement named). */
export interface BankDesign {
  readonly arrangement: string;
  readonly words: string;
  readonly recommended: boolean;
  /**
   * Where the file has no correction section: the correction study's defaults the bank was designed with, in
   * words (as `trivar correct` takes them on such a file), so the reader knows no file setting stood behind it.
   */
  readonly defaultsWords?: string;
}

/** A one-branch step's channel: its line (to the neutral) or its pair of lines; undefined for anything else. */
function singleBranchChannel(branch: string): StepChannel | undefined {
  const toNeutral = /^([ABC])-N$/.exec(branch);
  if (toNeutral) return toNeutral[1] as StepChannel;
  return isLinePair(branch) ? branch : undefined;
}

export function switchingFromBank(steps: readonly BankStep[], controller: ControllerSettings): SwitchingFromBank {
  checkListArgument(steps, 'steps', "a bank's steps (a selection's steps)", (x) => typeof x === 'object' && x !== null);
  checkObjectArgument(controller, 'controller', "the bank's controller settings (a selection's controller)");
  const out: SwitchedStep[] = [];
  const fixed: SwitchedStep[] = [];
  const notSimulated: number[] = [];
  let fixedKvar = 0;
  let fixedNotSimulatedKvar = 0;
  for (const s of steps) {
    const always = s.part === 'fixed' || s.output === null;
    if (always) fixedKvar += s.kvarAtNominalV;
    const channel = s.kind === 'three-phase' ? 'ABC' : s.branches.length === 1 ? singleBranchChannel(s.branches[0]!) : undefined;
    if (channel) (always ? fixed : out).push({ kvar: s.kvarAtNominalV, channel: channel as SwitchedStep['channel'], ...(s.output !== null ? { output: s.output } : {}) });
    else if (always) fixedNotSimulatedKvar += s.kvarAtNominalV;
    else notSimulated.push(s.output!);
  }
  return {
    steps: out,
    built: steps,
    settings: {
      targetPf: controller.targetBand.minPf,
      responseShare: controller.settingFraction,
      delaySeconds: controller.switchingDelayS,
      reconnectSeconds: controller.reconnectionDelayS,
      // The band's upper edge; with no upper PF given, unity unless the study allowed leading.
      ...(controller.targetBand.maxPf !== null ? { upperPf: controller.targetBand.maxPf } : controller.targetBand.leadingAllowed ? {} : { upperPf: 1 }),
    },
    discharge: { seconds: controller.dischargeTimeS, rule: controller.dischargeRule },
    fixedKvar,
    fixed,
    notSimulated,
    fixedNotSimulatedKvar,
  };
}

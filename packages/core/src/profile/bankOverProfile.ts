/**
 * An automatic bank over a profile (trivar profile --bank / --correction-bank): its steps (sized from the
 * profile, as written in profile.bank.steps, or the correction study's), the switching simulated by the
 * caller's solver (one board, or the bank's board in its installation), and what it changes.
 */
import type { Board } from '../board/boardModel.js';
import type { StepChannel, SwitchedStep, SwitchingSettings } from './bankController.js';
import { CAPACITOR_DISCHARGE, defaultPractice } from '../correction/capacitorDischarge.js';
import { maximumOf } from './intervalStatistics.js';
import { PROFILE_DEFAULTS } from './profileDefaults.js';
import { closingsBasisWords, EXTRAPOLATION_BELOW_HOURS, fewerStepsWords, frequentSwitchingWords, neverClosedWords, noBankWords, noVoltageRiseWords, shortReconnectWords, stepPlaceWords, switchingWithinIntervalWords, targetOutOfReachWords, type NoBankSized } from './profileWording.js';
import type { ProfileSpec } from './profileSpec.js';
import type { BankRun } from './simulateBank.js';
import { sizeBankSteps } from './sizeBankSteps.js';
import { profileBankResonance } from './profileBankResonance.js';
import type { IntervalFigures } from './solveBatch.js';
import type { ProfileSummary } from './summariseFigures.js';
import type { ProfileBankResult, ProfileStudyOptions } from './studyProfile.js';
import { belowTargetStates } from './belowTargetHours.js';
import { trySettledShort } from './settledShortTrial.js';
import { stepsNeverClosed } from './stepsNeverClosed.js';
import { judgedNominalOf } from '../board/nominalVoltages.js';
import { InputError, inputIssue, type InputIssue } from '../errors.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { labellerOf } from '../board/conventions/phaseNames.js';

/** The year closings are scaled to: 365 days (a leap day is no more switching). */
const YEAR_HOURS = 8760;

export interface BankOverProfileInput {
  /** The board the bank is on (its controller measures the board's incomer). */
  readonly board: Board;
  /** That board's figures without the bank. */
  readonly before: IntervalFigures;
  /**
   * Figures without the bank where the target is measured, when that is not the bank's board (`measuredAt`):
   * steps sized from the profile cover the need there. @defaultValue `before`
   */
  readonly meterBefore?: IntervalFigures;
  readonly profile?: ProfileSpec;
  readonly intervalMs: number;
  /** The hours each interval stands for where rows are not all one interval apart. @defaultValue every row one interval */
  readonly rowHours?: Float64Array | null;
  readonly label: (i: number) => string;
  readonly summarise: (figures: IntervalFigures) => ProfileSummary;
  /** Runs the switching over every interval with these steps (the figures returned: the bank's board). */
  /** Where the controller measures when that is not the bank's board: 'origin' or a board's name (`measuredAt`). */
  readonly meterPoint?: string;
  readonly simulate: (steps: readonly SwitchedStep[], fixed: readonly SwitchedStep[], settings: SwitchingSettings) => BankRun;
}

/** A bank simulated over the profile, or why none was: the sizing from the profile came to no steps. */
export type BankOverProfile = { readonly bank: ProfileBankResult; readonly run: BankRun } | { readonly notSized: NoBankSized };

/** Why a need of 0 kvar at the cover percentile: no current, no lagging reactive power, or the target held often enough. */
function whyNoSteps(f: IntervalFigures, targetPf: number, coverShare: number): NoBankSized {
  const tan = Math.tan(Math.acos(targetPf));
  let current = false;
  let lagging = false;
  let importing = 0;
  let below = 0;
  for (let i = 0; i < f.count; i++) {
    let w = 0;
    let q = 0;
    for (let k = 0; k < f.phaseW.length; k++) {
      if (f.lineA[k]![i]! > 0) current = true;
      if (f.phaseVar[k]![i]! > 0) lagging = true;
      w += f.phaseW[k]![i]!;
      q += f.phaseVar[k]![i]!;
    }
    if (w <= 0) continue;
    importing++;
    if (q > w * tan) below++;
  }
  const reason: NoBankSized['reason'] = !current ? 'no-current' : !lagging ? 'no-lagging-reactive-power' : 'target-held';
  return { reason, words: noBankWords(reason, targetPf, importing ? below / importing : 0, coverShare) };
}

/**
 * The parts of profile.bank that need a neutral, on a board without one: single-phase steps are connected line
 * to neutral, so `perPhase: true` (steps sized per phase) and a step on one phase have nothing to connect to.
 * Refused by field rather than dropped (perPhase would quietly size three-phase steps) or left to the solver
 * (a step from a phase to a missing neutral has no solution).
 */
function needsNeutralIssues(board: Board, bank: NonNullable<ProfileSpec['bank']>): InputIssue[] {
  if (board.hasNeutral) return [];
  const label = labellerOf(conventionsOf(board).phaseNames);
  const why = `on a board without a neutral (${board.name}): single-phase steps connect line to neutral`;
  const issues: InputIssue[] = [];
  if (bank.perPhase) issues.push(inputIssue('not_applicable', 'profile.bank.perPhase', `false or left out ${why}; the steps are then three-phase`, true));
  bank.steps?.forEach((step, k) => {
    if (step.phase && step.phase !== 'ABC') issues.push(inputIssue('not_applicable', `profile.bank.steps.${k}.phase`, `ABC (a three-phase step) or left out ${why}`, label(step.phase)));
  });
  return issues;
}

/** The bank's result and its run; why no bank was sized (steps sized from the profile, none needed); null when no bank is asked for. */
export function bankOverProfile(input: BankOverProfileInput, options: Pick<ProfileStudyOptions, 'bank' | 'targetPf' | 'designedBank'>): BankOverProfile | null {
  const { board, before, label } = input;
  const n = before.count;
  const designed = options.designedBank;
  if (!options.bank && !designed) return null;
  const b = input.profile?.bank;
  const neutralIssues = !designed && b ? needsNeutralIssues(board, b) : [];
  if (neutralIssues.length) throw new InputError(neutralIssues, "the profile's bank does not fit the board");
  const discharge = designed?.discharge ?? CAPACITOR_DISCHARGE[defaultPractice(board.frequencyHz)];
  const settings: SwitchingSettings & { coverShare: number | null } = designed
    ? { ...designed.settings, coverShare: null }
    : {
        targetPf: options.targetPf ?? b?.targetPf ?? PROFILE_DEFAULTS.targetPf,
        coverShare: b?.coverShare ?? PROFILE_DEFAULTS.coverShare,
        responseShare: b?.responseShare ?? PROFILE_DEFAULTS.responseShare,
        delaySeconds: b?.delaySeconds ?? PROFILE_DEFAULTS.delaySeconds,
        reconnectSeconds: b?.reconnectSeconds ?? discharge.seconds,
      };
  let steps: readonly SwitchedStep[];
  let needKvar: Record<string, number> | null = null;
  let sizingNotes: string[] = [];
  let targetOutOfReach: ProfileBankResult['targetOutOfReach'] = null;
  const source: ProfileBankResult['source'] = designed ? 'correction-study' : b?.steps ? 'board-file-steps' : 'profile';
  if (designed) steps = designed.steps;
  else if (b?.steps) steps = b.steps.map((s) => ({ kvar: s.kvar, channel: s.phase ?? 'ABC' }));
  else {
    const sizing = sizeBankSteps(board, input.meterBefore ?? before, {
      targetPf: settings.targetPf,
      coverShare: settings.coverShare!,
      stepCount: b?.stepCount ?? PROFILE_DEFAULTS.stepCount,
      perPhase: b?.perPhase ?? false,
      responseShare: settings.responseShare,
      // The share of an interval one switching delay takes (1 at most: a move an interval).
      delayShare: Math.min(1, (settings.delaySeconds * 1000) / input.intervalMs),
    });
    steps = sizing.steps;
    needKvar = { ...sizing.needKvar };
    sizingNotes = Object.entries(sizing.fewerSteps).map(([channel, reason]) =>
      fewerStepsWords(stepPlaceWords(board, channel as StepChannel), steps.filter((x) => x.channel === channel).length, b?.stepCount ?? PROFILE_DEFAULTS.stepCount, reason, settings.delaySeconds),
    );
    const short = Object.entries(sizing.reaches).find(([, closes]) => !closes);
    if (short) {
      const [channel] = short;
      const step = steps.find((x) => x.channel === channel)!.kvar;
      targetOutOfReach = { channel, needKvar: needKvar[channel]!, words: targetOutOfReachWords(stepPlaceWords(board, channel as StepChannel), needKvar[channel]!, step, settings.responseShare, settings.targetPf) };
    }
    if (!steps.length) return { notSized: whyNoSteps(input.meterBefore ?? before, settings.targetPf, settings.coverShare!) };
  }
  const fixed = designed?.fixed ?? [];
  if (steps.length || fixed.length) {
    const run = input.simulate(steps, fixed, settings);
    // The rate is taken over the hours the data covers (gaps left out; each row its own hours where rows
    // are not one interval apart), scaled to a 365-day year.
    const dataHours = input.rowHours ? input.rowHours.reduce((a, h) => a + h, 0) : (n * input.intervalMs) / 3_600_000;
    const years = dataHours / YEAR_HOURS;
    const stepRuns = steps.map((s, k) => ({
      step: s.output ?? k + 1,
      channel: s.channel,
      kvar: s.kvar,
      closings: run.closings[k]!,
      openings: run.openings[k]!,
      closingsPerYear: years > 0 ? run.closings[k]! / years : 0,
    }));
    const busiest = Math.max(0, ...stepRuns.map((s) => s.closingsPerYear));
    const rise = new Float64Array(n);
    for (let i = 0; i < n; i++)
      for (let k = 0; k < board.phases.length; k++) rise[i] = Math.max(rise[i]!, run.figures.phaseV[k]![i]! - before.phaseV[k]![i]!);
    const worstRise = maximumOf(rise);
    // A rise under a millionth of nominal is round-off, not a rise: none is reported, and no time for it.
    const riseShown = worstRise.value > 1e-6 * judgedNominalOf(board).ln;
    const everConnected = run.connectedKvar.some((k) => k > 0) || fixed.length > 0;
    const { upperPf, ...rest } = settings;
    const totalKvar = steps.reduce((s, x) => s + x.kvar, 0);
    const { belowTarget, settledShort } = belowTargetStates(
      run.meterFigures ?? run.figures,
      { targetPf: settings.targetPf, upperPf: upperPf ?? null, responseShare: settings.responseShare },
      { steps, stepOn: run.stepOn, phases: board.phases },
      input.intervalMs,
      input.rowHours ?? null,
    );
    const settledShortTrial = belowTarget.openStepsTooLarge
      ? trySettledShort({ steps, fixed, settings, settledShort, closingShare: belowTarget.openStepsTooLarge.closingShare, simulate: input.simulate, asIs: run, intervalMs: input.intervalMs, intervals: n, phases: board.phases, rowHours: input.rowHours ?? null })
      : null;
    const neverClosed = stepsNeverClosed(run.meterFigures ?? run.figures, settings, { steps, stepOn: run.stepOn, numbers: stepRuns.map((s) => s.step), phases: board.phases }, input.intervalMs, input.rowHours ?? null).map((n) => ({
      ...n,
      words: neverClosedWords(n, stepPlaceWords(board, n.channel), { responseShare: settings.responseShare, upperPf: upperPf ?? null }, totalKvar),
    }));
    const bank: ProfileBankResult = {
      source,
      design: designed?.design ?? null,
      sizedFromProfile: source === 'profile',
      needKvar,
      sizingNotes,
      placeWords: Object.fromEntries([...new Set([...steps.map((x) => x.channel), ...Object.keys(needKvar ?? {})])].map((c) => [c, stepPlaceWords(board, c as StepChannel)])),
      steps: stepRuns,
      totalKvar,
      fixedKvar: fixed.reduce((s, x) => s + x.kvar, 0),
      notSimulated: designed && (designed.notSimulated.length || designed.fixedNotSimulatedKvar) ? { outputs: designed.notSimulated, fixedKvar: designed.fixedNotSimulatedKvar } : null,
      settings: {
        ...rest,
        upperPf: upperPf ?? null,
        dischargeSeconds: discharge.seconds,
        dischargeRule: discharge.rule,
        reconnectFrom: designed ? 'correction-study' : b?.reconnectSeconds !== undefined ? 'file' : 'practice',
      },
      warnings: [
        ...(settings.reconnectSeconds < discharge.seconds ? [shortReconnectWords(settings.reconnectSeconds, discharge)] : []),
        ...(busiest > PROFILE_DEFAULTS.operationsPerYearLimit ? [frequentSwitchingWords(stepRuns, PROFILE_DEFAULTS.operationsPerYearLimit, dataHours, settings.responseShare)] : []),
      ],
      closingsBasis: { dataHours, extrapolated: dataHours < EXTRAPOLATION_BELOW_HOURS, words: closingsBasisWords(dataHours) },
      withinInterval: {
        intervalSeconds: input.intervalMs / 1000,
        movesPerInterval: settings.delaySeconds > 0 ? Math.floor(input.intervalMs / 1000 / settings.delaySeconds) : null,
        words: switchingWithinIntervalWords(input.intervalMs / 1000, settings.delaySeconds, settings.reconnectSeconds),
      },
      operationsPerYearLimit: PROFILE_DEFAULTS.operationsPerYearLimit,
      contactorLifeOperations: PROFILE_DEFAULTS.contactorLifeOperations,
      yearsToContactorLife: busiest > 0 ? PROFILE_DEFAULTS.contactorLifeOperations / busiest : null,
      voltageRisePercent: riseShown ? (100 * worstRise.value) / judgedNominalOf(board).ln : 0,
      voltageRiseAt: riseShown ? label(worstRise.index) : null,
      voltageRiseWords: riseShown ? null : noVoltageRiseWords(everConnected),
      measuredAt: input.meterPoint ?? null,
      belowTarget,
      settledShortTrial,
      neverClosed,
      targetOutOfReach,
      resonance: profileBankResonance(board, steps, fixed, designed?.built),
      after: input.summarise(run.figures),
    };
    return { bank, run };
  }
  return null;
}

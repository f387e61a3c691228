/**
 * The profile study: interval data (or scenarios) through the batch kernel,
 * summaries before any correction, and optionally an automatic bank simulated
 * over the same intervals with the summary after it.
 */
import { VOLTAGE_UNBALANCE_LIMITS } from '../board/conventions/unbalanceLimits.js';
import { InputError, inputIssue, quoteText } from '../errors.js';
import type { Board } from '../board/boardModel.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import type { PhaseNaming } from '../board/conventions/phaseNames.js';
import type { DriverColumns, DriverSpec } from './batchNetwork.js';
import { compileBatchNetwork } from './batchNetwork.js';
import type { BankDesign, SwitchingFromBank } from './switchingFromBank.js';
import type { SequenceReport } from './checkIntervalSequence.js';
import type { ProfileSpec } from './profileSpec.js';
import { simulateBank } from './simulateBank.js';
import type { BelowTarget } from './belowTargetHours.js';
import type { SettledShortTrial } from './settledShortTrial.js';
import type { NeverClosedStep } from './stepsNeverClosed.js';
import { clearRoundOff, conductorFloorA } from './intervalRoundOff.js';
import { bankOverProfile } from './bankOverProfile.js';
import type { ProfileBankResonance } from './profileBankResonance.js';
import { allocateFigures, solveBatch, type BatchSolveOptions, type IntervalFigures } from './solveBatch.js';
import { summariseFigures, type ProfileSummary, type ResolvedLimits, type SummaryContext } from './summariseFigures.js';
import { createZoneClock, monthKeyOf } from './zoneClock.js';
import { madeUpIntervalsWarnings, neutralOverLimitWarnings, PROFILE_CAUTIONS, type NoBankSized } from './profileWording.js';
import { assertProfileInput } from '../board/modelGuards.js';
import { judgedNominalOf } from '../board/nominalVoltages.js';

export interface ProfileStudyInput {
  /** The board as the drivers see it (see planColumns: metered phases added). */
  readonly board: Board;
  readonly drivers: readonly DriverSpec[];
  readonly columns: DriverColumns;
  readonly utcMs: Float64Array;
  readonly intervalMs: number;
  /** The hours each interval stands for where rows are not all one interval apart (IntervalTable.rowHours). @defaultValue every row one interval */
  readonly rowHours?: Float64Array | null;
  readonly sequence?: SequenceReport;
  readonly undriven?: { readonly loads: readonly string[]; readonly atRating: boolean };
  /** How columns were read where the file leaves it to the model (ColumnPlan.notes). @defaultValue none */
  readonly columnNotes?: readonly string[];
  readonly profile?: ProfileSpec;
  /** Per-interval figures already solved (e.g. by worker threads); solved here when absent. */
  readonly before?: IntervalFigures;
  readonly beforePath?: 'closed-form' | 'nodal';
}

export interface ProfileStudyOptions {
  /** IANA zone for calendar months and the times shown. @defaultValue 'UTC' */
  readonly timeZone?: string;
  /** Simulate an automatic bank (sized from the profile unless profile.bank.steps is given). @defaultValue false */
  readonly bank?: boolean;
  /** Overrides profile.bank.targetPf. */
  readonly targetPf?: number;
  /**
   * Simulate this bank instead (the correction study's steps, fixed part and controller,
   * see switchingFromBank); `bank` and `targetPf` are then not read.
   */
  readonly designedBank?: SwitchingFromBank;
  readonly solve?: BatchSolveOptions;
  readonly onProgress?: (stage: 'solve' | 'bank', done: number, total: number) => void;
}

export interface BankStepRun {
  /** The controller output of a designed bank's step, else the step's place in the list (1-based). */
  readonly step: number;
  readonly channel: string;
  readonly kvar: number;
  readonly closings: number;
  readonly openings: number;
  /** Closings scaled to a year of the data's span. */
  readonly closingsPerYear: number;
}

export interface ProfileBankResult {
  /** Where the steps came from: sized here from the profile, profile.bank.steps, or the correction study. */
  readonly source: 'profile' | 'board-file-steps' | 'correction-study';
  /** With a correction study's bank: which arrangement, and whether trivar correct recommended it; otherwise null. */
  readonly design: BankDesign | null;
  readonly sizedFromProfile: boolean;
  readonly needKvar: Readonly<Record<string, number>> | null;
  /** Sized from the profile with fewer steps than profile.bank.stepCount allows: why, per channel; else empty. */
  readonly sizingNotes: readonly string[];
  /** Each channel of the steps and the need, in the board's words ("three-phase", "line-to-neutral on L1 and L2", "across L1-L2"). */
  readonly placeWords: Readonly<Record<string, string>>;
  readonly steps: readonly BankStepRun[];
  /** Switched steps' kvar in all (the fixed part not included). */
  readonly totalKvar: number;
  /** Always-connected kvar simulated with the steps (a correction-study bank's fixed part). */
  readonly fixedKvar: number;
  /** Parts of the designed bank the simulator cannot place (line-to-line single steps): outputs, and fixed kvar. */
  readonly notSimulated: { readonly outputs: readonly number[]; readonly fixedKvar: number } | null;
  readonly settings: {
    readonly targetPf: number;
    /** Highest lagging PF the controller brings the board to (1: never leading), or null: no upper limit. */
    readonly upperPf: number | null;
    /** Share of intervals the sizing aims to hold at the target; null when the steps were not sized here. */
    readonly coverShare: number | null;
    readonly responseShare: number;
    readonly delaySeconds: number;
    readonly reconnectSeconds: number;
    /** The discharge time of the board's capacitor practice, s, and the rule it follows. */
    readonly dischargeSeconds: number;
    readonly dischargeRule: string;
    /** Where the reconnection time came from: the file (profile.bank.reconnectSeconds), the practice's discharge time, or the correction study. */
    readonly reconnectFrom: 'file' | 'practice' | 'correction-study';
  };
  /** What the settings put at risk, in words (a reconnection time shorter than the discharge time). */
  readonly warnings: readonly string[];
  /**
   * The switching inside an interval, where its length matters: the load taken as steady through each
   * interval, at most floor(interval ÷ delay) moves in it (null: no delay, the controller settles at once).
   */
  readonly withinInterval: { readonly intervalSeconds: number; readonly movesPerInterval: number | null; readonly words: string };
  readonly operationsPerYearLimit: number;
  readonly contactorLifeOperations: number;
  /** Years until the busiest step's contactor reaches its typical life. */
  readonly yearsToContactorLife: number | null;
  /**
   * What the closings per year rest on: the hours of data they are scaled from to a 365-day year, whether
   * that is under a week (an extrapolation), and in words. The bank is taken as settled at the first
   * interval's load, so its start-up switching is not counted.
   */
  readonly closingsBasis: { readonly dataHours: number; readonly extrapolated: boolean; readonly words: string };
  /**
   * Largest rise of any phase voltage the bank causes in one interval, % of nominal, and when; 0 and null
   * where there is none (no step ever in, or a supply with no impedance), `voltageRiseWords` then saying why.
   */
  readonly voltageRisePercent: number;
  readonly voltageRiseAt: string | null;
  readonly voltageRiseWords: string | null;
  /**
   * Where the controller measures, and `belowTarget` is worked, when that is not the bank's board: 'origin'
   * or an upstream board's name; null at the bank's own board.
   */
  readonly measuredAt: string | null;
  /**
   * Board-total PF below the target while importing (where the controller measures), hours, and why, each
   * interval by the simulated controller's state in it (belowTargetHours.ts): every step in; steps open on the
   * short lines fewer kvar than the shortfall (too small where the load falls short); with an upper limit, the
   * open steps too coarse for the band; settled with the open steps each too large for what is left; the
   * shortfall under the response threshold; the controller on its way. All 0 where the PF is at or above the target in
   * every importing interval.
   */
  readonly belowTarget: BelowTarget;
  /**
   * Where the bank settles short with its open steps too large (belowTarget.openStepsTooLarge): further steps
   * and a lower threshold run over the profile by the same controller, and the hours each brings to the
   * target (settledShortTrial.ts); null where there are no such hours.
   */
  readonly settledShortTrial: SettledShortTrial | null;
  /**
   * The switched steps never in service over the data, each with the hours its lines read short of the target
   * split by why the controller left it open, and in words (stepsNeverClosed.ts); empty where every step was in
   * at some time. Absent from results written before it was kept.
   */
  readonly neverClosed?: readonly (NeverClosedStep & { readonly words: string })[];
  /**
   * Where the sizing found no step size whose steps the controller closes up to the target at the sized need
   * (the last step's need under the response threshold): the channel, the need, kvar; otherwise null.
   */
  readonly targetOutOfReach: { readonly channel: string; readonly needKvar: number; readonly words: string } | null;
  /**
   * The bank's supply resonance in every state its controller can reach, as `trivar correct` checks its bank
   * (profileBankResonance.ts); null where there is no estimate (an ideal source). Absent from results written before it was kept.
   */
  readonly resonance?: ProfileBankResonance | null;
  readonly after: ProfileSummary;
}

export interface ProfileResult {
  readonly board: string;
  /** How the board names its phases ("A/B/C" or "L1/L2/L3"): reports label with it; data keys stay A/B/C. */
  readonly phaseNames: PhaseNaming;
  readonly path: 'closed-form' | 'nodal';
  readonly timeZone: string;
  readonly intervals: { readonly count: number; readonly intervalSeconds: number; readonly first: string; readonly last: string };
  readonly sequence: SequenceReport | null;
  readonly undriven: { readonly loads: readonly string[]; readonly atRating: boolean } | null;
  /** How columns were read where the file leaves it to the model: a phase in kW alone, a group's shares (a sentence each). */
  readonly columnNotes: readonly string[];
  readonly limits: ResolvedLimits;
  readonly before: ProfileSummary;
  readonly bank: ProfileBankResult | null;
  /** Why --bank sized and simulated no bank (the need at the cover percentile is 0); null otherwise. */
  readonly bankNotSized: NoBankSized | null;
  /** What the data shows that needs acting on: a neutral above its limit in any interval (hours, peak). */
  readonly warnings: readonly string[];
  readonly cautions: readonly string[];
}

/** The result and the per-interval columns behind it (for charts and per-interval files). */
export interface ProfileStudy {
  readonly result: ProfileResult;
  readonly utcMs: Float64Array;
  readonly before: IntervalFigures;
  readonly after: IntervalFigures | null;
  readonly connectedKvar: Float64Array | null;
  readonly label: (i: number) => string;
  /** The system's nominal line-to-neutral voltage, which the per-interval percentages are taken against (judgedNominalOf). */
  readonly nominalLineToNeutralV: number;
}

const pad = (x: number) => String(x).padStart(2, '0');

/**
 * The study's thresholds. The voltage band is the board's own limits (`conventions.voltageLimits`; for a
 * board of an installation its own `voltageLimits` where it has them), the one every other verdict on
 * the board uses, unless `profile.limits` sets either end.
 */
export function resolveLimits(board: Board, spec: ProfileSpec | undefined): ResolvedLimits {
  const l = spec?.limits;
  const own = conventionsOf(board).voltageLimits;
  const fromProfile = l?.voltageLowPercent !== undefined || l?.voltageHighPercent !== undefined;
  const unbalance = VOLTAGE_UNBALANCE_LIMITS[conventionsOf(board).region];
  return {
    unbalancePercent: l?.unbalancePercent ?? unbalance.percent,
    unbalance,
    unbalanceFrom: l?.unbalancePercent !== undefined ? 'profile.limits' : 'region',
    // An unrated neutral has no limit: a line's rating says nothing of the neutral's conductor.
    neutralA: l?.neutralA ?? board.neutralRatingA,
    voltageLowPercent: l?.voltageLowPercent ?? 100 - own.underPercent,
    voltageHighPercent: l?.voltageHighPercent ?? 100 + own.overPercent,
    voltageLimitsFrom: fromProfile ? 'profile.limits' : own.preset,
  };
}

/** An offset from UTC as ISO 8601 writes it after a time: +01:00, -05:00, +05:45. */
export function utcOffsetText(offsetMs: number): string {
  const minutes = Math.round(Math.abs(offsetMs) / 60_000);
  return `${offsetMs < 0 ? '-' : '+'}${pad(Math.floor(minutes / 60))}:${pad(minutes % 60)}`;
}

/**
 * Wall-clock times of the intervals in a zone: local times, calendar months, and the labels reports show.
 * In a zone other than UTC every label carries its offset ("2025-10-26 01:30+01:00"): the hour clocks repeat
 * when they go back is otherwise written twice alike, and the per-interval CSV, read again in the same zone,
 * would depend on row order. One form for every time of the zone, whether or not the record crosses a change,
 * so a script reading the outputs meets one format; the form the interval reader takes back unchanged.
 */
export function profileClock(utcMs: Float64Array, zone: string): { localMs: Float64Array; monthKey: Int32Array; label: (i: number) => string; labelUtc: (utcMs: number) => string } {
  const n = utcMs.length;
  const clock = createZoneClock(zone);
  const localMs = new Float64Array(n);
  const monthKey = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    localMs[i] = utcMs[i]! + clock.offsetAt(utcMs[i]!);
    monthKey[i] = monthKeyOf(localMs[i]!);
  }
  const withOffset = zone !== 'UTC';
  const labelLocal = (ms: number, offsetMs: number) => {
    const d = new Date(ms);
    const wall = `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}`;
    return withOffset ? wall + utcOffsetText(offsetMs) : wall;
  };
  return {
    localMs,
    monthKey,
    label: (i) => labelLocal(localMs[i]!, localMs[i]! - utcMs[i]!),
    labelUtc: (u) => {
      const offset = clock.offsetAt(u);
      return labelLocal(u + offset, offset);
    },
  };
}

export function studyProfile(input: ProfileStudyInput, options: ProfileStudyOptions = {}): ProfileStudy {
  assertProfileInput(input);
  const { board } = input;
  const n = input.columns.count;
  const zone = options.timeZone ?? 'UTC';
  const { localMs, monthKey, label, labelUtc } = profileClock(input.utcMs, zone);
  const limits = resolveLimits(board, input.profile);
  const ctx: SummaryContext = {
    board,
    utcMs: input.utcMs,
    localMs,
    monthKey,
    intervalMs: input.intervalMs,
    rowHours: input.rowHours ?? null,
    limits,
    tariff: input.profile?.tariff,
    label,
    labelUtc,
  };
  let before = input.before;
  let path = input.beforePath ?? 'nodal';
  if (!before) {
    before = allocateFigures(n, board.phases.length);
    const net = compileBatchNetwork(board, input.drivers);
    path = solveBatch(net, input.columns, before, { ...options.solve, onProgress: (d) => options.onProgress?.('solve', d, n) }).path;
  }
  // Round-off is not data: an idle interval has no current, power or power factor (figures solved elsewhere too).
  const floorA = conductorFloorA([board]);
  clearRoundOff([before], floorA, board.nominalLineToNeutralV);
  const beforeSummary = summariseFigures(before, ctx);

  // On a board file the controller reads the board's own incomer; a metering point upstream needs the installation's circuit.
  const point = options.bank && !options.designedBank ? input.profile?.bank?.measuredAt : undefined;
  if (point !== undefined && point !== board.name)
    throw new InputError(
      [inputIssue('not_applicable', 'profile.bank.measuredAt', `${quoteText(board.name)} (the board itself) on a board file; to measure at the origin, write the board as an installation file with this one board under boards:`, point)],
      'the point the bank\'s controller measures at does not fit a board file',
    );
  const withBank = bankOverProfile(
    {
      board,
      before,
      intervalMs: input.intervalMs,
      rowHours: input.rowHours ?? null,
      label,
      ...(input.profile ? { profile: input.profile } : {}),
      summarise: (f) => summariseFigures(f, ctx),
      simulate: (steps, fixed, settings) => {
        const run = simulateBank({ board, drivers: input.drivers, columns: input.columns, utcMs: input.utcMs, intervalMs: input.intervalMs, steps, fixed, settings, ...(options.solve ? { solve: options.solve } : {}) });
        clearRoundOff([run.figures], floorA, board.nominalLineToNeutralV);
        return run;
      },
    },
    options,
  );
  const simulated = withBank && 'bank' in withBank ? withBank : null;
  const bank = simulated?.bank ?? null;
  const after = simulated?.run.figures ?? null;
  const connectedKvar = simulated?.run.connectedKvar ?? null;
  const result: ProfileResult = {
    board: board.name,
    phaseNames: conventionsOf(board).phaseNames,
    path,
    timeZone: zone,
    intervals: { count: n, intervalSeconds: input.intervalMs / 1000, first: label(0), last: label(n - 1) },
    sequence: input.sequence ?? null,
    undriven: input.undriven ?? null,
    columnNotes: input.columnNotes ?? [],
    limits,
    before: beforeSummary,
    bank,
    bankNotSized: withBank && 'notSized' in withBank ? withBank.notSized : null,
    warnings: [...madeUpIntervalsWarnings(input.sequence), ...neutralOverLimitWarnings(beforeSummary, input.profile?.limits?.neutralA !== undefined)],
    cautions: PROFILE_CAUTIONS,
  };
  return { result, utcMs: input.utcMs, before, after, connectedKvar, label, nominalLineToNeutralV: judgedNominalOf(board).ln };
}

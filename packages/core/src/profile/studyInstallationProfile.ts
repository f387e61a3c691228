/**
 * The profile study on an installation: interval data through the installation's
 * batch path (every board and feeder in one circuit), a summary per board —
 * each board's voltages judged against its own limits, a sub-board's currents
 * being those of its incoming feeder — and the supply's energy and billing at
 * the main board. An automatic bank, when asked for, sits on one board; its
 * controller measures that board's incomer — or the metering point its target
 * names (`measuredAt`: the origin, solved as the installation with a load-free
 * board at the supply's terminals, or a board upstream) — and every board is
 * summarised again with it in.
 */
import { assertInstallationModel } from '../board/modelGuards.js';
import type { Board, Installation, BoardLoad } from '../board/boardModel.js';
import { InputError } from '../errors.js';
import { meteringPlace, meteringPointIssues, ORIGIN_POINT } from '../correction/meteringPoint.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import type { PhaseNaming } from '../board/conventions/phaseNames.js';
import { installationBoardIndex } from '../correction/correctInstallation.js';
import { boardOfInstallation, installationOf } from '../network/installationModel.js';
import type { DriverColumns, DriverSpec } from './batchNetwork.js';
import { bankOverProfile } from './bankOverProfile.js';
import type { SequenceReport } from './checkIntervalSequence.js';
import { boardNamesOf } from './installationColumns.js';
import { allocateBoardFigures, compileInstallationBatch, createInstallationKernel, solveInstallationBatch } from './installationBatch.js';
import { edgePowersAt } from './batchNetwork.js';
import type { ProfileSpec } from './profileSpec.js';
import { switchBank, type BankRun } from './simulateBank.js';
import { recordInterval, type IntervalFigures } from './solveBatch.js';
import { profileClock, resolveLimits, type ProfileBankResult, type ProfileStudyOptions } from './studyProfile.js';
import { summariseFigures, type ProfileSummary, type ResolvedLimits, type SummaryContext } from './summariseFigures.js';
import { madeUpIntervalsWarnings, neutralOverLimitWarnings, PROFILE_CAUTIONS, type NoBankSized } from './profileWording.js';
import { clearRoundOff, conductorFloorA } from './intervalRoundOff.js';
import { listedBanksInService, type ListedBankInService } from '../analysis/banksInServiceWords.js';

export interface InstallationProfileInput {
  readonly installation: Installation;
  /** Every load the drivers index (see planInstallationColumns), and the board of each. */
  readonly loads: readonly BoardLoad[];
  readonly loadBoards: readonly number[];
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
  /** The file's bank in service on the bank's board, taken out of `installation` for the bank studied (see withoutBankOn). */
  readonly replacedBank?: ListedBankInService;
}

export interface InstallationProfileOptions extends Pick<ProfileStudyOptions, 'timeZone' | 'bank' | 'targetPf' | 'designedBank' | 'onProgress'> {
  /** The board the bank goes on (by name). @defaultValue the main board */
  readonly bankBoard?: string;
  /**
   * Where the controller measures: `origin` or a board the bank's board is fed through (see
   * correction/meteringPoint.ts). @defaultValue profile.bank.measuredAt for a bank sized or written in the
   * profile, else the bank's own board
   */
  readonly measuredAt?: string;
  /** The field or option `measuredAt` came from, for its error. @defaultValue 'profile.bank.measuredAt' */
  readonly measuredAtPath?: string;
}

/** Where the controller measured, when not at the bank's board: the point and its summaries without and with the bank. */
export interface BankMeter {
  /** `origin`, or the name of the board at whose incomer it measures. */
  readonly point: string;
  readonly before: ProfileSummary;
  readonly after: ProfileSummary;
}

export interface InstallationProfileBoard {
  readonly board: string;
  /** The board feeding it; null for the main board. */
  readonly fedFrom: string | null;
  readonly limits: ResolvedLimits;
  /** Currents: the supply at the main board, the incoming feeder at a sub-board. Billing: main board only. */
  readonly before: ProfileSummary;
  /** The same with the bank in, wherever the bank is; null without a bank. */
  readonly after: ProfileSummary | null;
}

export interface InstallationProfileResult {
  readonly installation: string;
  readonly phaseNames: PhaseNaming;
  readonly path: 'nodal';
  readonly timeZone: string;
  readonly intervals: { readonly count: number; readonly intervalSeconds: number; readonly first: string; readonly last: string };
  readonly sequence: SequenceReport | null;
  readonly undriven: { readonly loads: readonly string[]; readonly atRating: boolean } | null;
  /** How columns were read where the file leaves it to the model: a phase in kW alone, a group's shares (a sentence each). */
  readonly columnNotes: readonly string[];
  /** The banks the file lists in service (harmonics.banks), as listed in every interval. */
  readonly banksInService: readonly ListedBankInService[];
  /** The file's bank on the studied bank's board, left out: the bank studied takes its place. */
  readonly replacedBank: ListedBankInService | null;
  /** Board number order (main first). */
  readonly boards: readonly InstallationProfileBoard[];
  /**
   * The bank and its run, on the board named; its `after` is that board's summary with the bank. `meter`:
   * where the controller measured when that is not the bank's board (its sizing and `belowTarget` are read there).
   */
  readonly bank: (ProfileBankResult & { readonly board: string; readonly meter: BankMeter | null }) | null;
  /** Why --bank sized and simulated no bank on the board named (the need at the cover percentile is 0); null otherwise. */
  readonly bankNotSized: (NoBankSized & { readonly board: string }) | null;
  /** What the data shows that needs acting on, board by board: a neutral above its limit in any interval (hours, peak). */
  readonly warnings: readonly string[];
  readonly cautions: readonly string[];
}

export interface InstallationProfileStudy {
  readonly result: InstallationProfileResult;
  readonly utcMs: Float64Array;
  /** Per board (board number). */
  readonly before: readonly IntervalFigures[];
  readonly after: readonly IntervalFigures[] | null;
  /** Switched kvar connected in each interval (nominal; the fixed part on top); null without a bank. */
  readonly connectedKvar: Float64Array | null;
  /** Where the controller measured, when not at the bank's board: per-interval figures there without and with the bank. */
  readonly meter: { readonly point: string; readonly before: IntervalFigures; readonly after: IntervalFigures } | null;
  readonly label: (i: number) => string;
}

/**
 * Where the bank's controller measures when that is not its own board: the point, the board number it is
 * read at, and for the origin the installation with a board there (meteringPoint.ts); null at the bank's board.
 * @throws {InputError} naming the field (or option) of a point that is neither the origin nor upstream of the bank
 */
function meterOf(bankBoard: Board, input: InstallationProfileInput, options: InstallationProfileOptions): { point: string; index: number; frame: Installation | null } | null {
  if (!options.bank && !options.designedBank) return null;
  const point = options.measuredAt ?? (options.designedBank ? undefined : input.profile?.bank?.measuredAt);
  const issues = meteringPointIssues(bankBoard, point, options.measuredAtPath ?? 'profile.bank.measuredAt');
  if (issues.length) throw new InputError(issues, 'the point the bank\'s controller measures at does not fit the installation');
  const place = meteringPlace(bankBoard, point);
  if (!place) return null;
  if (place.point !== ORIGIN_POINT) return { point: place.point, index: place.meterIndex, frame: null };
  return { point: place.point, index: place.meterIndex, frame: installationOf(place.inFrame(bankBoard)).installation };
}

export function studyInstallationProfile(input: InstallationProfileInput, options: InstallationProfileOptions = {}): InstallationProfileStudy {
  assertInstallationModel((input as Partial<InstallationProfileInput> | null)?.installation, 'input.installation');
  const { installation } = input;
  const n = input.columns.count;
  const zone = options.timeZone ?? 'UTC';
  const bankAt = installationBoardIndex(installation, options.bankBoard, 'bankBoard');
  const { localMs, monthKey, label, labelUtc } = profileClock(input.utcMs, zone);
  const names = boardNamesOf(installation);
  const boards = names.map((_, b) => boardOfInstallation(installation, b));
  const contexts = boards.map((board, b): SummaryContext => {
    // profile.limits hold for every board but the neutral threshold, which is the main board's; a sub-board's
    // neutral is judged against its feeder's neutral rating. The tariff prices the supply only.
    const spec = b === 0 || !input.profile?.limits?.neutralA ? input.profile : { ...input.profile, limits: { ...input.profile.limits, neutralA: undefined } };
    return { board, utcMs: input.utcMs, localMs, monthKey, intervalMs: input.intervalMs, rowHours: input.rowHours ?? null, limits: resolveLimits(board, spec), tariff: b === 0 ? input.profile?.tariff : undefined, label, labelUtc };
  });
  const before = allocateBoardFigures(installation, n);
  const net = compileInstallationBatch(installation, input.loads, input.loadBoards, input.drivers);
  solveInstallationBatch(net, input.columns, before, { onProgress: (d) => options.onProgress?.('solve', d, n) });
  const nominalV = installation.main.nominalLineToNeutralV;
  clearRoundOff(before, conductorFloorA(boards), nominalV);

  const meter = meterOf(boards[bankAt]!, input, options);
  // At the origin the circuit gains a load-free board at the supply's terminals (board 0): every board one on.
  const frame = meter?.frame ?? installation;
  const shift = frame === installation ? 0 : 1;
  const frameBoards = input.loadBoards.map((b) => b + shift);
  // The origin's service cable may be the circuit's stiffest conductor.
  const frameFloorA = conductorFloorA(shift ? [boardOfInstallation(frame, 0), ...boards] : boards);
  let meterBefore: IntervalFigures | undefined;
  let meterContext: SummaryContext | undefined;
  if (meter) {
    if (shift) {
      const framed = allocateBoardFigures(frame, n);
      solveInstallationBatch(compileInstallationBatch(frame, input.loads, frameBoards, input.drivers), input.columns, framed);
      clearRoundOff(framed, frameFloorA, nominalV);
      meterBefore = framed[0]!;
      // The origin is priced as the supply is: the main board's band and tariff, the origin's own (unrated) conductors.
      meterContext = { ...contexts[0]!, board: boardOfInstallation(frame, 0) };
    } else {
      meterBefore = before[meter.index]!;
      meterContext = contexts[meter.index]!;
    }
  }
  let meterAfter: IntervalFigures | null = null;

  let after: IntervalFigures[] | null = null;
  // Every board's figures of each run: the bank's own run is read back after the study, which also runs
  // trials (settledShortTrial.ts) whose figures are not the bank's.
  const boardsOfRun = new WeakMap<BankRun, { readonly after: IntervalFigures[]; readonly meterAfter: IntervalFigures | null }>();
  const outcome = bankOverProfile(
    {
      board: boards[bankAt]!,
      before: before[bankAt]!,
      ...(meterBefore ? { meterBefore } : {}),
      ...(meter ? { meterPoint: meter.point } : {}),
      intervalMs: input.intervalMs,
      rowHours: input.rowHours ?? null,
      label,
      ...(input.profile ? { profile: input.profile } : {}),
      summarise: (f) => summariseFigures(f, contexts[bankAt]!),
      simulate: (steps, fixed, settings) => {
        const figures = allocateBoardFigures(frame, n);
        const meterOfRun = meter ? figures[meter.index]! : null;
        const at = bankAt + shift;
        const run = { board: boards[bankAt]!, figures: figures[at]!, ...(meterOfRun ? { meter: meterOfRun } : {}), utcMs: input.utcMs, intervalMs: input.intervalMs, steps, fixed, settings };
        const switched = switchBank(run, (extra) => {
          const withSteps = compileInstallationBatch(frame, input.loads, frameBoards, input.drivers, extra.map((e) => ({ ...e, board: at })));
          const kernel = createInstallationKernel(withSteps);
          const index = new Map(withSteps.edges.map((e, k) => [`${e.board}|${e.from}|${e.to}|${e.vNominal}`, k]));
          return {
            edgeCount: withSteps.edges.length,
            path: 'nodal',
            edgeIndex: (e) => index.get(`${at}|${e.from}|${e.to}|${e.vNominal}`) ?? -1,
            powersAt: (i, out) => edgePowersAt(withSteps, input.columns, i, out),
            solve: (powers, i) => {
              kernel.solve(powers, i);
              kernel.states.forEach((s, b) => recordInterval(s, frame.main.sequence, figures[b]!, i));
            },
          };
        });
        clearRoundOff(figures, frameFloorA, nominalV);
        boardsOfRun.set(switched, { after: figures.slice(shift), meterAfter: meterOfRun });
        return switched;
      },
    },
    options,
  );
  const withBank = outcome && 'bank' in outcome ? outcome : null;
  if (withBank) ({ after, meterAfter } = boardsOfRun.get(withBank.run)!);
  const afterFigures = withBank ? after : null;
  const boardResults = boards.map((board, b): InstallationProfileBoard => ({
    board: board.name,
    fedFrom: b === 0 ? null : names[installation.subBoards[b - 1]!.fedFrom]!,
    limits: contexts[b]!.limits,
    before: summariseFigures(before[b]!, contexts[b]!),
    after: afterFigures ? summariseFigures((afterFigures as IntervalFigures[])[b]!, contexts[b]!) : null,
  }));
  const result: InstallationProfileResult = {
    installation: installation.name,
    phaseNames: conventionsOf(installation.main).phaseNames,
    path: 'nodal',
    timeZone: zone,
    intervals: { count: n, intervalSeconds: input.intervalMs / 1000, first: label(0), last: label(n - 1) },
    sequence: input.sequence ?? null,
    undriven: input.undriven ?? null,
    columnNotes: input.columnNotes ?? [],
    banksInService: listedBanksInService(installation),
    replacedBank: input.replacedBank ?? null,
    boards: boardResults,
    bank: withBank
      ? {
          board: names[bankAt]!,
          ...withBank.bank,
          meter: meter && meterBefore && meterAfter && meterContext ? { point: meter.point, before: summariseFigures(meterBefore, meterContext), after: summariseFigures(meterAfter, meterContext) } : null,
        }
      : null,
    bankNotSized: outcome && 'notSized' in outcome ? { board: names[bankAt]!, ...outcome.notSized } : null,
    // profile.limits.neutralA is the main board's limit; a sub-board's neutral is judged against its rating.
    warnings: [...madeUpIntervalsWarnings(input.sequence), ...boardResults.flatMap((r, b) => neutralOverLimitWarnings(r.before, b === 0 && input.profile?.limits?.neutralA !== undefined, r.board))],
    cautions: PROFILE_CAUTIONS,
  };
  const meterFigures = withBank && meter && meterBefore && meterAfter ? { point: meter.point, before: meterBefore, after: meterAfter as IntervalFigures } : null;
  return { result, utcMs: input.utcMs, before, after: afterFigures, connectedKvar: withBank?.run.connectedKvar ?? null, meter: meterFigures, label };
}

/**
 * The harmonic study in one call: solve the fundamental, then the board at
 * every order present (networkAtOrder.ts), read lines, neutral, voltages and
 * power factors, judge TDD, scan the resonance for every step combination and
 * check the capacitor duty in each.
 */
import { assertBoardModel } from '../board/modelGuards.js';
import { assertViableBoard } from '../analysis/viableOperatingPoint.js';
import { normaliseBoard } from '../board/normaliseBoard.js';
import type { Board, BoardLoad } from '../board/boardModel.js';
import { abs } from '../complex.js';
import { InputError, inputIssue } from '../errors.js';
import { compileBoard, solveCompiledBoard, solveNetwork, type NetworkSolution, type SolveOptions } from '../network/solveNetwork.js';
import { resolveSolveOptions, SOLVE_OPTION_KEYS } from '../network/solveOptions.js';
import { checkListArgument, checkNumberArgument, checkOptionKeys } from '../_internal/argumentChecks.js';
import { CompiledNetworkCache } from '../network/compiledNetworkCache.js';
import { NEGLIGIBLE_OHMS } from '../network/installationCircuit.js';
import { shortCircuitPathImpedance } from '../network/installationModel.js';
import { addInstalledBank, installedBankLayout, ordersPresent, resolveHarmonicModel, stateKey, type BankModel, type HarmonicModel } from './harmonicModel.js';
import { solveAtOrder } from './networkAtOrder.js';
import { readLines, readLineToLine, readNeutral, type OrderSolution } from './readHarmonics.js';
import { combinationLabel, scanResonance, stepCombinations } from './scanResonance.js';
import { CONTINUOUS_VOLTAGE_PU, DUTY_LIMITS, dutyCase, dutyRatio, type DutyOrder } from './capacitorDuty.js';
import { conditionWords, dutyConditions, withCapacitanceFactor, withLoadsOff } from './dutyConditions.js';
import { IEEE_519_SOURCE, ieee519OrderLimit, ieee519Row } from './ieee519.js';
import { checkVoltageDistortion } from './voltageDistortion.js';
import { HARMONICS_DEFAULTS } from './harmonicsDefaults.js';
import type { HarmonicsBoardSpec } from './harmonicsSpec.js';
import { harmonicsCautions, harmonicsWarningText, harmonicsWording, neutralPractice } from './harmonicsWording.js';
import { powerReading } from '../analysis/powerReading.js';
import { bankRatingIssue, bankRatingWarningOn, boardNominalPair } from '../board/bankRatingCheck.js';
import type { CapacitorDuty, ContinuousVoltage, DistortionReading, DutyCase, DutyCondition, HarmonicLineReading, HarmonicsPowerFactor, HarmonicsReport, HarmonicsWarning, NeutralCheck, ResonanceScan, TddCheck, VoltageDistortionCheck } from './harmonicsResult.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { regionWords, sourceModelOf, type RegionWords } from '../board/conventions/regionWords.js';
import { labelIn } from '../board/conventions/phaseNames.js';
import { ROUND_OFF_MARGIN } from '../analysis/boardWarnings.js';

export interface HarmonicsOptions {
  /** Passed to the fundamental solve. @defaultValue solver defaults */
  readonly solve?: SolveOptions;
  /** Scan grid override (orders), e.g. for a benchmark. @defaultValue from the board file's harmonics.scan */
  readonly scanOrders?: readonly number[];
  /** Most networks scanned from one bank's board with the other banks switched. @defaultValue HARMONICS_DEFAULTS.jointStateLimit */
  readonly jointStateLimit?: number;
}

const HARMONICS_OPTION_KEYS = ['solve', 'scanOrders', 'jointStateLimit'];

/**
 * The options of a harmonic study checked before any solve: a misspelt key would otherwise run the study
 * on its defaults without a word.
 * @param extraKeys keys a particular entry takes besides the common ones (`scanBoards` on an installation)
 * @throws {InputError} naming `options`, `options.<key>` or `options.solve.<key>`
 */
export function checkHarmonicsOptions(options: unknown, extraKeys: readonly string[] = []): asserts options is HarmonicsOptions | undefined {
  checkOptionKeys(options, 'options', [...HARMONICS_OPTION_KEYS, ...extraKeys]);
  if (options?.solve !== undefined) {
    checkOptionKeys(options.solve, 'options.solve', SOLVE_OPTION_KEYS);
    resolveSolveOptions(options.solve as SolveOptions, 'options.solve');
  }
  if (options?.scanOrders !== undefined) checkListArgument(options.scanOrders, 'options.scanOrders', 'a list of harmonic orders, numbers of at least 1', (h) => typeof h === 'number' && Number.isFinite(h) && h >= 1);
  if (options?.jointStateLimit !== undefined) checkNumberArgument(options.jointStateLimit, 'options.jointStateLimit', 'a whole number of networks, at least 1', (n) => Number.isInteger(n) && n >= 1);
}

/**
 * Solves the fundamental and every order present.
 * @param networks compiled networks to reuse, where the same board is solved in many states
 */
export function solveHarmonicOrders(board: Board, model: HarmonicModel, solve?: SolveOptions, networks?: CompiledNetworkCache): OrderSolution[] {
  assertBoardModel(board);
  const fundamental = networks ? solveCompiledBoard(compileBoard(board, (i) => networks.compileForLoadFlow(i)), solve) : solveNetwork(board, solve);
  const orders = networks ? { networks } : {};
  return [{ order: 1, solution: fundamental }, ...ordersPresent(model).map((h) => ({ order: h, solution: solveAtOrder(fundamental, model, h, orders) }))];
}

/** The board with the bank's steps switched as given (an off step draws nothing). */
export function withSteps(board: Board, bank: BankModel, steps: readonly boolean[]): Board {
  assertBoardModel(board);
  const off = new Set(bank.stepLoads.filter((_, k) => !steps[k]));
  return { ...board, loads: board.loads.map((l, i): BoardLoad => (off.has(i) ? { ...l, branches: l.branches.map((b) => ({ ...b, sNominal: { re: 0, im: 0 } })) } : l)) };
}

export function neutralCheck(board: Board, orders: readonly OrderSolution[], lines: readonly HarmonicLineReading[]): NeutralCheck | null {
  const current = readNeutral(orders);
  if (!current) return null;
  const triplen = current.orders.filter((o) => o.order % 3 === 0).reduce((s, o) => s + o.magnitude ** 2, 0);
  const largest = Math.max(...lines.map((l) => l.current.rms));
  const rating = board.neutralRatingA;
  const triplenSharePercent = current.rms > 0 ? (100 * triplen) / current.rms ** 2 : null;
  // The three-phase sizing note speaks of triplen currents: given where they are a real share of the neutral's.
  const threePhase = board.phases.length === 3;
  const practice = threePhase && (triplenSharePercent ?? 0) < NEUTRAL_NOTE_TRIPLEN_PERCENT ? null : neutralPractice(board.system);
  const ratioToPhase = largest > 0 ? current.rms / largest : null;
  return {
    current,
    triplenSharePercent,
    ratioToPhase,
    aboveLine: ratioToPhase !== null && ratioToPhase > 1 + ROUND_OFF_MARGIN ? aboveLineCause(current.fundamental, Math.sqrt(triplen), triplenSharePercent ?? 0, lines) : null,
    ratingA: rating,
    loadingPercent: rating ? (100 * current.rms) / rating : null,
    overloaded: rating !== null && current.rms > rating,
    practice,
  };
}

/** Share of the neutral's rms² in triplen orders, %, below which the triplen sizing note is left out (common practice, no source). */
const NEUTRAL_NOTE_TRIPLEN_PERCENT = 10;

const triplenRms = (d: DistortionReading) => Math.sqrt(d.orders.filter((o) => o.order % 3 === 0).reduce((s, o) => s + o.magnitude ** 2, 0));

/**
 * Why the neutral carries as much as the largest line. Its fundamental reaching the largest line's means
 * the loads sit on one line and the neutral brings that current back: the phase loading. Triplen orders
 * add from several lines only where the neutral carries more of them than any one line, and they matter
 * only as a real share of its rms (NEUTRAL_NOTE_TRIPLEN_PERCENT).
 */
function aboveLineCause(neutralFundamentalA: number, neutralTriplenA: number, triplenSharePercent: number, lines: readonly HarmonicLineReading[]): NonNullable<NeutralCheck['aboveLine']> {
  const lineFundamentalA = Math.max(...lines.map((l) => l.current.fundamental));
  const lineTriplenA = Math.max(...lines.map((l) => triplenRms(l.current)));
  const phaseLoading = neutralFundamentalA >= lineFundamentalA * (1 - ROUND_OFF_MARGIN);
  const triplenAdd = triplenSharePercent >= NEUTRAL_NOTE_TRIPLEN_PERCENT && neutralTriplenA > lineTriplenA * (1 + ROUND_OFF_MARGIN);
  const cause = phaseLoading ? (triplenAdd ? 'both' : 'phase-loading') : triplenAdd ? 'triplen' : 'harmonics';
  return { cause, neutralFundamentalA, lineFundamentalA, neutralTriplenA, lineTriplenA };
}

export function tddCheck(board: Board, model: HarmonicModel, lines: readonly HarmonicLineReading[]): TddCheck | null {
  if (!model.pcc) return null;
  const demand = model.pcc.demandCurrentA ?? Math.max(...lines.map((l) => l.current.fundamental));
  // I_sc through the path a fault at the board closes: line and neutral on a single-phase board (shortCircuitPathImpedance).
  const zSource = abs(shortCircuitPathImpedance(board));
  // Below NEGLIGIBLE_OHMS the circuit merges the source as a direct connection: no ratio from it, as for an ideal source.
  const ratio = model.pcc.shortCircuitRatio ?? (zSource >= NEGLIGIBLE_OHMS && demand > 0 ? board.nominalLineToNeutralV / zSource / demand : null);
  if (ratio === null || !(demand > 0)) return null;
  const row = ieee519Row(ratio);
  const tddLines = lines.map((l) => {
    const orders = l.current.orders.map((o) => {
      const percentOfDemand = (100 * o.magnitude) / demand;
      const limitPercent = ieee519OrderLimit(ratio, o.order);
      return { order: o.order, percentOfDemand, limitPercent, ok: percentOfDemand <= limitPercent };
    });
    const tddPercent = (100 * Math.sqrt(l.current.orders.reduce((s, o) => s + o.magnitude ** 2, 0))) / demand;
    return { phase: l.phase, tddPercent, orders, ok: tddPercent <= row.tddPercent && orders.every((o) => o.ok) };
  });
  return {
    shortCircuitRatio: ratio,
    shortCircuitRatioFrom: model.pcc.shortCircuitRatio !== null ? 'board file' : 'source impedance',
    demandCurrentA: demand,
    demandCurrentFrom: model.pcc.demandCurrentA !== null ? 'board file' : 'solved fundamental line current',
    tableRow: row.label,
    tddLimitPercent: row.tddPercent,
    lines: tddLines,
    ok: tddLines.every((l) => l.ok),
    source: IEEE_519_SOURCE,
  };
}

/** The orders a resonance is checked against: those solved, else the characteristic ones. */
export function checkedOrders(present: readonly number[]): Pick<ResonanceScan, 'checkedOrders' | 'checkedOrdersFrom'> {
  return present.length
    ? { checkedOrders: present, checkedOrdersFrom: 'spectra and background' }
    : { checkedOrders: [...HARMONICS_DEFAULTS.watchedOrders], checkedOrdersFrom: 'characteristic orders (no spectrum given)' };
}

/** The other banks of an installation in a duty solve: all fully on, all out of service, or the given parts off (per board, load numbers). */
export type OtherBanksSetting = 'on' | 'off' | { readonly partsOff: readonly (readonly number[])[] };

/** Other banks' states a duty check adds for one state of this bank's steps: each in words, with its parts off. */
export type SwitchedOtherBanks = (steps: readonly boolean[]) => readonly { readonly words: string; readonly partsOff: readonly (readonly number[])[] }[];

/**
 * Solves the fundamental and every order for the bank's board as given (`board`, `model`), with
 * every load off when `loadsOff`: the whole installation where the board has a place in one, with
 * every other board's bank as `others` sets it.
 */
export type DutySolver = (board: Board, model: HarmonicModel, loadsOff: boolean, others: OtherBanksSetting) => DutyOrder[];

/** The duty solver of a single board: every state through `networks`, its states changing load powers only. */
const boardDutySolver =
  (networks: CompiledNetworkCache, solve?: SolveOptions): DutySolver =>
  (board, model, loadsOff) =>
    solveHarmonicOrders(loadsOff ? withLoadsOff(board) : board, model, solve, networks);

/**
 * Every state of the board's bank, each at the capacitance tolerance ends and with the loads off —
 * and, where the installation has `otherBanks`, with them all on and all out of service, and in each
 * state `switched` gives for this bank's state (where the joint scan found a peak near a checked
 * order): the worst per state.
 */
export function capacitorDuty(board: Board, model: HarmonicModel, solveOrders: DutySolver, otherBanks = false, switched?: SwitchedOtherBanks): CapacitorDuty | null {
  const bank = model.bank;
  if (!bank) return null;
  const { limits, source } = DUTY_LIMITS[model.capacitorStandard];
  const conditions = dutyConditions(model.capacitanceTolerance, otherBanks);
  const plainConditions = dutyConditions(model.capacitanceTolerance);
  const ratio = (c: DutyCase) => dutyRatio(c.figures, limits);
  const cases: DutyCase[] = [];
  const nominalCases: DutyCase[] = [];
  let highestCapacitorVoltageV = 0;
  // The highest rms and fundamental voltage with the loads as given, at any capacitance and with the other
  // banks as they run: states a bank can stay in, so the continuous check reads them beside the running
  // state. With every load off a controller switches steps out; that row is the 8-hour allowance's.
  let highestRms: DutyCase | null = null;
  let highestInServiceV = 0;
  // States that switch electrically identical parts (equal steps) are one state: solve each once.
  const seen = new Set<string>();
  for (const steps of stepCombinations(bank.stepLoads.length)) {
    const key = stateKey(board, bank, steps);
    if (seen.has(key)) continue;
    seen.add(key);
    const withState = withSteps(board, bank, steps);
    const others = (switched?.(steps) ?? []).map((o) => ({ ...o, conditions: plainConditions.map((c): DutyCondition => ({ ...c, otherBanks: 'switched', otherBanksState: o.words })) }));
    const partsOff = new Map(others.map((o) => [o.words, o.partsOff]));
    let worst: DutyCase | null = null;
    for (const condition of [...conditions, ...others.flatMap((o) => o.conditions)]) {
      const at = withCapacitanceFactor(withState, model, condition.capacitancePercent / 100);
      const setting: OtherBanksSetting = condition.otherBanks === 'switched' ? { partsOff: partsOff.get(condition.otherBanksState!)! } : condition.otherBanks === 'off' ? 'off' : 'on';
      const orders = solveOrders(at.board, at.model, condition.loads === 'off', setting);
      const c = dutyCase(at.board, orders, at.model.bank!, steps, combinationLabel(bank, steps), limits, condition);
      if (!c) continue;
      if (condition.capacitancePercent === 100 && condition.loads === 'as given' && (condition.otherBanks === undefined || condition.otherBanks === 'on')) nominalCases.push(c);
      highestCapacitorVoltageV = Math.max(highestCapacitorVoltageV, c.capacitorVoltageV);
      if (condition.loads === 'as given' && condition.otherBanks !== 'off') {
        if (!highestRms || c.figures.voltageRms > highestRms.figures.voltageRms) highestRms = c;
        highestInServiceV = Math.max(highestInServiceV, c.capacitorVoltageV);
      }
      if (!worst || ratio(c) > ratio(worst)) worst = c;
    }
    if (worst) cases.push(worst);
  }
  if (cases.length === 0) return null;
  const worstOf = (list: readonly DutyCase[]) => list.reduce((w, c) => (ratio(c) > ratio(w) ? c : w));
  const vNetwork = bank.elementNominalV;
  const continuousPu = CONTINUOUS_VOLTAGE_PU[model.capacitorStandard];
  const running = nominalCases.length ? nominalCases.reduce((w, c) => (c.figures.voltageRms > w.figures.voltageRms ? c : w)) : null;
  return {
    standard: model.capacitorStandard,
    limits,
    limitsSource: source,
    ratedV: bank.ratedV,
    detuningPercent: bank.detuning * 100,
    capacitorVoltageV: vNetwork / (1 - bank.detuning),
    capacitanceTolerance: model.capacitanceTolerance,
    conditions,
    cases,
    worst: worstOf(cases),
    worstNominal: worstOf(nominalCases),
    highestCapacitorVoltageV,
    continuousVoltage: continuousPu === null || running === null || highestRms === null ? null : continuousVoltage(continuousPu, running, highestRms, highestInServiceV / bank.ratedV, vNetwork / (1 - bank.detuning) / bank.ratedV),
    ok: cases.every((c) => c.ok),
  };
}

/**
 * The continuous check: a unit at or above its rated voltage continuously is not within its limits,
 * whatever the 8-hour allowance says. "Reaches" is read on the figures as printed (3 decimals), so a
 * unit shown at 1.000 × rated is not called below it.
 */
function continuousVoltage(limitPu: number, running: DutyCase, highest: DutyCase, fundamentalPu: number, nominalPu: number): ContinuousVoltage {
  const reaches = (pu: number) => Number(pu.toFixed(3)) >= limitPu;
  return {
    limitPu,
    highestPu: running.figures.voltageRms,
    label: running.label,
    branch: running.branch,
    anyStatePu: highest.figures.voltageRms,
    anyState: { label: highest.label, branch: highest.branch, condition: highest.condition },
    fundamentalPu,
    nominalPu,
    reached: reaches(running.figures.voltageRms) || reaches(highest.figures.voltageRms) || reaches(fundamentalPu),
  };
}

/**
 * How the source is modelled where the file gives more than a symmetric impedance: an open delta has no
 * star point (two windings meeting at one line, no neutral, so no zero-sequence path); a star source's
 * star point is earthed through the zero-sequence impedance the file gives.
 */
function sourceAssumptions(board: Board, words: RegionWords): string[] {
  const alike = 'in the solve at each order and in the frequency scan alike';
  if (board.openDeltaCorner) {
    const corner = labelIn(conventionsOf(board).phaseNames, board.openDeltaCorner);
    return [`the source an open delta as the file gives it: two windings meeting at line ${corner}, each with its own impedance, and no ${words.starWord} point or neutral, so no zero-sequence current flows; ${alike}`];
  }
  if (board.sourceStarImpedance) return [`${words.sourceNeutralPoint} ${words.groundWord}ed through the zero-sequence impedance the file gives, ${alike}`];
  return [];
}

export function assumptions(board: Board, model: HarmonicModel, otherBanks = false): string[] {
  const forms = new Set(model.loads.flatMap((l) => (l.kind === 'linear' ? [l.form] : [])));
  const words = regionWords(conventionsOf(board).region, board.system, sourceModelOf(board));
  return [
    ...sourceAssumptions(board, words),
    forms.size
      ? `linear loads as ${[...forms].join(' and ')} R/X from their solved fundamental values (rated loads default to parallel R ‖ jX, loads in ohms and capacitors keep series form)`
      : 'no linear loads: every load is a harmonic source (its fundamental draws as solved)',
    'non-linear loads as ideal current sources; injection angle = spectrum angle + h × the angle of the load’s fundamental current',
    `source and feeder resistance ${model.resistance === 'constant' ? 'constant with frequency' : '× √h (skin effect)'}; reactances × h (inductive) or / h (capacitive)`,
    ...(model.bank
      ? [
          `capacitor duty: every bank state at capacitance −${model.capacitanceTolerance.minusPercent} %, nominal and +${model.capacitanceTolerance.plusPercent} %, with the loads as given and with every load off (the highest voltage; a controller normally switches steps off at light load, so that row covers a step left on)${otherBanks ? ', each with every other bank fully on, with every other bank out of service, and with the other banks in each state at which the joint scan puts a peak within ±10 % of a checked order' : ''}`,
        ]
      : []),
    model.background.length ? 'background supply distortion at each phase with h × the phase angle of its EMF' : 'no background supply distortion (the supply EMF is sinusoidal)',
    ...(model.pcc && model.pcc.shortCircuitRatio === null && !(abs(shortCircuitPathImpedance(board)) >= NEGLIGIBLE_OHMS)
      ? [harmonicsWording.noShortCircuitRatio]
      : []),
  ];
}

function dutyMessage(c: DutyCase, limits: CapacitorDuty['limits']): string {
  const parts: string[] = [];
  const f = c.figures;
  if (f.voltageRms > limits.voltageRms) parts.push(`rms voltage ${f.voltageRms.toFixed(2)} pu > ${limits.voltageRms}`);
  if (limits.voltagePeak !== null && f.voltagePeak > limits.voltagePeak) parts.push(`peak voltage ${f.voltagePeak.toFixed(2)} pu > ${limits.voltagePeak}`);
  if (f.currentRms > limits.currentRms) parts.push(`rms current ${f.currentRms.toFixed(2)} pu > ${limits.currentRms}`);
  if (limits.kvar !== null && f.kvar > limits.kvar) parts.push(`kvar ${f.kvar.toFixed(2)} pu > ${limits.kvar}`);
  return parts.join(', ');
}

/** What the warnings are drawn from; a part left out (null) gives none. */
export interface WarningSources {
  readonly scan: ResonanceScan | null;
  readonly neutral: NeutralCheck | null;
  readonly voltageDistortion: VoltageDistortionCheck | null;
  readonly duty: CapacitorDuty | null;
  readonly tdd: TddCheck | null;
  /** A split-phase board: its two lines are 180° apart, which the neutral warning's reason depends on. @defaultValue false */
  readonly splitPhase?: boolean;
}

/** The study's warnings, in a fixed order: ideal source, neutral, voltage distortion, resonance, duty, TDD. */
export function harmonicsWarnings({ scan, neutral, voltageDistortion, duty, tdd, splitPhase = false }: WarningSources, label: (term: string) => string): HarmonicsWarning[] {
  const warnings: HarmonicsWarning[] = [];
  const warn = (code: string, message: string, value: number | null = null, threshold: number | null = null) => warnings.push({ code, message, value, threshold });
  if (scan && scan.shortCircuitKVA === null) warn('ideal-source', harmonicsWarningText.idealSource);
  if (neutral?.overloaded) warn('neutral-overload', harmonicsWarningText.neutralOverload(neutral.current.rms, neutral.ratingA!), neutral.current.rms, neutral.ratingA);
  // Above 1 by more than round-off: on a single-phase board the neutral is the line's return, 1 ± 1e-16.
  if (neutral?.ratioToPhase !== null && neutral?.ratioToPhase !== undefined && neutral.ratioToPhase > 1 + ROUND_OFF_MARGIN)
    warn('neutral-above-phase', harmonicsWarningText.neutralAbovePhase(neutral, splitPhase), neutral.ratioToPhase, 1);
  if (voltageDistortion) {
    const { thdLimitPercent: thdLimit, basisName } = voltageDistortion;
    for (const bus of voltageDistortion.buses)
      if (bus.thdPercent !== null && bus.thdPercent > thdLimit * (1 + ROUND_OFF_MARGIN)) warn('voltage-thd', harmonicsWarningText.voltageThd(label(bus.bus), bus.thdPercent, thdLimit, basisName), bus.thdPercent, thdLimit);
    // One warning for every bus with an order above its level: the value and threshold those of the order furthest above its level.
    const overIndividual = voltageDistortion.buses.filter((b) => b.ordersAbove.length);
    if (overIndividual.length) {
      const worst = overIndividual.flatMap((b) => b.ordersAbove).reduce((w, o) => (o.percent / o.limitPercent > w.percent / w.limitPercent ? o : w));
      warn('voltage-individual', harmonicsWarningText.voltageIndividual(overIndividual.map((b) => ({ ...b, bus: label(b.bus) })), voltageDistortion), worst.percent, worst.limitPercent);
    }
  }
  // One warning per order at risk, naming every bank state that resonates near it.
  for (const o of scan?.checkedOrders ?? []) {
    const hits = scan!.combinations.flatMap((c) => {
      if (!c.nearOrders.includes(o)) return [];
      const peak = c.peaks.reduce((best, p) => (Math.abs(p.order - o) < Math.abs(best.order - o) ? p : best));
      return [{ label: c.label, order: peak.order }];
    });
    if (hits.length === 0) continue;
    const closest = hits.reduce((b, x) => (Math.abs(x.order - o) < Math.abs(b.order - o) ? x : b));
    warn('resonance', harmonicsWarningText.resonance(hits.map((x) => x.label), closest.order, o), closest.order, o);
  }
  if (duty)
    for (const c of duty.cases)
      if (!c.ok) warn('capacitor-duty', harmonicsWarningText.capacitorDuty(`${c.label} (${conditionWords(c.condition)})`, label(c.branch), dutyMessage(c, duty.limits)), dutyRatio(c.figures, duty.limits), 1);
  // Within the 8-hour limit (past it, the duty warning says so) but at or above the continuous rating, in the
  // running state, in any state checked, or at the fundamental alone: units rated too low.
  const cont = duty?.continuousVoltage;
  if (duty && cont?.reached && Math.max(cont.highestPu, cont.anyStatePu, cont.fundamentalPu) <= duty.limits.voltageRms) {
    const worst = Math.max(cont.highestPu, cont.anyStatePu, cont.fundamentalPu);
    warn(
      'capacitor-continuous-voltage',
      harmonicsWarningText.continuousVoltage({ ...cont, branch: label(cont.branch), anyState: { ...cont.anyState, branch: label(cont.anyState.branch), condition: conditionWords(cont.anyState.condition) } }, duty.ratedV, duty.capacitorVoltageV),
      worst,
      cont.limitPu,
    );
  }
  if (tdd)
    for (const l of tdd.lines) {
      const over = l.orders.filter((o) => !o.ok).map((o) => o.order);
      if (l.tddPercent > tdd.tddLimitPercent || over.length)
        warn('tdd', harmonicsWarningText.tdd(label(l.phase), l.tddPercent, tdd.tddLimitPercent, over), l.tddPercent, tdd.tddLimitPercent);
    }
  return warnings;
}

/**
 * Runs the harmonic study on a normalised board and its resolved model.
 * @throws {NumericalError} when a solve fails
 */
export function analyseHarmonics(board: Board, model: HarmonicModel, options: HarmonicsOptions = {}): HarmonicsReport {
  assertBoardModel(board);
  checkHarmonicsOptions(options);
  // One set of compiled networks for every solve: the study's and each duty state's, at every order.
  const networks = new CompiledNetworkCache();
  const orders = solveHarmonicOrders(board, model, options.solve, networks);
  const fundamental: NetworkSolution = orders[0]!.solution;
  const lines = readLines(orders);
  const lineToLine = readLineToLine(orders);
  const neutral = neutralCheck(board, orders, lines);
  const tdd = tddCheck(board, model, lines);
  const scan = scanResonance(fundamental, model, { ...checkedOrders(ordersPresent(model)), ...(options.scanOrders ? { grid: options.scanOrders } : {}) });
  const duty = capacitorDuty(board, model, boardDutySolver(networks, options.solve));
  const phaseNames = conventionsOf(board).phaseNames;
  const voltageDistortion = checkVoltageDistortion(lines, lineToLine, board.hasNeutral, model.voltageDistortionLimits);
  // Warnings name phases, pairs and branches the way the board file names them (L1-N or A-N).
  const label = (term: string) => labelIn(phaseNames, term);
  const warnings = harmonicsWarnings({ scan, neutral, voltageDistortion, duty, tdd, splitPhase: board.system === 'split-phase' }, label);
  const state = model.bank ? `every bank step on (${combinationLabel(model.bank, model.bank.stepLoads.map(() => true))})` : 'as given';
  const powerFactor = boardPowerFactor(orders, lines);
  const leads = leadingStateWarning(lines, powerFactor, state, model.bank ? allOnKvar(scan) : null, label);
  if (leads) warnings.push(leads);
  return {
    board: board.name,
    phaseNames,
    frequencyHz: board.frequencyHz,
    orders: orders.slice(1).map((o) => o.order),
    state,
    lines,
    lineToLine,
    hasNeutral: board.hasNeutral,
    neutral,
    powerFactor,
    tdd,
    voltageDistortion,
    scan,
    capacitorDuty: duty,
    spectra: spectraOf(board, model),
    assumptions: assumptions(board, model),
    warnings,
    cautions: harmonicsCautions(regionWords(conventionsOf(board).region, board.system).groundWord, board.hasNeutral),
  };
}

/**
 * Some lines lag and others lead at the fundamental (each by more than it prints as, 0.01 kvar): the board's
 * arithmetic PF then falls short of 1 by their opposing vars, and ΣQ1's sign — a few watts' worth either way — is
 * no sense to print beside it (a board at 0.991 read "lead" on −0.024 kvar of 31 kW).
 */
function linesDisagree(lines: readonly HarmonicLineReading[]): boolean {
  return lines.some((l) => l.fundamentalKvar >= 0.005) && lines.some((l) => l.fundamentalKvar <= -0.005);
}

/** Board figures, arithmetic over the lines: ΣP / Σ(V·I) with every order, and at the fundamental alone; the sense that of ΣQ1. */
export function boardPowerFactor(orders: readonly OrderSolution[], lines: readonly HarmonicLineReading[]): HarmonicsReport['powerFactor'] {
  const watts = lines.reduce((s, l) => s + l.kW * 1000, 0);
  const apparent = lines.reduce((s, l) => s + l.voltage.rms * l.current.rms, 0);
  const fundamentalLines = readLines([orders[0]!]);
  const apparent1 = fundamentalLines.reduce((s, l) => s + l.voltage.rms * l.current.rms, 0);
  const fundamental = powerReading({ re: lines.reduce((s, l) => s + l.fundamentalKW, 0) * 1000, im: lines.reduce((s, l) => s + l.fundamentalKvar, 0) * 1000 });
  return {
    true: apparent > 0 ? watts / apparent : null,
    displacement: apparent1 > 0 ? fundamentalLines.reduce((s, l) => s + l.kW * 1000, 0) / apparent1 : null,
    displacementSense: apparent1 > 0 && !linesDisagree(lines) ? fundamental.sense : 'none',
    fundamentalKW: fundamental.kW,
    fundamentalKvar: fundamental.kvar,
  };
}

/** What the bank delivers with every step on, at nominal voltage (the scan's state with every step on); null without that state. */
export function allOnKvar(scan: ResonanceScan): number | null {
  return scan.combinations.find((c) => c.steps.every(Boolean))?.capacitorKvar ?? null;
}

/**
 * The studied state leaves lines leading at the fundamental: the bank, every step on, delivers more than
 * those lines' loads draw and capacitive kvar goes back up the supply (as `bank-in-service-exceeds-loads`
 * says of a bank in service on an installation's board). Null where no line leads or no bank is on.
 * @param bankKvar what the bank in the studied state delivers at nominal voltage, kvar (the scan's figure)
 */
export function leadingStateWarning(lines: readonly HarmonicLineReading[], power: HarmonicsPowerFactor, state: string, bankKvar: number | null, label: (term: string) => string): HarmonicsWarning | null {
  if (bankKvar === null || !(bankKvar > 0)) return null;
  // As printed (powerFactorText.ts): a line whose vars show as 0.00 has no lead to speak of, and one that carries
  // power back reads "export", not lead. A line carrying the bank alone (no active power) leads at 0.000.
  const leading = lines.filter((l) => l.displacementSense === 'leading' && l.fundamentalKvar <= -0.005 && !(l.fundamentalKW <= -0.005));
  if (leading.length === 0) return null;
  const named = leading.map((l) => `${label(l.phase)} ${Math.abs(l.displacementPf!).toFixed(3)}`);
  return {
    code: 'bank-state-leads',
    message: harmonicsWarningText.leadingState(state, named, bankKvar, power.fundamentalKvar),
    value: power.fundamentalKvar,
    threshold: 0,
  };
}

/** The non-linear loads of a board and their spectra. */
export function spectraOf(board: Board, model: HarmonicModel): HarmonicsReport['spectra'] {
  return board.loads.flatMap((load, i) => {
    const b = model.loads[i]!;
    if (b.kind !== 'non-linear') return [];
    return [{ load: load.name, spectrum: b.spectrumName, source: b.source, thdPercent: 100 * Math.sqrt(b.spectrum.reduce((s, o) => s + o.fraction ** 2, 0)) }];
  });
}

/** A bank whose connection the board's system can take (installedBankLayout). */
function checkBank(spec: HarmonicsBoardSpec, board: Board): void {
  const bank = spec.harmonics?.bank;
  if (!bank) return;
  const layout = installedBankLayout(board, bank.connection);
  if (!layout.ok) throw new InputError([inputIssue('not_applicable', 'harmonics.bank.connection', layout.expected, bank.connection)]);
  // A spec handed in without parseBoard: the rating rule of the file (harmonicsRules.ts), here too.
  const rating = bankRatingIssue(bank, boardNominalPair(board), 'harmonics.bank.ratedV');
  if (rating) throw new InputError([rating]);
}

/**
 * Runs the harmonic study of a validated board file (`harmonics:` section, load
 * `spectrum` fields). `studyHarmonics` validates the file first and calls this.
 * @throws {InputError} for a bank on a board that is not three-phase
 * @throws {NumericalError} when a solve fails, or reason `collapsed` when the board's supply has collapsed
 */
export function studyBoardHarmonics(spec: HarmonicsBoardSpec, options: HarmonicsOptions = {}): HarmonicsReport {
  checkHarmonicsOptions(options);
  const plain = normaliseBoard(spec);
  checkBank(spec, plain);
  const withBank = spec.harmonics?.bank ? addInstalledBank(plain, spec.harmonics.bank) : { board: plain, model: null };
  const model = resolveHarmonicModel(spec, withBank.board, withBank.model);
  // Harmonics of a collapsed state describe nothing that can exist (as the correction study refuses it).
  assertViableBoard(withBank.board);
  const report = analyseHarmonics(withBank.board, model, options);
  const rating = spec.harmonics?.bank ? bankRatingWarningOn(spec.harmonics.bank, boardNominalPair(plain)) : null;
  return rating ? { ...report, warnings: [...report.warnings, rating] } : report;
}

/**
 * The harmonic study of an installation: every board's loads at once, through
 * the installation's compiled network at the fundamental and at every order
 * present (installationAtOrder.ts). Per board: the busbar voltages, the
 * incoming feeder's line and neutral currents (the triplen current each feeder
 * neutral carries back), power factors, voltage limits. Per bank: the scan of
 * every state seen from its board, with the supply and every feeder on the way
 * in the path, and its duty. A board file is the installation with one board,
 * and gives the figures `studyBoardHarmonics` gives.
 */
import type { Board, Installation } from '../board/boardModel.js';
import type { InstallationBaseSpec } from '../board/installationSchema.js';
import { normaliseInstallation } from '../board/normaliseInstallation.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { labelIn } from '../board/conventions/phaseNames.js';
import { regionWords, sourceModelOf } from '../board/conventions/regionWords.js';
import { boardOfInstallation, installationOf, withBoardLoads } from '../network/installationModel.js';
import { bankBoardsOf } from './banksInService.js';
import { solveCompiledInstallation, type InstallationSolution, type SolveOptions } from '../network/solveNetwork.js';
import { CompiledNetworkCache } from '../network/compiledNetworkCache.js';
import { assertViableSolutions } from '../analysis/viableOperatingPoint.js';
import { addInstalledBank, ordersPresent, resolveHarmonicModel, type BankModel, type HarmonicModel } from './harmonicModel.js';
import type { HarmonicLoadSpec, InstallationHarmonicsSectionSpec } from './harmonicsSpec.js';
import type { BoardHarmonics, BoardScan, HarmonicsWarning, InstallationHarmonicsReport, InstallationHarmonicsWarning, JointScan, OtherBankLevel, ResonanceScan } from './harmonicsResult.js';
import { solveInstallationAtOrder } from './installationAtOrder.js';
import { installationDutyOrders } from './installationDutyOrders.js';
import { readLines, readLineToLine, type OrderSolution } from './readHarmonics.js';
import { combinationLabel, scanResonance } from './scanResonance.js';
import { createInstallationScanEvaluator } from './scanEvaluator.js';
import { withInstallationLoadsOff, withOtherBanksOff, withPartsOff } from './dutyConditions.js';
import { scanJointResonance } from './scanJointResonance.js';
import { checkVoltageDistortion } from './voltageDistortion.js';
import { bankStateWords, harmonicsAssumptionText, harmonicsCautions, harmonicsWarningText } from './harmonicsWording.js';
import {
  assumptions,
  boardPowerFactor,
  capacitorDuty,
  allOnKvar,
  checkedOrders,
  checkHarmonicsOptions,
  leadingStateWarning,
  harmonicsWarnings,
  neutralCheck,
  spectraOf,
  tddCheck,
  type DutySolver,
  type HarmonicsOptions,
  type SwitchedOtherBanks,
} from './studyHarmonics.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';
import { bankRatingWarningOn, boardNominalPair } from '../board/bankRatingCheck.js';

/** What the study reads of an installation file: the installation, its loads' harmonic fields and the `harmonics:` section. */
export type HarmonicsInstallationSpec = Omit<InstallationBaseSpec, 'boards'> & {
  boards: (Omit<InstallationBaseSpec['boards'][number], 'loads'> & { loads: HarmonicLoadSpec[] })[];
  harmonics?: InstallationHarmonicsSectionSpec | undefined;
};

const boardNames = (installation: Installation) => [installation.main.name, ...installation.subBoards.map((sb) => sb.name)];

/** Every order any board's loads inject or the supply carries, ascending. */
function ordersOf(models: readonly HarmonicModel[]): number[] {
  return [...new Set(models.flatMap(ordersPresent))].sort((a, b) => a - b);
}

/** The fundamental and every order, read at board `b`. */
function boardOrders(b: number, fundamental: InstallationSolution, solved: readonly { order: number; solution: InstallationSolution }[]): OrderSolution[] {
  return [{ order: 1, solution: fundamental.boards[b]! }, ...solved.map((o) => ({ order: o.order, solution: o.solution.boards[b]! }))];
}

/** Solves the installation at the fundamental and every order, each through `networks`. */
function solveOrders(installation: Installation, models: readonly HarmonicModel[], networks: CompiledNetworkCache, solve?: SolveOptions) {
  const fundamental = solveCompiledInstallation(networks.compileForLoadFlow(installation), solve);
  return { fundamental, solved: ordersOf(models).map((order) => ({ order, solution: solveInstallationAtOrder(fundamental, models, order, { networks }) })) };
}

/** Per board, its bank's parts (load numbers): the fixed part and every step. */
const bankPartsOf = (models: readonly HarmonicModel[]) => models.map((m) => (m.bank ? [...(m.bank.fixedLoad === null ? [] : [m.bank.fixedLoad]), ...m.bank.stepLoads] : []));

/**
 * The duty solver of bank board `b`: the whole installation with that board as the bank state has it.
 * Every state, condition and other banks' setting changes load powers only (parts switched off draw
 * nothing, they are not removed), so at each order the circuits repeat and `networks` compiles each once.
 */
function installationDutySolver(models: readonly HarmonicModel[], b: number, networks: CompiledNetworkCache, solve?: SolveOptions): DutySolver {
  const solveStates = installationDutyOrders(networks, solve);
  // A state's model differs in its bank's capacitance only, not in what any load injects or the supply carries.
  const orders = ordersOf(models);
  return (board, model, loadsOff, others) => {
    const { installation } = installationOf(board);
    const at = models.map((m, i) => (i === b ? model : m));
    const switched = others === 'on' ? installation : others === 'off' ? withOtherBanksOff(installation, bankPartsOf(models), b) : withPartsOff(installation, others.partsOff);
    return solveStates(loadsOff ? withInstallationLoadsOff(switched) : switched, at, orders, b);
  };
}

/**
 * For a state of bank board `b`'s steps, the other banks' states at which its joint scan put a peak
 * within ±10 % of a checked order (its near orders), other than all on or all off (checked anyway):
 * each in the scan's words, with the parts it has off.
 */
function switchedOtherBanks(joint: JointScan, names: readonly string[], models: readonly HarmonicModel[]): SwitchedOtherBanks {
  const boards = joint.otherBanks.map((o) => names.indexOf(o.board));
  const partsOff = (levels: readonly OtherBankLevel[]) =>
    names.map((_, c) => {
      const j = boards.indexOf(c);
      if (j < 0) return [];
      const bank = models[c]!.bank!;
      const level = levels[j]!;
      return [...(bank.fixedLoad !== null && !level.fixedOn ? [bank.fixedLoad] : []), ...bank.stepLoads.filter((_, k) => !level.steps[k])];
    });
  const words = (levels: readonly OtherBankLevel[]) => levels.map((l, j) => bankStateWords(joint.otherBanks[j]!.board, l.label)).join('; ');
  const extremes = new Set([words(joint.otherBanks.map((o) => o.levels[0]!)), words(joint.otherBanks.map((o) => o.levels.at(-1)!))]);
  const wanted = new Set(joint.combinations.flatMap((c) => c.nearOrders.map((n) => n.peak.otherBanks)).filter((w) => !extremes.has(w)));
  const states = new Map<string, readonly (readonly number[])[]>();
  const visit = (prefix: readonly OtherBankLevel[]): void => {
    if (states.size === wanted.size) return;
    if (prefix.length === joint.otherBanks.length) {
      const w = words(prefix);
      if (wanted.has(w)) states.set(w, partsOff(prefix));
      return;
    }
    for (const level of joint.otherBanks[prefix.length]!.levels) visit([...prefix, level]);
  };
  if (wanted.size) visit([]);
  return (steps) => {
    const combination = joint.combinations.find((c) => c.steps.every((on, k) => on === steps[k]));
    const near = [...new Set(combination?.nearOrders.map((n) => n.peak.otherBanks) ?? [])];
    return near.flatMap((w) => (states.has(w) ? [{ words: w, partsOff: states.get(w)! }] : []));
  };
}

function depthOf(installation: Installation, b: number): number {
  let depth = 1;
  for (let at = b; at !== 0; at = installation.subBoards[at - 1]!.fedFrom) depth++;
  return depth;
}

function installationAssumptions(main: Board, models: readonly HarmonicModel[], banks: readonly number[], scans: readonly BoardScan[], scannedBoard?: number): string[] {
  // The single-board wording, with every board's load forms and any bank (the scanned one's tolerance where one board is asked for).
  const base = scannedBoard === undefined ? models[0]! : models[scannedBoard]!;
  const merged: HarmonicModel = { ...base, loads: models.flatMap((m) => m.loads), bank: (scannedBoard === undefined ? null : base.bank) ?? models.find((m) => m.bank)?.bank ?? null };
  return [
    ...assumptions(main, merged, banks.length > 1),
    main.system === 'split-phase'
      ? `sub-board feeders per conductor like the service feeder (line and neutral); each feeder neutral carries the difference of its two line currents at every order back towards ${regionWords(conventionsOf(main).region, main.system, sourceModelOf(main)).sourceNeutralPoint}`
      : main.hasNeutral
        ? 'sub-board feeders per conductor like the service feeder (line and neutral); each feeder neutral carries its boards’ zero-sequence (triplen) current back towards the source'
        : 'sub-board feeders per conductor like the service feeder; with no neutral, triplen currents of a balanced set have no path and only unbalance lets them flow in the lines',
    ...(banks.length > 1 ? [harmonicsAssumptionText.jointScan, ...scans.flatMap((s) => (s.jointScan && s.jointScan.coverage !== 'every step combination' ? [harmonicsAssumptionText.jointScanReduced(s.board, s.jointScan)] : []))] : []),
  ];
}

/**
 * One warning per checked order that some state of this bank comes within ±10 % of only with another
 * bank switched — that state clear of it with every other bank on, where the scan's own warning
 * covers it — naming the state whose peak is nearest.
 */
function jointResonanceWarnings(board: string, scan: ResonanceScan, joint: JointScan): HarmonicsWarning[] {
  return scan.checkedOrders.flatMap((o) => {
    const hits = joint.combinations.flatMap((c, k) =>
      scan.combinations[k]!.nearOrders.includes(o) ? [] : c.nearOrders.filter((n) => n.order === o).map((n) => ({ label: c.label, peak: n.peak })),
    );
    if (hits.length === 0) return [];
    const closest = hits.reduce((b, x) => (Math.abs(x.peak.order - o) < Math.abs(b.peak.order - o) ? x : b));
    const states = new Set(hits.map((x) => x.label)).size;
    return [{ code: 'resonance-other-banks', message: harmonicsWarningText.resonanceOtherBanks(bankStateWords(board, closest.label), closest.peak.otherBanks, closest.peak.order, o, states - 1), value: closest.peak.order, threshold: o }];
  });
}

/** An installation ready for its harmonic study: the banks added as loads of their boards, and every board's model. */
export interface InstallationHarmonicModel {
  readonly installation: Installation;
  /** One per board (0 = main board): how its loads behave at harmonic orders, its bank if it has one. */
  readonly models: readonly HarmonicModel[];
  /** Per bank of `harmonics.banks`, its board number; with a placed bank, every board that has a bank, ascending. */
  readonly bankBoards: readonly number[];
}

/** A bank placed on a board in place of the file's bank there (the bank a correction study designs). */
export interface PlacedBank {
  /** Board number (0 = main board). */
  readonly board: number;
  /** The board with the bank's parts added as loads, and its model; null when there is nothing to add. */
  readonly add: (board: Board) => { board: Board; model: BankModel } | null;
}

/**
 * Normalises a validated installation file and adds its banks: the installation and
 * models the study solves (also what a check against another solver starts from).
 * @param placed a bank that takes the place of the file's bank on its board (or is added where the file has none)
 * @throws {InputError} for a bank on an unknown board, two banks on one board, or a bank on a supply that is not three-phase
 */
export function resolveInstallationHarmonics(spec: HarmonicsInstallationSpec, placed?: PlacedBank): InstallationHarmonicModel {
  const { installation: plain, boardNumber } = normaliseInstallation(spec);
  const section = spec.harmonics ?? {};
  const fileBankBoards = bankBoardsOf(section.banks, plain);
  const count = plain.subBoards.length + 1;
  let installation = plain;
  const bankModels: (BankModel | null)[] = new Array(count).fill(null);
  (section.banks ?? []).forEach((bank, i) => {
    const b = fileBankBoards[i]!;
    if (b === placed?.board) return;
    const added = addInstalledBank(boardOfInstallation(installation, b), bank);
    installation = withBoardLoads(installation, b, added.board.loads);
    bankModels[b] = added.model;
  });
  const added = placed ? placed.add(boardOfInstallation(installation, placed.board)) : null;
  if (placed && added) {
    installation = withBoardLoads(installation, placed.board, added.board.loads);
    bankModels[placed.board] = added.model;
  }
  const loadSpecs: HarmonicLoadSpec[][] = new Array(count);
  spec.boards.forEach((board, i) => (loadSpecs[boardNumber[i]!] = board.loads));
  const { banks: bankSpecs, ...shared } = section;
  const models = Array.from({ length: count }, (_, b) => {
    const bank = b === placed?.board ? undefined : bankSpecs?.find((_, i) => fileBankBoards[i] === b);
    return resolveHarmonicModel({ loads: loadSpecs[b]!, harmonics: { ...shared, ...(bank ? { bank } : {}) } }, boardOfInstallation(installation, b), bankModels[b]!);
  });
  const bankBoards = placed ? bankModels.flatMap((m, b) => (m ? [b] : [])) : fileBankBoards;
  return { installation, models, bankBoards };
}

/**
 * Runs the harmonic study of a validated installation file (board loads'
 * `spectrum` fields, the `harmonics:` section with banks on named boards).
 * @throws {InputError} for a bank on an unknown board, two banks on one board, or a bank on a supply that is not three-phase
 * @throws {NumericalError} when a solve fails, or reason `collapsed` when a board's supply has collapsed
 */
export function studyInstallationHarmonicsSpec(spec: HarmonicsInstallationSpec, options: HarmonicsOptions = {}): InstallationHarmonicsReport {
  checkHarmonicsOptions(options);
  const resolved = resolveInstallationHarmonics(spec);
  const report = analyseInstallationHarmonics(resolved, options);
  // Ratings well above the voltage across the capacitors (refused far above by the file's rules): said on the bank's board.
  const nominal = boardNominalPair(resolved.installation.main);
  const rating = (spec.harmonics?.banks ?? []).flatMap((bank) => {
    const w = bankRatingWarningOn(bank, nominal);
    return w ? [{ ...w, board: bank.board }] : [];
  });
  return rating.length ? { ...report, warnings: [...report.warnings, ...rating] } : report;
}

export interface InstallationHarmonicsOptions extends HarmonicsOptions {
  /** The boards whose bank is scanned and checked for duty. @defaultValue every board with a bank (the main board when none has one) */
  readonly scanBoards?: readonly number[];
}

/**
 * Runs the harmonic study on a resolved installation (`resolveInstallationHarmonics`).
 * @throws {NumericalError} when a solve fails, or reason `collapsed` when a board's supply has collapsed
 */
export function analyseInstallationHarmonics(model: InstallationHarmonicModel, options: InstallationHarmonicsOptions = {}): InstallationHarmonicsReport {
  checkObjectArgument(model, 'model', 'an installation harmonic model from resolveInstallationHarmonics(...)', ['installation', 'models', 'bankBoards']);
  checkHarmonicsOptions(options, ['scanBoards']);
  const { installation, models, bankBoards } = model;
  // One set of compiled networks for every solve: the study's and each bank's duty states', at every order.
  const networks = new CompiledNetworkCache();
  const { fundamental, solved } = solveOrders(installation, models, networks, options.solve);
  // Harmonics of a collapsed state describe nothing that can exist (as the correction study refuses it).
  assertViableSolutions(fundamental.boards);
  const main = fundamental.boards[0]!.board;
  const phaseNames = conventionsOf(main).phaseNames;
  const label = (term: string) => labelIn(phaseNames, term);
  const warnings: InstallationHarmonicsWarning[] = [];
  const names = boardNames(installation);
  const boards = fundamental.boards.map((solution, b): BoardHarmonics => {
    const orders = boardOrders(b, fundamental, solved);
    const board = solution.board;
    const lines = readLines(orders);
    const lineToLine = readLineToLine(orders);
    const neutral = neutralCheck(board, orders, lines);
    const voltageDistortion = checkVoltageDistortion(lines, lineToLine, board.hasNeutral, models[b]!.voltageDistortionLimits);
    warnings.push(...harmonicsWarnings({ scan: null, neutral, voltageDistortion, duty: null, tdd: null, splitPhase: board.system === 'split-phase' }, label).map((w) => ({ ...w, board: board.name })));
    return {
      board: board.name,
      fedFrom: b === 0 ? null : names[installation.subBoards[b - 1]!.fedFrom]!,
      depth: depthOf(installation, b),
      lines,
      lineToLine,
      hasNeutral: board.hasNeutral,
      neutral,
      triplenNeutralA: neutral ? Math.sqrt(neutral.current.orders.filter((o) => o.order % 3 === 0).reduce((s, o) => s + o.magnitude ** 2, 0)) : null,
      powerFactor: boardPowerFactor(orders, lines),
      voltageDistortion,
      spectra: spectraOf(board, models[b]!),
    };
  });

  // Scan from each bank's board; with no bank, from the main board as it is.
  const scanned = options.scanBoards ? [...options.scanBoards] : bankBoards.length ? [...bankBoards].sort((a, b) => a - b) : [0];
  const checked = checkedOrders(ordersOf(models));
  const scans = scanned.map((b): BoardScan => {
    const evaluator = createInstallationScanEvaluator(fundamental, models, b);
    const scan = scanResonance(fundamental.boards[b]!, models[b]!, { ...checked, ...(options.scanOrders ? { grid: options.scanOrders } : {}) }, evaluator);
    const jointScan = scanJointResonance(fundamental, models, evaluator, { grid: scan.orders, checkedOrders: scan.checkedOrders, scan, ...(options.jointStateLimit !== undefined ? { stateLimit: options.jointStateLimit } : {}) });
    const duty = capacitorDuty(fundamental.boards[b]!.board, models[b]!, installationDutySolver(models, b, networks, options.solve), bankBoards.length > 1, jointScan ? switchedOtherBanks(jointScan, names, models) : undefined);
    warnings.push(...harmonicsWarnings({ scan, neutral: null, voltageDistortion: null, duty, tdd: null }, label).map((w) => ({ ...w, board: names[b]! })));
    if (jointScan) warnings.push(...jointResonanceWarnings(names[b]!, scan, jointScan).map((w) => ({ ...w, board: names[b]! })));
    // Read at the board's incoming feeder, every bank of the installation on (the state the figures are for).
    const bank = models[b]!.bank;
    const leads = bank ? leadingStateWarning(boards[b]!.lines, boards[b]!.powerFactor, `every step of its bank on (${combinationLabel(bank, bank.stepLoads.map(() => true))})`, allOnKvar(scan), label) : null;
    if (leads) warnings.push({ ...leads, board: names[b]! });
    return { board: names[b]!, scan, jointScan, capacitorDuty: duty };
  });
  const tdd = tddCheck(main, models[0]!, boards[0]!.lines);
  warnings.push(...harmonicsWarnings({ scan: null, neutral: null, voltageDistortion: null, duty: null, tdd }, label).map((w) => ({ ...w, board: null })));
  const bankStates = scanned.flatMap((b) => {
    const bank = models[b]!.bank;
    return bank ? [`${names[b]}: ${combinationLabel(bank, bank.stepLoads.map(() => true))}`] : [];
  });
  return {
    installation: installation.name,
    phaseNames,
    frequencyHz: main.frequencyHz,
    orders: solved.map((o) => o.order),
    state: bankStates.length ? `every bank step on (${bankStates.join('; ')})` : 'as given',
    boards,
    tdd,
    scans,
    assumptions: installationAssumptions(installation.main, models, bankBoards, scans, options.scanBoards?.[0]),
    warnings,
    cautions: harmonicsCautions(regionWords(conventionsOf(main).region, main.system).groundWord, boards.some((b) => b.hasNeutral)),
  };
}

/**
 * What correction equipment on one board of an installation does to every
 * board: the whole installation is solved without and with the equipment
 * (the same solver, loads at their models, every feeder's impedance), and each
 * board's incomer, feeder and the supply are read before and after.
 */
import type { Board, PhaseId } from '../board/boardModel.js';
import type { BoardResult, PowerFactorSense } from '../analysis/boardResult.js';
import type { InstallationResult } from '../analysis/installationResult.js';
import { analyseInstallation } from '../analysis/analyseInstallation.js';
import { solveInstallationNetwork, type SolveOptions } from '../network/solveNetwork.js';
import { installationOf } from '../network/installationModel.js';
import { addCorrectionEquipment, type EquipmentGroup } from './equipment.js';
import type { BeforeAfter, PfBeforeAfter } from './correctionResult.js';
import { beforeAfter, pfBeforeAfter } from './_internal/branchReadings.js';
import { judgeVoltage } from '../board/conventions/voltageLimits.js';
import { balanceWorsening } from './balanceWorsening.js';
import { overloadsCaused } from './overloadsCaused.js';
import { warningText } from './correctionWording.js';
import { assertBoardModel } from '../board/modelGuards.js';

/** One line at a board's incomer, before and after. */
export interface IncomerLineEffect {
  readonly phase: PhaseId;
  /** Phase voltage at the board (to its neutral bar; virtual neutral on a 3-wire board), V and % of nominal. */
  readonly voltageV: BeforeAfter;
  readonly voltagePercent: BeforeAfter;
  /** Current in the incomer (this board and every board beyond it), A. */
  readonly currentA: BeforeAfter;
  /** Displacement PF of the line at the incomer; null where the line carries no current. */
  readonly pf: PfBeforeAfter;
  readonly sense: { readonly before: PowerFactorSense; readonly after: PowerFactorSense };
}

/** One board's incomer and feeder, before and after. */
export interface BoardEffect {
  readonly name: string;
  readonly fedFrom: string | null;
  /** Boards between this one and the supply, counting itself (main board: 1). */
  readonly depth: number;
  /** True for the board the equipment is on. */
  readonly hasEquipment: boolean;
  readonly lines: readonly IncomerLineEffect[];
  /** The lowest and highest voltage the board's limits judge (its `voltageCheck`: line-to-neutral, line-to-line, at the loads), % of nominal. */
  readonly lowestVoltagePercent: BeforeAfter;
  readonly highestVoltagePercent: BeforeAfter;
  /** Branches of the board's own circuits outside its voltage band, as its over- and undervoltage warnings count them (the added equipment not counted). */
  readonly loadsOutsideVoltageBand: BeforeAfter;
  readonly neutralCurrentA: BeforeAfter | null;
  /** Vector PF |ΣP|/|ΣS| of the lines at the incomer (everything the feeder carries). */
  /** Null where the incomer carries no power before or after: a PF of nothing is not defined. */
  readonly vectorPf: BeforeAfter | null;
  /** Positive-sequence PF (IEEE 1459) at the incomer; null on a board with fewer than three phases. */
  readonly positiveSequencePf: BeforeAfter | null;
  /** |I2|/|I1| of the incomer currents, %; null below three phases. */
  readonly negativeSequenceCurrentPercent: BeforeAfter | null;
  /** Active and reactive power through the incomer (load convention, + lagging), kW / kvar. */
  readonly incomerKW: BeforeAfter;
  readonly incomerKvar: BeforeAfter;
  /** The board's feeder (the service feeder for the main board). */
  readonly feeder: {
    readonly largestLineCurrentA: BeforeAfter;
    readonly lineCurrentsA: readonly BeforeAfter[];
    readonly neutralCurrentA: BeforeAfter | null;
    readonly lossesKW: BeforeAfter;
    readonly voltageDropPercent: BeforeAfter;
  };
}

/** The supply: what the source delivers, before and after. */
export interface SupplyEffect {
  readonly kW: BeforeAfter;
  readonly kvar: BeforeAfter;
  readonly kVA: BeforeAfter;
  /** kW/kVA of what the source delivers (vector sum). */
  readonly pf: BeforeAfter;
  /** Source windings and every feeder, kW. */
  readonly lossesKW: BeforeAfter;
  /** The lowest voltage the limits judge anywhere in the installation, % of nominal (`totals.lowestVoltagePercent`). */
  readonly lowestVoltagePercent: BeforeAfter;
  /** Transformer loading, % of rated current; null without a transformer. */
  readonly transformerLoadingPercent: BeforeAfter | null;
  /** Each rated unit of a transformer bank or open delta (`sourceUnits` of the main board), % of its rated current; null without such units. */
  readonly sourceUnitLoadingPercent: readonly { readonly winding: string; readonly loading: BeforeAfter }[] | null;
}

/**
 * What the equipment makes worse on a board other than its own (its own board's are the verification's
 * warnings): an overload it causes, the neutral current or the current unbalance notably up (the
 * thresholds of balanceWorsening.ts).
 */
export interface OtherBoardWarning {
  readonly board: string;
  readonly code: 'overload-caused' | 'neutral-worse' | 'unbalance-worse';
  readonly message: string;
}

export interface InstallationEffect {
  /** The board the equipment is on. */
  readonly board: string;
  /** Boards in feeding order, main board first. */
  readonly boards: readonly BoardEffect[];
  /** The other boards' warnings, main board first. */
  readonly otherBoards: readonly OtherBoardWarning[];
  readonly supply: SupplyEffect;
  /** The two installation solves the figures come from. */
  readonly before: InstallationResult;
  readonly after: InstallationResult;
}

/**
 * The board's own circuits (branch by branch, as its voltage warnings count them) outside its voltage
 * band: the added equipment is not one of them, or a bank on an already low board would read as
 * making more loads low.
 */
const outsideBand = (r: BoardResult) =>
  r.loads
    .filter((l) => l.origin === 'board' && l.energised)
    .reduce((n, l) => n + l.branches.filter((br) => judgeVoltage(r.voltageCheck.limits, br.voltagePercent) !== 'within').length, 0);
const pair = (b: number | null | undefined, a: number | null | undefined): BeforeAfter | null =>
  b === null || b === undefined || a === null || a === undefined ? null : beforeAfter(b, a);

function boardEffect(before: InstallationResult, after: InstallationResult, index: number, equipmentBoard: string): BoardEffect {
  const b = before.boards[index]!;
  const a = after.boards[index]!;
  const rb = b.result;
  const ra = a.result;
  const fb = before.feeders[index]!;
  const fa = after.feeders[index]!;
  return {
    name: b.name,
    fedFrom: b.fedFrom,
    depth: b.depth,
    hasEquipment: b.name === equipmentBoard,
    lines: rb.phases.map((p, k) => {
      const q = ra.phases[k]!;
      return {
        phase: p.phase,
        voltageV: beforeAfter(p.voltage.magnitude, q.voltage.magnitude),
        voltagePercent: beforeAfter(p.voltagePercent, q.voltagePercent),
        currentA: beforeAfter(p.current.magnitude, q.current.magnitude),
        pf: pfBeforeAfter(p.pf, q.pf),
        sense: { before: p.sense, after: q.sense },
      };
    }),
    // The voltages the limits judge (voltageCheck.ts), so the figures agree with the board's verdict.
    lowestVoltagePercent: beforeAfter(rb.voltageCheck.lowest.percent, ra.voltageCheck.lowest.percent),
    highestVoltagePercent: beforeAfter(rb.voltageCheck.highest.percent, ra.voltageCheck.highest.percent),
    loadsOutsideVoltageBand: beforeAfter(outsideBand(rb), outsideBand(ra)),
    neutralCurrentA: pair(rb.neutral?.current.magnitude, ra.neutral?.current.magnitude),
    // A board with no power (nothing on it, or nothing beyond it) has no PF: null, as a board result says.
    vectorPf: pair(rb.powerFactor.vector.pf, ra.powerFactor.vector.pf),
    positiveSequencePf: pair(rb.powerFactor.positiveSequence?.pf, ra.powerFactor.positiveSequence?.pf),
    negativeSequenceCurrentPercent: pair(rb.unbalance?.currentNegativePercent, ra.unbalance?.currentNegativePercent),
    incomerKW: beforeAfter(sumOf(rb, 'kW'), sumOf(ra, 'kW')),
    incomerKvar: beforeAfter(sumOf(rb, 'kvar'), sumOf(ra, 'kvar')),
    feeder: {
      largestLineCurrentA: beforeAfter(Math.max(...fb.lines.map((l) => l.current.magnitude)), Math.max(...fa.lines.map((l) => l.current.magnitude))),
      lineCurrentsA: fb.lines.map((l, k) => beforeAfter(l.current.magnitude, fa.lines[k]!.current.magnitude)),
      neutralCurrentA: pair(fb.neutral?.current.magnitude, fa.neutral?.current.magnitude),
      lossesKW: beforeAfter(fb.lossesKW, fa.lossesKW),
      voltageDropPercent: beforeAfter(fb.voltageDropPercent, fa.voltageDropPercent),
    },
  };
}

const unitsEffect = (b: BoardResult['sourceUnits'], a: BoardResult['sourceUnits']): SupplyEffect['sourceUnitLoadingPercent'] =>
  b && a ? b.map((u, k) => ({ winding: u.winding, loading: beforeAfter(u.loadingPercent, a[k]!.loadingPercent) })) : null;

const sumOf = (r: BoardResult, key: 'kW' | 'kvar') => r.phases.reduce((s, p) => s + p[key], 0);

function supplyEffect(before: InstallationResult, after: InstallationResult): SupplyEffect {
  const kva = (r: InstallationResult) => Math.hypot(r.totals.sourceKW, r.totals.sourceKvar);
  const pf = (r: InstallationResult) => (kva(r) > 0 ? Math.min(1, Math.abs(r.totals.sourceKW) / kva(r)) : 1);
  const tb = before.boards[0]!.result.transformer;
  const ta = after.boards[0]!.result.transformer;
  return {
    kW: beforeAfter(before.totals.sourceKW, after.totals.sourceKW),
    kvar: beforeAfter(before.totals.sourceKvar, after.totals.sourceKvar),
    kVA: beforeAfter(kva(before), kva(after)),
    pf: beforeAfter(pf(before), pf(after)),
    lossesKW: beforeAfter(before.totals.lossesKW, after.totals.lossesKW),
    lowestVoltagePercent: beforeAfter(before.totals.lowestVoltagePercent, after.totals.lowestVoltagePercent),
    transformerLoadingPercent: tb && ta ? beforeAfter(tb.loadingPercent, ta.loadingPercent) : null,
    sourceUnitLoadingPercent: unitsEffect(before.boards[0]!.result.sourceUnits, after.boards[0]!.result.sourceUnits),
  };
}

/** Each other board's incomer, without and with the equipment: what it makes worse there (see OtherBoardWarning). */
function otherBoardWarnings(before: InstallationResult, after: InstallationResult, equipmentBoard: string): OtherBoardWarning[] {
  return before.boards.flatMap((b, i): OtherBoardWarning[] => {
    if (b.name === equipmentBoard) return [];
    const rb = b.result;
    const ra = after.boards[i]!.result;
    const overloads = overloadsCaused(rb, ra);
    return [
      ...overloads.map((o): OtherBoardWarning => ({ board: b.name, code: 'overload-caused', message: warningText.overloadCaused(o.message) })),
      ...balanceWorsening(rb, ra)
        // A neutral the equipment takes over its rating is said once, as the overload.
        .filter((w) => !(w.code === 'neutral-worse' && overloads.some((o) => o.code === 'neutral-over-rating')))
        .map((w): OtherBoardWarning => ({
          board: b.name,
          code: w.code,
          message: w.code === 'unbalance-worse' ? warningText.unbalanceWorse(w.before, w.after, w.threshold) : warningText.neutralWorse(w.before, w.after, ra.neutral?.ratingA ?? null),
        })),
    ];
  });
}

/**
 * Solves the installation `board` belongs to without and with `equipment` on `board`, and reads every board.
 * @param board a board with its place in an installation (`boardOfInstallation`); a lone board is the
 *   installation of one board
 * @param equipment e.g. `report.verification.equipment`
 * @throws {NumericalError} if a solve fails
 * @example
 * const effect = installationEffect(boardOfInstallation(installation, 3), report.verification.equipment);
 * effect.boards[0].vectorPf //=> { before: 0.93…, after: 0.96…, change: 0.03… } at the main incomer
 */
export function installationEffect(board: Board, equipment: readonly EquipmentGroup[], solve: SolveOptions = {}): InstallationEffect {
  assertBoardModel(board);
  const analyse = (b: Board) => analyseInstallation(solveInstallationNetwork(installationOf(b).installation, solve), { ...solve, openNeutral: false });
  const before = analyse(board);
  const after = analyse(addCorrectionEquipment(board, equipment));
  return {
    board: board.name,
    boards: before.boards.map((_, i) => boardEffect(before, after, i, board.name)),
    otherBoards: otherBoardWarnings(before, after, board.name),
    supply: supplyEffect(before, after),
    before,
    after,
  };
}

/**
 * Checks a hand calculation on the real board: the capacitors the user chose
 * are added to the board exactly as given, the textbook figures are worked out,
 * and the difference to the solved board is split into named effects by
 * switching them on one at a time (ideal board → board voltage → neutral
 * return → capacitor square law → voltage-dependent loads), re-solving each time.
 */
import type { Board, BoardLoad, PhaseId } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import type { BoardResult } from '../analysis/boardResult.js';
import { solveBoardModel } from '../analysis/solveBoardModel.js';
import { correctionCautions } from '../correction/correctionWording.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { regionWords, sourceModelOf } from '../board/conventions/regionWords.js';
import { labellerOf, type PhaseLabel, type PhaseLabeller } from '../board/conventions/phaseNames.js';
import { parseHandFigures } from './validateHandFigures.js';
import type { HandFiguresSpec } from './handFiguresSpec.js';
import type { Compared, EffectContribution, HandCapacitor, HandCheckResult, HandEffectId, LineCheck } from './handCheckResult.js';
import { nominalPhaseVoltages, textbookWorking } from './textbookWorking.js';
import { EFFECT_TITLES, effectExplanation, handCheckWarningWords } from './handCheckWording.js';
import { powerReading } from '../analysis/powerReading.js';
import type { ComplexValue } from '../complex.js';
import type { BoardWarning, PowerFactorSense, PowerReading } from '../analysis/boardResult.js';
import { assertBoardModel } from '../board/modelGuards.js';

const ZERO = { re: 0, im: 0 };
const CONSTANT_POWER = { z: 0, i: 0, p: 1 };
const CONSTANT_IMPEDANCE = { z: 1, i: 0, p: 0 };

interface CapacitorPlan {
  readonly spec: HandFiguresSpec['capacitors'][number];
  readonly from: PhaseId;
  readonly to: PhaseId | 'N';
  readonly nominalV: number;
  readonly handKvar: number;
  readonly capacitanceF: number;
}

function planCapacitors(spec: HandFiguresSpec, board: Board): CapacitorPlan[] {
  const omega = 2 * Math.PI * board.frequencyHz;
  return spec.capacitors.map((c) => {
    const [from, to] = c.branch.split('-') as [PhaseId, PhaseId | 'N'];
    const nominalV = to === 'N' ? board.nominalLineToNeutralV : (board.nominalLineToLineV ?? 2 * board.nominalLineToNeutralV);
    if (c.uF !== undefined) {
      const capacitanceF = c.uF * 1e-6;
      return { spec: c, from, to, nominalV, capacitanceF, handKvar: (omega * capacitanceF * nominalV * nominalV) / 1000 };
    }
    const ratedV = c.ratedV ?? nominalV;
    return { spec: c, from, to, nominalV, handKvar: c.kvar!, capacitanceF: (c.kvar! * 1000) / (omega * ratedV * ratedV) };
  });
}

/** The capacitors as added loads: holding the hand kvar (constant power) or as the real capacitance. */
function capacitorLoads(plans: readonly CapacitorPlan[], board: Board, real: boolean): BoardLoad[] {
  const omega = 2 * Math.PI * board.frequencyHz;
  const label = labelsOf(board);
  return plans.map((c) => ({
    name: `hand capacitor ${label(c.spec.branch)}`,
    connection: c.spec.branch as ConnectionSpec,
    model: real ? 'constant-impedance' : 'constant-power',
    origin: 'added',
    branches: [
      {
        from: c.from,
        to: c.to,
        vNominal: c.nominalV,
        sNominal: { re: 0, im: real ? -omega * c.capacitanceF * c.nominalV * c.nominalV : -1000 * c.handKvar },
        zip: real ? CONSTANT_IMPEDANCE : CONSTANT_POWER,
      },
    ],
  }));
}

const isNonZero = (z: ComplexValue | undefined): boolean => z !== undefined && (z.re !== 0 || z.im !== 0);

/** Does anything between the EMFs and the board's lines have impedance: a source of any kind, a feeder flat or per phase? */
const hasSupplyImpedance = (board: Board): boolean =>
  [board.sourceImpedance, board.lineImpedance, board.sourceStarImpedance, ...(board.sourceImpedances ?? []), ...(board.lineImpedances ?? [])].some(isNonZero);

/**
 * The board on the hand method's supply: nominal balanced EMFs behind no impedance at all. Every form
 * of source and feeder impedance is taken off — a bank's or an open delta's units (per phase, and the
 * open delta's corner), a star-point return, a feeder given per phase — so their drop is booked under
 * the board voltage, not under the line-pair share.
 */
function idealSupplyOf(board: Board, nominal: ReadonlyMap<PhaseId, ComplexValue>): Board {
  const { sourceImpedances: _units, sourceStarImpedance: _star, openDeltaCorner: _corner, lineImpedances: _lines, ...rest } = board;
  return { ...rest, emf: board.phases.map((p) => nominal.get(p)!), sourceImpedance: ZERO, lineImpedance: ZERO, neutralImpedance: ZERO };
}

/** The board file's phase labels (L1-L2 or A-B), for every sentence and name the check writes. */
const labelsOf = (board: Board): PhaseLabeller => labellerOf(conventionsOf(board).phaseNames);

const asConstantPower = (loads: readonly BoardLoad[]): BoardLoad[] => loads.map((l) => ({ ...l, branches: l.branches.map((b) => ({ ...b, zip: CONSTANT_POWER })) }));

interface Figures {
  readonly currentA: ReadonlyMap<PhaseId, number>;
  readonly pf: ReadonlyMap<PhaseId, number>;
  /** The angle φ of each line's power, atan(Q/|P|), degrees, lagging positive: it passes through unity without a turn. */
  readonly angleDeg: ReadonlyMap<PhaseId, number>;
  readonly neutralA: number | null;
  readonly boardPf: number;
}

/** φ = atan(Q/|P|) in degrees, lagging positive; 0 where no power flows. */
const powerAngleDeg = (kW: number, kvar: number): number => (kW === 0 && kvar === 0 ? 0 : (Math.atan2(kvar, Math.abs(kW)) * 180) / Math.PI);

/** A PF that is lagging on one side and leading on the other: its difference is told by the angle, not by the PF. */
const crossesUnity = (a: PowerFactorSense, b: PowerFactorSense): boolean => (a === 'lagging' && b === 'leading') || (a === 'leading' && b === 'lagging');

const figuresOf = (r: BoardResult): Figures => ({
  currentA: new Map(r.phases.map((p) => [p.phase, p.current.magnitude])),
  // A line with no current has no PF (null); hand methods take an idle line as unity.
  pf: new Map(r.phases.map((p) => [p.phase, p.pf ?? 1])),
  angleDeg: new Map(r.phases.map((p) => [p.phase, powerAngleDeg(p.kW, p.kvar)])),
  neutralA: r.neutral && !r.board.neutralOpen ? r.neutral.current.magnitude : null,
  // A board with no power at all: 1, as the textbook working takes it (textbookWorking.ts).
  boardPf: r.powerFactor.vector.pf ?? 1,
});

function contribution(effect: HandEffectId, explanation: string, from: Figures, to: Figures, board: Board): EffectContribution {
  return {
    effect,
    title: EFFECT_TITLES[effect],
    explanation,
    lines: board.phases.map((phase) => ({
      phase,
      currentA: to.currentA.get(phase)! - from.currentA.get(phase)!,
      pf: to.pf.get(phase)! - from.pf.get(phase)!,
      angleDeg: to.angleDeg.get(phase)! - from.angleDeg.get(phase)!,
    })),
    neutralA: to.neutralA !== null && from.neutralA !== null ? to.neutralA - from.neutralA : null,
    boardPf: to.boardPf - from.boardPf,
  };
}

/**
 * The board with the hand figures' capacitors connected as what they are (capacitances), ready to solve
 * or to draw against the board without them.
 * @throws {InputError} for figures that are not valid for the board
 */
export function addHandCapacitors(board: Board, figures: unknown): Board {
  assertBoardModel(board);
  const plans = planCapacitors(parseHandFigures(figures, board), board);
  return { ...board, loads: [...board.loads, ...capacitorLoads(plans, board, true)] };
}

/** A reading that leads by more than the printed PF shows (a lead at 1.000 is round-off, as every table reads it). */
const leadsVisibly = (r: Pick<PowerReading, 'pf' | 'sense'>): boolean => r.sense === 'leading' && r.pf !== null && r.pf.toFixed(3) !== '1.000';

/** True when `after` leads more than `before` did, as printed (PF to 3 decimals): both leading. */
const leadsMore = (after: number, before: number): boolean => +after.toFixed(3) < +before.toFixed(3);

/** One line's reactive power as the textbook split counts it, kvar, and the line-pair branches on it. */
interface LineBalance {
  readonly loadKvar: number;
  /** By hand, at nominal voltage (the textbook split). */
  readonly capacitorKvar: number;
  /** The same capacitors at the voltage each sees as solved, split alike. */
  readonly solvedCapacitorKvar: number;
  readonly pairs: readonly PhaseLabel[];
}

/**
 * The lines, and the board, your capacitors leave leading: over-correction the figures alone would not
 * say. A reading that already led without the capacitors (a line a line-to-line load makes lead) is
 * worded against that state, as the correction study words it: the capacitors did not cause it. A line
 * that leads only now is over-corrected where its capacitors give it more than its loads draw (the
 * textbook split, as the working table shows it); where they give it less, its lead is the 30° shift of
 * the line-pair branches on it, and the warning says that instead.
 */
function leadingWarnings(
  solved: BoardResult,
  board: PowerReading,
  before: { readonly lines: readonly PowerReading[]; readonly board: PowerReading },
  capacitorKvar: number,
  loadKvar: number,
  label: PhaseLabeller,
  acrossLines: (phase: PhaseId) => boolean,
  balance: (phase: PhaseId) => LineBalance,
): BoardWarning[] {
  const lines = solved.phases.flatMap((p, k): BoardWarning[] => {
    if (!leadsVisibly(p)) return [];
    const b = before.lines[k]!;
    const own = balance(p.phase);
    const overCorrected = own.capacitorKvar > own.loadKvar;
    const message = !leadsVisibly(b)
      ? overCorrected
        ? handCheckWarningWords.leadingLine(label(p.phase), p.pf!, own.capacitorKvar, own.loadKvar, own.pairs.length > 0, own.solvedCapacitorKvar)
        : own.solvedCapacitorKvar > own.loadKvar
          ? handCheckWarningWords.leadingLineVoltage(label(p.phase), p.pf!, own.solvedCapacitorKvar, own.capacitorKvar, own.loadKvar)
          : own.pairs.length > 0
            ? handCheckWarningWords.leadingLineShare(label(p.phase), p.pf!, own.capacitorKvar, own.loadKvar, own.pairs)
            : handCheckWarningWords.leadingLineOther(label(p.phase), p.pf!, own.solvedCapacitorKvar, own.loadKvar)
      : leadsMore(p.pf!, b.pf!)
        ? handCheckWarningWords.leadingLineMore(label(p.phase), p.pf!, b.pf!)
        : handCheckWarningWords.leadingLineBefore(label(p.phase), p.pf!, b.pf!, acrossLines(p.phase));
    return [{ code: 'hand-line-leading', message, value: p.pf!, threshold: 1 }];
  });
  const ledBefore = leadsVisibly(before.board) && !leadsMore(board.pf!, before.board.pf!);
  const whole: BoardWarning[] = leadsVisibly(board)
    ? [{ code: 'hand-board-leading', message: ledBefore ? handCheckWarningWords.leadingBoardBefore(board.pf!, before.board.pf!) : handCheckWarningWords.leadingBoard(board.pf!, capacitorKvar, loadKvar), value: board.pf!, threshold: 1 }]
    : [];
  return [...lines, ...whole];
}

const compared = (yours: number | null | undefined, textbook: number, solved: number): Compared => ({ yours: yours ?? null, textbook, solved, difference: solved - textbook });

/**
 * Checks hand figures on a board.
 * @param board a normalised board (`normaliseBoard(parseBoard(file))`)
 * @param figures the hand figures (see `handFiguresSchema`), validated here
 * @throws {InputError} for figures that are not valid for the board (each issue names its field path)
 * @throws {NumericalError} if a solve fails
 * @example
 * const check = checkHandFigures(board, { capacitors: [{ branch: 'A-B', kvar: 10 }], expected: { pf: 0.95 } });
 * check.effects.map((e) => e.effect) //=> ['line-pair-split', 'board-voltage', 'neutral-return', 'capacitor-voltage', 'voltage-dependent-loads']
 */
export function checkHandFigures(board: Board, figures: unknown): HandCheckResult {
  assertBoardModel(board);
  const spec = parseHandFigures(figures, board);
  const plans = planCapacitors(spec, board);
  const targetPf = spec.targetPf ?? null;
  const hand = textbookWorking(board, plans.map((p) => ({ branch: p.spec.branch, handKvar: p.handKvar })), targetPf);

  const solve = (b: Board) => solveBoardModel({ ...b, studies: { openNeutral: false } }, { openNeutral: false });
  const handCaps = capacitorLoads(plans, board, false);
  const realCaps = capacitorLoads(plans, board, true);
  const cpLoads = asConstantPower(board.loads);
  const nominal = nominalPhaseVoltages(board);
  const ideal: Board = { ...idealSupplyOf(board, nominal), loads: [...cpLoads, ...handCaps] };
  const withDrop: Board = { ...board, neutralImpedance: ZERO, loads: [...cpLoads, ...handCaps] };
  const withNeutral: Board = { ...board, loads: [...cpLoads, ...handCaps] };
  const withCapLaw: Board = { ...board, loads: [...cpLoads, ...realCaps] };
  const actual: Board = { ...board, loads: [...board.loads, ...realCaps] };
  const results = [ideal, withDrop, withNeutral, withCapLaw, actual].map(solve);
  const rNeutral = results[2]!;
  const rActual = results[4]!;
  // The board as it is, without the capacitors: a line that led already is not their doing.
  const rBefore = solve(board);

  const textbookFigures: Figures = {
    currentA: new Map(hand.phases.map((p) => [p.phase, p.currentAfterA])),
    pf: new Map(hand.phases.map((p) => [p.phase, p.pfAfter])),
    angleDeg: new Map(hand.phases.map((p) => [p.phase, powerAngleDeg(p.kW, p.kvarAfter)])),
    neutralA: rActual.neutral && !board.neutralOpen ? hand.neutralA : null,
    boardPf: hand.boardPf,
  };

  const added = rActual.loads.filter((l) => l.origin === 'added');
  const capacitors: HandCapacitor[] = plans.map((p, k) => {
    const br = added[k]!.branches[0]!;
    return { branch: p.spec.branch, handKvar: p.handKvar, capacitanceUF: p.capacitanceF * 1e6, nominalV: p.nominalV, appliedV: br.voltage.magnitude, kvarAtAppliedV: -br.kvar };
  });

  // Numbers for the explanations.
  const pairLoads = board.loads.flatMap((l) => l.branches).filter((b) => b.to !== 'N' && !String(b.to).startsWith('star:'));
  const pairCapKvar = plans.filter((p) => p.to !== 'N').reduce((s, p) => s + p.handKvar, 0);
  const volts = rActual.phases.map((p) => p.voltagePercent);
  const unbalancedSource = board.emf.some((e, k) => Math.abs(e.re - nominal.get(board.phases[k]!)!.re) + Math.abs(e.im - nominal.get(board.phases[k]!)!.im) > 1e-9);
  const hasDrop = hasSupplyImpedance(board) || unbalancedSource;
  const rated = board.loads.flatMap((l) => l.branches).reduce((s, b) => ({ re: s.re + b.sNominal.re, im: s.im + b.sNominal.im }), ZERO);
  const boardLoads = rActual.loads.filter((l) => l.origin === 'board');
  const solvedKW = boardLoads.reduce((s, l) => s + l.kW, 0);
  const solvedKvar = boardLoads.reduce((s, l) => s + l.kvar, 0);
  const allConstantPower = board.loads.every((l) => l.branches.every((b) => b.zip.p === 1));
  const ratedNotes = plans
    .filter((p) => p.spec.ratedV !== undefined && Math.abs(p.spec.ratedV - p.nominalV) > 1e-9)
    .map((p) => effectExplanation.ratedNote(labelsOf(board)(p.spec.branch), p.spec.ratedV!, p.nominalV))
    .join('');
  const neutralBar = rNeutral.neutral?.barVoltage?.magnitude ?? 0;

  const f = [textbookFigures, ...results.map(figuresOf)] as const;
  const effects: EffectContribution[] = [
    contribution('line-pair-split', effectExplanation.lineSplit(pairLoads.reduce((s, b) => s + b.sNominal.re, 0) / 1000, pairLoads.reduce((s, b) => s + b.sNominal.im, 0) / 1000, pairCapKvar, board.system === 'split-phase', labelsOf(board)), f[0], f[1]!, board),
    contribution('board-voltage', hasDrop ? effectExplanation.boardVoltage(Math.min(...volts), Math.max(...volts), unbalancedSource) : effectExplanation.noDrop, f[1]!, f[2]!, board),
    contribution('neutral-return', board.hasNeutral && !board.neutralOpen ? effectExplanation.neutralReturn(rActual.neutral?.current.magnitude ?? 0, rNeutral.neutral?.current.magnitude ?? 0, neutralBar, regionWords(conventionsOf(board).region, board.system, sourceModelOf(board)).sourceNeutralPoint, board.system === 'split-phase') : effectExplanation.noNeutral, f[2]!, f[3]!, board),
    contribution('capacitor-voltage', effectExplanation.capacitorVoltage(capacitors.reduce((s, c) => s + c.kvarAtAppliedV, 0), plans.reduce((s, p) => s + p.handKvar, 0), ratedNotes), f[3]!, f[4]!, board),
    contribution('voltage-dependent-loads', allConstantPower ? effectExplanation.allConstantPower : effectExplanation.voltageDependentLoads(solvedKW, solvedKvar, rated.re / 1000, rated.im / 1000), f[4]!, f[5]!, board),
  ];

  const expected = spec.expected;
  const lines: LineCheck[] = rActual.phases.map((p) => {
    const tb = hand.phases.find((h) => h.phase === p.phase)!;
    const mine = expected?.lines?.[p.phase];
    return {
      phase: p.phase,
      currentA: compared(mine?.currentA, tb.currentAfterA, p.current.magnitude),
      pf: compared(mine?.pf, tb.pfAfter, p.pf ?? 1),
      senseTextbook: tb.senseAfter,
      senseSolved: p.sense,
      angleDeg: compared(null, textbookFigures.angleDeg.get(p.phase)!, powerAngleDeg(p.kW, p.kvar)),
      crossesUnity: crossesUnity(tb.senseAfter, p.sense),
    };
  });
  const fa = figuresOf(rActual);
  const boardPower = {
    textbook: powerReading({ re: hand.phases.reduce((s, p) => s + p.kW, 0) * 1000, im: hand.phases.reduce((s, p) => s + p.kvarAfter, 0) * 1000 }),
    solved: powerReading({ re: rActual.phases.reduce((s, p) => s + p.kW, 0) * 1000, im: rActual.phases.reduce((s, p) => s + p.kvar, 0) * 1000 }),
  };
  const warnings = [
    ...leadingWarnings(rActual, boardPower.solved, { lines: rBefore.phases, board: powerReading({ re: rBefore.phases.reduce((s, p) => s + p.kW, 0) * 1000, im: rBefore.phases.reduce((s, p) => s + p.kvar, 0) * 1000 }) }, capacitors.reduce((s, c) => s + c.kvarAtAppliedV, 0), solvedKvar, labelsOf(board), (phase) => pairLoads.some((b) => b.from === phase || b.to === phase), (phase) => {
      const tb = hand.phases.find((h) => h.phase === phase)!;
      const pairs = [...new Set([...pairLoads.map((b) => `${b.from}-${b.to}`), ...plans.filter((c) => c.to !== 'N').map((c) => c.spec.branch)])].filter((pair) => pair.split('-').includes(phase));
      // A split-phase 240 V branch is in line with both half-windings: no 30° shift to name there.
      // The capacitors as solved, split as the textbook splits them: a line-to-neutral one whole, a line-pair one half.
      const solvedCapacitorKvar = capacitors.reduce((sum, c) => {
        const [from, to] = c.branch.split('-');
        return sum + (to === 'N' ? (from === phase ? c.kvarAtAppliedV : 0) : from === phase || to === phase ? c.kvarAtAppliedV / 2 : 0);
      }, 0);
      return { loadKvar: tb.kvarBefore, capacitorKvar: tb.capacitorKvar, solvedCapacitorKvar, pairs: board.system === 'split-phase' ? [] : pairs.map((pair) => labelsOf(board)(pair)) };
    }),
    ...rActual.warnings,
  ];
  const cautions = correctionCautions(regionWords(conventionsOf(board).region, board.system).groundWord);
  return {
    board: { name: board.name, system: board.system, nominalLineToNeutralV: board.nominalLineToNeutralV, frequencyHz: board.frequencyHz },
    phaseNames: conventionsOf(board).phaseNames,
    targetPf,
    capacitors,
    textbook: hand.phases,
    lines,
    neutralA: fa.neutralA !== null && textbookFigures.neutralA !== null ? compared(expected?.neutralA, textbookFigures.neutralA, fa.neutralA) : null,
    boardPf: compared(expected?.pf, hand.boardPf, fa.boardPf),
    boardPower,
    effects,
    warnings,
    operatingPoint: { collapsed: rActual.operatingPoint.collapsed, findings: rActual.operatingPoint.findings },
    cautions: [...cautions, ...rActual.cautions.filter((c) => !cautions.includes(c))],
  };
}

/**
 * `trivar correct` without an arrangement: every arrangement that fits the
 * board is sized, built and verified with the same study, set side by side,
 * and one is recommended with the reason in words.
 *
 * Recommendation rule (common practice, no source): first what meets the
 * target across the capacitance tolerance, then at nominal capacitance, then
 * nothing to do, and after all of those what meets the target but overloads a
 * conductor or the supply that was not overloaded without it; among those the least cost (the unit choice's cost, plus a
 * reactor at twice the cost of a capacitor of the same kvar); costs within 5 %
 * count as equal and the lower losses after correction decide. Where nothing
 * meets the target, the arrangement that comes closest is named, and why.
 * A supply resonance estimated near a harmonic order in a reachable step state does not rank: without
 * the board's harmonic currents it is a reason for a harmonic study (or a detuned bank), which the
 * verdict and the recommendation say, not for a dearer arrangement (hillside-workshop: a 96-unit
 * compensator had been recommended over an 11.7-unit delta bank for its estimate near the 11th). Where
 * the study has the board's spectra, the harmonic check's scan decides (correctWithHarmonicData).
 */
import type { Board } from '../board/boardModel.js';
import { InputError } from '../errors.js';
import type { Arrangement, CorrectionSpec } from './correctionSpec.js';
import { parseCorrectionSpec } from './validateCorrectionSpec.js';
import { arrangementsFor } from './correctionRules.js';
import { correctBoard } from './correctBoard.js';
import { reactorKvarOf } from './equipment.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import type { CorrectionReport, CorrectionStatus } from './correctionResult.js';
import { arrangementNames, comparisonWording } from './correctionWording.js';
import { balanceWorsening } from './balanceWorsening.js';
import { comparisonRiseWords } from './voltageRiseFlag.js';
import { assertViableBoard } from '../analysis/viableOperatingPoint.js';
import { assertBoardModel } from '../board/modelGuards.js';

/** One arrangement's outcome in figures a reader compares. */
export interface ArrangementFigures {
  readonly deliveredKvar: number;
  readonly nameplateKvar: number;
  readonly units: number;
  readonly switchedSteps: number;
  /** Reactor kvar the arrangement needs (balancing compensator only). */
  readonly reactorKvar: number;
  /** Lowest line PF after correction (null where no line carries current: there is no PF to read). */
  readonly lowestLinePf: number | null;
  /** The PF the target is defined on, after (null where not defined). */
  readonly targetPfAfter: number | null;
  readonly neutralCurrentA: number | null;
  readonly negativeSequencePercent: number | null;
  /** Losses after, kW: source and feeder of a main board; a sub-board's own feeder (BoardResult.losses). */
  readonly lossesKW: number;
  /** Cost figure used to rank (kvar-equivalents). */
  readonly cost: number;
  /** The steady voltage rise judged against the flag level, %, and whether it is above it (VoltageRise.judgedPercent, flagged): said beside the verdict, it does not rank. */
  readonly voltageRisePercent: number;
  readonly voltageRiseFlagged: boolean;
}

export interface ArrangementOutcome {
  readonly arrangement: Arrangement;
  /** Null when the study does not apply to this arrangement (see `notApplicable`). */
  readonly report: CorrectionReport | null;
  readonly figures: ArrangementFigures | null;
  /** Why the arrangement could not be studied with these settings. */
  readonly notApplicable: string | null;
}

export interface CorrectionComparison {
  readonly outcomes: readonly ArrangementOutcome[];
  /** Null only when no arrangement could be studied. */
  readonly recommended: Arrangement | null;
  /** True when the recommended arrangement meets the target (or there is nothing to do). */
  readonly meetsTarget: boolean;
  /** Why that one, in words. */
  readonly why: string;
  readonly rule: string;
}

/**
 * Settings that belong to one arrangement only are dropped for the others (also used by the harmonic comparison).
 * The target's definition is not one of them: every arrangement compared is judged on the one definition the
 * comparison's header states, the one given or the banks' default (per-line). Left to its own default the
 * compensator was judged on PF1+ beside banks judged line by line: two identical builds showed different
 * "PF after", and a compensator was recommended as meeting a per-line target its weakest line missed.
 */
export function specFor(spec: CorrectionSpec, arrangement: Arrangement): CorrectionSpec {
  const { starPoint, share, compensator, balance, target, ...rest } = spec;
  const out: Record<string, unknown> = { ...rest, arrangement };
  if (arrangement === 'star-bank' && starPoint !== undefined) out.starPoint = starPoint;
  if (arrangement !== 'balancing-compensator' && share !== undefined) out.share = share;
  if (arrangement === 'balancing-compensator') {
    if (compensator !== undefined) out.compensator = compensator;
    if (balance !== undefined) out.balance = balance;
  }
  // Per-phase targets go to the compensator too: it refuses them (it makes every line alike), so it is shown
  // as not applicable rather than judged on pf alone beside banks judged line by line.
  out.target = { ...target, definition: target?.definition ?? comparedDefinition(spec) };
  return out as CorrectionSpec;
}

/** The definition every arrangement of a comparison is judged on: the one given, else the banks' default. */
function comparedDefinition(spec: CorrectionSpec): NonNullable<NonNullable<CorrectionSpec['target']>['definition']> {
  return spec.target?.definition ?? CORRECTION_DEFAULTS.definition;
}

export function figuresOf(r: CorrectionReport): ArrangementFigures {
  const v = r.verification;
  const sel = r.selection;
  const reactorKvar = reactorKvarOf(v.equipment);
  // Judged where the target is measured (the board, or its metering point).
  const linePfs = (v.metering?.after ?? v.after).phases.flatMap((p) => (p.pf === null ? [] : [p.pf]));
  const lowest = linePfs.length === 0 ? null : Math.min(...linePfs);
  const def = r.target.definition;
  const pf = v.metering?.powerFactor ?? v.powerFactor;
  // No line current: no power factor of any definition to read (the board-wide ones default to 1 there).
  const targetPfAfter =
    lowest === null ? null : def === 'per-line' ? lowest : def === 'effective' ? (pf.effective?.after ?? null) : def === 'positive-sequence' ? (pf.positiveSequence?.after ?? null) : def === 'vector' ? (pf.vector?.after ?? null) : (pf.arithmetic?.after ?? null);
  return {
    deliveredKvar: sel?.deliveredKvar ?? 0,
    nameplateKvar: sel?.nameplateKvar ?? 0,
    units: sel?.units ?? 0,
    switchedSteps: sel?.steps.filter((s) => s.output !== null).length ?? 0,
    reactorKvar,
    lowestLinePf: lowest,
    targetPfAfter,
    neutralCurrentA: v.neutralCurrentA?.after ?? null,
    negativeSequencePercent: v.unbalance?.negativeSequenceCurrentPercent.after ?? null,
    lossesKW: v.after.losses.totalKW,
    cost: (sel?.cost.value ?? 0) + CORRECTION_DEFAULTS.reactorCostFactor * reactorKvar,
    voltageRisePercent: v.voltageRise.judgedPercent,
    voltageRiseFlagged: v.voltageRise.flagged,
  };
}

const STATUS_RANK: Record<CorrectionStatus, number> = {
  'meets-target': 0,
  'meets-target-at-nominal-capacitance': 1,
  'already-meets-target': 0,
  'misses-target-with-available-units': 2,
  infeasible: 3,
  'no-suitable-units': 4,
  // Nothing built: after any build that is made and misses, before an arrangement that cannot reach the target.
  'nothing-to-build': 2.5,
};

/** Where a build that meets the target but overloads a conductor or the supply ranks: after every one that meets it without, before a miss. */
const OVERLOAD_RANK = 1.5;

/**
 * Sizes, builds and verifies every arrangement that fits the board, and recommends one.
 * @param board a normalised board
 * @param spec the study without an arrangement (one given is ignored: all are compared)
 * @returns each arrangement's report and figures, the recommendation and why
 * @throws {InputError} for a study that is not valid for the board
 * @throws {NumericalError} reason `collapsed` when the supply cannot carry the board's loads as they are
 * @example
 * const c = compareCorrections(board, { target: { pf: 0.95 } });
 * c.recommended //=> 'delta-bank'
 * c.why         //=> 'delta bank: meets the target at the least cost …'
 */
export function compareCorrections(board: Board, spec: unknown): CorrectionComparison {
  assertBoardModel(board);
  const parsed = parseCorrectionSpec(spec, board);
  assertViableBoard(board);
  const outcomes = arrangementsFor(board).map((arrangement): ArrangementOutcome => {
    try {
      const report = correctBoard(board, specFor(parsed, arrangement));
      return { arrangement, report, figures: figuresOf(report), notApplicable: null };
    } catch (error) {
      if (error instanceof InputError) return { arrangement, report: null, figures: null, notApplicable: error.issues.map((i) => i.message).join('; ') };
      throw error;
    }
  });
  return { outcomes, ...recommendArrangement(outcomes) };
}

/**
 * The recommendation rule (see the top of this file) applied to outcomes as they are shown, with the
 * reason in words: also used where each outcome is a harmonic-checked variant, so the reason always
 * reads the figures beside it. `among` limits the candidates (all studied outcomes by default); the
 * reason still names every studied one.
 */
export function recommendArrangement(outcomes: readonly ArrangementOutcome[], among?: readonly Arrangement[]): Omit<CorrectionComparison, 'outcomes'> {
  const studied = outcomes.filter((o): o is ArrangementOutcome & { report: CorrectionReport; figures: ArrangementFigures } => o.report !== null && o.figures !== null);
  const candidates = among === undefined ? studied : studied.filter((o) => among.includes(o.arrangement));
  if (!candidates.length) return { recommended: null, meetsTarget: false, why: comparisonWording.noneStudied, rule: comparisonWording.rule };
  // Meeting the target while overloading what feeds the board ranks after every build that meets it without.
  const overloads = (o: (typeof studied)[number]) => o.report.verification.overloadsCaused.length > 0;
  // So does one whose supply resonance lies near a harmonic order in a state the controller can reach, as its warnings say.
  const resonates = (o: (typeof studied)[number]) => o.report.status.startsWith('meets') && o.report.verification.resonanceNearHarmonic;
  const rank = (o: (typeof studied)[number]) => {
    const r = STATUS_RANK[o.report.status];
    return r <= 1 && overloads(o) ? OVERLOAD_RANK + r / 10 : r;
  };
  const bestRank = Math.min(...candidates.map(rank));
  const pool = candidates.filter((o) => rank(o) === bestRank);
  const meetsTarget = bestRank < STATUS_RANK['misses-target-with-available-units'];
  const cheapest = Math.min(...pool.map((o) => o.figures.cost));
  // Meeting the target: least cost, then losses. Missing it: the one that comes closest.
  const closeness = (o: (typeof studied)[number]) => o.figures.targetPfAfter ?? -Infinity;
  const near = meetsTarget ? pool.filter((o) => o.figures.cost <= cheapest * 1.05 + 1e-9) : pool;
  const chosen = meetsTarget
    ? near.reduce((a, b) => (b.figures.lossesKW < a.figures.lossesKW - 1e-12 ? b : a))
    : near.reduce((a, b) => (closeness(b) > closeness(a) ? b : a));
  const others = studied.filter((o) => o !== chosen);
  const names = arrangementNames(chosen.report.verification.before.board.system, chosen.report.verification.before.conventions.region);
  const why = comparisonWording.why(
    names[chosen.arrangement],
    chosen.report.status,
    chosen.figures,
    others.map((o) => ({ name: names[o.arrangement], status: o.report.status, cost: o.figures.cost, lossesKW: o.figures.lossesKW, overloads: overloads(o), withheld: o.report.nothingToBuild?.withheldWords ?? null, resonates: resonates(o) })),
    meetsTarget && near.length > 1,
  );
  // A verdict never hides that an arrangement makes the balance notably worse (see balanceWorsening).
  const worse = [chosen, ...others].flatMap((o) => {
    // A neutral the arrangement overloads is said once, with the overloads below.
    const neutralOverloaded = o.report.verification.overloadsCaused.some((x) => x.code === 'neutral-over-rating');
    const changes = balanceWorsening(o.report.verification.before, o.report.verification.after).filter((c) => !(neutralOverloaded && c.code === 'neutral-worse'));
    return changes.length ? [comparisonWording.balanceWorse(names[o.arrangement], o === chosen, changes)] : [];
  });
  const overloaded = [chosen, ...others].flatMap((o) => (overloads(o) ? [comparisonWording.overloads(names[o.arrangement], o === chosen, o.report.verification.overloadsCaused.map((x) => x.message))] : []));
  // A board its own capacitors make lead is told to deal with them first (the warning solve gives it).
  const ownLead = chosen.report.verification.before.warnings.find((w) => w.code === 'line-leading');
  // Nothing to build: why, in the figures of each line's need, and what to do instead.
  const nothing = chosen.report.nothingToBuild;
  // The recommended build resonating near a harmonic order: none meets the target clear of one, and the verdict says it.
  const resonating = resonates(chosen) && !overloads(chosen) ? [comparisonWording.resonates(names[chosen.arrangement], candidates.filter((o) => o !== chosen && rank(o) <= 1 && !resonates(o)).map((o) => names[o.arrangement]))] : [];
  // Nor that a build raises the voltage above the flag level: each such arrangement with its figure, and what it means here.
  const rises = [chosen, ...others].filter((o) => o.figures.voltageRiseFlagged);
  const rise = rises.length
    ? [
        comparisonRiseWords(
          rises.map((o) => ({ name: names[o.arrangement], percent: o.figures.voltageRisePercent, recommended: o === chosen })),
          chosen.report.verification.voltageRise.flagLevelPercent,
          chosen.figures.voltageRiseFlagged ? (chosen.report.verification.voltageRise.flagReading?.words ?? null) : null,
        ),
      ]
    : [];
  const notes = [...(nothing ? [nothing.why, nothing.advice] : []), ...(ownLead ? [comparisonWording.ownCapacitorsLead(ownLead.message)] : []), ...resonating, ...overloaded, ...worse, ...rise];
  const whyAll = notes.length ? `${why}; ${notes.join('; ')}` : why;
  return { recommended: chosen.arrangement, meetsTarget, why: whyAll, rule: comparisonWording.rule };
}

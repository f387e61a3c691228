/**
 * The whole correction study in one call: validate the spec, size the
 * arrangement on the solved board, choose units, and re-solve the board with
 * the chosen bank to verify it. Each step is also a public function of its own
 * (`sizeStarBank` / `sizeDeltaBank` / `sizeBalancingCompensator`,
 * `selectBankUnits`, `verifyCorrection`).
 */
import type { Board, PhaseId } from '../board/boardModel.js';
import type { Arrangement, CorrectionSpec } from './correctionSpec.js';
import { InputError, inputIssue } from '../errors.js';
import { addCorrectionEquipment, kvarFromSusceptance, reactorKvarOf, type EquipmentGroup } from './equipment.js';
import { worstStepState } from './switchedStepStates.js';
import { meteringPlace, solveMeter } from './meteringPoint.js';
import { readTargetFigures } from '../analysis/analyseSolution.js';
import { solveNetwork } from '../network/solveNetwork.js';
import { parseCorrectionSpec } from './validateCorrectionSpec.js';
import { resolveTarget, TARGET_SLACK, widthlessTargetPf, type TargetCheck } from './correctionTarget.js';
import { judgeBalance } from './balanceTarget.js';
import { sizeStarBank } from './sizeStarBank.js';
import { sizeDeltaBank } from './sizeDeltaBank.js';
import { sizeBalancingCompensator } from './sizeBalancingCompensator.js';
import { defaultPractice, selectBankUnitsPreferring, type BuildPreference } from './selectBankUnits.js';
import { verifyCorrection, type VerifyCorrectionOptions } from './verifyCorrection.js';
import { scaleBoardLoads } from './scaleBoardLoads.js';
import type { BankSelection, BankSizing, BuildVerdict, CompensatorSizing, CorrectionReport, CorrectionStatus, CorrectionVerification, CorrectionWarning, FewerBranchesBuild, LineComparison, NothingToBuild, RoundingBesideReactors, SizedEquipment, WithheldBuild } from './correctionResult.js';
import { nothingToBuildOf, withheldBuildOf } from './nothingToBuild.js';
import { catalogueUnitOf, TYPICAL_CATALOGUES } from './unitCatalogues.js';
import type { TargetDefinition } from './correctionSpec.js';
import { withCtReading, type CtEndReading, type CtReading } from './controllerSettings.js';
import { arrangementNames, ctNeededClause, resonanceSummaryClause, correctionCautions, ctRatingWords, nothingToBuildCautions, exemptLeadingLines, exemptLeadingWords, infeasibleReason, lostNeutralCaution, lostNeutralUnequal, MODEL_CAUTION, meteringWarning, reportSummary, warningText } from './correctionWording.js';
import { definedOnly } from './_internal/optionSchemas.js';
import { assertViableBoard } from '../analysis/viableOperatingPoint.js';
import { CORRECTION_DEFAULTS, toleranceFractions } from './correctionDefaults.js';
import { refitReactors, selectionWithResizedReactors, type RefitOutcome } from './_internal/refitReactors.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { labellerOf, type PhaseLabeller } from '../board/conventions/phaseNames.js';
import { regionWords, starWordOf } from '../board/conventions/regionWords.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { judgedNominalOf } from '../board/nominalVoltages.js';
import { emptyBelowKvar } from './_internal/branchReadings.js';
import { riseFlagRider } from './voltageRiseFlag.js';

/** @param use `limitsOnly` for the light-load sizing, read only for its limits (see ResolvedBankOptions) */
function sizeArrangement(board: Board, spec: CorrectionSpec & { arrangement: Arrangement }, use: { limitsOnly?: boolean; heldBranches?: readonly string[] } = {}): BankSizing | CompensatorSizing {
  // A bank's rounding windows hold across the tolerance its units are chosen for (selectBankUnits).
  const bankUse = { ...(use.limitsOnly ? { limitsOnly: true } : {}), capacitanceTolerance: toleranceFractions(spec.capacitanceTolerance) };
  switch (spec.arrangement) {
    case 'star-bank':
      return sizeStarBank(board, definedOnly({ target: spec.target, starPoint: spec.starPoint, share: spec.share }), bankUse);
    case 'delta-bank':
      return sizeDeltaBank(board, definedOnly({ target: spec.target, share: spec.share }), bankUse);
    case 'balancing-compensator':
      return sizeBalancingCompensator(
        board,
        definedOnly({
          target: spec.target,
          branches: spec.compensator?.branches,
          reactors: spec.compensator?.reactors,
          weights: spec.compensator?.weights,
          balance: spec.balance,
        }),
        // The light-load sizing only gives limits: no search for fewer branches there.
        { fewerBranches: !use.limitsOnly, ...(use.heldBranches ? { heldBranches: use.heldBranches } : {}) },
      );
  }
}

/** Verdicts of a build from units, best first. */
const BUILD_VERDICT_RANK: Readonly<Record<BuildVerdict, number>> = { meets: 0, 'meets-at-nominal': 1, misses: 2, withheld: 3, 'no-units': 4 };

/** How the withheld-build wording names the PF a target is defined on. */
const DEFINITION_WORDS: Readonly<Record<TargetDefinition, string>> = {
  'per-line': 'lowest line PF',
  effective: 'effective PF (IEEE 1459)',
  vector: 'vector PF',
  arithmetic: 'arithmetic PF',
  'positive-sequence': 'positive-sequence PF',
};

/**
 * The re-solve's warnings of a limit a build passes beside the target, what makes one of two candidate builds
 * worse: a line leading at light load, an overload the bank causes. Not the voltage-rise flag: a cheaper
 * build a tenth of a per cent past it is no reason to buy three times the units (the warning stays); the
 * capacitor voltage is held by the units' rating (selectBankUnits: ≥ the highest solved voltage / 1.10).
 */
const LIMIT_WARNINGS: ReadonlySet<string> = new Set(['light-load-leading', 'overload-caused']);

/** The steps of a selection as bought: two selections with the same are one build. */
const stepsBought = (s: BankSelection) => JSON.stringify(s.steps.map((st) => [st.part, st.branches, st.unit.name, st.units, st.output === null]));

/** Star-point shift above this fraction of the line-to-neutral voltage is worth a warning (common practice, no source). */
const STAR_SHIFT_WARNING = 0.1;

function starPointWarnings(sizing: BankSizing | CompensatorSizing, board: Board): CorrectionWarning[] {
  if (sizing.arrangement === 'balancing-compensator' || !sizing.starPointShift) return [];
  const shift = sizing.starPointShift.magnitude;
  const ln = board.nominalLineToNeutralV;
  if (shift <= STAR_SHIFT_WARNING * ln) return [];
  const volts = sizing.branches.map((b) => b.appliedV);
  return [
    {
      code: 'star-point-shift',
      message: warningText.starPointShift(shift, (100 * shift) / ln, Math.min(...volts), Math.max(...volts), starWordOf(conventionsOf(board).region)),
      path: 'starPoint',
      value: shift,
      threshold: STAR_SHIFT_WARNING * ln,
    },
  ];
}

/**
 * A floating star point of line-to-neutral capacitors warned above this share of the line-to-neutral
 * voltage across one of them: IEC practice rates units 10 % above the voltage they see
 * (CORRECTION_DEFAULTS.voltageMarginPercent), so past it a unit runs above its rating.
 */
const FLOATING_BANK_WARNING = 1.1;

/**
 * What the broken-neutral study says of capacitors from a line to the neutral, said of the equipment:
 * a caution wherever it puts capacitors line to neutral on a board with more than one line (a star
 * bank tied to the neutral, a compensator's line-to-neutral branches), and a warning where those
 * branches are unequal enough that the bank's own star point, with the neutral lost and no load on the
 * board, puts more than FLOATING_BANK_WARNING × the line-to-neutral voltage across one of them
 * (Millman: V_star = Σ B_k·V_k / Σ B_k over the branches, V_k the solved phase voltages). On a
 * single-phase board a lost neutral only takes the supply away.
 */
function lostNeutralNotes(board: Board, what: string, v: CorrectionVerification, selection: BankSelection | null, label: PhaseLabeller): { caution: string | null; warning: CorrectionWarning | null } {
  const none = { caution: null, warning: null };
  if (!board.hasNeutral || board.phases.length < 2) return none;
  const empty = emptyBelowKvar(v.branches.reduce((sum, b) => sum + Math.abs(b.kvarAtAppliedV), 0));
  const tied = v.branches.filter((b) => b.branch.endsWith('-N') && b.element !== 'none' && Math.abs(b.kvarAtAppliedV) >= empty);
  const capacitors = tied.filter((b) => b.element === 'capacitor');
  if (capacitors.length === 0) return none;
  const words = regionWords(conventionsOf(board).region, board.system);
  // Each branch's nameplate as the units table lists it (a three-phase step's shared over its branches); the
  // sized output at nominal voltage where no units were chosen.
  const steps = selection?.steps ?? [];
  const plate = (branch: string) => steps.reduce((sum, st) => sum + (st.branches.includes(branch) ? st.nameplateKvar / st.branches.length : 0), 0);
  const basis = steps.length ? 'nameplate' : 'at nominal voltage';
  const named = capacitors.map((b) => ({ branch: label(b.branch), kvar: steps.length ? plate(b.branch) : b.kvarAtNominalV }));
  const caution = lostNeutralCaution(what, named, basis, words.phasesWord, words.starWord);
  // With reactors among them the floating point can sit in series resonance: no single figure; the caution says it.
  if (tied.some((b) => b.element === 'reactor')) return { caution, warning: null };
  const phaseOf = (branch: string) => v.after.phases.find((p) => `${p.phase}-N` === branch)!;
  const total = tied.reduce((sum, b) => sum + b.susceptanceS, 0);
  const star = tied.reduce((acc, b) => {
    const u = phaseOf(b.branch).voltage;
    return { re: acc.re + (b.susceptanceS * u.re) / total, im: acc.im + (b.susceptanceS * u.im) / total };
  }, { re: 0, im: 0 });
  const across = tied.map((b) => {
    const u = phaseOf(b.branch).voltage;
    return { b, volts: Math.hypot(u.re - star.re, u.im - star.im) };
  });
  const worst = across.reduce((m, x) => (x.volts > m.volts ? x : m));
  const ln = judgedNominalOf(board).ln;
  if (worst.volts <= FLOATING_BANK_WARNING * ln) return { caution, warning: null };
  // The unit's rating across the branch: a single-phase unit's own, a three-phase (star) unit's element at U_r/√3.
  const ratings = (selection?.steps ?? []).filter((s) => s.branches.includes(worst.b.branch)).map((s) => (s.unit.kind === 'single-phase' ? s.unit.ratedV : s.unit.ratedV / Math.sqrt(3)));
  const figures = { branch: label(worst.b.branch), volts: worst.volts, lineToNeutralV: ln, ratedV: ratings.length ? Math.min(...ratings) : null };
  const between = words.phasesWord === 'leg' ? 'a line-to-line bank' : `a delta or floating-${words.starWord} bank`;
  return {
    caution,
    warning: { code: 'lost-neutral-unequal-bank', message: lostNeutralUnequal(what, named, basis, figures, words.starWord, between), path: null, value: worst.volts, threshold: FLOATING_BANK_WARNING * ln },
  };
}

/** What gets built: a bank's sizing, or a compensator's capacitor-only solution. */
const buildable = (sizing: BankSizing | CompensatorSizing): SizedEquipment =>
  sizing.arrangement === 'balancing-compensator' ? (sizing.recommended === 'ideal' ? sizing.ideal : sizing.capacitorOnly) : sizing;

/**
 * The reactors of the equipment as built, for the one-line summary. A branch the sizing reads as empty
 * (a re-fit's last bits where the answer is zero) is no reactor, as in the branch tables; nor is one
 * that would print as 0.00 kvar: nobody builds it.
 */
function reactorWords(equipment: readonly EquipmentGroup[], label: PhaseLabeller): string {
  const branches = equipment.flatMap((g) => g.branches);
  const kvarOf = (b: (typeof branches)[number]) => Math.abs(kvarFromSusceptance(b.susceptanceS, b.vNominal));
  const empty = Math.max(emptyBelowKvar(branches.reduce((sum, b) => sum + kvarOf(b), 0)), 0.005);
  const reactors = branches.filter((b) => b.susceptanceS < 0 && kvarOf(b) >= empty);
  return reactors.length ? `, with ${reactors.map((b) => `a ${kvarOf(b).toFixed(2)} kvar reactor on ${label(b.branch)}`).join(' and ')}` : '';
}

/**
 * Sizes, selects and verifies power-factor correction for a board.
 * @param board a normalised board (`normaliseBoard(parseBoard(file))`)
 * @param spec the study, validated here (see `correctionSpecSchema`)
 * @returns a JSON-serialisable report: status and reasons, the continuous
 *   sizing, the chosen units, the verified before/after results (with the
 *   corrected `Board`), warnings and cautions
 * @throws {InputError} for a spec that is not valid for the board (each issue names its field path)
 * @throws {NumericalError} if a solve fails, or (reason `collapsed`) when the supply cannot carry
 *   the board's loads as they are: equipment sized for that state would be sized for a state that cannot exist
 * @example
 * const report = correctBoard(board, { arrangement: 'star-bank', target: { pf: 0.95 }, lightLoad: { fraction: 0.3 } });
 * report.status //=> 'meets-target'
 * report.verification.board // the corrected board, for another simulator
 */
export function correctBoard(board: Board, spec: unknown): CorrectionReport {
  return correctBoardBuilt(board, spec, { detunedSteps: false });
}

/**
 * `correctBoard` with how the bank is built (not exported from the package): `detunedSteps` where the
 * catalogue holds the fundamental equivalents of capacitors behind detuning reactors (correctWithHarmonics.ts),
 * so each switched step has its own reactor and the stricter least step applies (leastSwitchedStep.ts).
 */
export function correctBoardBuilt(board: Board, spec: unknown, construction: { readonly detunedSteps: boolean }): CorrectionReport {
  assertBoardModel(board);
  const checked = parseCorrectionSpec(spec, board);
  if (checked.arrangement === undefined)
    throw new InputError(
      [inputIssue('missing', 'arrangement', 'star-bank, delta-bank or balancing-compensator (compareCorrections sizes and compares them all)', undefined)],
      'the correction settings are not valid',
    );
  assertViableBoard(board);
  const parsed = { ...checked, arrangement: checked.arrangement };
  // Sentences name phases and branches the way the board file does (L1-L2 or A-B); data keys stay A/B/C.
  const { phaseNames, region } = conventionsOf(board);
  const label = labellerOf(phaseNames);
  const target = resolveTarget(parsed.target, board, parsed.arrangement);
  const sizing = sizeArrangement(board, parsed);
  const asSized = buildable(sizing);
  const needsUnits = sizing.status !== 'already-meets-target' && asSized.branches.some((b) => b.element === 'capacitor');
  const scaled = parsed.lightLoad ? scaleBoardLoads(board, parsed.lightLoad) : null;
  // The light-load sizing a build's limits come from, once per set of branches held out (both roundings share one).
  const lightSizings = new Map<string, SizedEquipment>();
  const lightSizedFor = (heldBranches: readonly string[] | undefined): SizedEquipment | undefined => {
    if (!scaled) return undefined;
    const key = (heldBranches ?? []).join(' ');
    let light = lightSizings.get(key);
    if (!light) lightSizings.set(key, (light = buildable(sizeArrangement(scaled, parsed, { limitsOnly: true, ...(heldBranches ? { heldBranches } : {}) }))));
    return light;
  };
  // Measured away from the board, the controller's CT reads there: the selection chooses it, and the least
  // step on it, on the largest line current there before correction (set again on the verified build).
  const meterForCt = meteringPlace(board, target.measuredAt);
  const meterCurrentA = meterForCt ? Math.max(0, ...solveMeter(board, meterForCt).phases.map((p) => p.current.magnitude)) : undefined;
  /** `nameHeldBack`: search again without the least step where the build fits worse, to name the step held back (only where the verdict needs it). */
  const selectUnits = (sized: SizedEquipment, how: { heldBranches?: readonly string[]; besideReactors?: 'up' } = {}, preference: BuildPreference = 'least-cost', nameHeldBack = false): BankSelection =>
    selectBankUnitsPreferring(
      sized,
      definedOnly({
        practice: parsed.practice ?? defaultPractice(board.frequencyHz),
        catalogue: parsed.catalogue,
        minStepKvar: parsed.bank?.minStepKvar,
        lineCurrentA: meterCurrentA,
        detunedSteps: construction.detunedSteps,
        trimSteps: parsed.bank?.trimSteps,
        maxUnitsPerBranch: parsed.bank?.maxUnitsPerBranch,
        controller: parsed.controller,
        target: parsed.target,
        capacitanceTolerance: parsed.capacitanceTolerance,
        voltageMarginPercent: parsed.voltageMarginPercent,
        deliveryFloorPercent: parsed.deliveryFloorPercent,
        lightLoad: lightSizedFor(how.heldBranches),
        phaseNames,
        region,
        besideReactors: how.besideReactors,
      }),
      preference,
      nameHeldBack,
    );
  const verifyOptions = (equipment: VerifyCorrectionOptions['equipment'], steps?: VerifyCorrectionOptions['steps']): VerifyCorrectionOptions =>
    definedOnly({
      equipment,
      steps,
      target: parsed.target,
      arrangement: parsed.arrangement,
      lightLoad: parsed.lightLoad,
      capacitanceTolerance: parsed.capacitanceTolerance,
      voltageRiseLimitPercent: parsed.voltageRiseLimitPercent,
    });
  /** A build from units, its reactors sized again around the capacitors as built where it has them, re-solved. */
  interface Build {
    readonly sized: SizedEquipment;
    readonly selection: BankSelection | null;
    readonly refit: RefitOutcome | null;
    readonly recommended: readonly EquipmentGroup[];
    readonly verification: CorrectionVerification;
    readonly verdict: BuildVerdict;
    /** The unit choice's cost plus the reactors' (as compareCorrections counts them); null when no units fit. */
    readonly cost: number | null;
    /** A cheaper build the re-solve proved worse and this one replaced, said in the warnings. */
    readonly passedOver?: CorrectionWarning;
    /** Verdict `withheld`: what the build would have done, why it is not offered. */
    readonly withheld: WithheldBuild | null;
    /** The same selection made again naming the step the least step held back (LeastSwitchedStep.heldBack). */
    readonly heldBackOf?: () => BankSelection['leastStep']['heldBack'];
  }
  const buildOf = (sized: SizedEquipment, selection: BankSelection | null): Build => {
    // Built with reactors, a compensator gets its reactors sized again beside the capacitors as built
    // (units round capacitors; the reactors were sized beside exact ones), and keeps them if that helps.
    const refit =
      selection && !selection.unbuildable && sizing.arrangement === 'balancing-compensator' && sizing.recommended === 'ideal'
        ? refitReactors(board, selection.equipment, {
            target: sizing.target,
            balance: sizing.balance,
            includeZeroSequence: sizing.branchesUsed === 'delta-and-star',
            weights: sizing.weights,
            maxIterations: CORRECTION_DEFAULTS.maxIterations,
          })
        : null;
    const recommended = sizing.status === 'already-meets-target' ? [] : refit?.used ? refit.equipment : (selection?.equipment ?? sized.equipment);
    // The steps as built, so the resonance is judged in every state the controller can reach.
    const verification = verifyCorrection(board, verifyOptions(recommended, selection && !selection.unbuildable && recommended.length ? selection.steps : undefined));
    const judged: BuildVerdict = selection?.unbuildable
      ? 'no-units'
      : !verification.check.met || (sizing.arrangement === 'balancing-compensator' && !judgeBalance(verification.after, sizing.balance).met)
      ? 'misses'
      : !verification.tolerance.low.check.met || verification.tolerance.high.check.leadingLines.length > 0
      ? 'meets-at-nominal'
      : 'meets';
    const reactorKvar = reactorKvarOf(recommended);
    // A compensator's reactors balance what its capacitors correct: with no capacitor built, they are not built either.
    const reactorsAlone = sizing.arrangement === 'balancing-compensator' && selection !== null && !selection.unbuildable && selection.units === 0 && reactorKvar >= 0.005;
    const withheld =
      judged === 'no-units' ? null : withheldBuildOf(verification, target.definition, { missesTarget: judged === 'misses', reactorsAlone, capacitorKvar: capacitorKvarOf(recommended), reactorKvar });
    const verdict: BuildVerdict = withheld ? 'withheld' : judged;
    const cost = selection?.unbuildable ? null : (selection?.cost.value ?? 0) + CORRECTION_DEFAULTS.reactorCostFactor * reactorKvar;
    return { sized, selection, refit, recommended, verification, verdict, cost, withheld };
  };
  const limitsBroken = (b: Build) => b.verification.warnings.filter((w) => LIMIT_WARNINGS.has(w.code)).length;
  /**
   * The build from units, proved by re-solving. Two candidates: the unit choice's least-cost build and,
   * where it differs, its equal-steps one (BuildPreference). The windows they are chosen in are
   * first-order, so the re-solve ranks them: verdict, then the limits it shows passed, then cost (a tie
   * to the least-cost build). The second is chosen and re-solved only where the first falls short.
   */
  const provenBuildOf = (sized: SizedEquipment, how: { heldBranches?: readonly string[]; besideReactors?: 'up' } = {}): Build => {
    const cheapest = { ...buildOf(sized, selectUnits(sized, how)), heldBackOf: () => selectUnits(sized, how, 'least-cost', true).leastStep.heldBack };
    // Proved: it meets the target across the tolerance and passes no limit; the second is for a build that does not.
    if (cheapest.verdict === 'meets' && limitsBroken(cheapest) === 0) return cheapest;
    const alternative = selectUnits(sized, how, 'equal-steps');
    const cheapestSelection = cheapest.selection!;
    if (stepsBought(alternative) === stepsBought(cheapestSelection)) return cheapest;
    const equalSteps = { ...buildOf(sized, alternative), heldBackOf: () => selectUnits(sized, how, 'equal-steps', true).leastStep.heldBack };
    const rank = (b: Build) => [BUILD_VERDICT_RANK[b.verdict], limitsBroken(b), b.cost ?? Infinity];
    const [a, c] = [rank(equalSteps), rank(cheapest)];
    const wins = a[0]! !== c[0]! ? a[0]! < c[0]! : a[1]! !== c[1]! ? a[1]! < c[1]! : a[2]! < c[2]!;
    if (!wins) return cheapest;
    if (cheapest.cost === null || equalSteps.cost === null || cheapest.cost >= equalSteps.cost) return equalSteps;
    // Kept on a better verdict, or on a limit the cheaper one passes (the one the kept build does not, else its first).
    const limits = cheapest.verification.warnings.filter((w) => LIMIT_WARNINGS.has(w.code));
    const passed = limits.find((w) => !equalSteps.verification.warnings.some((x) => x.code === w.code)) ?? limits[0];
    const why = cheapest.verdict === equalSteps.verdict && passed ? { limit: passed.message } : { verdict: cheapest.verdict === 'meets' ? ('misses' as const) : cheapest.verdict };
    const equalOnly = alternative.steps.every((st) => st.part !== 'trim');
    const message = warningText.cheaperBuildPassedOver(cheapestSelection.units, cheapestSelection.cost.value, why, alternative.units, alternative.cost.value, equalOnly);
    return { ...equalSteps, passedOver: { code: 'cheaper-build-passed-over', message, path: null, value: cheapestSelection.cost.value, threshold: null } };
  };
  /** True when `a` is the build to keep over `b`: a better verdict, else no higher cost. */
  const keeps = (a: Build, b: Build): boolean =>
    BUILD_VERDICT_RANK[a.verdict] < BUILD_VERDICT_RANK[b.verdict] || (a.verdict === b.verdict && a.cost !== null && b.cost !== null && a.cost <= b.cost);
  const { build: chosen, fewerBranchesBuild, roundingBesideReactors } = chooseBuild();
  /**
   * The build from units. Two compensators have a second build to weigh, kept when it re-solves to a
   * better verdict or the same at no higher cost: a capacitor-only compensator that also works on fewer
   * branches (units round differently on different branches, so fewer can cost more), and one with
   * reactors, whose capacitors are rounded down to their requirement (the reactors as sized then
   * balance them) or, where that build does not meet the target across the tolerance, up (the reactors
   * sized again around them; rounded down, the PF falls short).
   */
  function chooseBuild(): { build: Build; fewerBranchesBuild: FewerBranchesBuild | null; roundingBesideReactors: RoundingBesideReactors | null } {
    if (!needsUnits) return { build: buildOf(asSized, null), fewerBranchesBuild: null, roundingBesideReactors: null };
    const base = provenBuildOf(asSized);
    if (sizing.arrangement !== 'balancing-compensator') return { build: base, fewerBranchesBuild: null, roundingBesideReactors: null };
    const fewer = sizing.recommended === 'capacitor-only' ? sizing.fewerBranches : null;
    if (fewer) {
      const onFewer = provenBuildOf(fewer.solution, { heldBranches: fewer.spared.map((b) => b.branch) });
      const used = keeps(onFewer, base);
      return {
        build: used ? onFewer : base,
        fewerBranchesBuild: { used, cost: onFewer.cost, costOnEveryBranch: base.cost, verdict: onFewer.verdict, verdictOnEveryBranch: base.verdict },
        roundingBesideReactors: null,
      };
    }
    // Rounding up is for a build that rounding down leaves short: one that meets across the tolerance is kept.
    if (sizing.recommended === 'ideal' && asSized.branches.some((b) => b.element === 'reactor') && base.verdict !== 'meets') {
      const up = provenBuildOf(asSized, { besideReactors: 'up' });
      const used = keeps(up, base) && !(up.verdict === base.verdict && up.cost === base.cost);
      return {
        build: used ? up : base,
        fewerBranchesBuild: null,
        roundingBesideReactors: { used: used ? 'up' : 'down', verdictDown: base.verdict, verdictUp: up.verdict, costDown: base.cost, costUp: up.cost },
      };
    }
    return { build: base, fewerBranchesBuild: null, roundingBesideReactors: null };
  }
  // Nothing to build: a build that made things worse (withheld), or a best build from units of nothing at
  // all where exact capacitors would meet the target (the need is below what a unit or step can give).
  // A build short of the target because the least switched step held a step back (the CT's resolution) is not
  // "nothing to build": the step and the CT are what to change, and the report names them (stepHeldBack).
  const heldBackStep = chosen.verdict !== 'meets' && chosen.heldBackOf ? chosen.heldBackOf() : null;
  const nothingCase =
    sizing.status !== 'already-meets-target' &&
    !chosen.selection?.unbuildable &&
    (chosen.verdict === 'withheld' || (sizing.status === 'meets-target' && chosen.verdict === 'misses' && nothingBuilt(chosen.recommended) && heldBackStep === null));
  const { sized, refit } = chosen;
  const selection = nothingCase ? null : chosen.selection;
  const recommended = nothingCase ? [] : chosen.recommended;
  // The board as it stands is what a study with nothing to build verifies: no "after" of equipment not offered.
  const verification = nothingCase ? verifyCorrection(board, verifyOptions([])) : chosen.verification;
  const useRefit = refit !== null && refit.used && !nothingCase;
  const asBuilt = useRefit && selection ? selectionWithResizedReactors(selection, refit, verification.branches) : selection;
  // The controller's CT goes where it reads (where the target is measured, else the equipment's board) and
  // carries the largest current there: before, with every step in, or in the worst state of the switched
  // steps (a fixed reactor with the capacitors out, trim steps apart): chosen and checked on the build as verified.
  // Capacitors are made to a tolerance: the CT is sized at the end that draws more where it reads, each end solved
  // (with load current there, more capacitance can mean less current: the high end is not always the worse).
  const meter = meterForCt;
  const endReading = (capacitanceFactor: number): CtEndReading => {
    // Only the line figures are read (readTargetFigures), not the whole analysis: a few solves per build.
    const solveAt = (equipment: readonly EquipmentGroup[]) => {
      const equipped = addCorrectionEquipment(board, equipment, { capacitanceFactor });
      const atBoard = readTargetFigures(solveNetwork(equipped));
      return { atBoard, atCt: meter ? solveMeter(equipped, meter, {}, readTargetFigures) : atBoard };
    };
    const all = solveAt(verification.equipment);
    const worst = worstStepState({
      steps: asBuilt!.steps,
      equipment: verification.equipment,
      equipped: all.atBoard,
      atCt: all.atCt,
      frequencyHz: board.frequencyHz,
      capacitanceFactor,
      solveAtCt: (equipment) => solveAt(equipment).atCt,
    });
    return { capacitanceFactor, afterA: Math.max(0, ...all.atCt.phases.map((p) => p.current.magnitude)), stepState: worst && { ...worst, lineLabel: label(worst.phase) } };
  };
  const toleranceEnds = asBuilt && asBuilt.controller ? { low: endReading(verification.tolerance.low.capacitanceFactor), high: endReading(verification.tolerance.high.capacitanceFactor) } : null;
  const ctReading: CtReading = verification.metering
    ? { place: 'metering-point', point: verification.metering.point, lines: verification.metering.lines, afterFrom: 'as-built', toleranceEnds }
    : { place: 'board', point: board.name, lines: verification.lines, afterFrom: 'as-built', toleranceEnds };
  const withCt = asBuilt && withCtReading(asBuilt, ctReading, parsed.controller ?? {});
  // Short of the target across the tolerance: the step the least step held back, where one would have fitted, is named.
  const heldBack = withCt ? heldBackStep : null;
  const built = withCt && heldBack ? { ...withCt, leastStep: { ...withCt.leastStep, heldBack } } : withCt;
  const resizedWords = (r: NonNullable<typeof refit>['reactors']) => r.map((x) => ({ ...x, branch: label(x.branch) }));
  const resizing = refit ? { reactors: refit.reactors, objectiveSized: refit.objectiveSized, objectiveResized: refit.objectiveResized, converged: refit.converged, used: useRefit, solves: refit.solves } : null;
  const idealVerification = sizing.arrangement === 'balancing-compensator' ? verifyCorrection(board, verifyOptions(sizing.ideal.equipment)) : null;

  const balance = sizing.arrangement === 'balancing-compensator' && !nothingCase ? judgeBalance(verification.after, sizing.balance) : null;
  let status: CorrectionStatus;
  const reasons = [...sizing.reasons];
  let nothingToBuild: NothingToBuild | null = null;
  if (sizing.status === 'already-meets-target') status = 'already-meets-target';
  else if (nothingCase) {
    status = 'nothing-to-build';
    const practice = parsed.practice ?? defaultPractice(board.frequencyHz);
    nothingToBuild = nothingToBuildOf({
      before: verification.before,
      pfTargetOf: (phase) => target.lines.find((l) => l.phase === phase)?.minPf ?? target.pf,
      definitionWords: DEFINITION_WORDS[target.definition],
      minStepKvar: parsed.bank?.minStepKvar ?? CORRECTION_DEFAULTS.minStepKvar,
      selection: chosen.selection,
      sized,
      units: parsed.catalogue ? parsed.catalogue.map(catalogueUnitOf) : TYPICAL_CATALOGUES[practice].units,
      withheld: chosen.withheld,
      label,
    });
    reasons.push(nothingToBuild.why);
  }
  else if (sizing.status === 'infeasible') status = 'infeasible';
  else if (selection?.unbuildable) {
    status = 'no-suitable-units';
    reasons.push(selection.unbuildable.message);
  } else if (chosen.verdict === 'misses') {
    status = 'misses-target-with-available-units';
    reasons.push(infeasibleReason.unitsMissTarget([...verification.check.shortfalls, ...(balance?.shortfalls ?? [])]));
    // A build with a step below the least would have fitted: said beside the shortfall, with its figures.
    if (built?.leastStep.heldBack) reasons.push(heldBackWords(built.leastStep, label));
    const pinned = widthlessTargetPf(target);
    if (pinned !== null) reasons.push(infeasibleReason.widthlessTarget(pinned, target.leading === 'allowed'));
    // Rounded down beside the reactors (kept at their continuous values the capacitors may not pass their
    // requirement: the balance would tip), the small net compensation shrinks; rounded up did no better.
    const reactorKvar = sized.branches.reduce((sum, b) => sum + (b.element === 'reactor' ? -b.kvarAtAppliedV : 0), 0);
    if (selection && reactorKvar > 0 && roundingBesideReactors?.used !== 'up') {
      const idealCapKvar = sized.branches.reduce((sum, b) => sum + (b.element === 'capacitor' ? b.kvarAtAppliedV : 0), 0);
      if (selection.deliveredKvar < idealCapKvar)
        reasons.push(
          infeasibleReason.capacitorsRoundedDownBesideReactors(
            selection.deliveredKvar,
            idealCapKvar,
            reactorKvar,
            resizing && { used: resizing.used, reactors: resizedWords(resizing.reactors) },
            roundingBesideReactors?.verdictUp ?? null,
          ),
        );
    }
  } else if (nothingBuilt(recommended)) {
    // The sizing found every branch empty: the board meets the target as it is, and that is the verdict
    // (the one a comparison gives), not "meets the target with 0.00 kvar" and cautions for a bank not added.
    status = 'already-meets-target';
  } else status = chosen.verdict === 'meets-at-nominal' ? 'meets-target-at-nominal-capacitance' : 'meets-target';
  // "A line that already led may not lead more" is meant for the one line a line-to-line load makes
  // lead; where every judged line led before (other banks in service, an over-sized fixed bank) and
  // one is still short of its minimum, capacitors cannot help, and a met target would contradict the
  // PF printed beside it.
  const overCompensated = sizing.arrangement !== 'balancing-compensator' && (status === 'meets-target' || status === 'meets-target-at-nominal-capacitance' || status === 'already-meets-target') ? leadingShortLines(verification.check) : [];
  if (overCompensated.length) {
    status = 'infeasible';
    reasons.push(infeasibleReason.alreadyLeading(overCompensated.map(label)));
  }

  // Branch-level guesses of the selection give way to the re-solved verdict: a
  // branch "short of its share" does not matter when the board meets the target
  // (at nominal capacitance too: the tolerance ends have their own warnings).
  const settledByVerdict = new Set(
    status === 'meets-target' ? ['units-below-target', 'tolerance-window', 'units-past-limit'] : status === 'meets-target-at-nominal-capacitance' ? ['units-below-target'] : [],
  );
  const what = arrangementNames(board.system, conventionsOf(board).region)[parsed.arrangement];
  const lostNeutral = status === 'already-meets-target' ? { caution: null, warning: null } : lostNeutralNotes(board, what, verification, built, label);
  const warnings: CorrectionWarning[] = nothingCase ? [] : [
    ...(status === 'already-meets-target' ? [{ code: 'nothing-to-do', message: warningText.alreadyMet, path: 'target', value: null, threshold: null }] : []),
    ...(lostNeutral.warning ? [lostNeutral.warning] : []),
    ...starPointWarnings(sizing, board),
    ...(sizing.arrangement === 'balancing-compensator' ? sizing.warnings : []),
    ...(built?.warnings ?? []).filter((w) => !settledByVerdict.has(w.code)),
    ...(chosen.passedOver ? [chosen.passedOver] : []),
    // Met at nominal capacitance only where a smaller step would have fitted the ranges: said beside it (a miss says it in the reasons).
    ...(status === 'meets-target-at-nominal-capacitance' && built?.leastStep.heldBack ? [heldBackWarning(built.leastStep, label)] : []),
    ...(resizing?.used ? [{ code: 'reactors-resized', message: warningText.reactorsResized(resizedWords(resizing.reactors)), path: null, value: null, threshold: null }] : []),
    ...verification.warnings,
    ...(verification.metering && built?.controller
      ? [{ code: 'controller-reads-elsewhere', message: meteringWarning(verification.metering.point, board.name, built.controller.ctChosen, largestLineCurrents(verification.lines)), path: 'target.measuredAt', value: null, threshold: null }]
      : []),
  ];
  const delivered = selection?.deliveredKvar ?? 0;
  const nameplate = selection?.nameplateKvar ?? 0;
  return {
    arrangement: parsed.arrangement,
    status,
    summary:
      (status === 'already-meets-target' || status === 'nothing-to-build'
        ? reportSummary[status](what)
        : status === 'no-suitable-units'
          ? reportSummary[status](what, delivered, nameplate, (selection?.unbuildable?.branches ?? []).map(label))
          : reportSummary[status](what, delivered, nameplate)) +
      reactorWords(recommended, label) +
      // A line that led before is held to another rule than the target as written: the verdict says which and why.
      (status.startsWith('meets') ? exemptWords(verification, label) : '') +
      // Meeting the PF target says nothing of what the equipment overloads: the summary says it beside the verdict.
      (verification.overloadsCaused.length ? `; but with it in, ${verification.overloadsCaused.map((o) => o.message).join('; ')}` : '') +
      // Nor of a supply resonance near a harmonic order in a state the controller can reach.
      (status.startsWith('meets') ? resonanceSummaryClause(verification, verification.overloadsCaused.length ? 'and' : 'but') : '') +
      // Nor with the CT given, where it is below the current it must carry: met with the CT it needs.
      (status.startsWith('meets') && built?.controller?.ctNeeded ? ctNeededClause(built.controller) : '') +
      // Nor does it say what the rise does: above the flag level the verdict carries the flag beside it.
      riseFlagRider(verification.voltageRise, 'see the warnings'),
    reasons,
    target,
    sizing,
    selection: built,
    verification,
    idealVerification,
    balance,
    reactorResizing: resizing,
    fewerBranchesBuild,
    roundingBesideReactors,
    nothingToBuild,
    warnings,
    // Nothing to install: the capacitor cautions (discharge, inrush, resonance) are for equipment being added;
    // with nothing to build, the discharge caution stays for a capacitor added at the equipment, as advised.
    cautions:
      status === 'already-meets-target'
        ? [MODEL_CAUTION]
        : status === 'nothing-to-build'
        ? nothingToBuildCautions(regionWords(conventionsOf(board).region, board.system).groundWord)
        : [...(lostNeutral.caution ? [lostNeutral.caution] : []), ...correctionCautions(regionWords(conventionsOf(board).region, board.system).groundWord)],
  };
}

/** A step below the least that would have fitted the capacitance ranges, in words with its figures. */
function heldBackWords(least: BankSelection['leastStep'], label: PhaseLabeller): string {
  const held = least.heldBack!;
  return infeasibleReason.stepHeldBack({ ...held, branches: held.branches.map(label) }, { responseThresholdA: least.responseThresholdA, ct: ctRatingWords(least.ctPrimaryA, least.ctSecondaryA), detuned: least.detuned });
}

function heldBackWarning(least: BankSelection['leastStep'], label: PhaseLabeller): CorrectionWarning {
  return { code: 'step-held-back', message: heldBackWords(least, label), path: null, value: least.heldBack!.responseThresholdA, threshold: least.responseThresholdA };
}

/** The largest line current before and after, A. */
function largestLineCurrents(lines: readonly LineComparison[]): { before: number; after: number } {
  return { before: Math.max(0, ...lines.map((l) => l.currentA.before)), after: Math.max(0, ...lines.map((l) => l.currentA.after)) };
}

/** The lines held only to lead no more than before (they led before correction), for the verdict; '' when none. */
function exemptWords(v: CorrectionVerification, label: PhaseLabeller): string {
  // The figures the target was judged on: the metering point's where it is measured elsewhere.
  const judgedLines = v.metering?.lines ?? v.lines;
  const lines = exemptLeadingLines(v.check).map((p) => {
    const line = judgedLines.find((l) => l.phase === p)!;
    return { line: label(p), pfBefore: line.pf.before, pfAfter: line.pf.after };
  });
  return lines.length ? `; ${exemptLeadingWords(lines)}` : '';
}

/** Capacitor kvar of equipment at nominal voltage. */
const capacitorKvarOf = (groups: readonly EquipmentGroup[]): number =>
  groups.flatMap((g) => g.branches).reduce((sum, b) => sum + (b.susceptanceS > 0 ? kvarFromSusceptance(b.susceptanceS, b.vNominal) : 0), 0);

/** True when the equipment as built has no element worth building (every branch read as empty, as the branch tables read it). */
function nothingBuilt(equipment: readonly EquipmentGroup[]): boolean {
  const branches = equipment.flatMap((g) => g.branches);
  const kvarOf = (b: (typeof branches)[number]) => Math.abs(kvarFromSusceptance(b.susceptanceS, b.vNominal));
  const empty = emptyBelowKvar(branches.reduce((sum, b) => sum + kvarOf(b), 0));
  return branches.every((b) => kvarOf(b) < empty);
}

/** Lines short of their minimum PF on a board whose every judged line led before correction; empty otherwise. */
function leadingShortLines(check: TargetCheck): PhaseId[] {
  const judged = check.lines.filter((l) => l.loaded);
  if (judged.length === 0 || !judged.every((l) => check.leadingBefore.includes(l.phase))) return [];
  const minimum = (l: (typeof judged)[number]) => l.minPf ?? check.board?.minPf ?? 1;
  return judged.filter((l) => l.pf !== null && l.pf < minimum(l) * (1 - TARGET_SLACK)).map((l) => l.phase);
}

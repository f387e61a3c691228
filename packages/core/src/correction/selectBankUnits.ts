/**
 * From continuous ratings to hardware: the bank as it is bought and installed.
 *
 * The branches of a bank form sets: the three branches of a delta or star bank
 * are one three-phase set; a lone branch (split-phase, single-phase board) is a
 * set of its own. A three-phase set gets equal three-phase steps (three-phase
 * units in a delta bank, one single-phase unit per branch in a star bank) and,
 * where the board is unbalanced, optional single-phase trim steps on single
 * branches; a lone branch gets single-phase units. Work is done in capacitance,
 * which does not depend on the voltage (C = Q_r/(2π·f_r·V_r²) per element).
 *
 * Rules, per branch:
 * - rating ≥ (1 + margin) × nominal voltage across the unit (margin by practice)
 *   and the highest solved voltage ≤ 110 % of rating (IEEE 18 / IEC 60831-1);
 * - a unit delivers at least the delivery floor of its nameplate at the nominal voltage across it (on a
 *   floating star, at its solved voltage);
 * - the design state (everything on at the design load) reaches C_req/(1 − tol⁻)
 *   and stays ≤ C_limit/(1 + tol⁺) (see `tierOf` for the order of compromises);
 * - the fixed part stays within what the light load can take at +tol;
 * - at most the controller's outputs; no switched step below the least step (its nameplate below
 *   `minStepKvar`, or its C/k below a share of the CT secondary, stricter for detuned steps:
 *   leastSwitchedStep.ts), and a step series no wider than about 1:10 where a build fits as well.
 * Among builds that fit equally well, the least cost = nameplate kvar + a fixed
 * kvar-equivalent per unit (weights in `CORRECTION_DEFAULTS`), then the fewest units, and only
 * then the build that sits most centrally in its windows (see bankSearch.ts). The study
 * (correctBoard.ts) re-solves the build chosen, and the equal-steps one where that falls short.
 */
import * as z from 'zod';
import { CONTROLLER_OUTPUTS, PRACTICES, capacitorUnitSchema, type CapacitanceToleranceSpec, type CapacitorUnitSpec, type ControllerSpec, type Practice, type TargetSpec } from './correctionSpec.js';
import { CORRECTION_DEFAULTS, toleranceFractions } from './correctionDefaults.js';
import { TYPICAL_CATALOGUES, catalogueUnitOf, type CatalogueUnit } from './unitCatalogues.js';
import type { EquipmentBranch, EquipmentGroup } from './equipment.js';
import type { BankSelection, BankSizing, BankStep, BranchSelection, CorrectionWarning, LeastSwitchedStep, LineComparison, SelectedUnit, SizedEquipment, StepFloor, UnbuildableBranches } from './correctionResult.js';
import { limitWords, selectionWording, warningText } from './correctionWording.js';
import { parseOptions } from '../_internal/zodIssues.js';
import { labellerOf, PHASE_NAMINGS, type PhaseNaming } from '../board/conventions/phaseNames.js';
import { REGIONS, type Region } from '../board/conventions/region.js';
import { starWordOf } from '../board/conventions/regionWords.js';
import { cheapestStepUnits, firstFit, leastCostOverWindows, searchSet, shortOfTarget, switchedStepsOf, type Need, type SetBuild, type SetRules, type UnitChoice } from './_internal/bankSearch.js';
import { leastStepKvar, leastStepResponse, leastSwitchedStep, stepSeriesSpan, stepSeriesWarning } from './leastSwitchedStep.js';
import { defaultPractice } from './capacitorDischarge.js';
import { controllerSettings, controllerWarnings, ctBasisOf, resolveCurrentTransformer, responseThresholdA } from './controllerSettings.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';
import type { TargetCheck } from './correctionTarget.js';

export interface SelectBankUnitsOptions {
  /** Regional practice: typical catalogue, voltage margin, discharge time. @defaultValue 'north-american' at 60 Hz, 'iec' at 50 Hz */
  readonly practice?: Practice;
  /** Units to build from. @defaultValue the practice's built-in typical catalogue (`TYPICAL_CATALOGUES`) */
  readonly catalogue?: readonly CapacitorUnitSpec[];
  /** Smallest switched step, kvar nameplate (the least C/k on the CT applies as well). @defaultValue 1 */
  readonly minStepKvar?: number;
  /**
   * The units are the fundamental equivalents of capacitors behind detuning reactors, one reactor per
   * step: the stricter least step (leastSwitchedStep.ts). @defaultValue false
   */
  readonly detunedSteps?: boolean;
  /** Single-phase trim steps on unbalanced three-phase sets. @defaultValue 'auto' */
  readonly trimSteps?: 'auto' | 'none';
  /** Most units in one branch. @defaultValue 24 */
  readonly maxUnitsPerBranch?: number;
  /** The controller: outputs, CT, switching delay. @defaultValue 6 outputs, CT chosen from the line current, 30 s */
  readonly controller?: ControllerSpec;
  /** Target the controller holds (its band). @defaultValue `{ pf: 0.95 }` */
  readonly target?: TargetSpec;
  /** Largest line current where the CT reads, A, to choose it on or check it against. @defaultValue the larger of the before and after figures of the sizing's line comparison (the equipment's board); correctBoard checks the worst state of the switched steps as well, on the build it verified */
  readonly lineCurrentA?: number;
  /** Capacitance tolerance, %. @defaultValue `{ minusPercent: 5, plusPercent: 10 }` (IEC 60831-1, from memory) */
  readonly capacitanceTolerance?: CapacitanceToleranceSpec;
  /** Rated voltage above the nominal voltage across a unit, %. @defaultValue 10 (iec) or 0 (north-american) */
  readonly voltageMarginPercent?: number;
  /** Least share of its nameplate a unit must deliver at the nominal voltage across it, %. @defaultValue 65 */
  readonly deliveryFloorPercent?: number;
  /**
   * The same sizing run on the light-load board. Its limit (or value) per
   * branch caps the fixed part, and its voltages join the rating check.
   * @defaultValue none — no fixed part
   */
  readonly lightLoad?: SizedEquipment;
  /** How the board file names its phases: warnings name branches that way (data keys stay A/B/C). @defaultValue 'A/B/C' */
  readonly phaseNames?: PhaseNaming;
  /** The board's region: a floating star point is said in its words (a wye point in North America). @defaultValue 'iec' */
  readonly region?: Region;
  /**
   * Beside reactors: `down` keeps each capacitor at most at its requirement (the reactors as sized then
   * balance it), `up` allows the headroom a branch without a sized limit gets (the reactors are then
   * sized again around the capacitors as built: see refitReactors). @defaultValue 'down'
   */
  readonly besideReactors?: 'down' | 'up';
}

const selectOptionsSchema = z.strictObject({
  practice: z.enum(PRACTICES).optional(),
  catalogue: z.array(capacitorUnitSchema).min(1).optional(),
  minStepKvar: z.number().nonnegative().optional(),
  detunedSteps: z.boolean().optional(),
  trimSteps: z.enum(['auto', 'none']).optional(),
  maxUnitsPerBranch: z.int().min(1).max(200).optional(),
  controller: z
    .strictObject({
      outputs: z.literal(CONTROLLER_OUTPUTS).optional(),
      ctPrimaryA: z.number().positive().optional(),
      ctSecondaryA: z.literal([1, 5]).optional(),
      switchingDelayS: z.number().positive().max(3600).optional(),
    })
    .optional(),
  target: z.custom<TargetSpec>((v) => typeof v === 'object' && v !== null).optional(),
  lineCurrentA: z.number().nonnegative().optional(),
  capacitanceTolerance: z.strictObject({ minusPercent: z.number().min(0).max(50).optional(), plusPercent: z.number().min(0).max(50).optional() }).optional(),
  voltageMarginPercent: z.number().min(0).max(100).optional(),
  deliveryFloorPercent: z.number().min(0).max(100).optional(),
  lightLoad: z.custom<SizedEquipment>((v) => typeof v === 'object' && v !== null && Array.isArray((v as SizedEquipment).branches)).optional(),
  phaseNames: z.enum(PHASE_NAMINGS).optional(),
  region: z.enum(REGIONS).optional(),
  besideReactors: z.enum(['down', 'up']).optional(),
});

export { defaultPractice };

interface Usable {
  readonly unit: CatalogueUnit;
  readonly index: number | null;
}

/** Headroom over the requirement where the sizing knows no limit (common practice, no source). */
const NO_LIMIT_HEADROOM = 1.25;

const elementF = (u: CatalogueUnit) => ((u.kind === 'three-phase' ? u.ratedKvar / 3 : u.ratedKvar) * 1000) / (2 * Math.PI * u.ratedHz * u.ratedV ** 2);

/**
 * Chooses units, steps and controller settings for a sized bank or compensator.
 * Reactor branches are kept at their continuous value (not selected).
 * @param sized a `BankSizing` or a `CompensatorSolution`
 * @returns the steps as built (fixed part, balanced and trim steps, each with its
 *   units, nameplate and delivered kvar and C/k), controller settings, per branch
 *   the design and fixed capacitance against its window, nameplate and delivered
 *   totals, what was minimised, and the bank as equipment for `verifyCorrection`.
 *   Branches no unit fits are listed in `unbuildable` (and left empty).
 * @throws {InputError} for options that are not valid (field path in each issue)
 * @example
 * const selection = selectBankUnits(sizeDeltaBank(board, { target: { pf: 0.95 } }));
 * selection.steps.map((s) => s.nameplateKvar) //=> e.g. [10, 10, 10] (three equal three-phase steps)
 * selection.controller?.responseThresholdA    //=> C/k of the smallest step, A
 */
export function selectBankUnits(sized: SizedEquipment, options?: SelectBankUnitsOptions): BankSelection {
  return selectBankUnitsPreferring(sized, options, 'least-cost', true);
}

/**
 * Which builds the unit choice prefers before cost: `least-cost` ranks every build that fits as
 * well by cost (equal steps, trims or both); `equal-steps` keeps equal steps — an ordinary
 * controller reading one CT — wherever one fits every branch's window, trims only where none does,
 * and the narrowest windows that a build fits whole. The study re-solves both and keeps the better.
 */
export type BuildPreference = 'least-cost' | 'equal-steps';

/**
 * `selectBankUnits` with the preference given (the study's candidates; not exported from the package).
 * `nameHeldBack`: where a set's build fits worse than one with a step below the least would, search
 * again without the least step to name that step (`leastStep.heldBack`); the study asks only where its
 * verdict falls short, as the second search costs as much as the first.
 */
export function selectBankUnitsPreferring(sized: SizedEquipment, options: SelectBankUnitsOptions | undefined, preference: BuildPreference, nameHeldBack = false): BankSelection {
  checkObjectArgument(sized, 'sized', 'a sizing from sizeStarBank, sizeDeltaBank or sizeBalancingCompensator', ['frequencyHz', 'branches', 'equipment']);
  const opts = parseOptions(selectOptionsSchema, options, 'selectBankUnits options');
  const practice = opts.practice ?? defaultPractice(sized.frequencyHz);
  const typical = opts.catalogue === undefined;
  const label = labellerOf(opts.phaseNames ?? 'A/B/C');
  const catalogueTitle = typical ? TYPICAL_CATALOGUES[practice].title : 'catalogue given in the correction';
  const all: Usable[] = typical ? TYPICAL_CATALOGUES[practice].units.map((unit) => ({ unit, index: null })) : opts.catalogue!.map((u, index) => ({ unit: catalogueUnitOf(u, index), index }));
  const { minus, plus } = toleranceFractions(opts.capacitanceTolerance);
  const margin = (opts.voltageMarginPercent ?? CORRECTION_DEFAULTS.voltageMarginPercent[practice]) / 100;
  const floor = (opts.deliveryFloorPercent ?? CORRECTION_DEFAULTS.deliveryFloorPercent) / 100;
  const limitV = CORRECTION_DEFAULTS.continuousVoltageLimit;
  const controllerSpec = opts.controller ?? {};
  const outputs = controllerSpec.outputs ?? CORRECTION_DEFAULTS.controllerOutputs;
  const minStepKvar = opts.minStepKvar ?? CORRECTION_DEFAULTS.minStepKvar;
  const maxUnits = opts.maxUnitsPerBranch ?? CORRECTION_DEFAULTS.maxUnitsPerBranch;
  const unitCostKvar = CORRECTION_DEFAULTS.unitCostKvar;
  const hz = sized.frequencyHz;
  const omega = 2 * Math.PI * hz;
  const warnings: CorrectionWarning[] = [];
  const warn = (code: string, message: string, path: string | null = null, value: number | null = null, threshold: number | null = null) =>
    warnings.push({ code, message, path, value, threshold });

  // Per branch: the window and the voltage rule.
  const slots = sized.equipment.flatMap((g) => g.branches);
  // The board has three lines where any slot touches C: a three-phase board's equipment always spans its
  // three lines (a delta bank lists A-B, B-C and C-A even where one is empty); a split-phase board has A and B.
  const threePhaseLines = slots.some((s) => s.from === 'C' || s.to === 'C');
  // Alone, a selection knows only the equipment's board and the continuous sizing's after state:
  // correctBoard chooses the CT again on the build it verified and where the controller reads (withCtReading).
  const ctBasis = ctBasisOf(opts.lineCurrentA !== undefined ? { givenA: opts.lineCurrentA } : { place: 'board', point: null, lines: sizedLines(sized), afterFrom: 'as-sized' });
  const ct = resolveCurrentTransformer(controllerSpec, ctBasis.currentA);
  const detuned = opts.detunedSteps ?? false;
  // The least step on this CT; each set's floors in capacitance come from it (`leastStepFOf`).
  const leastOnCt = (kinds: readonly Pick<StepFloor, 'kind' | 'voltageV'>[]) => leastSwitchedStep({ ct, detuned, minStepKvar, kinds });
  const leastResponseA = leastStepResponse(ct.secondaryA, detuned).responseThresholdA;
  // Units are rated for the system's voltage: 277 V on a 480Y/277 board, though its model holds 277.1 V.
  const ratedAt = (slot: { vNominal: number; ratedV?: number }) => slot.ratedV ?? slot.vNominal;
  // Beside reactors kept at their continuous value a capacitor may not grow past its requirement (the
  // balance would tip and lines lead); beside reactors sized again, and elsewhere, a quarter more is allowed.
  const headroom = sized.branches.some((b) => b.element === 'reactor') && opts.besideReactors !== 'up' ? 1 : NO_LIMIT_HEADROOM;
  // Windows that hold together, where the sizing found them for this tolerance (sizeBank.ts): every
  // branch rounded inside its own keeps every line on target and within its bound.
  const rounding = (sized as { roundingWindows?: BankSizing['roundingWindows'] }).roundingWindows ?? null;
  const together = rounding && Math.abs(rounding.tolerance.minus - minus) < 1e-12 && Math.abs(rounding.tolerance.plus - plus) < 1e-12 ? rounding : null;
  /** A branch's need inside one set of windows that hold together (kvar at nominal voltage to F). */
  const heldTogether = (info: { need: Need; slot: { vNominal: number }; capacitor: boolean }, w: { lowKvar: readonly number[]; highKvar: readonly number[] }, i: number): Need => {
    // A branch the sizing left empty is held empty in the windows (roundingWindows.ts): no unit may go there.
    if (!info.capacitor) return info.need.maxF === null ? info.need : { nominalF: 0, minF: 0, maxF: 0, limitF: 0, fixedMaxF: 0 };
    const toF = (kvar: number) => (kvar * 1000) / (omega * info.slot.vNominal ** 2);
    const lowF = toF(w.lowKvar[i]!);
    const highF = toF(w.highKvar[i]!);
    return { nominalF: lowF * (1 - minus), minF: lowF, maxF: highF, limitF: highF * (1 + plus), fixedMaxF: Math.min(info.need.fixedMaxF, lowF) };
  };
  const branchInfo = sized.branches.map((b, i) => {
    const slot = slots[i]!;
    const light = opts.lightLoad?.branches[i];
    const highestVoltageV = Math.max(b.appliedV, light?.appliedV ?? 0);
    const requiredRatedV = Math.max((1 + margin) * ratedAt(slot), highestVoltageV / limitV);
    const capacitor = b.element === 'capacitor';
    const requiredF = capacitor ? b.susceptanceS / omega : 0;
    const minF = requiredF / (1 - minus);
    // Where the sizing gives no upper limit (the capacitor-only compensator), a branch takes at
    // most a quarter more than it needs and an empty branch nothing: past that its lines lead.
    const limitF =
      b.element === 'reactor' ? null : b.limitSusceptanceS !== null ? Math.max(b.limitSusceptanceS, 0) / omega : capacitor ? headroom * requiredF : 0;
    const maxF = limitF === null ? null : limitF / (1 + plus);
    const lightLimit = light ? Math.max(0, light.limitSusceptanceS ?? light.susceptanceS) : 0;
    const fixedMaxF = Math.min(lightLimit / omega / (1 + plus), minF);
    const need: Need = { nominalF: requiredF, minF, maxF, limitF, fixedMaxF };
    // Where the delivery floor is judged: the nominal voltage across the unit, as the rating is chosen for
    // the system (a board a few per cent low would otherwise refuse the usual rating, 280 V units on 230 V,
    // for a sag); on a floating star, the solved voltage, as its star point moves with the bank itself.
    const floorV = slot.to === 'star' ? b.appliedV : ratedAt(slot);
    return { b, slot, highestVoltageV, requiredRatedV, need, capacitor, floorV };
  });

  // Sets: a three-branch group is one three-phase set, anything else one set per branch.
  let offset = 0;
  const sets = sized.equipment.flatMap((g) => {
    const indices = g.branches.map((_, k) => offset + k);
    offset += g.branches.length;
    if (g.branches.length === 3) return [{ group: g, indices }];
    return indices.map((i) => ({ group: g, indices: [i] }));
  });
  const activeSets = sets.filter((s) => s.indices.some((i) => branchInfo[i]!.capacitor));
  const outputsPerSet = Math.max(1, Math.floor(outputs / Math.max(1, activeSets.length)));

  const fits = (u: CatalogueUnit, indices: readonly number[]) =>
    indices.every((i) => {
      const info = branchInfo[i]!;
      const delivered = (info.floorV / u.ratedV) ** 2 * (hz / u.ratedHz);
      return u.ratedV >= info.requiredRatedV * (1 - 1e-12) && delivered >= floor - 1e-12;
    });
  const choiceOf = (usable: Usable, unitsPerCount: number): UnitChoice => ({ unit: usable.unit, index: usable.index, elementF: elementF(usable.unit), unitsPerCount });
  /**
   * How a step on these branches reads on the controller (as `makeStep` states it), and its kvar at
   * nominal voltage and C/k per farad on each branch: C/k and kvar are linear in the capacitance.
   */
  const stepReading = (indices: readonly number[]) => {
    const slot = branchInfo[indices[0]!]!.slot;
    const lineToLine = slot.to === 'N' || slot.to === 'star' ? slot.vNominal * Math.sqrt(3) : slot.vNominal;
    const basis: StepFloor['kind'] = indices.length === 3 ? 'three-phase' : slot.to !== 'N' && slot.to !== 'star' && threePhaseLines ? 'line-pair' : 'single-phase';
    const voltageV = basis === 'single-phase' ? slot.vNominal : lineToLine;
    const kvarPerF = indices.reduce((sum, i) => sum + (omega * ratedAt(branchInfo[i]!.slot) ** 2) / 1000, 0);
    return { basis, voltageV, kvarPerF, ckPerF: responseThresholdA(kvarPerF, basis, voltageV, ct.primaryA / ct.secondaryA) };
  };
  /** The least switched step's capacitance per branch for a step read as `reading`, F (the larger of C/k and, detuned, the least kvar). */
  const leastStepFOf = (reading: ReturnType<typeof stepReading>) => leastStepKvar(leastResponseA, reading.basis, reading.voltageV, ct.primaryA / ct.secondaryA, detuned) / reading.kvarPerF;
  /** Kinds of step the bank may have, for the least step's words (each once). */
  const stepKinds: Pick<StepFloor, 'kind' | 'voltageV'>[] = [];
  const addKind = (r: ReturnType<typeof stepReading>) => {
    if (!stepKinds.some((k) => k.kind === r.basis && Math.abs(k.voltageV - r.voltageV) < 1e-6)) stepKinds.push({ kind: r.basis, voltageV: r.voltageV });
  };
  let heldBack: LeastSwitchedStep['heldBack'] = null;

  // An equal bank's own window, where the sizing found it (per-line targets on a three-phase bank).
  const equal = (sized as { equalShare?: { minKvar: number | null; limitKvar: number } | null }).equalShare ?? null;
  const lightEqual = (opts.lightLoad as { equalShare?: { minKvar: number | null; limitKvar: number } | null } | undefined)?.equalShare ?? null;
  const equalNeedsOf = (indices: readonly number[]): Need[] | undefined => {
    if (!equal || equal.minKvar === null) return undefined;
    return indices.map((i) => {
      const v = branchInfo[i]!.slot.vNominal;
      const toF = (kvar: number) => (kvar * 1000) / (omega * v * v);
      const nominalF = toF(equal.minKvar!);
      const minF = nominalF / (1 - minus);
      const limitF = toF(equal.limitKvar);
      const fixedMaxF = lightEqual ? Math.min(toF(lightEqual.limitKvar) / (1 + plus), minF) : branchInfo[i]!.need.fixedMaxF;
      return { nominalF, minF, maxF: limitF / (1 + plus), limitF, fixedMaxF };
    });
  };
  const usedNeed: Need[] = branchInfo.map((x) => x.need);
  const designF = sized.branches.map(() => 0);
  const fixedF = sized.branches.map(() => 0);
  const builds: { set: (typeof sets)[number]; build: SetBuild; choices: readonly UnitChoice[] }[] = [];
  const unbuildable: number[] = [];
  let equalBankWindows = false;
  // Whether a build with single-line steps was weighed against equal steps (the cost statement then says how).
  let equalStepsWeighed = false;
  for (const set of sets) {
    const infos = set.indices.map((i) => branchInfo[i]!);
    if (!infos.some((x) => x.capacitor)) continue;
    const three = set.indices.length === 3;
    const delta = three && set.group.connection === 'ABC-delta';
    const floating = three && set.group.branches.some((b) => b.to === 'star');
    const singles = all.filter((u) => u.unit.kind === 'single-phase');
    // Beside a reactor a set gets no equal part: it would put capacitance on the reactor's branch.
    const withReactor = infos.some((x) => x.b.element === 'reactor');
    const balancedChoices: UnitChoice[] = withReactor
      ? []
      : three
      ? [
          ...(delta ? all.filter((u) => u.unit.kind === 'three-phase' && fits(u.unit, set.indices)).map((u) => choiceOf(u, 1)) : []),
          ...singles.filter((u) => fits(u.unit, set.indices)).map((u) => choiceOf(u, 3)),
        ]
      : singles.filter((u) => fits(u.unit, set.indices)).map((u) => choiceOf(u, 1));
    const trimsAllowed = three && !floating && (withReactor || (opts.trimSteps ?? CORRECTION_DEFAULTS.trimSteps) === 'auto');
    const trimChoices = set.indices.map((i) => (trimsAllowed && branchInfo[i]!.capacitor ? singles.filter((u) => fits(u.unit, [i])).map((u) => choiceOf(u, 1)) : []));
    if (!balancedChoices.length && !trimChoices.some((c) => c.length)) {
      unbuildable.push(...set.indices.filter((i) => branchInfo[i]!.capacitor));
      continue;
    }
    // A capacitor branch no unit suits (its voltage is lower than its neighbours', so a unit that delivers
    // enough there does not on it) is unbuildable, not "short of the target": the others are still built.
    const uncovered = balancedChoices.length ? [] : set.indices.filter((i, k) => branchInfo[i]!.capacitor && !trimChoices[k]!.length);
    unbuildable.push(...uncovered);
    const equalNeeds = three && !withReactor ? equalNeedsOf(set.indices) : undefined;
    const singleLineStepsKvar = three && trimsAllowed && balancedChoices.length > 0 ? CORRECTION_DEFAULTS.singleLineStepsKvar : 0;
    if (singleLineStepsKvar > 0 && trimChoices.some((c) => c.length)) equalStepsWeighed = true;
    const balancedReading = stepReading(set.indices);
    const trimReadings = set.indices.map((i) => stepReading([i]));
    if (balancedChoices.length) addKind(balancedReading);
    trimReadings.forEach((r, k) => trimChoices[k]!.length && addKind(r));
    const rules: SetRules = {
      unitCostKvar,
      singleLineStepsKvar,
      minSwitchedSteps: CORRECTION_DEFAULTS.minSwitchedSteps,
      minStepKvar,
      leastStepF: { balanced: leastStepFOf(balancedReading), trims: trimReadings.map(leastStepFOf) },
      ckPerF: { balanced: balancedReading.ckPerF, trims: trimReadings.map((r) => r.ckPerF) },
      widestStepRatio: CORRECTION_DEFAULTS.widestStepRatio,
      outputs: outputsPerSet,
      maxUnitsPerBranch: maxUnits,
    };
    const search = (needs: readonly Need[], setRules: SetRules) => searchSet(needs, balancedChoices, trimChoices, setRules, equalNeeds, { equalStepsFirst: preference === 'equal-steps' });
    // Windows that hold together, where the sizing found them (each branch's own are then empty): the
    // best build over every set, ties to the narrowest; for equal steps first, the narrowest set a build
    // fits whole, else the best over every set.
    const overWindows = preference === 'equal-steps' ? firstFit : leastCostOverWindows;
    const searchWith = (setRules: SetRules) =>
      together && three ? overWindows(together.sets.map((w) => () => search(set.indices.map((i) => heldTogether(branchInfo[i]!, w, i)), setRules))) : search(infos.map((x) => x.need), setRules);
    const build = searchWith(rules);
    // Where the build kept to the least step fits a range worse than one with a smaller step would, that
    // step is named (not built): the study says so where the re-solved board misses the target.
    // The floor can change the fit only where some unit is smaller than it (any count of larger ones passes).
    const floorBinds =
      balancedChoices.some((c) => c.elementF < rules.leastStepF.balanced * (1 - 1e-9)) || trimChoices.some((choices, k) => choices.some((c) => c.elementF < rules.leastStepF.trims[k]! * (1 - 1e-9)));
    if (nameHeldBack && heldBack === null && floorBinds && Math.max(...build.tiers) > 0) {
      const free = searchWith({ ...rules, leastStepF: { balanced: 0, trims: rules.leastStepF.trims.map(() => 0) } });
      if (Math.max(...free.tiers) < Math.max(...build.tiers)) {
        const below = switchedStepsOf(free, rules).filter((st) => st.responseA < leastResponseA * (1 - 1e-9) || st.capacitanceF < (st.branches.length === 1 ? rules.leastStepF.trims[st.branches[0]!]! : rules.leastStepF.balanced) * (1 - 1e-9));
        const smallest = below.reduce<(typeof below)[number] | null>((a, b) => (a === null || b.responseA < a.responseA ? b : a), null);
        if (smallest) {
          const kvarPerF = smallest.branches.length === 1 ? trimReadings[smallest.branches[0]!]!.kvarPerF : balancedReading.kvarPerF;
          heldBack = { branches: smallest.branches.map((b) => branchInfo[set.indices[b]!]!.b.branch), kvarAtNominalV: smallest.capacitanceF * kvarPerF, responseThresholdA: smallest.responseA };
        }
      }
    }
    set.indices.forEach((i, k) => {
      designF[i] = build.designF[k]!;
      fixedF[i] = build.fixedF[k]!;
      usedNeed[i] = build.needs[k]!;
    });
    builds.push({ set, build, choices: balancedChoices });
    // The search hands back the very needs it judged the build on: the equal bank's, or each branch's own.
    if (equalNeeds !== undefined && build.needs === equalNeeds) equalBankWindows = true;
    const names = set.indices.map((i) => label(branchInfo[i]!.b.branch));
    build.tiers.forEach((tier, k) => {
      if (uncovered.includes(set.indices[k]!)) return;
      const name = names[k]!;
      const limit = limitWords(opts.target ?? {});
      if (tier === 1 || tier === 2) warn('tolerance-window', warningText.windowMissed(name, limit));
      if (shortOfTarget(tier) && build.needs[k]!.minF > 0) warn('units-below-target', warningText.unitsBelowTarget(name, limit));
      if (tier === 5) warn('units-past-limit', warningText.unitsPastLimit(name, limit));
    });
    if (build.violations.outputs) warn('outputs-short', warningText.outputsShort(names, outputsPerSet), 'controller.outputs', outputs, null);
  }

  // Steps, numbered across sets.
  const steps: BankStep[] = [];
  let output = 0;
  const selected = (c: UnitChoice, indices: readonly number[]): SelectedUnit => ({
    name: c.unit.name,
    kind: c.unit.kind,
    ratedKvar: c.unit.ratedKvar,
    ratedV: c.unit.ratedV,
    ratedHz: c.unit.ratedHz,
    source: typical ? 'typical' : 'catalogue',
    catalogueIndex: c.index,
    elementCapacitanceUF: c.elementF * 1e6,
    deliveredFraction: Math.min(...indices.map((i) => (branchInfo[i]!.b.appliedV / c.unit.ratedV) ** 2 * (hz / c.unit.ratedHz))),
  });
  const frequencyWarned = new Set<string>();
  const makeStep = (part: BankStep['part'], c: UnitChoice, count: number, indices: readonly number[], switched: boolean): BankStep => {
    const three = indices.length === 3;
    const perBranchF = count * c.elementF;
    const kvarAt = (v: (i: number) => number) => indices.reduce((s, i) => s + (perBranchF * omega * v(i) ** 2) / 1000, 0);
    const kvarAtNominalV = kvarAt((i) => ratedAt(branchInfo[i]!.slot));
    const slot = branchInfo[indices[0]!]!.slot;
    const lineToLine = slot.to === 'N' || slot.to === 'star' ? slot.vNominal * Math.sqrt(3) : slot.vNominal;
    const kind = three ? 'three-phase' : 'single-phase';
    // One branch across two lines of a three-phase board: a per-line controller sees √3/2 of its current.
    const thresholdBasis = three ? 'three-phase' : slot.to !== 'N' && slot.to !== 'star' && threePhaseLines ? 'line-pair' : 'single-phase';
    // Units rated for another frequency (a catalogue's, or a typical one of another practice, --practice) are said once each.
    if (c.unit.ratedHz !== hz && !frequencyWarned.has(c.unit.name)) {
      frequencyWarned.add(c.unit.name);
      warn('unit-frequency', warningText.unitFrequency(c.unit.name, c.unit.ratedHz, hz), c.index === null ? 'practice' : `catalogue[${c.index}].ratedHz`, c.unit.ratedHz, hz);
    }
    return {
      output: switched ? ++output : null,
      part,
      kind,
      branches: indices.map((i) => branchInfo[i]!.b.branch),
      unit: selected(c, indices),
      units: count * c.unitsPerCount,
      nameplateKvar: count * c.unitsPerCount * c.unit.ratedKvar,
      kvarAtNominalV,
      deliveredKvar: kvarAt((i) => branchInfo[i]!.b.appliedV),
      capacitancePerBranchUF: perBranchF * 1e6,
      detuningFactor: 0,
      responseThresholdA: responseThresholdA(kvarAtNominalV, thresholdBasis, three || thresholdBasis === 'line-pair' ? lineToLine : slot.vNominal, ct.primaryA / ct.secondaryA),
      thresholdBasis,
      onAtDesign: true,
    };
  };
  for (const { set, build, choices } of builds) {
    const lone = set.indices.length === 1;
    if (build.balanced) {
      const { choice, fixedCount, stepCounts } = build.balanced;
      // A lone branch's step may be one larger can where the search counted several small ones (same µF, less cost).
      const part = (kind: BankStep['part'], count: number, switched: boolean) => {
        const made = lone ? cheapestStepUnits(count, choice, choices, unitCostKvar) : { choice, count };
        steps.push(makeStep(kind, made.choice, made.count, set.indices, switched));
      };
      if (fixedCount > 0) part('fixed', fixedCount, false);
      for (const count of stepCounts) part(lone ? 'single' : 'balanced', count, true);
    }
    for (const t of build.trims) steps.push(makeStep('trim', t.choice, t.count, [set.indices[t.branch]!], true));
  }
  // Fixed parts first, then outputs in order.
  steps.sort((a, b) => (a.output ?? 0) - (b.output ?? 0));

  let unbuildableInfo: UnbuildableBranches | null = null;
  if (unbuildable.length) {
    const requiredRatedV = Math.max(...unbuildable.map((i) => branchInfo[i]!.requiredRatedV));
    const appliedV = Math.min(...unbuildable.map((i) => branchInfo[i]!.b.appliedV));
    const floorV = Math.min(...unbuildable.map((i) => branchInfo[i]!.floorV));
    const floating = unbuildable.some((i) => branchInfo[i]!.slot.to === 'star');
    const names = unbuildable.map((i) => branchInfo[i]!.b.branch);
    unbuildableInfo = {
      branches: names,
      requiredRatedV,
      appliedV,
      floorV,
      message: selectionWording.noUnit(names.map(label), requiredRatedV, floorV, floating, catalogueTitle, floor * 100, all.map((u) => ({ ratedV: u.unit.ratedV, hzFactor: hz / u.unit.ratedHz })), starWordOf(opts.region ?? 'iec')),
    };
  }
  if (sized.branches.some((b) => b.element === 'reactor')) warn('reactors-not-selected', warningText.reactorsNotSelected);

  // Reactors stay as sized: the sizing already left out the negligible ones (see negligibleBranches.ts),
  // so the units' table shows the compensator the sizing table does.
  let k = 0;
  const equipment: EquipmentGroup[] = sized.equipment.map((g) => ({
    ...g,
    branches: g.branches.map((br): EquipmentBranch => {
      const i = k++;
      const b = sized.branches[i]!;
      const reactor = b.element === 'reactor';
      return { ...br, susceptanceS: reactor ? b.susceptanceS : designF[i]! * omega, fixedSusceptanceS: reactor ? b.susceptanceS : fixedF[i]! * omega };
    }),
  }));
  const perBranch = (i: number) => {
    const name = branchInfo[i]!.b.branch;
    const on = steps.filter((s) => s.branches.includes(name));
    return {
      units: on.reduce((s, st) => s + st.units / st.branches.length, 0),
      nameplateKvar: on.reduce((s, st) => s + st.nameplateKvar / st.branches.length, 0),
    };
  };
  const selections = branchInfo.map(({ b, slot, highestVoltageV, requiredRatedV }, i): BranchSelection => {
    const need = usedNeed[i]!;
    const share = perBranch(i);
    const reactor = b.element === 'reactor';
    const design = designF[i]!;
    return {
      branch: b.branch,
      units: share.units,
      nameplateKvar: share.nameplateKvar,
      requiredCapacitanceUF: need.nominalF * 1e6,
      minimumCapacitanceUF: need.minF * 1e6,
      maximumCapacitanceUF: need.maxF === null ? null : need.maxF * 1e6,
      fixedCapacitanceUF: fixedF[i]! * 1e6,
      designCapacitanceUF: design * 1e6,
      nominalV: ratedAt(slot),
      highestVoltageV,
      requiredRatedV,
      designKvarAtAppliedV: reactor ? b.kvarAtAppliedV : (design * omega * b.appliedV ** 2) / 1000,
      designCurrentA: reactor ? b.currentA : design * omega * b.appliedV,
      withinWindow: need.nominalF === 0 ? design === 0 : builds.some(({ set, build }) => set.indices.includes(i) && build.tiers[set.indices.indexOf(i)] === 0),
    };
  });
  const target = opts.target ?? {};
  const perLine = steps.some((s) => s.output !== null && s.branches.length === 1) && slots.length > 1;
  const controller = controllerSettings({
    spec: controllerSpec,
    practice,
    ct,
    steps,
    band: { minPf: target.pf ?? CORRECTION_DEFAULTS.pf, maxPf: target.maxLaggingPf ?? null, leadingAllowed: target.leading === 'allowed' },
    perLine,
    ctBasis,
  });
  // A CT given in the file or on the command line is checked against what it must read.
  if (controller) warnings.push(...controllerWarnings(controller));
  const seriesWarning = stepSeriesWarning(steps, label);
  if (seriesWarning) warnings.push(seriesWarning);
  const leastStep: LeastSwitchedStep = { ...leastOnCt(stepKinds), ratio: stepSeriesSpan(steps)?.ratio ?? null, heldBack };
  const nameplateKvar = steps.reduce((s, st) => s + st.nameplateKvar, 0);
  const units = steps.reduce((s, st) => s + st.units, 0);
  // Many small units forced by a narrow capacitance range: say what sets the range and what would widen it.
  const narrow = narrowestWindow(selections);
  if (narrow && narrow.widthPercent < NARROW_WINDOW_PERCENT && unitCostKvar * units > nameplateKvar) {
    const perLineTarget = (sized as { check?: TargetCheck }).check?.board === null;
    warn(
      'many-small-units',
      warningText.manySmallUnits({
        units,
        nameplateKvar,
        unitCostKvar,
        branch: label(narrow.branch),
        lowUF: narrow.lowUF,
        highUF: narrow.highUF,
        widthPercent: narrow.widthPercent,
        minusPercent: minus * 100,
        plusPercent: plus * 100,
        perLineTarget,
        leadingAllowed: target.leading === 'allowed',
        upperBound: target.maxLaggingPf ?? null,
        trimsOff: (opts.trimSteps ?? CORRECTION_DEFAULTS.trimSteps) === 'none',
      }),
      'capacitanceTolerance',
      narrow.widthPercent,
      NARROW_WINDOW_PERCENT,
    );
  }
  return {
    frequencyHz: hz,
    equipment,
    catalogue: typical ? 'typical' : 'user',
    practice,
    catalogueTitle,
    catalogueNote: typical ? selectionWording.typicalNote : selectionWording.userNote,
    capacitanceTolerance: { minusPercent: minus * 100, plusPercent: plus * 100 },
    windowsHeldTogether: together !== null,
    equalBankWindows,
    voltageMarginPercent: margin * 100,
    continuousLimitPercent: limitV * 100,
    deliveryFloorPercent: floor * 100,
    cost: { statement: selectionWording.costStatement(unitCostKvar, preference, equalStepsWeighed ? CORRECTION_DEFAULTS.singleLineStepsKvar : null), unitCostKvar, value: nameplateKvar + unitCostKvar * units },
    steps,
    controller,
    leastStep,
    selections,
    nameplateKvar,
    deliveredKvar: steps.reduce((s, st) => s + st.deliveredKvar, 0),
    units,
    unbuildable: unbuildableInfo,
    warnings,
  };
}

/**
 * A capacitance range narrower than this (max/min − 1, %) with a build whose per-unit cost exceeds the
 * capacitance it holds is one only many small units can hit: the report says why (a design choice,
 * common practice, no source: 5 % is about the step of the smaller units in a branch of a few of them).
 */
const NARROW_WINDOW_PERCENT = 5;

/** The built capacitor branch with the narrowest range, or null where none has an upper end. */
function narrowestWindow(selections: readonly BranchSelection[]): { branch: string; lowUF: number; highUF: number; widthPercent: number } | null {
  let best: { branch: string; lowUF: number; highUF: number; widthPercent: number } | null = null;
  for (const s of selections) {
    // An empty range (max below min) is worded by the units table itself; it forces no unit size.
    if (s.units <= 0 || s.maximumCapacitanceUF === null || !(s.minimumCapacitanceUF > 0) || s.maximumCapacitanceUF < s.minimumCapacitanceUF) continue;
    const widthPercent = 100 * (s.maximumCapacitanceUF / s.minimumCapacitanceUF - 1);
    if (!best || widthPercent < best.widthPercent) best = { branch: s.branch, lowUF: s.minimumCapacitanceUF, highUF: s.maximumCapacitanceUF, widthPercent };
  }
  return best;
}

/** A sizing's line comparison at the equipment's board, before and after as sized (none where it has none). */
function sizedLines(sized: SizedEquipment): readonly Pick<LineComparison, 'currentA'>[] {
  return (sized as { lines?: readonly Pick<LineComparison, 'currentA'>[] }).lines ?? [];
}

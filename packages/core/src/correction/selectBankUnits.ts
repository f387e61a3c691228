/**
 * From continuous ratings to hardware: each capacitor branch becomes a fixed
 * part plus switched steps built from catalogue units.
 *
 * Work is done in capacitance, which does not depend on the voltage: a unit
 * rated Q_r at V_r, f_r has C = Q_r/(2π·f_r·V_r²) and gives ω·C·V² where it is
 * used. Per branch, with the sizing's requirement C_req:
 * - rated voltage ≥ highest voltage across the branch × (1 + margin) (for a floating star: the
 *   line-to-line voltage, which an element reaches when the star point moves);
 * - the design state (fixed part + the steps switched on at the design load)
 *   reaches C_req/(1 − tol⁻), so the target holds with the lowest capacitance,
 *   and stays ≤ C_limit/(1 + tol⁺), so no line leads with the highest; where no
 *   build fits that window, not leading comes first and the target second
 *   (see `tierOf`);
 * - the fixed part stays ≤ the light-load limit/(1 + tol⁺) (no fixed part
 *   without a light-load condition);
 * - among those, the least installed nameplate kvar — counting anything within
 *   5 % of it as equal and then taking the fewest units, then the finest step.
 *   All units of a branch are of one type.
 */
import * as z from 'zod';
import { InputError, inputIssue } from '../errors.js';
import { capacitorUnitSchema, STEP_PATTERNS, type CapacitanceToleranceSpec, type CapacitorUnitSpec, type StepPattern } from './correctionSpec.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import { capacitorOutput, unitCapacitanceF } from './capacitorOutput.js';
import { TYPICAL_CAPACITOR_UNITS } from './typicalCapacitorUnits.js';
import type { EquipmentBranch, EquipmentGroup } from './equipment.js';
import type { BankSelection, BranchSelection, BranchSizing, CorrectionWarning, SizedEquipment } from './correctionResult.js';
import { selectionWording, warningText } from './correctionWording.js';
import { parseOptions } from '../_internal/zodIssues.js';
import { candidatesFor, shortOfTarget, type Need, type UsableUnit } from './_internal/bankBuilds.js';

export interface SelectBankUnitsOptions {
  /** Units to build from. @defaultValue the built-in typical ratings at the board frequency (`TYPICAL_CAPACITOR_UNITS`) */
  readonly catalogue?: readonly CapacitorUnitSpec[];
  /** Switched-step ratios, or `fixed` for no switched steps. @defaultValue '1:2:4' */
  readonly pattern?: StepPattern;
  /** Most units in one branch. @defaultValue 24 */
  readonly maxUnitsPerBranch?: number;
  /** Capacitance tolerance, %. @defaultValue `{ minusPercent: 5, plusPercent: 10 }` (IEC 60831-1, from memory) */
  readonly capacitanceTolerance?: CapacitanceToleranceSpec;
  /** Rated voltage must exceed the highest applied voltage by this, %. @defaultValue 10 */
  readonly voltageMarginPercent?: number;
  /**
   * The same sizing run on the light-load board. Its limit (or value) per
   * branch caps the fixed part, and its voltages join the rating check.
   * @defaultValue none — no fixed part
   */
  readonly lightLoad?: SizedEquipment;
}

const selectOptionsSchema = z.strictObject({
  catalogue: z.array(capacitorUnitSchema).min(1).optional(),
  pattern: z.enum(STEP_PATTERNS).optional(),
  maxUnitsPerBranch: z.int().min(1).max(200).optional(),
  capacitanceTolerance: z.strictObject({ minusPercent: z.number().min(0).max(50).optional(), plusPercent: z.number().min(0).max(50).optional() }).optional(),
  voltageMarginPercent: z.number().min(0).max(100).optional(),
  lightLoad: z.custom<SizedEquipment>((v) => typeof v === 'object' && v !== null && Array.isArray((v as SizedEquipment).branches)).optional(),
});

const MULTIPLIERS: Record<StepPattern, readonly number[]> = { fixed: [], '1:1:1': [1, 1, 1], '1:2:2': [1, 2, 2], '1:2:4': [1, 2, 4] };

interface ResolvedSelectOptions {
  readonly units: readonly UsableUnit[];
  readonly typical: boolean;
  readonly pattern: StepPattern;
  readonly maxUnits: number;
  readonly minus: number;
  readonly plus: number;
  readonly margin: number;
  readonly lightLoad: SizedEquipment | null;
}

function resolveSelectOptions(sized: SizedEquipment, input: SelectBankUnitsOptions | undefined): ResolvedSelectOptions {
  const options = parseOptions(selectOptionsSchema, input, 'selectBankUnits options');
  const typical = options.catalogue === undefined;
  const units = typical
    ? TYPICAL_CAPACITOR_UNITS.filter((u) => u.ratedHz === sized.frequencyHz).map((unit) => ({ unit, index: null }))
    : options.catalogue!.map((unit, index) => ({ unit, index }));
  const tol = options.capacitanceTolerance ?? {};
  return {
    units,
    typical,
    pattern: options.pattern ?? CORRECTION_DEFAULTS.pattern,
    maxUnits: options.maxUnitsPerBranch ?? CORRECTION_DEFAULTS.maxUnitsPerBranch,
    minus: (tol.minusPercent ?? CORRECTION_DEFAULTS.capacitanceTolerance.minusPercent) / 100,
    plus: (tol.plusPercent ?? CORRECTION_DEFAULTS.capacitanceTolerance.plusPercent) / 100,
    margin: (options.voltageMarginPercent ?? CORRECTION_DEFAULTS.voltageMarginPercent) / 100,
    lightLoad: options.lightLoad ?? null,
  };
}

/**
 * Chooses units for each capacitor branch of a sized bank or compensator.
 * Reactor branches are kept at their continuous value (not selected).
 * @param sized a `BankSizing` or a `CompensatorSolution`
 * @returns per branch the unit, the fixed and switched counts, the steps on at
 *   the design load, installed kvar and capacitance, and the bank as equipment
 * @throws {InputError} for an empty catalogue (`catalogue`), or when no unit is
 *   rated for the voltage a branch sees (`catalogue`)
 * @example
 * const selection = selectBankUnits(sizeDeltaBank(board, { target: { pf: 0.95 } }), { pattern: '1:2:4' });
 * selection.selections[0].stepUnits //=> [k, 2k, 4k] units per switched step, e.g. [1, 2, 4]
 * selection.equipment // the bank as built, for verifyCorrection
 */
export function selectBankUnits(sized: SizedEquipment, options?: SelectBankUnitsOptions): BankSelection {
  const opts = resolveSelectOptions(sized, options);
  const multipliers = MULTIPLIERS[opts.pattern];
  const omega = 2 * Math.PI * sized.frequencyHz;
  const slots = sized.equipment.flatMap((g) => g.branches);
  const warnings: CorrectionWarning[] = [];
  const warn = (code: string, message: string, path: string | null = null, value: number | null = null, threshold: number | null = null) =>
    warnings.push({ code, message, path, value, threshold });
  const short: { branch: string; neededV: number }[] = [];
  let highestNeed = 0;
  const designB: number[] = [];
  const fixedB: number[] = [];

  const selections = sized.branches.map((b: BranchSizing, i): BranchSelection => {
    const slot = slots[i]!;
    const light = opts.lightLoad?.branches[i];
    // The star point of a floating star bank moves as its steps switch (or a fuse opens): an
    // element can then see up to the line-to-line voltage, so that is what its rating must cover.
    const worstCaseV = slot.to === 'star' ? slot.vNominal * Math.sqrt(3) : slot.vNominal;
    const highestVoltageV = Math.max(worstCaseV, b.appliedV, light?.appliedV ?? 0);
    const requiredRatedV = highestVoltageV * (1 + opts.margin);
    const requiredF = b.element === 'capacitor' ? b.susceptanceS / omega : 0;
    const minF = requiredF / (1 - opts.minus);
    const limitF = b.limitSusceptanceS !== null && b.element === 'capacitor' ? Math.max(b.limitSusceptanceS, 0) / omega : null;
    const maxF = limitF === null ? null : limitF / (1 + opts.plus);
    const lightLimit = light ? Math.max(0, light.limitSusceptanceS ?? light.susceptanceS) : 0;
    const fixedMaxF = Math.min(lightLimit / omega / (1 + opts.plus), minF);
    const empty = (): BranchSelection => {
      // A reactor stays as sized (continuous); an empty branch is built as nothing.
      const reactor = b.element === 'reactor';
      designB.push(reactor ? b.susceptanceS : 0);
      fixedB.push(reactor ? b.susceptanceS : 0);
      return {
        branch: b.branch,
        unit: null,
        fixedUnits: 0,
        stepUnits: [],
        stepsOnAtDesign: [],
        installedUnits: 0,
        installedKvar: 0,
        requiredCapacitanceUF: requiredF * 1e6,
        minimumCapacitanceUF: minF * 1e6,
        maximumCapacitanceUF: maxF === null ? null : maxF * 1e6,
        fixedCapacitanceUF: 0,
        designCapacitanceUF: 0,
        highestVoltageV,
        requiredRatedV,
        designKvarAtAppliedV: reactor ? b.kvarAtAppliedV : 0,
        designCurrentA: reactor ? b.currentA : 0,
        withinWindow: requiredF === 0,
      };
    };
    if (b.element !== 'capacitor') return empty();
    highestNeed = Math.max(highestNeed, requiredRatedV);
    const usable = opts.units.filter(({ unit }) => unit.ratedV >= requiredRatedV * (1 - 1e-12));
    if (!usable.length) {
      short.push({ branch: b.branch, neededV: requiredRatedV });
      return empty();
    }
    const need: Need = { nominalF: requiredF, minF, maxF, limitF, fixedMaxF };
    let chosen = candidatesFor(usable, multipliers, need, opts.maxUnits);
    if (!chosen) {
      warn('unit-count', warningText.unitCount(b.branch, opts.maxUnits), 'bank.maxUnitsPerBranch', null, opts.maxUnits);
      chosen = candidatesFor(usable, multipliers, need, Number.MAX_SAFE_INTEGER);
    }
    const c = chosen!;
    if (c.tier === 1 || c.tier === 2) warn('tolerance-window', warningText.windowMissed(b.branch));
    if (shortOfTarget(c.tier)) warn('units-below-target', warningText.unitsBelowTarget(b.branch));
    if (c.tier === 5) warn('units-past-limit', warningText.unitsPastLimit(b.branch));
    if (c.units === 0) return empty();
    if (c.unit.ratedHz !== sized.frequencyHz)
      warn('unit-frequency', warningText.unitFrequency(c.unit.name ?? `catalogue[${c.index}]`, c.unit.ratedHz, sized.frequencyHz), c.index === null ? null : `catalogue[${c.index}].ratedHz`, c.unit.ratedHz, sized.frequencyHz);
    const cu = unitCapacitanceF(c.unit);
    const fixedF = c.fixedUnits * cu;
    designB.push(c.designF * omega);
    fixedB.push(fixedF * omega);
    const out = capacitorOutput(c.unit, { voltageV: b.appliedV, frequencyHz: sized.frequencyHz });
    if (out.kvar < CORRECTION_DEFAULTS.underusedOutputFraction * c.unit.ratedKvar)
      warn('unit-underused', warningText.unitUnderused(b.branch, c.unit.ratedV, b.appliedV, out.kvar / c.unit.ratedKvar), null, out.kvar / c.unit.ratedKvar, CORRECTION_DEFAULTS.underusedOutputFraction);
    const designKvar = (c.designF * omega * b.appliedV ** 2) / 1000;
    return {
      branch: b.branch,
      unit: {
        name: c.unit.name ?? `catalogue[${c.index}]`,
        ratedKvar: c.unit.ratedKvar,
        ratedV: c.unit.ratedV,
        ratedHz: c.unit.ratedHz,
        source: opts.typical ? 'typical' : 'catalogue',
        catalogueIndex: c.index,
        capacitanceUF: cu * 1e6,
        outputKvar: out.kvar,
      },
      fixedUnits: c.fixedUnits,
      stepUnits: multipliers.map((m) => m * c.stepBase),
      stepsOnAtDesign: c.stepsOn,
      installedUnits: c.units,
      installedKvar: c.installedKvar,
      requiredCapacitanceUF: requiredF * 1e6,
      minimumCapacitanceUF: minF * 1e6,
      maximumCapacitanceUF: maxF === null ? null : maxF * 1e6,
      fixedCapacitanceUF: fixedF * 1e6,
      designCapacitanceUF: c.designF * 1e6,
      highestVoltageV,
      requiredRatedV,
      designKvarAtAppliedV: designKvar,
      designCurrentA: c.designF * omega * b.appliedV,
      withinWindow: c.tier === 0,
    };
  });
  if (short.length) {
    const neededV = Math.max(...short.map((s) => s.neededV));
    throw new InputError(
      [inputIssue('out_of_range', 'catalogue', selectionWording.noUnit(short.map((s) => s.branch), neededV), `units rated up to ${Math.max(...opts.units.map((u) => u.unit.ratedV))} V`)],
      'no capacitor unit fits',
    );
  }
  if (!opts.typical)
    opts.units.forEach(({ unit, index }) => {
      if (unit.ratedV < highestNeed * (1 - 1e-12))
        warn('unit-voltage-low', warningText.unitVoltageLow(unit.name ?? `catalogue[${index}]`, unit.ratedV, highestNeed), `catalogue[${index}].ratedV`, unit.ratedV, highestNeed);
    });
  if (sized.branches.some((b) => b.element === 'reactor')) warn('reactors-not-selected', warningText.reactorsNotSelected);

  let k = 0;
  const equipment: EquipmentGroup[] = sized.equipment.map((g) => ({
    ...g,
    branches: g.branches.map((br): EquipmentBranch => {
      const design = designB[k]!;
      const fixed = fixedB[k++]!;
      return { ...br, susceptanceS: design, fixedSusceptanceS: fixed };
    }),
  }));
  return {
    frequencyHz: sized.frequencyHz,
    equipment,
    catalogue: opts.typical ? 'typical' : 'user',
    catalogueNote: opts.typical ? selectionWording.typicalNote : selectionWording.userNote,
    pattern: opts.pattern,
    capacitanceTolerance: { minusPercent: opts.minus * 100, plusPercent: opts.plus * 100 },
    voltageMarginPercent: opts.margin * 100,
    selections,
    installedKvar: selections.reduce((s, x) => s + x.installedKvar, 0),
    installedUnits: selections.reduce((s, x) => s + x.installedUnits, 0),
    warnings,
  };
}

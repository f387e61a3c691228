/**
 * What a correction study asks for, as a zod schema: one source for validation,
 * the TypeScript types and (if the board file grows a `correction` section) the
 * JSON Schema. Every field is optional except the arrangement; defaults are in
 * `correctionDefaults.ts`, board-dependent rules in `correctionRules.ts`.
 */
import * as z from 'zod';
import { nameReferenceSchema, nameSchema } from '../board/nameSchemas.js';

const powerFactor = z.number().gt(0).max(1);
const percent = z.number().nonnegative();

export const ARRANGEMENTS = ['star-bank', 'delta-bank', 'balancing-compensator'] as const;
export const TARGET_DEFINITIONS = ['per-line', 'effective', 'vector', 'arithmetic', 'positive-sequence'] as const;
export const PRACTICES = ['iec', 'north-american'] as const;
export const CONTROLLER_OUTPUTS = [6, 8, 12] as const;

export const targetSchema = z
  .strictObject({
    pf: powerFactor.optional().describe('lowest acceptable power factor, 0 < pf <= 1; default 0.95'),
    definition: z
      .enum(TARGET_DEFINITIONS)
      .optional()
      .describe(
        'which power factor the target applies to: per-line displacement PF of every line, or one board figure (IEEE 1459 effective, vector, arithmetic, positive-sequence); default per-line (positive-sequence for a balancing compensator)',
      ),
    perPhase: z
      .strictObject({ A: powerFactor.optional(), B: powerFactor.optional(), C: powerFactor.optional() })
      .optional()
      .describe('per-line targets that override pf for the named lines (definition per-line only)'),
    leading: z.enum(['never', 'allowed']).optional().describe('whether a line may end up leading; default never'),
    minLeadingPf: powerFactor.optional().describe('with leading allowed: the lowest acceptable leading PF; default the target pf'),
    maxLaggingPf: powerFactor
      .optional()
      .describe('upper bound: do not correct beyond this lagging PF (keeps every line lagging); must be >= pf'),
    measuredAt: nameSchema('origin or a board name')
      .optional()
      .describe(
        "where the target is measured: origin (the supply's terminals, where the service cable starts, e.g. a tariff meter) or the name of a board the equipment's board is fed through (at its incomer); default the equipment's own board",
      ),
  })
  .describe('the power-factor target');

export const capacitorUnitSchema = z
  .strictObject({
    name: nameSchema('catalogue designation').optional(),
    kind: z
      .enum(['three-phase', 'single-phase'])
      .optional()
      .describe('three-phase: three delta-connected elements in one case, rated at the line-to-line voltage; single-phase: one element between two terminals; default single-phase'),
    ratedKvar: z.number().positive().describe('rated output at rated voltage and frequency, kvar (the whole unit: all three elements of a three-phase unit)'),
    ratedV: z.number().positive().describe('rated voltage, V rms (line-to-line for a three-phase unit)'),
    ratedHz: z.literal([50, 60]).describe('rated frequency, Hz'),
  })
  .describe('one capacitor unit as bought');

export const bankSchema = z
  .strictObject({
    minStepKvar: z.number().nonnegative().optional().describe('smallest switched step, kvar nameplate; default 1'),
    trimSteps: z
      .enum(['auto', 'none'])
      .optional()
      .describe('single-phase trim steps beside the equal three-phase steps where the board is unbalanced: auto (where they lower the cost or are needed) or none; default auto'),
    maxUnitsPerBranch: z.int().min(1).max(200).optional().describe('most units in one branch of the bank; default 24'),
  })
  .describe('how the bank is built from units');

export const controllerSchema = z
  .strictObject({
    outputs: z.literal(CONTROLLER_OUTPUTS).optional().describe('switched outputs of the controller (6, 8 or 12); default 6'),
    ctPrimaryA: z.number().positive().optional().describe('current transformer primary, A; default the next standard rating at or above 1.25 × the largest line current where the controller reads (target.measuredAt, else the board), before or after correction or in any state of the switched steps, whichever is largest'),
    ctSecondaryA: z.literal([1, 5]).optional().describe('current transformer secondary, A; default 5'),
    switchingDelayS: z.number().positive().max(3600).optional().describe('delay before a step is switched, s; default 30'),
  })
  .describe('the automatic controller that switches the steps');

export const balanceTargetSchema = z
  .strictObject({
    maxNegativeSequencePercent: percent.max(100).optional().describe('balancing compensator: most |I2|/|I1| left, %; default 10'),
    maxNeutralPercent: percent.max(300).optional().describe('balancing compensator on a 4-wire board: most neutral current left, % of |I1|; default 20'),
  })
  .describe('what a balancing compensator must leave of the unbalance it exists to remove');

export const lightLoadSchema = z
  .strictObject({
    fraction: z.number().min(0).max(1).describe('fraction of every board load present at light load'),
    perLoad: z
      .record(nameReferenceSchema('a load name'), z.number().min(0).max(1))
      .optional()
      .describe('fractions for named loads, overriding fraction (0 = off): a second load set'),
  })
  .describe('the light-load condition the fixed part of the bank is checked against');

export const compensatorSchema = z
  .strictObject({
    branches: z
      .enum(['delta', 'delta-and-star'])
      .optional()
      .describe('line-to-line branches only, or also line-to-neutral ones (4-wire only); default delta-and-star on a 4-wire board'),
    reactors: z
      .enum(['allowed', 'none'])
      .optional()
      .describe('allowed: where capacitors alone cannot balance the board, build the Steinmetz/Gyugyi solution with its reactors; none: capacitors only; default allowed'),
    weights: z
      .strictObject({
        negativeSequence: percent.optional().describe('weight of |I2|² (per unit); default 1'),
        zeroSequence: percent.optional().describe('weight of |I0|² (per unit); default 1'),
        reactive: percent.optional().describe('weight of (Q1 − Q1 target)² (per unit); default 1'),
      })
      .optional()
      .describe('weights of the capacitor-only objective'),
  })
  .describe('balancing compensator settings');

export const toleranceSchema = z
  .strictObject({
    minusPercent: percent.max(50).optional().describe('capacitance may be this much below rated, %; default 5'),
    plusPercent: percent.max(50).optional().describe('capacitance may be this much above rated, %; default 10'),
  })
  .describe('capacitance tolerance of the units');

export const correctionSpecSchema = z
  .strictObject({
    arrangement: z.enum(ARRANGEMENTS).optional().describe('what to size; without it every arrangement that fits the board is sized and compared'),
    target: targetSchema.optional(),
    starPoint: z
      .enum(['neutral', 'floating'])
      .optional()
      .describe('star bank only (a wye bank in North America): its star point tied to the neutral (default where there is one) or floating'),
    share: z
      .enum(['equal', 'proportional'])
      .optional()
      .describe(
        'star or delta bank with a board-wide target: equal kvar per branch (a three-phase bank), or in proportion to what each branch needs for unity PF; default equal',
      ),
    compensator: compensatorSchema.optional(),
    balance: balanceTargetSchema.optional(),
    practice: z
      .enum(PRACTICES)
      .optional()
      .describe('regional practice: picks the built-in typical catalogue, the voltage margin and the discharge time; default north-american on a 60 Hz board, iec on 50 Hz'),
    catalogue: z
      .array(capacitorUnitSchema)
      .min(1)
      .optional()
      .describe('capacitor units to build the bank from; default the built-in typical catalogue of the practice'),
    bank: bankSchema.optional(),
    controller: controllerSchema.optional(),
    deliveryFloorPercent: z
      .number()
      .min(0)
      .max(100)
      .optional()
      .describe('a unit must deliver at least this share of its nameplate kvar at the nominal voltage across it, %; default 65'),
    capacitanceTolerance: toleranceSchema.optional(),
    voltageMarginPercent: percent
      .max(100)
      .optional()
      .describe('a unit must be rated at least this much above the nominal voltage across it, %; default 10 (iec) or 0 (north-american)'),
    lightLoad: lightLoadSchema.optional(),
    voltageRiseLimitPercent: z.number().positive().max(100).optional().describe('flag a steady voltage rise above this, %; default 3'),
  })
  .describe('a power-factor correction study');

/** A correction study as written (validated). */
export type CorrectionSpec = z.infer<typeof correctionSpecSchema>;
export type TargetSpec = z.infer<typeof targetSchema>;
export type CapacitorUnitSpec = z.infer<typeof capacitorUnitSchema>;
export type BankSpec = z.infer<typeof bankSchema>;
export type LightLoadSpec = z.infer<typeof lightLoadSchema>;
export type CompensatorSpec = z.infer<typeof compensatorSchema>;
export type CapacitanceToleranceSpec = z.infer<typeof toleranceSchema>;
export type Arrangement = (typeof ARRANGEMENTS)[number];
export type TargetDefinition = (typeof TARGET_DEFINITIONS)[number];
export type Practice = (typeof PRACTICES)[number];
export type ControllerSpec = z.infer<typeof controllerSchema>;
export type BalanceTargetSpec = z.infer<typeof balanceTargetSchema>;

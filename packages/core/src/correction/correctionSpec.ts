/**
 * What a correction study asks for, as a zod schema: one source for validation,
 * the TypeScript types and (if the board file grows a `correction` section) the
 * JSON Schema. Every field is optional except the arrangement; defaults are in
 * `correctionDefaults.ts`, board-dependent rules in `correctionRules.ts`.
 */
import * as z from 'zod';

const powerFactor = z.number().gt(0).max(1);
const percent = z.number().nonnegative();

export const ARRANGEMENTS = ['star-bank', 'delta-bank', 'balancing-compensator'] as const;
export const TARGET_DEFINITIONS = ['per-line', 'effective', 'vector', 'arithmetic', 'positive-sequence'] as const;
export const STEP_PATTERNS = ['fixed', '1:1:1', '1:2:2', '1:2:4'] as const;

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
  })
  .describe('the power-factor target');

export const capacitorUnitSchema = z
  .strictObject({
    name: z.string().min(1).optional().describe('catalogue designation'),
    ratedKvar: z.number().positive().describe('rated output at rated voltage and frequency, kvar (one capacitor element)'),
    ratedV: z.number().positive().describe('rated voltage of the element, V rms'),
    ratedHz: z.literal([50, 60]).describe('rated frequency, Hz'),
  })
  .describe('one capacitor unit: a single capacitance between two terminals');

export const bankSchema = z
  .strictObject({
    pattern: z
      .enum(STEP_PATTERNS)
      .optional()
      .describe('switched-step ratios (three steps), or fixed for a bank with no switched steps; default 1:2:4'),
    maxUnitsPerBranch: z.int().min(1).max(200).optional().describe('most units in one branch of the bank; default 24'),
  })
  .describe('how each branch of the bank is built from units');

export const lightLoadSchema = z
  .strictObject({
    fraction: z.number().min(0).max(1).describe('fraction of every board load present at light load'),
    perLoad: z
      .record(z.string(), z.number().min(0).max(1))
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
    arrangement: z.enum(ARRANGEMENTS).describe('what to size'),
    target: targetSchema.optional(),
    starPoint: z
      .enum(['neutral', 'floating'])
      .optional()
      .describe('star bank only: star point tied to the neutral (default where there is one) or floating'),
    share: z
      .enum(['equal', 'proportional'])
      .optional()
      .describe(
        'star or delta bank with a board-wide target: equal kvar per branch (a three-phase bank), or in proportion to what each branch needs for unity PF; default equal',
      ),
    compensator: compensatorSchema.optional(),
    catalogue: z
      .array(capacitorUnitSchema)
      .min(1)
      .optional()
      .describe('capacitor units to build the bank from; default a built-in list of typical ratings'),
    bank: bankSchema.optional(),
    capacitanceTolerance: toleranceSchema.optional(),
    voltageMarginPercent: percent
      .max(100)
      .optional()
      .describe('a unit must be rated at least this much above the highest voltage it sees, %; default 10'),
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
export type StepPattern = (typeof STEP_PATTERNS)[number];

/**
 * The board file, as a zod schema. One source of truth for validation, the
 * TypeScript types (`BoardSpec`) and the exported JSON Schema.
 *
 * Shape rules that zod cannot say neatly (exactly one way to rate a load, a
 * neutral load on a board with no neutral...) live in `boardRules.ts`.
 */
import * as z from 'zod';
import { correctionSpecSchema } from '../correction/correctionSpec.js';

const positive = z.number().positive();
const nonNegative = z.number().nonnegative();

export const SYSTEMS = ['three-phase-4wire', 'three-phase-3wire', 'single-phase', 'split-phase'] as const;
export const CONNECTIONS = ['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'] as const;
export const LOAD_MODELS = ['constant-impedance', 'constant-current', 'constant-power'] as const;

const impedanceSchema = z
  .strictObject({
    r: nonNegative.describe('resistance, ohm'),
    x: z.number().describe('reactance, ohm (positive inductive, negative capacitive)'),
  })
  .describe('series impedance R + jX in ohm');

const phaseEmfSchema = z.strictObject({
  V: positive.describe('open-circuit line-to-neutral EMF, V rms'),
  angleDeg: z.number().min(-360).max(360).describe('angle, degrees'),
});

const transformerSchema = z
  .strictObject({
    kVA: positive.describe('rated apparent power, kVA'),
    impedancePercent: positive.max(30).describe('short-circuit impedance u_k, % of rated'),
    xOverR: nonNegative.max(100).describe('X/R ratio of the short-circuit impedance'),
  })
  .describe('supply transformer; its impedance is referred to the board voltage');

const conductorSchema = z
  .strictObject({
    r: nonNegative.optional().describe('resistance, ohm'),
    x: nonNegative.optional().describe('reactance, ohm'),
    lengthM: positive.optional().describe('route length, m'),
    lengthFt: positive.optional().describe('route length, ft'),
    rOhmPerKm: nonNegative.optional().describe('resistance per km of conductor, ohm/km'),
    xOhmPerKm: nonNegative.optional().describe('reactance per km of conductor, ohm/km (default 0.08 for a library size)'),
    mm2: positive.optional().describe('metric size, mm² (resistance from IEC 60228 class 2)'),
    awg: z.string().optional().describe('AWG size, e.g. "12" or "4/0" (resistance from NEC Chapter 9 Table 8)'),
    kcmil: positive.optional().describe('size in kcmil, e.g. 250 (NEC Chapter 9 Table 8)'),
    material: z.enum(['copper', 'aluminium', 'aluminum']).optional().describe('conductor metal for a library size; default copper'),
    temperatureC: z.number().min(-40).max(250).optional().describe('conductor operating temperature, °C (default 70 for mm², 75 for AWG/kcmil)'),
    parallel: z.int().min(1).max(12).optional().describe('conductors in parallel (2 = a doubled neutral); default 1'),
    ratingA: positive.optional().describe('current rating of this conductor, A'),
  })
  .describe('a conductor: r and x directly; or a length with rOhmPerKm, or with a size (mm2, awg or kcmil)');

const perPhaseConductorSchema = z
  .strictObject({ A: conductorSchema.optional(), B: conductorSchema.optional(), C: conductorSchema.optional() })
  .describe('a different conductor for each phase');

const perPhaseImpedanceSchema = z
  .strictObject({ A: impedanceSchema.optional(), B: impedanceSchema.optional(), C: impedanceSchema.optional() })
  .describe('a different source impedance for each phase, ohm');

const windingSchema = z
  .union([transformerSchema, impedanceSchema])
  .describe('one single-phase unit: its rating (kVA, impedancePercent, xOverR) or its impedance (r, x) referred to the secondary');

export const supplySchema = z.strictObject({
  system: z.enum(SYSTEMS).describe('how the board is fed'),
  voltage: z
    .strictObject({
      lineToLine: positive.optional().describe('nominal line-to-line voltage, V'),
      lineToNeutral: positive.optional().describe('nominal line-to-neutral voltage, V'),
    })
    .describe('nominal voltage: give lineToLine or lineToNeutral'),
  frequencyHz: z.literal([50, 60]).describe('supply frequency, Hz'),
  sequence: z.enum(['ABC', 'ACB']).optional().describe('phase sequence; default ABC'),
  emf: z
    .strictObject({ A: phaseEmfSchema.optional(), B: phaseEmfSchema.optional(), C: phaseEmfSchema.optional() })
    .optional()
    .describe('unbalanced source EMFs per phase; default balanced at nominal voltage'),
  impedance: z.union([impedanceSchema, perPhaseImpedanceSchema]).optional().describe('source impedance per phase, ohm: one value for all, or one per phase'),
  transformer: transformerSchema.optional(),
  zeroSequence: impedanceSchema
    .optional()
    .describe('zero-sequence impedance Z0 of the source, ohm (4-wire star sources; impedance or transformer gives Z1)'),
  bank: z
    .strictObject({ A: windingSchema.optional(), B: windingSchema.optional(), C: windingSchema.optional() })
    .optional()
    .describe('a bank of single-phase transformers with star-connected secondaries, one unit per phase (units may differ)'),
  openDelta: z
    .strictObject({ 'A-B': windingSchema.optional(), 'B-C': windingSchema.optional(), 'C-A': windingSchema.optional() })
    .optional()
    .describe('an open-delta supply (three-phase-3wire): exactly two single-phase units, between the phases named'),
});

export const feederSchema = z
  .strictObject({
    line: z.union([conductorSchema, perPhaseConductorSchema]).optional().describe('each line (phase) conductor: one for all, or one per phase'),
    neutral: conductorSchema.optional().describe('the neutral conductor'),
    lengthM: positive.optional().describe('route length for every conductor that does not give its own, m'),
    lengthFt: positive.optional().describe('route length for every conductor that does not give its own, ft'),
  })
  .describe('the cable or busway that feeds the board');

export const loadSchema = z.strictObject({
  name: z.string().min(1).describe('circuit name'),
  connection: z.enum(CONNECTIONS).describe('where the load connects'),
  starPoint: z
    .enum(['neutral', 'floating'])
    .optional()
    .describe('for ABC-star loads: star point tied to the neutral (default on 4-wire boards) or floating'),
  kW: z.number().optional().describe('active power at nominal voltage, kW (negative = generation)'),
  kvar: z.number().optional().describe('reactive power at nominal voltage, kvar (positive = lagging)'),
  kVA: positive.optional().describe('apparent power at nominal voltage, kVA'),
  A: positive.optional().describe('current at nominal voltage, A (line current for three-phase loads)'),
  pf: z.number().gt(0).max(1).optional().describe('displacement power factor, 0 < pf <= 1'),
  sense: z.enum(['lagging', 'leading']).optional().describe('whether pf is lagging (inductive, default) or leading'),
  ohms: impedanceSchema.optional().describe('impedance per phase (star) or per branch (delta), ohm'),
  model: z.enum(LOAD_MODELS).optional().describe('voltage dependence; default constant-power, constant-impedance for ohms'),
  zip: z
    .strictObject({ z: nonNegative.max(1), i: nonNegative.max(1), p: nonNegative.max(1) })
    .optional()
    .describe('ZIP fractions of constant impedance, current and power; must sum to 1'),
});

export const studiesSchema = z
  .strictObject({
    openNeutral: z.boolean().optional().describe('also solve the board with the neutral conductor broken'),
  })
  .describe('extra what-if studies to run with the solve');

export const boardSchema = z
  .strictObject({
    $schema: z.string().optional(),
    name: z.string().min(1).optional().describe('board name'),
    note: z.string().optional().describe('free text'),
    supply: supplySchema,
    feeder: feederSchema.optional(),
    loads: z.array(loadSchema).min(1).describe('the circuits on the board'),
    studies: studiesSchema.optional(),
    correction: correctionSpecSchema
      .partial()
      .optional()
      .describe('a power-factor correction study for `trivar correct` (command-line options override it)'),
  })
  .describe('a trivar board file');

/** A board as written in a board file (validated). */
export type BoardSpec = z.infer<typeof boardSchema>;
export type LoadSpec = z.infer<typeof loadSchema>;
export type SupplySpec = z.infer<typeof supplySchema>;
export type ConductorSpec = z.infer<typeof conductorSchema>;
export type PerPhaseConductorSpec = z.infer<typeof perPhaseConductorSchema>;
export type FeederSpec = z.infer<typeof feederSchema>;
export type WindingSpec = z.infer<typeof windingSchema>;
export type ImpedanceSpec = z.infer<typeof impedanceSchema>;
export type SystemKind = (typeof SYSTEMS)[number];
export type ConnectionSpec = (typeof CONNECTIONS)[number];
export type LoadModelName = (typeof LOAD_MODELS)[number];

/**
 * The board itself, as zod schemas: supply, feeder, loads, the what-if
 * studies of a solve. One source of truth for validation, the TypeScript types
 * and the exported JSON Schema.
 *
 * The studies add load fields and file sections of their own; `boardSchemaWith`
 * is where they plug in, and boardFile/boardFileSchema.ts (above the studies)
 * composes the whole file, so this layer never imports a study.
 *
 * Shape rules that zod cannot say neatly (exactly one way to rate a load, a
 * neutral load on a board with no neutral...) live in `boardRules.ts`.
 */
import * as z from 'zod';
import { groupDigits } from '../_internal/groupDigits.js';
import { conventionsSchema } from './conventions/conventionsSchema.js';
import { nameSchema, readableText } from './nameSchemas.js';
import { NOTATION_ACCEPTED, readVoltageNotation } from './conventions/voltageNotation.js';
import {
  CIRCUIT_NUMBER,
  ANGLE_DEG,
  AWG_MAX_CHARS,
  BREAKER_POLES,
  CONDUCTOR_MATERIALS,
  CONDUIT_KINDS,
  CONNECTIONS,
  FREQUENCIES_HZ,
  LOAD_MODELS,
  NAME_MAX_CHARACTERS,
  CIRCUIT_MAX_CHARACTERS,
  NOTATION_MAX_CHARS,
  PARALLEL_CONDUCTORS,
  PF_SENSES,
  PHASE_SEQUENCES,
  PHYSICAL_RANGES,
  STAR_POINTS,
  SYSTEMS,
  type PhysicalRange,
} from './boardRanges.js';

export { CIRCUIT_MAX_CHARACTERS, CONNECTIONS, LOAD_MODELS, NAME_MAX_CHARACTERS, PHYSICAL_RANGES, SYSTEMS };

const nonNegative = z.number().nonnegative();

/**
 * A physical number in a plausible range, stated whole in the message whichever end is crossed.
 * The ranges only keep out nonsense (1e308 kW, a 1e-320 power factor) that would end in overflow
 * or a misleading "singular network"; they are wide on purpose. See PHYSICAL_RANGES.
 */
export function within(range: PhysicalRange): z.ZodNumber {
  const { min, max, unit, above } = range;
  const text = `a number ${above ? 'above' : 'from'} ${groupDigits(min)} ${above ? 'and at most' : 'to'} ${groupDigits(max)}${unit ? ` ${unit}` : ''}`;
  return (above ? z.number().gt(min, { message: text }) : z.number().min(min, { message: text })).max(max, { message: text });
}

export { labelSchema, nameReferenceSchema, nameSchema } from './nameSchemas.js';

const impedanceOf = (r: PhysicalRange, x: PhysicalRange) =>
  z
    .strictObject({
      r: within(r).describe('resistance, ohm'),
      x: within(x).describe('reactance, ohm (positive inductive, negative capacitive)'),
    })
    .describe('series impedance R + jX in ohm');
export const impedanceSchema = impedanceOf(PHYSICAL_RANGES.supplyOhms, PHYSICAL_RANGES.supplyReactanceOhms);
const loadImpedanceSchema = impedanceOf(PHYSICAL_RANGES.loadOhms, PHYSICAL_RANGES.loadReactanceOhms);

const phaseEmfSchema = z.strictObject({
  V: within(PHYSICAL_RANGES.emfV).describe('open-circuit line-to-neutral EMF, V rms'),
  angleDeg: z.number().min(ANGLE_DEG.min).max(ANGLE_DEG.max).describe('angle, degrees'),
});

const transformerSchema = z
  .strictObject({
    kVA: within(PHYSICAL_RANGES.transformerKVA).describe('rated apparent power, kVA'),
    impedancePercent: within(PHYSICAL_RANGES.impedancePercent).describe('short-circuit impedance u_k, % of rated'),
    xOverR: within(PHYSICAL_RANGES.xOverR).describe('X/R ratio of the short-circuit impedance'),
  })
  .describe('supply transformer; its impedance is referred to the board voltage');

export const conductorSchema = z
  .strictObject({
    r: within(PHYSICAL_RANGES.supplyOhms).optional().describe('resistance, ohm'),
    x: within(PHYSICAL_RANGES.supplyOhms).optional().describe('reactance, ohm'),
    lengthM: within(PHYSICAL_RANGES.lengthM).optional().describe('route length, m'),
    lengthFt: within(PHYSICAL_RANGES.lengthFt).optional().describe('route length, ft'),
    rOhmPerKm: within(PHYSICAL_RANGES.ohmsPerKm).optional().describe('resistance per km of conductor, ohm/km'),
    xOhmPerKm: within(PHYSICAL_RANGES.ohmsPerKm).optional().describe('reactance per km of conductor at the supply frequency, ohm/km; default for a library size: AWG/kcmil NEC Chapter 9 Table 9 (60 Hz, in the raceway `conduit` names), mm² 0.08 at 50 Hz, each scaled to the supply frequency'),
    mm2: within(PHYSICAL_RANGES.conductorMm2).optional().describe('metric size, mm² (resistance from IEC 60228 class 2)'),
    awg: z.string().max(AWG_MAX_CHARS).optional().describe('AWG size, e.g. "12" or "4/0" (resistance from NEC Chapter 9 Table 8)'),
    kcmil: within(PHYSICAL_RANGES.conductorKcmil).optional().describe('size in kcmil, e.g. 250 (NEC Chapter 9 Table 8)'),
    material: z.enum(CONDUCTOR_MATERIALS).optional().describe('conductor metal for a library size; default copper'),
    conduit: z.enum(CONDUIT_KINDS).optional().describe('raceway of an AWG/kcmil size, for its NEC Table 9 reactance: non-magnetic (PVC or aluminium conduit, the default) or steel'),
    temperatureC: within(PHYSICAL_RANGES.conductorTemperatureC).optional().describe('conductor operating temperature, °C (default 70 for mm², 75 for AWG/kcmil)'),
    parallel: z.int().min(PARALLEL_CONDUCTORS.min).max(PARALLEL_CONDUCTORS.max).optional().describe('conductors in parallel (2 = a doubled neutral); default 1'),
    ratingA: within(PHYSICAL_RANGES.ratingA).optional().describe('current rating of one conductor, A (derated for its installation); with parallel conductors the set is rated parallel × this'),
  })
  .describe('a conductor: r and x directly; or a length with rOhmPerKm, or with a size (mm2, awg or kcmil)');

export const perPhaseConductorSchema = z
  .strictObject({ A: conductorSchema.optional(), B: conductorSchema.optional(), C: conductorSchema.optional() })
  .describe('a different conductor for each phase');

export const perPhaseImpedanceSchema = z
  .strictObject({ A: impedanceSchema.optional(), B: impedanceSchema.optional(), C: impedanceSchema.optional() })
  .describe('a different source impedance for each phase, ohm');

const windingSchema = z
  .union([transformerSchema, impedanceSchema])
  .describe('one single-phase unit: its rating (kVA, impedancePercent, xOverR) or its impedance (r, x) referred to the secondary');

/** "208Y/120", "400/230", "120/240": read into both figures; `written` keeps the text (it also tells the region). */
const voltageNotationSchema = z
  .string()
  .max(NOTATION_MAX_CHARS)
  .describe(`the trade's notation: ${NOTATION_ACCEPTED}`)
  .transform((text, ctx) => {
    const read = readVoltageNotation(text);
    if (!read.ok) {
      ctx.addIssue({ code: 'custom', message: read.problem, params: { code: 'bad_voltage_notation' } });
      return z.NEVER;
    }
    return { lineToLine: read.notation.lineToLineV, lineToNeutral: read.notation.lineToNeutralV, written: read.notation.text };
  });

export const supplySchema = z.strictObject({
  system: z.enum(SYSTEMS).describe('how the board is fed (may be left out when voltage is written as notation)'),
  voltage: z
    .union([
      z
        .strictObject({
          lineToLine: within(PHYSICAL_RANGES.voltage).optional().describe('nominal line-to-line voltage, V'),
          lineToNeutral: within(PHYSICAL_RANGES.voltage).optional().describe('nominal line-to-neutral voltage, V'),
          // A validated spec keeps the notation it was read from, and must validate again as it is.
          written: z.string().max(NOTATION_MAX_CHARS).optional().describe('the notation this was read from (set by trivar; write the notation itself as the voltage)'),
        })
        .describe('give lineToLine or lineToNeutral'),
      voltageNotationSchema,
    ])
    .describe('nominal voltage: { lineToLine } or { lineToNeutral }, or notation such as "208Y/120", "400/230", "120/240"'),
  frequencyHz: z.literal(FREQUENCIES_HZ).describe('supply frequency, Hz'),
  sequence: z.enum(PHASE_SEQUENCES).optional().describe('phase sequence; default ABC'),
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
    .describe('a bank of single-phase transformers with star-connected (wye) secondaries, one unit per phase (units may differ)'),
  openDelta: z
    .strictObject({ 'A-B': windingSchema.optional(), 'B-C': windingSchema.optional(), 'C-A': windingSchema.optional() })
    .optional()
    .describe('an open-delta supply (three-phase-3wire): exactly two single-phase units, between the phases named'),
});

export const feederSchema = z
  .strictObject({
    line: z.union([conductorSchema, perPhaseConductorSchema]).optional().describe('each line (phase) conductor: one for all, or one per phase'),
    neutral: conductorSchema.optional().describe('the neutral conductor: required with line conductors where loads on the board (or boards beyond it) return through the neutral; r: 0, x: 0 for a neutral of no impedance'),
    lengthM: within(PHYSICAL_RANGES.lengthM).optional().describe('route length for every conductor that does not give its own, m'),
    lengthFt: within(PHYSICAL_RANGES.lengthFt).optional().describe('route length for every conductor that does not give its own, ft'),
  })
  .describe('the cable or busway that feeds the board');

export const loadSchema = z.strictObject({
  name: nameSchema('circuit name'),
  circuit: z
    .union([readableText(CIRCUIT_MAX_CHARACTERS), z.int().min(CIRCUIT_NUMBER.min).max(CIRCUIT_NUMBER.max).transform(String)])
    .optional()
    .describe(`circuit number or way on the board, for the panel schedule (default: position in the list): text of at most ${CIRCUIT_MAX_CHARACTERS} characters ("7", "1,3" for a 2-pole breaker, "L3/2"), or a whole number ${CIRCUIT_NUMBER.min} to ${CIRCUIT_NUMBER.max}, read as its text`),
  breakerA: within(PHYSICAL_RANGES.ratingA).optional().describe('rated current of the circuit breaker or fuse, A (shown in the panel schedule)'),
  poles: z
    .literal(BREAKER_POLES)
    .optional()
    .describe('poles of the breaker on line conductors (a 1P+N device is 1): 1 for a line-to-neutral load, 2 line-to-line, 3 three-phase'),
  continuous: z
    .boolean()
    .optional()
    .describe(
      'whether the load can run at its rating for 3 h or more (a continuous load); default true. On a North-American board a continuous load is warned about above 80 % of its breaker rating (NEC 210.20(A)), any other load above 100 %',
    ),
  connection: z.enum(CONNECTIONS).describe('where the load connects'),
  starPoint: z
    .enum(STAR_POINTS)
    .optional()
    .describe('for ABC-star loads: star (wye) point tied to the neutral (default on 4-wire boards) or floating'),
  kW: within(PHYSICAL_RANGES.loadKW).optional().describe('active power at nominal voltage, kW (negative = generation)'),
  kvar: within(PHYSICAL_RANGES.loadKvar).optional().describe('reactive power at nominal voltage, kvar (positive = lagging)'),
  kVA: within(PHYSICAL_RANGES.loadKVA).optional().describe('apparent power at nominal voltage, kVA'),
  A: within(PHYSICAL_RANGES.loadA).optional().describe('current at nominal voltage, A (line current for three-phase loads)'),
  pf: within(PHYSICAL_RANGES.pf).optional().describe('displacement power factor, 0.01 <= pf <= 1'),
  sense: z.enum(PF_SENSES).optional().describe('whether pf is lagging (inductive, default) or leading'),
  ohms: loadImpedanceSchema.optional().describe('impedance per phase (star) or per branch (delta), ohm; its draw at nominal voltage (branches × V²/|Z|) at most the kVA limit of a load, 100,000 kVA'),
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

/** What a study adds to a board file: fields on every load, and sections of the file. */
export interface BoardFileExtension<L extends z.ZodRawShape, S extends z.ZodRawShape> {
  readonly loadFields: L;
  readonly sections: S;
}

/** The load schema with a study's fields appended (after the board's own, so the JSON Schema keeps its order). */
export const loadSchemaWith = <L extends z.ZodRawShape>(loadFields: L) => loadSchema.extend(loadFields);

/**
 * The board file's schema with the studies' load fields and sections added:
 * the extension point boardFile/ uses to compose the whole file.
 */
export function boardSchemaWith<L extends z.ZodRawShape, S extends z.ZodRawShape>(extension: BoardFileExtension<L, S>) {
  return z
    .strictObject({
      $schema: z.string().optional(),
      name: nameSchema('board name').optional(),
      note: z.string().optional().describe('free text'),
      supply: supplySchema,
      conventions: conventionsSchema.optional(),
      feeder: feederSchema.optional(),
      loads: z.array(loadSchemaWith(extension.loadFields)).min(1).describe('the circuits on the board'),
      studies: studiesSchema.optional(),
      ...extension.sections,
    })
    .describe('a trivar board file');
}

/** The board without any study's fields: what this layer and the solver read. */
export const boardBaseSchema = boardSchemaWith({ loadFields: {}, sections: {} });

/**
 * A board as the board layer reads it (validated): supply, feeder, loads, studies.
 * A whole board file (boardFile/ `BoardSpec`) is one of these with study fields added.
 */
export type BoardBaseSpec = z.infer<typeof boardBaseSchema>;
export type LoadBaseSpec = z.infer<typeof loadSchema>;
export type SupplySpec = z.infer<typeof supplySchema>;
export type ConductorSpec = z.infer<typeof conductorSchema>;
export type PerPhaseConductorSpec = z.infer<typeof perPhaseConductorSchema>;
export type FeederSpec = z.infer<typeof feederSchema>;
export type WindingSpec = z.infer<typeof windingSchema>;
export type ImpedanceSpec = z.infer<typeof impedanceSchema>;
export type SystemKind = (typeof SYSTEMS)[number];
export type ConnectionSpec = (typeof CONNECTIONS)[number];
export type LoadModelName = (typeof LOAD_MODELS)[number];

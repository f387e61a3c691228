/**
 * What a harmonic study reads from a board file, as zod schemas: a load's
 * `spectrum` and `linearForm` (`harmonicLoadFields`, added to every load by
 * boardFile/), and the board's `harmonics:` section
 * (background supply distortion, an installed bank to check, TDD at the point
 * of common coupling, the frequency scan). Checks zod cannot say as a type
 * (whole orders, no repeats, a plausible total) are refinements here, so they
 * run wherever the schema does and name the field.
 */
import * as z from 'zod';
import type { BoardBaseSpec, LoadBaseSpec } from '../board/boardSchema.js';
import { nameSchema } from '../board/nameSchemas.js';
import { SPECTRUM_KINDS } from './typicalSpectra.js';
import { toleranceSchema } from '../correction/correctionSpec.js';
import { VOLTAGE_DISTORTION_BASES } from './voltageDistortionLimits.js';

/** Highest harmonic order studied: IEEE 519-2014 limits stop at h = 50. */
export const MAX_ORDER = 50;
/** A total distortion above this (% of fundamental) is not a plausible current spectrum (common practice, no source). */
export const MAX_SPECTRUM_THD_PERCENT = 200;
/** A single background voltage harmonic above this (% of nominal) is not a plausible supply (common practice, no source). */
export const MAX_BACKGROUND_PERCENT = 20;

const entrySchema = (what: string, maxPercent: number) =>
  z.strictObject({
    order: z.number().describe(`harmonic order, a whole number from 2 to ${MAX_ORDER}`),
    percent: z.number().positive().max(maxPercent).describe(what),
    angleDeg: z.number().min(-360).max(360).optional().describe('angle relative to h × the fundamental angle, degrees; default 0'),
  });

type Entry = { order: number; percent: number };

/** Whole orders in range, each once; and, for current spectra, a plausible total. */
function checkOrders(entries: readonly Entry[], ctx: z.RefinementCtx, maxThdPercent: number | null): void {
  const seen = new Map<number, number>();
  entries.forEach((e, i) => {
    if (!Number.isInteger(e.order) || e.order < 2 || e.order > MAX_ORDER)
      ctx.addIssue({
        code: 'custom',
        path: [i, 'order'],
        params: { code: Number.isInteger(e.order) ? 'out_of_range' : 'not_integer' },
        message: `a whole harmonic order from 2 to ${MAX_ORDER}`,
      });
    else if (seen.has(e.order))
      ctx.addIssue({ code: 'custom', path: [i, 'order'], params: { code: 'duplicate' }, message: `each order once (order ${e.order} is already at [${seen.get(e.order)}])` });
    else seen.set(e.order, i);
  });
  if (maxThdPercent !== null) {
    const thd = Math.sqrt(entries.reduce((s, e) => s + e.percent * e.percent, 0));
    if (thd > maxThdPercent)
      ctx.addIssue({
        code: 'custom',
        path: [],
        params: { code: 'implausible', received: Math.round(thd * 10) / 10 },
        message: `a spectrum whose total distortion √Σ(%²) is at most ${maxThdPercent} % of the fundamental (percent is of the load's fundamental current)`,
      });
  }
}

export const spectrumEntriesSchema = z
  .array(entrySchema("current of this order, % of the load's fundamental current", 100))
  .min(1)
  .superRefine((entries, ctx) => checkOrders(entries, ctx, MAX_SPECTRUM_THD_PERCENT))
  .describe('harmonic currents of a non-linear load');

export const spectrumSchema = z
  .union([z.enum(SPECTRUM_KINDS), spectrumEntriesSchema])
  .describe(`a built-in typical spectrum (${SPECTRUM_KINDS.join(', ')}) or a list of { order, percent, angleDeg }`);

export const LINEAR_FORMS = ['series', 'parallel'] as const;
export const linearFormSchema = z
  .enum(LINEAR_FORMS)
  .describe('how a linear load is represented at harmonic orders: series R + jX or parallel R ‖ jX from its fundamental values');

/** The fields a harmonic study adds to every load of a board file. */
export const harmonicLoadFields = {
  spectrum: spectrumSchema.optional().describe('harmonic currents of a non-linear load: a built-in typical spectrum or a list; default none (linear)'),
  linearForm: linearFormSchema
    .optional()
    .describe('for a linear load at harmonic orders: series R + jX or parallel R ‖ jX; default from harmonics.linearForm (parallel); ohms loads keep series'),
};

export const backgroundSchema = z
  .array(entrySchema('harmonic voltage of the supply, % of the nominal voltage', MAX_BACKGROUND_PERCENT))
  .min(1)
  .superRefine((entries, ctx) => checkOrders(entries, ctx, null))
  .describe('harmonic voltages already on the supply before this board draws anything (background distortion)');

export const installedBankSchema = z
  .strictObject({
    connection: z.enum(['delta', 'star']).describe('delta (units line to line; on a split-phase board the one capacitor across the two lines) or star to the neutral bar (on a single-phase board the one capacitor from the line to the neutral)'),
    ratedV: z.number().positive().describe('rated voltage of each capacitor element, V'),
    stepsKvar: z.array(z.number().positive()).min(1).max(12).describe('three-phase output of each switched step at rated voltage, kvar'),
    fixedKvar: z.number().nonnegative().optional().describe('three-phase output of the permanently connected part at rated voltage, kvar; default 0'),
    detuningPercent: z.number().min(0).max(20).optional().describe('detuning reactor, p = X_L/X_C in %; 0 or absent for a plain bank'),
    capacitanceTolerance: toleranceSchema.optional().describe('capacitance tolerance of the units; the duty is checked at each end; default −5 % … +10 % (IEC 60831-1, from memory)'),
  })
  .describe('a capacitor bank on the board whose steps the scan switches');

export const harmonicsSectionSchema = z
  .strictObject({
    background: backgroundSchema.optional(),
    linearForm: linearFormSchema.optional().describe('default form for linear loads; default parallel'),
    resistance: z
      .enum(['constant', 'skin-effect'])
      .optional()
      .describe('source and feeder resistance at order h: constant, or × √h for skin effect; default constant'),
    bank: installedBankSchema.optional(),
    pcc: z
      .strictObject({
        shortCircuitRatio: z.number().positive().optional().describe('I_sc/I_L at the point of common coupling; default from the source impedance'),
        demandCurrentA: z.number().positive().optional().describe('maximum demand load current I_L, A; default the solved fundamental line current'),
      })
      .optional()
      .describe('judge the current distortion against the IEEE 519 table at the board feed'),
    scan: z
      .strictObject({
        maxOrder: z.number().min(2).max(MAX_ORDER).optional().describe('highest order scanned; default 25'),
        step: z.number().min(0.005).max(1).optional().describe('order step of the scan; default 0.05'),
      })
      .optional(),
    detuning: z
      .union([z.enum(['auto', 'none']), z.literal([5.67, 7, 14])])
      .optional()
      .describe('trivar correct: detuned variants compared with the plain bank — auto (5.67, 7 and 14 %), none, or one factor in %; default auto'),
    capacitorStandard: z.enum(['ieee-18', 'iec-60831-1']).optional().describe('limits the capacitor duty is judged against; default IEC 60831-1 at 50 Hz, IEEE 18 at 60 Hz'),
    voltageDistortionLimits: z
      .enum(VOLTAGE_DISTORTION_BASES)
      .optional()
      .describe(
        'levels the board voltages are judged against, each order and THD: iec-61000-2-2 (compatibility levels of public LV networks), en50160 (supply levels at LV) or ieee-519 (5 % one order, 8 % THD at ≤ 1 kV); default iec-61000-2-2 on an IEC board, ieee-519 on a North-American one. Current distortion at the point of common coupling (pcc) is IEEE 519 whatever this says',
      ),
  })
  .describe('a harmonic study for `trivar harmonics`');

/** A bank on one board of an installation: the installed bank's fields and the board it is on. */
export const installationBankSchema = installedBankSchema
  .extend({
    board: nameSchema('the name of the board the bank is on'),
    stepsInService: z
      .array(z.number().int().min(1).max(12))
      .max(12)
      .optional()
      .describe(
        'the steps in service at the fundamental (trivar solve, and trivar correct for equipment on another board), numbered from 1; default every step; [] for the fixed part only. trivar harmonics switches every step whatever this says',
      ),
  })
  .describe('a capacitor bank on one board of the installation; the scan switches its steps');

/** An installation file's `harmonics:` section: the board file's, with banks on named boards instead of one bank. */
export const installationHarmonicsSectionSchema = harmonicsSectionSchema
  .omit({ bank: true })
  .extend({
    banks: z.array(installationBankSchema).min(1).optional().describe('capacitor banks installed on the boards, at most one per board'),
  })
  .describe('a harmonic study for `trivar harmonics` on the installation (pcc judges the supply intake)');

export type SpectrumSpec = z.infer<typeof spectrumSchema>;
export type SpectrumEntrySpec = z.infer<typeof spectrumEntriesSchema>[number];
export type LinearForm = (typeof LINEAR_FORMS)[number];
export type HarmonicsSectionSpec = z.infer<typeof harmonicsSectionSchema>;
export type InstalledBankSpec = z.infer<typeof installedBankSchema>;
export type InstallationBankSpec = z.infer<typeof installationBankSchema>;
export type InstallationHarmonicsSectionSpec = z.infer<typeof installationHarmonicsSectionSchema>;
export type HarmonicLoadSpec = LoadBaseSpec & z.infer<z.ZodObject<typeof harmonicLoadFields>>;
/**
 * What the harmonic study reads from a board file: the board, its loads' harmonic
 * fields and the `harmonics:` section. A whole board file (`BoardSpec`) is one.
 */
export type HarmonicsBoardSpec = Omit<BoardBaseSpec, 'loads'> & {
  loads: HarmonicLoadSpec[];
  harmonics?: HarmonicsSectionSpec | undefined;
};

/**
 * The board file's `profile:` section: load groups that interval-data columns
 * can name, scenarios for users without logged data, the tariff, limits and
 * the automatic bank to simulate. Every field is optional; defaults with their
 * reasons are in profileDefaults.ts.
 */
import * as z from 'zod';
import { labelSchema, nameReferenceSchema, nameSchema } from '../board/nameSchemas.js';
import { CURRENCY_MAX_CHARACTERS } from '../board/boardRanges.js';
// The lowest switching threshold, and why, is in profileDefaults.ts: the report's advice reads it without zod.
import { MIN_RESPONSE_SHARE, PROFILE_DEFAULTS } from './profileDefaults.js';

export { MIN_RESPONSE_SHARE };

const positive = z.number().positive();
const RESPONSE_SHARE_RANGE = `a number from ${MIN_RESPONSE_SHARE} to 1.5 (× the smallest step): below ${MIN_RESPONSE_SHARE} a step that closes leaves the board over-corrected past the threshold and opens again, so the controller hunts on a steady load (common practice, no source)`;
const nonNegative = z.number().nonnegative();
const powerFactor = z.number().gt(0).max(1);

export const scenarioSchema = z
  .strictObject({
    name: nameSchema('scenario name'),
    hours: positive.max(8784).optional().describe('hours per year the board spends in this state; all the scenarios together at most 8784 h (a leap year)'),
    weight: positive.optional().describe('relative share of the year (scaled so all weights fill 8760 h); give hours or weight'),
    loads: z
      .record(nameReferenceSchema('a load or group name'), nonNegative.max(10))
      .describe('load or group name → fraction of its rating in this state (1 = rated)'),
    others: nonNegative.max(10).optional().describe('fraction of rating for loads not named in loads; default 0 (off)'),
  })
  .describe('a named state of the board');

export const tariffSchema = z
  .strictObject({
    currency: labelSchema('label printed beside charges', CURRENCY_MAX_CHARACTERS).optional().describe(`label printed beside charges (at most ${CURRENCY_MAX_CHARACTERS} characters); default "units"`),
    reactive: z
      .strictObject({
        tanPhiAllowance: nonNegative.describe('kvarh allowed free per kWh in the month (tan φ); e.g. 0.4 ≈ PF 0.93'),
        pricePerKvarh: nonNegative.describe('charge per lagging kvarh above the allowance'),
      })
      .optional()
      .describe('a charge on reactive energy above a tan φ allowance, per calendar month'),
    demand: z
      .strictObject({
        windowMinutes: z.number().int().min(1).max(60).optional().describe('demand averaging window, minutes; default 15'),
        pricePerKVA: nonNegative.describe('charge per kVA of the month’s highest window-average demand'),
      })
      .optional()
      .describe('a charge on the highest kVA demand of each calendar month'),
  })
  .describe('tariff forms to price; every figure is the user’s own');

export const bankStepSchema = z.strictObject({
  kvar: positive.describe('output at nominal voltage, kvar (three-phase total, or the one phase)'),
  phase: z.enum(['ABC', 'A', 'B', 'C']).optional().describe('ABC = three-phase step (star, to neutral); A/B/C = single-phase step on that phase; default ABC'),
});

export const profileBankSchema = z
  .strictObject({
    targetPf: powerFactor.optional().describe('power factor the controller aims for; default 0.95'),
    coverShare: z.number().gt(0).max(1).optional().describe('share of intervals whose need the sized bank covers; default 0.95'),
    stepCount: z.number().int().min(1).max(16).optional().describe('most equal steps when sizing from the profile (fewer where the need is covered by fewer of the smallest units); default 6'),
    steps: z.array(bankStepSchema).min(1).max(24).optional().describe('steps as built (skips sizing from the profile)'),
    responseShare: z
      .number()
      .min(MIN_RESPONSE_SHARE, { message: RESPONSE_SHARE_RANGE })
      .max(1.5, { message: RESPONSE_SHARE_RANGE })
      .optional()
      .describe(
        `switching threshold as a share of the smallest step (C/k setting), ${MIN_RESPONSE_SHARE} to 1.5; default ${PROFILE_DEFAULTS.responseShare}, the share the correction study sets C/k at. Below ${MIN_RESPONSE_SHARE} the controller hunts on a steady load: a step that closes leaves the board over-corrected by more than the threshold and opens again (common practice, no source)`,
      ),
    delaySeconds: nonNegative.max(3600).optional().describe('time a need must persist before a step switches; default 30 s'),
    reconnectSeconds: nonNegative.max(3600).optional().describe('minimum time a step stays off before reconnecting (discharge); default the discharge time of the board\'s practice: 180 s IEC (50 Hz), 60 s North-American (60 Hz)'),
    perPhase: z.boolean().optional().describe('size single-phase steps per phase instead of three-phase steps; default false'),
    measuredAt: nameSchema('origin or a board name')
      .optional()
      .describe(
        "installation files: where the controller measures: origin (the supply's terminals, where the service cable starts) or a board the bank's board is fed through (at its incomer); default the bank's own board. The correction study's bank (--correction-bank) reads where its target is measured instead (correction.target.measuredAt)",
      ),
  })
  .describe('an automatic capacitor bank simulated over the profile');

export const profileLimitsSchema = z
  .strictObject({
    unbalancePercent: positive
      .optional()
      .describe("voltage unbalance threshold, %, on the board region's index: |V2|/|V1| for IEC boards (default 2), the largest deviation of a line-to-line voltage from their average for North-American boards (default 3, ANSI C84.1)"),
    neutralA: positive.optional().describe('neutral current threshold, A; default the neutral rating (none where the neutral has no rating)'),
    voltageLowPercent: positive.optional().describe("lowest acceptable phase voltage, % of nominal; default the board's voltage limits (conventions.voltageLimits, or the board's own in an installation)"),
    voltageHighPercent: positive.optional().describe("highest acceptable phase voltage, % of nominal; default the board's voltage limits (conventions.voltageLimits, or the board's own in an installation)"),
  })
  .describe('thresholds for the hours-above counts');

export const profileSpecSchema = z
  .strictObject({
    groups: z
      .record(nameSchema('group name'), z.array(nameReferenceSchema('a load name')).min(1))
      .optional()
      .describe('named sets of loads that one interval-data column can drive'),
    scenarios: z.array(scenarioSchema).min(1).optional().describe('named load states for a profile without logged data'),
    tariff: tariffSchema.optional(),
    limits: profileLimitsSchema.optional(),
    bank: profileBankSchema.optional(),
  })
  .describe('load-over-time study for `trivar profile`');

export type ProfileSpec = z.infer<typeof profileSpecSchema>;
export type ScenarioSpec = z.infer<typeof scenarioSchema>;
export type TariffSpec = z.infer<typeof tariffSchema>;
export type ProfileBankSpec = z.infer<typeof profileBankSchema>;
export type BankStepSpec = z.infer<typeof bankStepSchema>;
export type ProfileLimitsSpec = z.infer<typeof profileLimitsSchema>;

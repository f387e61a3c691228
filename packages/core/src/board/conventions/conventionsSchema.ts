/** The file's `conventions:` section (board and installation files alike). */
import * as z from 'zod';
import { PHASE_NAMINGS } from './phaseNames.js';
import { REGIONS } from './region.js';
import { bandWords, presetLimits, VOLTAGE_LIMIT_PERCENT, VOLTAGE_LIMIT_PRESET_NAMES } from './voltageLimits.js';

const presetWords = VOLTAGE_LIMIT_PRESET_NAMES.map((n) => `${n}: ${bandWords(presetLimits(n))}`).join('; ');

const percentBand = z.number().min(VOLTAGE_LIMIT_PERCENT.min).max(VOLTAGE_LIMIT_PERCENT.max);

export const voltageLimitsSchema = z
  .union([
    z.enum(VOLTAGE_LIMIT_PRESET_NAMES as [string, ...string[]]).describe(`a named preset (${presetWords})`),
    z
      .strictObject({
        underPercent: percentBand.describe('allowed fall below nominal, % (0 to 50)'),
        overPercent: percentBand.describe('allowed rise above nominal, % (0 to 50)'),
      })
      .describe('custom limits, % of nominal'),
  ])
  .describe('the voltage limits every board is judged against; default by region (en50160-supply, or c84-service-a in North America)');

export const conventionsSchema = z
  .strictObject({
    region: z
      .enum(REGIONS)
      .optional()
      .describe('wording and defaults of a region; default from the voltage notation, a split-phase system, or the frequency (60 Hz: north-america)'),
    phaseNames: z
      .enum(PHASE_NAMINGS)
      .optional()
      .describe('how reports label the phases (the file may be written in either naming); default the naming the file uses, else A/B/C in North America and L1/L2/L3 elsewhere'),
    voltageLimits: voltageLimitsSchema.optional(),
  })
  .describe('the trade conventions the reports follow');

export type ConventionsSpec = z.infer<typeof conventionsSchema>;

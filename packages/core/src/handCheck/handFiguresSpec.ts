/**
 * The hand figures a user brings to `trivar check`: the capacitors they chose
 * (per phase or per line pair, in kvar or µF) and, optionally, the power factor
 * and currents they expect, and the target their sizing aimed at.
 */
import * as z from 'zod';
import { within } from '../board/boardSchema.js';
import { PHYSICAL_RANGES } from '../board/boardRanges.js';

export const HAND_BRANCHES = ['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A'] as const;
export type HandBranch = (typeof HAND_BRANCHES)[number];

export const handCapacitorSchema = z
  .strictObject({
    branch: z.enum(HAND_BRANCHES).describe('where the capacitor connects: a phase to neutral (A-N…) or a line pair (A-B…)'),
    kvar: within(PHYSICAL_RANGES.capacitorKvar).optional().describe('nameplate output, kvar (at ratedV)'),
    uF: within(PHYSICAL_RANGES.capacitorUF).optional().describe('capacitance, µF'),
    ratedV: within(PHYSICAL_RANGES.voltage).optional().describe('voltage the kvar rating is stated at, V; default the nominal voltage across the branch'),
  })
  .refine((c) => (c.kvar === undefined) !== (c.uF === undefined), { message: 'either kvar or uF (one of them, not both)' })
  .refine((c) => c.ratedV === undefined || c.kvar !== undefined, { message: 'ratedV only beside a kvar rating (a capacitance in uF needs none)', path: ['ratedV'] });

const expectedLineSchema = z.strictObject({
  currentA: within(PHYSICAL_RANGES.loadA).optional().describe('line current you expect after the capacitors, A'),
  pf: z.number().gt(0).max(1).optional().describe('power factor you expect on this line'),
});

export const handFiguresSchema = z
  .strictObject({
    $schema: z.string().optional(),
    note: z.string().optional(),
    targetPf: z.number().gt(0).max(1).optional().describe('the power factor your sizing aimed at (shows Qc = P(tan φ1 − tan φ2) per phase)'),
    capacitors: z.array(handCapacitorSchema).min(1).describe('the capacitors you chose'),
    expected: z
      .strictObject({
        lines: z.strictObject({ A: expectedLineSchema.optional(), B: expectedLineSchema.optional(), C: expectedLineSchema.optional() }).optional(),
        neutralA: z.number().nonnegative().max(PHYSICAL_RANGES.loadA.max).optional().describe('neutral current you expect, A'),
        pf: z.number().gt(0).max(1).optional().describe('board power factor you expect (vector: ΣP/|ΣS|)'),
      })
      .optional()
      .describe('the figures your hand calculation predicts with the capacitors in'),
  })
  .describe('hand figures for trivar check');

export type HandFiguresSpec = z.infer<typeof handFiguresSchema>;
export type HandCapacitorSpec = z.infer<typeof handCapacitorSchema>;

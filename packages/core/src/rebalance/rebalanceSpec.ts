/**
 * What a rebalancing study asks for, as a zod schema: the board file's
 * `rebalance:` section and the options of `rebalanceBoard`. Defaults live in
 * `resolveRebalanceSpec` (rebalanceRules.ts); board-dependent checks there too.
 */
import * as z from 'zod';
import { nameReferenceSchema, nameSchema } from '../board/nameSchemas.js';

/** The figures a score can weigh. */
export const AIM_FIGURES = ['largestLine', 'neutral', 'currentUnbalance', 'voltageUnbalance'] as const;
export type AimFigure = (typeof AIM_FIGURES)[number];

const weight = z.number().nonnegative();

export const aimSchema = z
  .strictObject({
    largestLine: weight.optional().describe('weight of the largest line current, per A'),
    neutral: weight.optional().describe('weight of the neutral current, per A'),
    currentUnbalance: weight.optional().describe('weight of the current unbalance |I2|/|I1|, per %'),
    voltageUnbalance: weight.optional().describe('weight of the board voltage unbalance |V2|/|V1|, per %'),
  })
  .describe('what to make small: weights of each figure in the score (default largestLine 1, and neutral 1 where the board has a neutral)');

const pinEntry = z.union([
  nameReferenceSchema('a circuit name (unique in the file): it stays where it is'),
  z
    .strictObject({
      circuit: nameReferenceSchema('circuit name'),
      board: nameSchema('board name').optional().describe('the board it is on (needed where several boards have a circuit of that name)'),
      on: z.enum(['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A']).optional().describe('the connection it must end on; default where it is now'),
    })
    .describe('a circuit that stays, or must end on the given connection (a forced move when it is elsewhere now)'),
]);

const lineCapacity = z.union([
  z.number().positive(),
  z.strictObject({ A: z.number().positive().optional(), B: z.number().positive().optional(), C: z.number().positive().optional() }),
]);

export const loadConditionSchema = z
  .strictObject({
    name: nameSchema('what the condition is, e.g. "evening peak"'),
    weight: z.number().positive().optional().describe('weight in the weighted mean of conditions; default 1'),
    factor: z.number().min(0).optional().describe('fraction of every circuit running; default 1'),
    circuits: z
      .record(nameReferenceSchema('a circuit name, or "board/circuit"'), z.number().min(0))
      .optional()
      .describe('per-circuit fractions that override factor (0 = off; an exporting circuit keeps its sign); key a circuit name, or "board/circuit" where the name is on several boards'),
  })
  .describe('one load condition the circuits are scored under');

export const rebalanceSpecSchema = z
  .strictObject({
    aim: aimSchema.optional(),
    combine: z
      .enum(['worst', 'weighted'])
      .optional()
      .describe('how the conditions combine: the worst condition, or the weighted mean; default worst'),
    moveLimit: z.int().min(0).optional().describe('most circuits that may be moved; default no limit'),
    nearBestPercent: z
      .number()
      .min(0)
      .max(100)
      .optional()
      .describe('fewest-moves mode: the fewest moves whose score is within this % of the best score of the answers that keep every rating and capacity; no effect where none does'),
    pinned: z.array(pinEntry).optional().describe('circuits that must not move, or must end on a given connection'),
    lineCapacityA: lineCapacity.optional().describe('largest current each line may carry in any condition, A (one number for every line), at each board where the score is measured'),
    conditions: z
      .union([z.array(loadConditionSchema).min(1), z.literal('scenarios')])
      .optional()
      .describe('load conditions, or "scenarios": the profile section\'s scenarios, weighted by their hours; default one: every circuit at its rating'),
    boards: z
      .array(nameSchema('board name'))
      .min(1)
      .optional()
      .describe('installations: the boards whose circuits may move; default every board'),
    measureAt: nameSchema('"each", "main" or a board name')
      .optional()
      .describe('installations: where the score is measured: "each" (every board\'s incomer, scores added), "main" (the main incomer) or a board name (its incomer and bus voltage); default each'),
  })
  .describe('a rebalancing study for `trivar rebalance` (command-line options override it)');

export type RebalanceSpec = z.infer<typeof rebalanceSpecSchema>;
export type AimSpec = z.infer<typeof aimSchema>;
export type LoadConditionSpec = z.infer<typeof loadConditionSchema>;
export type PinSpec = z.infer<typeof pinEntry>;

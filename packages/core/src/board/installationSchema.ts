/**
 * The installation file: one supply, boards in a radial tree joined by feeders.
 * The main board (the one with no `fedFrom`) takes the service feeder from the
 * supply; every other board names the board that feeds it. A board file
 * (supply, feeder, loads) is the installation with one board and stays valid.
 */
import * as z from 'zod';
import { correctionSpecSchema } from '../correction/correctionSpec.js';
import { feederSchema, loadSchema, studiesSchema, supplySchema } from './boardSchema.js';
import { rebalanceSpecSchema } from '../rebalance/rebalanceSpec.js';

export const installationBoardSchema = z.strictObject({
  name: z.string().min(1).describe('board name (unique in the installation)'),
  fedFrom: z.string().min(1).optional().describe('the board that feeds this one; leave out for the main board, which the supply feeds'),
  feeder: feederSchema.optional().describe('the cable from the feeding board (for the main board: from the supply)'),
  loads: z.array(loadSchema).describe('the circuits on this board (may be empty on a board that only feeds others)'),
});

export const installationSchema = z
  .strictObject({
    $schema: z.string().optional(),
    name: z.string().min(1).optional().describe('installation name'),
    note: z.string().optional().describe('free text'),
    supply: supplySchema,
    boards: z.array(installationBoardSchema).min(1).describe('the boards, in any order; exactly one has no fedFrom'),
    studies: studiesSchema.optional(),
    correction: correctionSpecSchema
      .partial()
      .extend({ board: z.string().min(1).optional().describe('the board the bank goes on; default the main board') })
      .optional()
      .describe('a power-factor correction study for `trivar correct` (command-line options override it)'),
    rebalance: rebalanceSpecSchema.optional(),
  })
  .describe('a trivar installation file');

export type InstallationSpec = z.infer<typeof installationSchema>;
export type InstallationBoardSpec = z.infer<typeof installationBoardSchema>;

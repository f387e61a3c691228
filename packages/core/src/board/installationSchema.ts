/**
 * The installation file: one supply, boards in a radial tree joined by feeders.
 * The main board (the one with no `fedFrom`) takes the service feeder from the
 * supply; every other board names the board that feeds it. A board file
 * (supply, feeder, loads) is the installation with one board and stays valid.
 *
 * As with board files, the studies' load fields and sections plug in through
 * `installationSchemaWith`; boardFile/ composes the whole file.
 */
import * as z from 'zod';
import { conventionsSchema, voltageLimitsSchema } from './conventions/conventionsSchema.js';
import { feederSchema, loadSchemaWith, nameSchema, studiesSchema, supplySchema, type BoardFileExtension } from './boardSchema.js';

const installationBoardSchemaWith = <L extends z.ZodRawShape>(loadFields: L) =>
  z.strictObject({
    name: nameSchema('board name, unique in the installation'),
    fedFrom: nameSchema('the feeding board').optional().describe('the board that feeds this one; leave out for the main board, which the supply feeds'),
    feeder: feederSchema.optional().describe('the cable from the feeding board (for the main board: from the supply)'),
    voltageLimits: voltageLimitsSchema
      .optional()
      .describe(
        "this board's own voltage limits, in place of the installation's (conventions.voltageLimits) for every check of its voltages: a named preset or { underPercent, overPercent }, e.g. tighter limits on a board feeding sensitive equipment",
      ),
    loads: z.array(loadSchemaWith(loadFields)).describe('the circuits on this board (may be empty on a board that only feeds others)'),
  });

/** The installation file's schema with the studies' load fields and sections added. */
export function installationSchemaWith<L extends z.ZodRawShape, S extends z.ZodRawShape>(extension: BoardFileExtension<L, S>) {
  return z
    .strictObject({
      $schema: z.string().optional(),
      name: nameSchema('installation name').optional(),
      note: z.string().optional().describe('free text'),
      supply: supplySchema,
      conventions: conventionsSchema.optional(),
      boards: z.array(installationBoardSchemaWith(extension.loadFields)).min(1).describe('the boards, in any order; exactly one has no fedFrom'),
      studies: studiesSchema.optional(),
      ...extension.sections,
    })
    .describe('a trivar installation file');
}

/** The installation without any study's fields: what this layer and the solver read. */
export const installationBaseSchema = installationSchemaWith({ loadFields: {}, sections: {} });

export type InstallationBaseSpec = z.infer<typeof installationBaseSchema>;

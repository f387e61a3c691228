/**
 * The whole board and installation file: the board layer's schemas with every
 * study's load fields and sections added. This is the one place that knows all
 * the studies' sections, so board/ never imports a study; a new study section
 * is added here (and its rules in validateBoard.ts).
 */
import * as z from 'zod';
import { boardSchemaWith, nameSchema } from '../board/boardSchema.js';
import { installationSchemaWith } from '../board/installationSchema.js';
import { harmonicLoadFields, harmonicsSectionSchema, installationHarmonicsSectionSchema } from '../harmonics/harmonicsSpec.js';
import { profileSpecSchema } from '../profile/profileSpec.js';
import { rebalanceSpecSchema } from '../rebalance/rebalanceSpec.js';
import { correctionSection } from './correctionSection.js';

const CORRECTION_WORDS = 'a power-factor correction study for `trivar correct` (command-line options override it)';

export const boardSchema = boardSchemaWith({
  loadFields: harmonicLoadFields,
  sections: {
    correction: correctionSection.optional().describe(CORRECTION_WORDS),
    profile: profileSpecSchema.optional(),
    harmonics: harmonicsSectionSchema.optional(),
    rebalance: rebalanceSpecSchema.optional(),
  },
});

export const installationSchema = installationSchemaWith({
  loadFields: harmonicLoadFields,
  sections: {
    correction: correctionSection
      .extend({ board: nameSchema('board name').optional().describe('the board the bank goes on; default the main board') })
      .optional()
      .describe(CORRECTION_WORDS),
    profile: profileSpecSchema.optional(),
    harmonics: installationHarmonicsSectionSchema.optional(),
    rebalance: rebalanceSpecSchema.optional(),
  },
});

/** A board as written in a board file (validated), with every study's section. */
export type BoardSpec = z.infer<typeof boardSchema>;
/** One load of a board file, with the study fields (spectrum, linearForm). */
export type LoadSpec = BoardSpec['loads'][number];
export type InstallationSpec = z.infer<typeof installationSchema>;
export type InstallationBoardSpec = InstallationSpec['boards'][number];

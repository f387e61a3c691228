/**
 * The board file's `correction:` section: the correction study with every field optional (the command
 * line fills in the rest). Apart from boardFileSchema.ts so that `trivar correct` can check a board's
 * correction section without building every study's schema (wellFormedCorrectionBoard.ts).
 */
import { correctionSpecSchema } from '../correction/correctionSpec.js';

export const correctionSection = correctionSpecSchema.partial();

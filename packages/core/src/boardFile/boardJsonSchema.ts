import * as z from 'zod';
import { boardSchema, installationSchema } from './boardFileSchema.js';
import { withTradeSpellings } from '../board/conventions/spellingsInJsonSchema.js';

/**
 * JSON Schema (draft 2020-12) of the board file, for editors to complete and
 * check board files. Generated from the same zod schema the validator uses, with
 * the trade's other spellings the reader accepts (L1/L2/L3, voltage notation).
 */
export function boardJsonSchema(): Record<string, unknown> {
  return {
    ...withTradeSpellings(z.toJSONSchema(boardSchema, { io: 'input' }) as Record<string, unknown>),
    title: 'trivar board file',
  };
}

/** JSON Schema of the installation file (a supply and boards in a radial tree), made the same way. */
export function installationJsonSchema(): Record<string, unknown> {
  return {
    ...withTradeSpellings(z.toJSONSchema(installationSchema, { io: 'input' }) as Record<string, unknown>),
    title: 'trivar installation file',
  };
}

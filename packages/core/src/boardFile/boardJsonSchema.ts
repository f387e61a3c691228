import * as z from 'zod';
import { boardSchema } from './boardFileSchema.js';

/**
 * JSON Schema (draft 2020-12) of the board file, for editors to complete and
 * check board files. Generated from the same zod schema the validator uses.
 */
export function boardJsonSchema(): Record<string, unknown> {
  return {
    ...z.toJSONSchema(boardSchema, { io: 'input' }),
    title: 'trivar board file',
  };
}

/** `trivar schema`: print the JSON Schema of board files. */
import { boardJsonSchema } from '@trivar/core';
import type { CliIo } from '../io.js';

export function runSchema(io: CliIo): void {
  io.stdout(`${JSON.stringify(boardJsonSchema(), null, 2)}\n`);
}

/** `trivar schema`: print the JSON Schema of board files, or of installation files. */
import { boardJsonSchema, installationJsonSchema } from '@trivar/core';
import type { CliIo } from '../io.js';

export interface SchemaCommandOptions {
  readonly installation?: boolean;
}

export function runSchema(io: CliIo, options: SchemaCommandOptions = {}): void {
  io.stdout(`${JSON.stringify(options.installation ? installationJsonSchema() : boardJsonSchema(), null, 2)}\n`);
}

/** The one place results reach stdout: exact JSON, or the text report with user text escaped for the terminal. */
import type { CliIo } from './io.js';
import { forTerminal } from './format/terminalText.js';

export function writeResult<T>(io: CliIo, result: T, json: boolean | undefined, render: (result: T) => string): void {
  io.stdout(json ? `${JSON.stringify(result, null, 2)}\n` : render(forTerminal(result)));
}

/** What a command needs from the outside world; tests pass their own. */
import { readFileSync } from 'node:fs';
import { EXIT, UsageError } from './exitCodes.js';

export interface CliIo {
  readonly stdout: (text: string) => void;
  readonly stderr: (text: string) => void;
  /** Reads a board file, or standard input for "-". */
  readonly readSource: (path: string) => Promise<string>;
  /** True when stdout is a terminal (colour allowed). */
  readonly isTty: boolean;
  /** True when stderr is a terminal: long runs may draw a progress bar there. */
  readonly progressTty?: boolean;
}

async function readStdin(): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString('utf8');
}

export const processIo: CliIo = {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
  readSource: async (path) => {
    if (path === '-') return readStdin();
    try {
      return readFileSync(path, 'utf8');
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a directory' : (code ?? 'unreadable');
      throw new UsageError(`cannot read board file "${path}": ${why}`, EXIT.input);
    }
  },
  isTty: Boolean(process.stdout.isTTY),
  progressTty: Boolean(process.stderr.isTTY),
};

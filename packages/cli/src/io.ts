/** What a command needs from the outside world; tests pass their own. */
import { closeSync, openSync, readSync } from 'node:fs';
import { EXIT, UsageError } from './exitCodes.js';
import { decodeBoardBytes } from './decodeBoardBytes.js';
import { fileErrorWords } from './fileErrorWords.js';

/** Default read limit for a board file or standard input, MB (MiB). A board of 1,000 circuits is about 70 kB. */
export const DEFAULT_MAX_INPUT_MB = 1;

export interface ReadOptions {
  /** Refuse input larger than this many MiB, counted while reading. @defaultValue DEFAULT_MAX_INPUT_MB */
  readonly maxInputMB?: number;
}

export interface CliIo {
  readonly stdout: (text: string) => void;
  readonly stderr: (text: string) => void;
  /** Reads a board file, or standard input for "-", as text. */
  readonly readSource: (path: string, options?: ReadOptions) => Promise<string>;
  /** True when stdout is a terminal (colour allowed). */
  readonly isTty: boolean;
  /** True when stderr is a terminal: long runs may draw a progress bar there. */
  readonly progressTty?: boolean;
}

const MIB = 1024 * 1024;
const CHUNK = 64 * 1024;

function sourceName(path: string): string {
  return path === '-' ? 'standard input' : `board file "${path}"`;
}

function tooLarge(path: string, maxBytes: number): UsageError {
  const mb = maxBytes / MIB;
  return new UsageError(
    `${sourceName(path)} is larger than the ${mb} MB read limit; a board file is normally a few kB (1,000 circuits are about 70 kB). ` +
      `If this really is a board, raise the limit with --max-input-mb <MB>`,
    EXIT.input,
  );
}

/**
 * Reads at most maxBytes + 1 bytes, so a device or pipe without end (/dev/zero) is refused, not buffered.
 * Synchronous: one file is read before anything else can happen, and node:fs/promises (with the stream
 * and readline modules it loads) was 23 M instructions of every run, more than reading the file.
 */
function readFileLimited(path: string, maxBytes: number): Buffer {
  const fd = openSync(path, 'r');
  try {
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      const buffer = Buffer.allocUnsafe(Math.min(CHUNK, maxBytes + 1 - total));
      const bytesRead = readSync(fd, buffer, 0, buffer.length, null);
      if (bytesRead === 0) break;
      chunks.push(buffer.subarray(0, bytesRead));
      total += bytesRead;
      if (total > maxBytes) throw tooLarge(path, maxBytes);
    }
    return Buffer.concat(chunks, total);
  } finally {
    closeSync(fd);
  }
}

async function readStdinLimited(maxBytes: number): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let total = 0;
  for await (const chunk of process.stdin) {
    const bytes = chunk as Buffer;
    total += bytes.length;
    if (total > maxBytes) {
      process.stdin.destroy();
      throw tooLarge('-', maxBytes);
    }
    chunks.push(bytes);
  }
  return Buffer.concat(chunks, total);
}

/** Reads a board source with the size limit enforced while reading; file errors in plain words. */
export async function readBoardSource(path: string, options: ReadOptions = {}): Promise<string> {
  const maxBytes = Math.floor((options.maxInputMB ?? DEFAULT_MAX_INPUT_MB) * MIB);
  let bytes: Buffer;
  try {
    bytes = path === '-' ? await readStdinLimited(maxBytes) : readFileLimited(path, maxBytes);
  } catch (e) {
    if (e instanceof UsageError) throw e;
    throw new UsageError(`cannot read ${sourceName(path)}: ${fileErrorWords(e)}`, EXIT.input);
  }
  return decodeBoardBytes(bytes, sourceName(path));
}

/**
 * process.stderr, built on first use and guarded then: errors on stderr itself are ignored, there is
 * nowhere left to report them. Node builds the stream the first time it is read, and for a pipe that
 * is a net.Socket and the modules behind it (about 18 M instructions): a run that writes nothing to
 * stderr never pays for it. Every write to stderr goes through here, so none is unguarded.
 */
let stderrGuarded = false;
export function stderrStream(): NodeJS.WriteStream {
  const stream = process.stderr;
  if (!stderrGuarded) {
    stderrGuarded = true;
    stream.on('error', () => undefined);
  }
  return stream;
}

/**
 * What happens when stdout cannot take the output. A reader that closed the pipe
 * (`trivar solve board.yaml | head -1`) ends trivar quietly with exit 0, as other
 * Unix filters do; any other write error (a full disk: ENOSPC) is an error with
 * its own exit code.
 */
export function guardOutputStreams(): void {
  process.stdout.on('error', (error: NodeJS.ErrnoException) => {
    if (error.code === 'EPIPE') return process.exit(EXIT.ok);
    try {
      stderrStream().write(`error: cannot write the output: ${fileErrorWords(error)}\n`);
    } finally {
      process.exit(EXIT.output);
    }
  });
}

/**
 * Ends the run with `code` once stdout and stderr have taken everything written to them. Why not let
 * Node end on its own: at a natural end Node first waits for V8's background garbage-collection work
 * and then finishes its marking (about 2 ms of a 1,000-load solve), for a heap about to be thrown away.
 * A failed stdout write is left to guardOutputStreams' handler, which ends the run with its own code.
 */
export function exitWhenFlushed(code: number): void {
  process.exitCode = code;
  process.stdout.write('', (error) => {
    if (!error) stderrStream().write('', () => process.exit(code));
  });
}

export const processIo: CliIo = {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => stderrStream().write(text),
  readSource: readBoardSource,
  isTty: Boolean(process.stdout.isTTY),
  // Read when a command asks (only the long ones draw progress), not at start-up: see stderrStream.
  get progressTty() {
    return Boolean(stderrStream().isTTY);
  },
};

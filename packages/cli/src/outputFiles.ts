/** Writing the files a command produces, never over one of its inputs. */
import { existsSync, fstatSync, mkdirSync, realpathSync, statSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { EXIT, UsageError } from './exitCodes.js';
import { fileErrorWords } from './fileErrorWords.js';

/** The path as it will be written: symlinks resolved where the file or its folder exists. */
function canonical(path: string): string {
  const abs = resolve(path);
  if (existsSync(abs)) return realpathSync(abs);
  const dir = dirname(abs);
  return existsSync(dir) ? resolve(realpathSync(dir), abs.slice(dir.length + 1)) : abs;
}

/**
 * The file standard input reads from when the shell redirected one to it (`trivar … - < board.yaml`):
 * its device and inode, or null for a pipe, a terminal or no standard input at all.
 */
function standardInputFile(): { readonly dev: number; readonly ino: number } | null {
  try {
    const s = fstatSync(0);
    return s.isFile() ? { dev: s.dev, ino: s.ino } : null;
  } catch {
    return null;
  }
}

/**
 * True when two paths name the same file: the same path once links are resolved, or one file under two
 * names (a hard link). "-" is standard input: the same file as `a` when the shell redirected `a` to it.
 */
export function sameFile(a: string, b: string): boolean {
  if (b === '-') {
    const input = standardInputFile();
    if (input === null) return false;
    try {
      const s = statSync(a);
      return s.dev === input.dev && s.ino === input.ino;
    } catch {
      return false; // the output does not exist yet
    }
  }
  if (canonical(a) === canonical(b)) return true;
  try {
    const sa = statSync(a);
    const sb = statSync(b);
    return sa.dev === sb.dev && sa.ino === sb.ino;
  } catch {
    return false; // one does not exist yet: not the same file
  }
}

/**
 * Throws if any output would replace an input file (a "-" input is standard input, which clashes only
 * when the shell redirected that very file to it), or two outputs are one file (the second would
 * silently replace the first).
 */
export function assertNotInput(outputs: readonly string[], inputs: readonly string[]): void {
  outputs.forEach((out, k) => {
    if (out === '-') throw standardOutputAsFile();
    const input = inputs.find((i) => sameFile(out, i));
    if (input !== undefined)
      throw new UsageError(`refusing to write "${out}": it is an input file of this command${input === '-' ? ' (read from standard input)' : ''}; choose another output name`);
    const earlier = outputs.slice(0, k).find((o) => sameFile(out, o));
    if (earlier !== undefined) throw new UsageError(`refusing to write "${out}": "${earlier}" is written by this command too; give each output its own file`);
  });
}

/**
 * "-" given where a file is written: it means standard input as an input, but written as a path it made a file
 * named "-" in the current folder (over one there) while the user looked for the output on the terminal.
 */
const standardOutputAsFile = () =>
  new UsageError('refusing to write a file named "-": name a file to write; the commands that print their output leave the option out for standard output (e.g. trivar diagram board.yaml > out.svg)');

export function writeOutputFile(path: string, content: string): void {
  if (path === '-') throw standardOutputAsFile();
  try {
    writeFileSync(path, content, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'its folder does not exist' : code === 'EISDIR' ? 'it is a directory' : code === 'EACCES' ? 'permission denied' : fileErrorWords(e);
    // A place that cannot take a file is the command line's mistake (2); a device that fails while writing is not (6).
    const device = code === 'ENOSPC' || code === 'EDQUOT' || code === 'EFBIG' || code === 'EIO' || code === 'EROFS';
    throw new UsageError(`cannot write "${path}": ${why}`, device ? EXIT.output : EXIT.usage);
  }
}

/** Creates the folder a command writes several files into (and its parents), with a clear error where it cannot. */
export function makeOutputFolder(path: string): void {
  if (path === '-') throw standardOutputAsFile();
  try {
    mkdirSync(path, { recursive: true });
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOTDIR' || code === 'EEXIST' ? 'it, or a folder on its way, is a file' : code === 'EACCES' ? 'permission denied' : (code ?? 'cannot be created');
    throw new UsageError(`cannot create the folder "${path}": ${why}`, EXIT.usage);
  }
}

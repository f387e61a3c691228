/** Writing the files a command produces, never over one of its inputs. */
import { existsSync, mkdirSync, realpathSync, statSync, writeFileSync } from 'node:fs';
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

/** True when two paths name the same file: the same path once links are resolved, or one file under two names (a hard link). */
export function sameFile(a: string, b: string): boolean {
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
 * Throws if any output would replace an input file ("-" inputs are standard input and never clash), or
 * two outputs are one file (the second would silently replace the first).
 */
export function assertNotInput(outputs: readonly string[], inputs: readonly string[]): void {
  const ins = inputs.filter((i) => i !== '-');
  outputs.forEach((out, k) => {
    if (ins.some((i) => sameFile(out, i))) throw new UsageError(`refusing to write "${out}": it is an input file of this command; choose another output name`);
    const earlier = outputs.slice(0, k).find((o) => sameFile(out, o));
    if (earlier !== undefined) throw new UsageError(`refusing to write "${out}": "${earlier}" is written by this command too; give each output its own file`);
  });
}

export function writeOutputFile(path: string, content: string): void {
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
  try {
    mkdirSync(path, { recursive: true });
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOTDIR' || code === 'EEXIST' ? 'it, or a folder on its way, is a file' : code === 'EACCES' ? 'permission denied' : (code ?? 'cannot be created');
    throw new UsageError(`cannot create the folder "${path}": ${why}`, EXIT.usage);
  }
}

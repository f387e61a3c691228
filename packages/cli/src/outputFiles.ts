/** Writing the files a command produces, never over one of its inputs. */
import { existsSync, realpathSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { EXIT, UsageError } from './exitCodes.js';

/** The path as it will be written: symlinks resolved where the file or its folder exists. */
function canonical(path: string): string {
  const abs = resolve(path);
  if (existsSync(abs)) return realpathSync(abs);
  const dir = dirname(abs);
  return existsSync(dir) ? resolve(realpathSync(dir), abs.slice(dir.length + 1)) : abs;
}

/** Throws if any output would replace an input file ("-" inputs are standard input and never clash). */
export function assertNotInput(outputs: readonly string[], inputs: readonly string[]): void {
  const ins = inputs.filter((i) => i !== '-').map(canonical);
  for (const out of outputs) {
    if (ins.includes(canonical(out))) throw new UsageError(`refusing to write "${out}": it is an input file of this command; choose another output name`);
  }
}

export function writeOutputFile(path: string, content: string): void {
  try {
    writeFileSync(path, content, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'its folder does not exist' : code === 'EISDIR' ? 'it is a directory' : code === 'EACCES' ? 'permission denied' : (code ?? 'unwritable');
    throw new UsageError(`cannot write "${path}": ${why}`, EXIT.usage);
  }
}

/** Example files that describe one board (installation files, with `boards:`, are solved by `trivar solve` and tested on their own). */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

export const isBoardExample = (dir: string) => (file: string): boolean => file.endsWith('.yaml') && !/^boards:/m.test(readFileSync(join(dir, file), 'utf8'));

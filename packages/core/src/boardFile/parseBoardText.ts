/**
 * Board-file text to a validated board. Its own module, apart from validateBoard.ts, so a caller
 * that reads the text itself (the CLI reads plain YAML without the yaml package) does not load yaml.
 */
import { readBoardText } from '../board/readBoardText.js';
import type { BoardSpec } from './boardFileSchema.js';
import { parseBoard } from './validateBoard.js';

/** `readBoardText` then `parseBoard`. @throws {InputError} */
export function parseBoardText(text: string): BoardSpec {
  return parseBoard(readBoardText(text));
}

/** `trivar check`: solve the board with the capacitors of a hand calculation and explain every difference. */
import { checkHandFigures, InputError, normaliseBoard, parseBoard, readBoardText, type HandCheckResult } from '@trivar/core';
import type { CliIo } from '../io.js';
import { UsageError } from '../exitCodes.js';
import { renderHandCheckReport } from '../format/handCheckReport.js';

export interface CheckCommandOptions {
  readonly json?: boolean;
}

/** The figures file, with read errors naming it as such (the reader's wording speaks of board files). */
async function readFigures(path: string, io: CliIo): Promise<string> {
  try {
    return await io.readSource(path);
  } catch (error) {
    if (error instanceof UsageError) throw new UsageError(error.message.replace('board file', 'hand figures file'), error.exitCode);
    throw error;
  }
}

export async function runCheck(boardFile: string, figuresFile: string, options: CheckCommandOptions, io: CliIo): Promise<HandCheckResult> {
  const spec = parseBoard(readBoardText(await io.readSource(boardFile)));
  const figures = readBoardText(await readFigures(figuresFile, io));
  let result: HandCheckResult;
  try {
    result = checkHandFigures(normaliseBoard(spec), figures);
  } catch (error) {
    // Say which file the problems are in: the board file has already been checked.
    if (error instanceof InputError) throw new InputError(error.issues, `the hand figures in "${figuresFile}" are not valid`);
    throw error;
  }
  io.stdout(options.json ? `${JSON.stringify(result, null, 2)}\n` : renderHandCheckReport(result));
  return result;
}

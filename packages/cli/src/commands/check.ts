/** `trivar check`: solve the board with the capacitors of a hand calculation and explain every difference. */
import { addHandCapacitors, checkHandFigures, collapseError, conventionsOf, InputError, isInstallationInput, labellerOf, normaliseBoard, parseBoard, readBoardText, renderCurrentTriangles, solveBoardModel, type HandCheckResult } from '@trivar/core';
import { assertNotInput, writeOutputFile } from '../outputFiles.js';
import type { CliIo } from '../io.js';
import { EXIT, UsageError } from '../exitCodes.js';
import { HAND_FIGURES_ON_INSTALLATION } from '../handFiguresWording.js';
import { renderHandCheckReport } from '../format/handCheckReport.js';
import { writeResult } from '../writeResult.js';

export interface CheckCommandOptions {
  readonly json?: boolean;
  /** Also write the per-line current triangles (without → with the capacitors) to this SVG file. */
  readonly diagram?: string;
}

/** The figures file, with read errors naming it as such (the reader's wording speaks of board files). */
export async function readFigures(path: string, io: CliIo): Promise<string> {
  try {
    return await io.readSource(path);
  } catch (error) {
    if (error instanceof UsageError) throw new UsageError(error.message.replace('board file', 'hand figures file'), error.exitCode);
    throw error;
  }
}

export async function runCheck(boardFile: string, figuresFile: string, options: CheckCommandOptions, io: CliIo): Promise<HandCheckResult> {
  if (boardFile === '-' && figuresFile === '-') throw new UsageError('the board and the hand figures cannot both come from standard input (-): give at least one of them as a file');
  const raw = readBoardText(await io.readSource(boardFile));
  if (isInstallationInput(raw)) throw new UsageError(`${boardFile}: ${HAND_FIGURES_ON_INSTALLATION}`, EXIT.input);
  const spec = parseBoard(raw);
  const figures = readBoardText(await readFigures(figuresFile, io));
  if (options.diagram) assertNotInput([options.diagram], [boardFile, figuresFile]);
  const board = normaliseBoard(spec);
  let result: HandCheckResult;
  try {
    result = checkHandFigures(board, figures);
  } catch (error) {
    // Say which file the problems are in: the board file has already been checked.
    if (error instanceof InputError) throw new InputError(error.issues, `the hand figures in "${figuresFile}" are not valid`);
    throw error;
  }
  if (options.diagram) {
    const svg = renderCurrentTriangles(solveBoardModel(board, { openNeutral: false }), solveBoardModel(addHandCapacitors(board, figures), { openNeutral: false }), {
      title: 'Line current triangles — without and with your capacitors',
      changeName: 'your capacitors',
    });
    writeOutputFile(options.diagram, svg);
  }
  // Lines and branches as the board file names them (L1-L2 or A-B).
  const label = labellerOf(conventionsOf(board).phaseNames);
  writeResult(io, result, options.json, (r) => renderHandCheckReport(r, label));
  // As `trivar solve`: the figures are written, then a board the capacitors collapse exits 4.
  if (result.operatingPoint.collapsed) throw collapseError(result);
  return result;
}

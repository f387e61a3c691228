/**
 * What `trivar solve` and `trivar correct` load only when a file needs it: the full board-file
 * schemas (zod and every study's sections), for a board the well-formed shortcut steps aside from
 * (it names every problem) and for installation files. A well-formed board never loads them.
 */
export { parseBoard, parseInstallation, solveInstallation } from '@trivar/core';

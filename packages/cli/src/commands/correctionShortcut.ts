/**
 * The correction section's shortcut (zod and that section's schema, not every study's), imported by
 * `trivar solve` only for a file with a `correction:` section: a board without one loads no zod.
 */
export { readWellFormedCorrectionBoard } from '@trivar/core';

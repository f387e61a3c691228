/** Options of every network solve, with their defaults resolved in one place. */
import { argumentIssueError, checkNumberArgument } from '../_internal/argumentChecks.js';

export interface SolveOptions {
  /**
   * Stop when the estimated remaining error of every node voltage is below this
   * fraction of the nominal line-to-neutral voltage.
   * @defaultValue 1e-10
   */
  readonly tolerance?: number;
  /** @defaultValue 100 */
  readonly maxIterations?: number;
  /**
   * Per-unit branch voltage below which constant-current and constant-power
   * parts of a load behave as constant impedance.
   * @defaultValue 0.7
   */
  readonly lowVoltageThreshold?: number;
}

export interface ResolvedSolveOptions {
  readonly tolerance: number;
  readonly maxIterations: number;
  readonly lowVoltageThreshold: number;
}

/** The keys a SolveOptions object takes, for the entry points that check an options object's keys. */
export const SOLVE_OPTION_KEYS: readonly string[] = ['tolerance', 'maxIterations', 'lowVoltageThreshold'];

/**
 * Only the solve options of a larger options object (`openNeutral` beside them): what a study hands
 * on to the solver, whose entry refuses keys it does not take.
 */
export function solveOptionsOf(options: SolveOptions | undefined): SolveOptions {
  if (!options) return {};
  const { tolerance, maxIterations, lowVoltageThreshold } = options;
  return { ...(tolerance !== undefined ? { tolerance } : {}), ...(maxIterations !== undefined ? { maxIterations } : {}), ...(lowVoltageThreshold !== undefined ? { lowVoltageThreshold } : {}) };
}

/**
 * The options with their defaults.
 * @param argument how the caller names the options, for the error (`options`, `options.solve`)
 * @throws {InputError} naming `<argument>.<field>` for a value outside its range
 */
export function resolveSolveOptions(options: SolveOptions = {}, argument = 'options'): ResolvedSolveOptions {
  if (options === null || typeof options !== 'object') throw argumentIssueError(argument, 'the solve options ({} or nothing for the defaults)', options);
  const resolved = {
    tolerance: options.tolerance ?? 1e-10,
    maxIterations: options.maxIterations ?? 100,
    lowVoltageThreshold: options.lowVoltageThreshold ?? 0.7,
  };
  // Checked inline first: a compiled network resolves its options on every solve of a sizing loop, and
  // the path text and closures of the checks below are built only for the error.
  const { tolerance, maxIterations, lowVoltageThreshold } = resolved;
  if (typeof tolerance === 'number' && tolerance > 0 && tolerance < 0.1 && Number.isInteger(maxIterations) && maxIterations >= 1 && typeof lowVoltageThreshold === 'number' && lowVoltageThreshold > 0 && lowVoltageThreshold <= 1)
    return resolved;
  checkNumberArgument(tolerance, `${argument}.tolerance`, 'a number above 0 and below 0.1 (a fraction of the nominal voltage)', (x) => x > 0 && x < 0.1);
  checkNumberArgument(maxIterations, `${argument}.maxIterations`, 'a whole number of iterations, at least 1', (x) => Number.isInteger(x) && x >= 1);
  checkNumberArgument(lowVoltageThreshold, `${argument}.lowVoltageThreshold`, 'a number above 0 and at most 1 (per unit)', (x) => x > 0 && x <= 1);
  return resolved;
}

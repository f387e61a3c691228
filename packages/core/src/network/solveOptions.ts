/** Options of every network solve, with their defaults resolved in one place. */

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

export function resolveSolveOptions(options: SolveOptions = {}): ResolvedSolveOptions {
  const resolved = {
    tolerance: options.tolerance ?? 1e-10,
    maxIterations: options.maxIterations ?? 100,
    lowVoltageThreshold: options.lowVoltageThreshold ?? 0.7,
  };
  if (!(resolved.tolerance > 0 && resolved.tolerance < 0.1))
    throw new RangeError(`solveNetwork: tolerance must be in (0, 0.1) (received ${resolved.tolerance})`);
  if (!Number.isInteger(resolved.maxIterations) || resolved.maxIterations < 1)
    throw new RangeError(`solveNetwork: maxIterations must be a positive integer (received ${resolved.maxIterations})`);
  if (!(resolved.lowVoltageThreshold > 0 && resolved.lowVoltageThreshold <= 1))
    throw new RangeError(`solveNetwork: lowVoltageThreshold must be in (0, 1] (received ${resolved.lowVoltageThreshold})`);
  return resolved;
}


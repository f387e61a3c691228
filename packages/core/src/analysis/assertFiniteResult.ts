import { NumericalError } from '../errors.js';

/** No NaN or infinity may reach a caller (JSON would silently turn them into null). */
export function assertFiniteResult<T>(result: T): T {
  // First a plain walk; the path is only spelled out when something is wrong
  // (building path strings for every number was most of the check's cost).
  if (allFinite(result)) return result;
  const visit = (value: unknown, path: string): void => {
    if (typeof value === 'number') {
      if (!Number.isFinite(value)) throw new NumericalError('non-finite', `the result has a non-finite value at ${path}; check for extreme impedance or power values`);
    } else if (Array.isArray(value)) value.forEach((v, i) => visit(v, `${path}[${i}]`));
    else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) visit(v, path ? `${path}.${k}` : k);
  };
  visit(result, '');
  return result;
}

/**
 * True when every number in plain data is finite. Numbers are tested in the loops, not by a call
 * each: the walk runs once per result, mostly before V8 has optimised it, over tens of thousands of numbers.
 */
function allFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (value === null || typeof value !== 'object') return true;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const item: unknown = value[i];
      if (typeof item === 'number' ? !Number.isFinite(item) : typeof item === 'object' && !allFinite(item)) return false;
    }
    return true;
  }
  const record = value as Record<string, unknown>;
  for (const key in record) {
    const item = record[key];
    if (typeof item === 'number' ? !Number.isFinite(item) : typeof item === 'object' && !allFinite(item)) return false;
  }
  return true;
}

import { NumericalError } from '../errors.js';

/** No NaN or infinity may reach a caller (JSON would silently turn them into null). */
export function assertFiniteResult<T>(result: T): T {
  // First a plain walk; the path is only spelled out when something is wrong
  // (building path strings for every number was most of the check's cost).
  const allFinite = (value: unknown): boolean => {
    if (typeof value === 'number') return Number.isFinite(value);
    if (Array.isArray(value)) return value.every(allFinite);
    if (value && typeof value === 'object') {
      for (const k in value) if (!allFinite((value as Record<string, unknown>)[k])) return false;
    }
    return true;
  };
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

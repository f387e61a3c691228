/** Asserts a value is plain JSON data: objects, arrays, strings, booleans, null and finite numbers only. */
import { expect } from 'vitest';

export function expectPlainData(value: unknown, path = 'report'): void {
  if (value === null || typeof value === 'string' || typeof value === 'boolean') return;
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) expect.fail(`${path} is ${value}, not a finite number`);
    return;
  }
  if (Array.isArray(value)) {
    value.forEach((v, i) => expectPlainData(v, `${path}[${i}]`));
    return;
  }
  if (typeof value === 'object' && Object.getPrototypeOf(value) === Object.prototype) {
    for (const [k, v] of Object.entries(value)) expectPlainData(v, `${path}.${k}`);
    return;
  }
  expect.fail(`${path} is not plain data (${typeof value})`);
}

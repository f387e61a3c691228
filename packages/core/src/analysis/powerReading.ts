import { abs, type ComplexValue } from '../complex.js';
import type { PowerReading } from './boardResult.js';

/**
 * Power reading from complex power in VA. Q within 1e-9 of S counts as unity.
 * No power at all (a line or load with no current after the noise floor) has no
 * power factor: pf null, sense "none".
 */
export function powerReading(s: ComplexValue): PowerReading {
  const kVA = abs(s) / 1000;
  const kvar = s.im / 1000;
  if (kVA === 0) return { kW: s.re / 1000, kvar, kVA, pf: null, sense: 'none' };
  const sense = Math.abs(s.im) <= 1e-9 * abs(s) ? 'unity' : s.im > 0 ? 'lagging' : 'leading';
  return { kW: s.re / 1000, kvar, kVA, pf: Math.abs(s.re) / 1000 / kVA, sense };
}

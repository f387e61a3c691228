import { abs, type ComplexValue } from '../complex.js';
import type { PowerReading } from './boardResult.js';

/** Power reading from complex power in VA. Q within 1e-9 of S counts as unity. */
export function powerReading(s: ComplexValue): PowerReading {
  const kVA = abs(s) / 1000;
  const kvar = s.im / 1000;
  const sense = Math.abs(s.im) <= 1e-9 * Math.max(abs(s), 1e-30) ? 'unity' : s.im > 0 ? 'lagging' : 'leading';
  return { kW: s.re / 1000, kvar, kVA, pf: kVA === 0 ? 1 : Math.abs(s.re) / 1000 / kVA, sense };
}

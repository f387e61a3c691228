import { abs, type ComplexValue } from '../complex.js';
import type { PowerReading } from './boardResult.js';

/** A part of S this small is round-off (far above double precision, far below any meter). */
const ROUND_OFF = 1e-9;

/**
 * Power reading from complex power in VA. Q within 1e-9 of S counts as unity and
 * is reported as 0 kvar (what is left is the round-off of V·I* between a voltage
 * and a current in phase: about 1e-16 of S); likewise P within 1e-9 of S is 0 kW.
 * No power at all (a line or load with no current after the noise floor) has no
 * power factor: pf null, sense "none".
 */
export function powerReading(s: ComplexValue): PowerReading {
  const kVA = abs(s) / 1000;
  if (kVA === 0) return { kW: s.re / 1000, kvar: s.im / 1000, kVA, pf: null, sense: 'none' };
  const { kW, kvar } = powerParts(s);
  const sense = kvar === 0 ? 'unity' : kvar > 0 ? 'lagging' : 'leading';
  return { kW, kvar, kVA, pf: Math.min(1, Math.abs(kW) / kVA), sense };
}

/** P and Q of a complex power in VA as kW and kvar, a part within 1e-9 of S read as 0 (see `powerReading`). */
export function powerParts(s: ComplexValue): { kW: number; kvar: number } {
  const limit = ROUND_OFF * abs(s);
  return { kW: Math.abs(s.re) <= limit ? 0 : s.re / 1000, kvar: Math.abs(s.im) <= limit ? 0 : s.im / 1000 };
}

import { checkNumberArgument } from '../_internal/argumentChecks.js';

/**
 * The billing power factor of a period, kWh / √(kWh² + kvarh²) over imported energy and lagging
 * reactive energy (as a tariff meter totals them). Where nothing was imported it is undefined,
 * not 1: a board that drew nothing has no power factor to bill, and a 1.000 beside 0 kWh would
 * read as a perfect result.
 */
export function billingPowerFactor(kWhImport: number, kvarhLagging: number): number | null {
  checkNumberArgument(kWhImport, 'kWhImport', 'the imported energy, kWh: a finite number');
  checkNumberArgument(kvarhLagging, 'kvarhLagging', 'the lagging reactive energy, kvarh: a finite number');
  return kWhImport > 0 ? kWhImport / Math.hypot(kWhImport, kvarhLagging) : null;
}

/** How a billing power factor reads in text: three decimals, or why there is none. */
export function billingPowerFactorText(pf: number | null, short = false): string {
  // NaN printed "NaN": a billing PF is kWh over √(kWh² + kvarh²), from 0 to 1.
  if (pf !== null && !(pf >= 0 && pf <= 1 + 1e-9)) checkNumberArgument(pf, 'pf', 'a billing power factor from 0 to 1, or null where nothing was imported', (x) => x >= 0 && x <= 1 + 1e-9);
  if (pf !== null) return pf.toFixed(3);
  return short ? '-' : 'none (no energy imported)';
}

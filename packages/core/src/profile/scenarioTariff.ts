/**
 * The board file's tariff priced on scenarios (profile.scenarios, no interval data). Scenarios carry
 * hours but no calendar months, so each charge is priced the one way their figures allow, and says how:
 * the reactive charge on the year's totals; the demand charge per month in which the largest scenario
 * lasts a whole demand window.
 */
import type { TariffSpec } from './profileSpec.js';
import type { BoardScenarios } from './studyScenarios.js';
import { PROFILE_DEFAULTS } from './profileDefaults.js';

export interface ScenarioTariff {
  /** profile.tariff.currency, "units" where the file names none. */
  readonly currency: string;
  /**
   * Lagging kvarh above the allowance over the year's totals, and its charge; null without a reactive tariff.
   * A tariff judges each calendar month on its own: this is that charge where every month has the year's mix
   * of scenarios, and the least it can be otherwise (a month with more kvarh per kWh pays more).
   */
  readonly reactive: { readonly tanPhiAllowance: number; readonly chargeableKvarh: number; readonly charge: number } | null;
  /**
   * The largest scenario's kVA and the demand charge of a month in which it lasts a whole window; null without
   * a demand tariff. Scenarios say nothing of when in the year a state occurs, so no yearly figure is given.
   */
  readonly demand: { readonly scenario: string; readonly peakKVA: number; readonly windowMinutes: number; readonly chargePerMonth: number } | null;
}

/** Null where the file prices neither reactive energy nor demand. */
export function priceScenarios(year: BoardScenarios, tariff: TariffSpec | undefined): ScenarioTariff | null {
  if (!tariff?.reactive && !tariff?.demand) return null;
  const reactive = tariff.reactive;
  const chargeableKvarh = reactive ? Math.max(0, year.kvarhLagging - reactive.tanPhiAllowance * year.kWhImport) : 0;
  let largest: BoardScenarios['scenarios'][number] | null = null;
  for (const s of year.scenarios) if (largest === null || Math.hypot(s.kW, s.kvar) > Math.hypot(largest.kW, largest.kvar)) largest = s;
  const peakKVA = largest ? Math.hypot(largest.kW, largest.kvar) : 0;
  return {
    currency: tariff.currency ?? 'units',
    reactive: reactive ? { tanPhiAllowance: reactive.tanPhiAllowance, chargeableKvarh, charge: chargeableKvarh * reactive.pricePerKvarh } : null,
    demand:
      tariff.demand && largest
        ? {
            scenario: largest.name,
            peakKVA,
            windowMinutes: tariff.demand.windowMinutes ?? PROFILE_DEFAULTS.demandWindowMinutes,
            chargePerMonth: peakKVA * tariff.demand.pricePerKVA,
          }
        : null,
  };
}

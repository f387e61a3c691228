/**
 * The voltage unbalance a board is judged against, by region: each region's documents define the figure
 * differently, so the limit comes with its own index.
 *  - IEC practice: the voltage unbalance factor |V2|/|V1| (IEC 61000-4-30), 2 % (EN 50160 and the
 *    IEC 61000-2-2 compatibility level; from memory).
 *  - North-American practice: the largest deviation of a line-to-line voltage from the average of the
 *    three, as % of that average, 3 % (ANSI C84.1 Annex D, at the service with no load; from memory).
 *    NEMA MG 1 uses the same index for motor derating.
 */
import type { Region } from './region.js';
import { checkObjectArgument } from '../../_internal/argumentChecks.js';

export interface VoltageUnbalanceLimit {
  /** Which figure the limit judges: |V2|/|V1|, or the line-to-line deviation from the average. */
  readonly index: 'negative-sequence' | 'line-deviation';
  readonly percent: number;
  /** The figure's name in a sentence: "voltage unbalance factor |V2|/|V1|", "voltage unbalance". */
  readonly name: string;
  /** How the figure is computed, where its name does not say it; null where it does. */
  readonly definition: string | null;
  /** The source and how far it was checked. */
  readonly source: string;
}

export const VOLTAGE_UNBALANCE_LIMITS: Readonly<Record<Region, VoltageUnbalanceLimit>> = {
  iec: { index: 'negative-sequence', percent: 2, name: 'voltage unbalance factor |V2|/|V1|', definition: null, source: 'EN 50160 / IEC 61000-2-2 level, from memory' },
  'north-america': {
    index: 'line-deviation',
    percent: 3,
    name: 'voltage unbalance',
    definition: 'the largest deviation of a line-to-line voltage from the average of the three, as % of that average',
    source: 'ANSI C84.1 Annex D, from memory',
  },
};

/** The figure a limit judges, from a board's two indices. */
export function unbalanceFigure(limit: VoltageUnbalanceLimit, figures: { readonly voltageFactorPercent: number; readonly lineVoltageRatePercent: number }): number {
  checkObjectArgument(limit, 'limit', "a voltage unbalance limit (a board's conventions.unbalanceLimit)", ['index']);
  checkObjectArgument(figures, 'figures', 'the unbalance figures { voltageFactorPercent, lineVoltageRatePercent } (a result\'s unbalance)', ['voltageFactorPercent', 'lineVoltageRatePercent']);
  return limit.index === 'negative-sequence' ? figures.voltageFactorPercent : figures.lineVoltageRatePercent;
}

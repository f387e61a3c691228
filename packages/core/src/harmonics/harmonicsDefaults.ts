/**
 * Every default of the harmonic study, with the reason for it, in one place.
 */
import { CORRECTION_DEFAULTS } from '../correction/correctionDefaults.js';

export const HARMONICS_DEFAULTS = {
  /**
   * Linear loads given by a rating (kW/pf...) are taken as R ‖ jX from their
   * fundamental values: the usual aggregate model for mixed passive loads in
   * harmonic studies (common practice, no source). Loads given in ohms keep the
   * series R + jX they were written in.
   */
  linearForm: 'parallel',
  /** Source and feeder resistance independent of frequency; `skin-effect` multiplies it by √h (common practice). */
  resistance: 'constant',
  /**
   * Injection angle of order h when a spectrum gives none: h × the angle of the
   * load's fundamental current (+ the spectrum's relative angle, 0 by default),
   * the usual convention for spectra quoted with the fundamental at 0°.
   */
  injectionAngle: 'h × fundamental angle',
  /** Frequency scan: orders 1 … 25 in steps of 0.05 (the characteristic resonances of LV banks lie well inside). */
  scanMaxOrder: 25,
  scanStep: 0.05,
  /** A resonance within ±10 % of an injected order is flagged (the rule of thumb; common practice). */
  resonanceBand: 0.1,
  /**
   * Orders watched when no load has a spectrum: the same typical orders trivar correct flags a supply
   * resonance near (CORRECTION_DEFAULTS.resonanceWatchedOrders, with why), so the two commands judge a
   * bank's resonance alike.
   */
  watchedOrders: CORRECTION_DEFAULTS.resonanceWatchedOrders,
  /** A scan peak must stand this far (fraction of its height) above the valley beside it to count. */
  peakProminence: 0.05,
  /**
   * Most networks scanned from one bank's board with the other banks switched (its states × theirs):
   * each is a full scan, 7–9 ms at 481 points on a three-board installation (examples/ferrybank-joinery.yaml
   * on a shared two-core machine), so the limit is half a minute at most. Above it the other banks
   * are taken at their extremes.
   */
  jointStateLimit: 4096,
} as const;

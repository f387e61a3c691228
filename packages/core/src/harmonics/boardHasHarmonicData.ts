/**
 * Whether a board file holds harmonic data: its own module, so a caller deciding which correction
 * study to run does not load the harmonic study to ask.
 */
import type { HarmonicsBoardSpec } from './harmonicsSpec.js';

/** True when the board file gives the harmonic study something to work on. */
export function boardHasHarmonicData(spec: HarmonicsBoardSpec): boolean {
  return spec.harmonics !== undefined || spec.loads.some((l) => l.spectrum !== undefined && l.spectrum !== 'linear');
}

/** True when an installation file gives the harmonic study something to work on (a `harmonics:` section, or a load with a spectrum on any board). */
export function installationHasHarmonicData(spec: { readonly harmonics?: unknown; readonly boards: readonly { readonly loads: HarmonicsBoardSpec['loads'] }[] }): boolean {
  return spec.harmonics !== undefined || spec.boards.some((b) => b.loads.some((l) => l.spectrum !== undefined && l.spectrum !== 'linear'));
}

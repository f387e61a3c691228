/**
 * Whether a board file holds harmonic data: its own module, so a caller deciding which correction
 * study to run does not load the harmonic study to ask.
 */
import type { HarmonicsBoardSpec } from './harmonicsSpec.js';
import { checkListArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

/** True when the board file gives the harmonic study something to work on. */
export function boardHasHarmonicData(spec: HarmonicsBoardSpec): boolean {
  checkObjectArgument(spec, 'spec', "a board spec from parseBoard(...) (a board file's data)", ['loads']);
  checkListArgument(spec.loads, 'spec.loads', 'the list of loads of the board spec', (x) => typeof x === 'object' && x !== null);
  return spec.harmonics !== undefined || spec.loads.some((l) => l.spectrum !== undefined && l.spectrum !== 'linear');
}

/** True when an installation file gives the harmonic study something to work on (a `harmonics:` section, or a load with a spectrum on any board). */
export function installationHasHarmonicData(spec: { readonly harmonics?: unknown; readonly boards: readonly { readonly loads: HarmonicsBoardSpec['loads'] }[] }): boolean {
  checkObjectArgument(spec, 'spec', "an installation spec from parseInstallation(...) (an installation file's data)", ['boards']);
  checkListArgument(spec.boards, 'spec.boards', 'the list of boards of the installation spec, each with its loads', (b) => typeof b === 'object' && b !== null && Array.isArray((b as { loads?: unknown }).loads));
  return spec.harmonics !== undefined || spec.boards.some((b) => b.loads.some((l) => l.spectrum !== undefined && l.spectrum !== 'linear'));
}

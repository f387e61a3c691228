/**
 * Colours of the drawings. Phase colours come from the Okabe–Ito palette
 * (M. Okabe, K. Ito, "Color Universal Design", 2008), chosen because its hues stay
 * distinguishable with the common forms of colour-vision deficiency; every
 * phasor also carries its name in text, so colour is never the only cue.
 */
import type { PhaseId } from '../board/boardModel.js';

export const PHASE_COLOUR: Readonly<Record<PhaseId, string>> = {
  A: '#0072B2', // blue
  B: '#D55E00', // vermillion
  C: '#009E73', // bluish green
};
export const NEUTRAL_COLOUR = '#000000';
/** The correcting equipment's contribution (reddish purple). */
export const EQUIPMENT_COLOUR = '#CC79A7';
export const GRID_COLOUR = '#B8B8B8';
export const INK = '#1A1A1A';
export const MUTED_INK = '#555555';

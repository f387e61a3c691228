/**
 * Built-in typical current spectra by kind of load, % of the fundamental
 * current. Each carries where it comes from; none is a measurement of a
 * particular product. Angles are not given: the injection angle defaults to
 * h × the fundamental angle (see `harmonicsDefaults.ts`).
 */

export const SPECTRUM_KINDS = [
  'switch-mode',
  'switch-mode-pfc',
  'led-driver',
  'six-pulse-drive',
  'six-pulse-drive-choke',
  'ev-charger',
  'linear',
] as const;

export type SpectrumKind = (typeof SPECTRUM_KINDS)[number];

export interface TypicalSpectrum {
  readonly kind: SpectrumKind;
  readonly description: string;
  /** [order, % of fundamental]. */
  readonly orders: readonly (readonly [number, number])[];
  /** Always 'typical': a stand-in until measured values are known. */
  readonly status: 'typical';
  readonly source: string;
}

export const TYPICAL_SPECTRA: Readonly<Record<SpectrumKind, TypicalSpectrum>> = {
  'switch-mode': {
    kind: 'switch-mode',
    description: 'single-phase switch-mode supply without PFC (computers, small electronics)',
    orders: [
      [3, 81],
      [5, 60.6],
      [7, 37],
      [9, 15.7],
      [11, 2.4],
      [13, 6.3],
      [15, 7.9],
    ],
    status: 'typical',
    source: 'textbook spectrum of a switch-mode power supply, e.g. Dugan et al., Electrical Power Systems Quality (from memory)',
  },
  'switch-mode-pfc': {
    kind: 'switch-mode-pfc',
    description: 'single-phase switch-mode supply with active PFC',
    orders: [
      [3, 8],
      [5, 4],
      [7, 3],
      [9, 2],
      [11, 1.5],
      [13, 1],
    ],
    status: 'typical',
    source: 'common practice, no source (active PFC keeps the 3rd below about 10 %)',
  },
  'led-driver': {
    kind: 'led-driver',
    description: 'LED driver above 25 W, at the class C emission limits',
    orders: [
      [3, 27],
      [5, 10],
      [7, 7],
      [9, 5],
      [11, 3],
      [13, 3],
      [15, 3],
    ],
    status: 'typical',
    source: 'IEC 61000-3-2 class C limits for lighting above 25 W at PF 0.9 (3rd = 30 % × PF), used as a typical upper figure (from memory)',
  },
  'six-pulse-drive': {
    kind: 'six-pulse-drive',
    description: 'three-phase six-pulse drive, diode front end, no DC choke or line reactor',
    orders: [
      [5, 65],
      [7, 45],
      [11, 8],
      [13, 6],
      [17, 4],
      [19, 3],
    ],
    status: 'typical',
    source: 'common practice, no source (capacitor-input six-pulse bridges without reactance draw 5th ≈ 60–80 %, 7th ≈ 40–60 %)',
  },
  'six-pulse-drive-choke': {
    kind: 'six-pulse-drive-choke',
    description: 'three-phase six-pulse drive with a DC choke (or a 3–5 % line reactor)',
    orders: [
      [5, 33],
      [7, 11],
      [11, 7],
      [13, 5],
      [17, 3],
      [19, 2.5],
    ],
    status: 'typical',
    source: 'common practice, no source (a DC choke brings the 5th to about 30–35 %)',
  },
  'ev-charger': {
    kind: 'ev-charger',
    description: 'electric-vehicle charger (on-board charger with active PFC)',
    orders: [
      [3, 5],
      [5, 3.5],
      [7, 2.5],
      [9, 1.5],
      [11, 1],
      [13, 1],
    ],
    status: 'typical',
    source: 'common practice, no source (chargers with active PFC stay under about 10 % current THD)',
  },
  linear: {
    kind: 'linear',
    description: 'linear load (no harmonic current of its own)',
    orders: [],
    status: 'typical',
    source: 'definition',
  },
};

/**
 * Random boards for the harmonic study: boardSpecArb's boards with spectra on
 * some loads (built-in kinds or random orders and angles), a linear form on
 * others, and sometimes background distortion.
 */
import fc from 'fast-check';
import type { BoardSpec } from '@trivar/core';
import { boardSpecArb } from './boardSpec.js';

const ORDERS = [2, 3, 4, 5, 7, 9, 11, 13, 15, 17, 19, 23, 25, 29, 31, 35, 37, 49];

export const spectrumArb = fc.oneof(
  fc.constantFrom('switch-mode' as const, 'switch-mode-pfc' as const, 'led-driver' as const, 'six-pulse-drive' as const, 'six-pulse-drive-choke' as const, 'ev-charger' as const),
  fc
    .uniqueArray(fc.constantFrom(...ORDERS), { minLength: 1, maxLength: 5 })
    .chain((orders) =>
      fc.tuple(...orders.map((order) => fc.record({ order: fc.constant(order), percent: fc.double({ min: 0.5, max: 60, noNaN: true }), angleDeg: fc.double({ min: -180, max: 180, noNaN: true }) }))),
    ),
);

/** Random boards (no open neutral) with spectra on some loads, a linear form on others, maybe background. */
export const harmonicBoardArb: fc.Arbitrary<BoardSpec> = fc
  .tuple(
    boardSpecArb(),
    fc.array(fc.option(spectrumArb, { nil: undefined }), { minLength: 6, maxLength: 6 }),
    fc.array(fc.constantFrom('series' as const, 'parallel' as const, undefined), { minLength: 6, maxLength: 6 }),
    fc.option(fc.uniqueArray(fc.constantFrom(3, 5, 7, 11), { minLength: 1, maxLength: 3 }), { nil: undefined }),
  )
  .map(([spec, spectra, forms, background]) => ({
    ...spec,
    loads: spec.loads.map((load, i) => {
      // A floating star of fixed impedance keeps its own star point: a current source alone would leave it undefined.
      const starLoad = load.connection === 'ABC-star';
      const spectrum = starLoad ? undefined : spectra[i];
      if (spectrum !== undefined) return { ...load, spectrum };
      return forms[i] ? { ...load, linearForm: forms[i] } : load;
    }),
    ...(background ? { harmonics: { background: background.map((order, k) => ({ order, percent: 1 + k, angleDeg: 10 * k })) } } : {}),
  }));

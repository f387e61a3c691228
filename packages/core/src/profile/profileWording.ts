/** Cautions printed with every profile result. */
export const PROFILE_CAUTIONS: readonly string[] = [
  'Figures are computed from the interval data and the board model; logger accuracy, CT ratios and clock errors carry straight through.',
  'A neutral that carries more than its rating in any interval overheats in service; check conductor sizing against local wiring rules.',
  'Capacitor banks store charge after switching off: reconnection before discharge, leading power factor at light load, and resonance with the supply are hazards. Installation and settings are for licensed practitioners under local codes.',
];

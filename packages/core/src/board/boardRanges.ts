/**
 * The board file's accepted ranges and word lists, without zod: the schema (boardSchema.ts)
 * and the well-formed shortcut (wellFormedBoard.ts) both read them from here, so they
 * cannot drift apart, and the shortcut loads without the schema library.
 */

export interface PhysicalRange {
  readonly min: number;
  readonly max: number;
  readonly unit: string;
  /** The lower end is excluded. */
  readonly above?: boolean;
}

/** Accepted ranges of the physical numbers in a board file (common practice, no source, unless named). */
export const PHYSICAL_RANGES = {
  /** Low voltage is up to 1000 V a.c. (IEC 60038, IEC 60364); 10 V leaves room for extra-low-voltage boards. */
  voltage: { min: 10, max: 1000, unit: 'V' },
  emfV: { min: 0, max: 1000, unit: 'V', above: true },
  /** Distribution transformers feeding LV boards run from a few kVA to about 4,000 kVA. */
  transformerKVA: { min: 0.1, max: 10_000, unit: 'kVA' },
  impedancePercent: { min: 0, max: 30, unit: '%', above: true },
  xOverR: { min: 0, max: 100, unit: '' },
  /** Source, feeder and conductor impedances (a 1 mm² copper conductor is 18 ohm/km, IEC 60228). */
  supplyOhms: { min: 0, max: 1000, unit: 'ohm' },
  supplyReactanceOhms: { min: -1000, max: 1000, unit: 'ohm' },
  ohmsPerKm: { min: 0, max: 10_000, unit: 'ohm/km' },
  lengthM: { min: 0, max: 100_000, unit: 'm', above: true },
  lengthFt: { min: 0, max: 330_000, unit: 'ft', above: true },
  /** Cable library sizes (the tables hold the sizes; these only keep out nonsense). */
  conductorMm2: { min: 0, max: 5000, unit: 'mm²', above: true },
  conductorKcmil: { min: 0, max: 5000, unit: 'kcmil', above: true },
  conductorTemperatureC: { min: -50, max: 250, unit: '°C' },
  ratingA: { min: 0, max: 100_000, unit: 'A', above: true },
  /** Loads: 100 MW is far beyond any one LV board. */
  loadKW: { min: -100_000, max: 100_000, unit: 'kW' },
  loadKvar: { min: -100_000, max: 100_000, unit: 'kvar' },
  loadKVA: { min: 0, max: 100_000, unit: 'kVA', above: true },
  loadA: { min: 0, max: 100_000, unit: 'A', above: true },
  /** Below 0.01 a load is a reactance: give kW and kvar. */
  pf: { min: 0.01, max: 1, unit: '' },
  loadOhms: { min: 0, max: 1e7, unit: 'ohm' },
  /** Capacitors a user brings to trivar check: as far as the loads go (100,000 kvar is some 6 F at 230 V, 50 Hz). */
  capacitorKvar: { min: 0, max: 100_000, unit: 'kvar', above: true },
  capacitorUF: { min: 0, max: 1e7, unit: 'µF', above: true },
  loadReactanceOhms: { min: -1e7, max: 1e7, unit: 'ohm' },
} as const satisfies Record<string, PhysicalRange>;

export const SYSTEMS = ['three-phase-4wire', 'three-phase-3wire', 'single-phase', 'split-phase'] as const;
export const CONNECTIONS = ['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'] as const;
export const LOAD_MODELS = ['constant-impedance', 'constant-current', 'constant-power'] as const;

/** The other word lists and limits of a board file, one place for the schema and the shortcut. */
export const FREQUENCIES_HZ = [50, 60] as const;
export const PHASE_SEQUENCES = ['ABC', 'ACB'] as const;
export const CONDUCTOR_MATERIALS = ['copper', 'aluminium', 'aluminum'] as const;
/** The raceway columns of NEC Table 9's reactance: PVC or aluminium conduit (`non-magnetic`), or `steel` conduit. */
export const CONDUIT_KINDS = ['non-magnetic', 'steel'] as const;
export const STAR_POINTS = ['neutral', 'floating'] as const;
export const PF_SENSES = ['lagging', 'leading'] as const;
export const BREAKER_POLES = [1, 2, 3] as const;
/** A circuit number written bare (`circuit: 7`), as panel schedules number circuits: read as its text, "7". */
export const CIRCUIT_NUMBER = { min: 1, max: 9999 } as const;
/** Longest voltage notation ("208Y/120") and AWG size ("4/0") read, in characters. */
/** Longest board or circuit name: a name heads a table row and a box in the drawings. */
export const NAME_MAX_CHARACTERS = 100;
/** Longest name a study section refers to: a board's and a load's name joined by "/" or "//" ("<board>//<load>"). */
export const NAME_REFERENCE_MAX_CHARACTERS = 2 * NAME_MAX_CHARACTERS + 2;
/** Longest label printed beside charges (a currency: "EUR", "$", "units"). */
export const CURRENCY_MAX_CHARACTERS = 8;
/** Longest circuit number or way ("L1-12", "3,5,7"): a cell of the panel schedule (common practice, no source). */
export const CIRCUIT_MAX_CHARACTERS = 24;
/**
 * A name or circuit holds none of these: C0 and C1 controls (NUL, escape, tab, line breaks), DEL, the
 * line and paragraph separators, and the bidirectional embeddings, overrides and isolates (U+202A–U+202E,
 * U+2066–U+2069; Unicode UAX #9), which make a name print other than it is stored, in reports and errors.
 */
export const NAME_WITHOUT_CONTROLS = /^[^\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]*$/;
export const NAME_CONTROLS_MESSAGE = 'text without control characters (NUL, tab, line breaks, escape) or direction overrides (U+202A–U+202E, U+2066–U+2069)';
/** Some visible character (an empty text is the length check's to report). */
export const NAME_VISIBLE = /^$|\S/;
export const NOTATION_MAX_CHARS = 40;
export const AWG_MAX_CHARS = 12;
/** Conductors in parallel on one line or neutral. */
export const PARALLEL_CONDUCTORS = { min: 1, max: 12 } as const;
/** EMF angles, degrees. */
export const ANGLE_DEG = { min: -360, max: 360 } as const;

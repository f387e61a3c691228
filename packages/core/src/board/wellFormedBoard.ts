/**
 * The shortcut past the board schema: a board file's own fields (supply, feeder, loads,
 * conventions, studies) checked as plain data, without zod. On a board the schema accepts
 * it gives exactly the schema's output (same values, same key order); on anything else it
 * gives undefined and the caller runs the schema, which words every problem. It refuses
 * every study section and study load field, so the schema stays the one judge of those.
 *
 * Why: on a 1,000-load board the schema's per-load checks, and loading zod with every
 * study's schemas, were a large part of `trivar solve`'s time (see the README's figures).
 * Its parts are also the installation file's (wellFormedInstallation.ts). Mirrors boardSchema.ts field by field, with the ranges and lists of boardRanges.ts;
 * test/property/wellFormedBoard.test.ts holds it to the schema on random and mutated boards.
 */
import { firstOf, listOf, NOT_THIS_SHAPE, numberIn, oneOf, optional, required, strictObjectOf, textOf, trueOrFalse, wholeIn, type PlainShape } from '../_internal/plainShape.js';
import type { BoardBaseSpec } from './boardSchema.js';
import {
  ANGLE_DEG,
  AWG_MAX_CHARS,
  BREAKER_POLES,
  CIRCUIT_NUMBER,
  CONDUCTOR_MATERIALS,
  CONDUIT_KINDS,
  CONNECTIONS,
  FREQUENCIES_HZ,
  LOAD_MODELS,
  NAME_MAX_CHARACTERS,
  CIRCUIT_MAX_CHARACTERS,
  NAME_VISIBLE,
  NAME_WITHOUT_CONTROLS,
  NOTATION_MAX_CHARS,
  PARALLEL_CONDUCTORS,
  PF_SENSES,
  PHASE_SEQUENCES,
  PHYSICAL_RANGES as R,
  STAR_POINTS,
  SYSTEMS,
  type PhysicalRange,
} from './boardRanges.js';
import { readVoltageNotation } from './conventions/voltageNotation.js';
import { REGIONS } from './conventions/region.js';
import { PHASE_NAMINGS } from './conventions/phaseNames.js';
import { VOLTAGE_LIMIT_PERCENT, VOLTAGE_LIMIT_PRESET_NAMES } from './conventions/voltageLimits.js';

const within = (range: PhysicalRange) => numberIn(range.min, range.max, range.above);
const impedanceOf = (r: PhysicalRange, x: PhysicalRange) => strictObjectOf({ r: required(within(r)), x: required(within(x)) });
const impedance = impedanceOf(R.supplyOhms, R.supplyReactanceOhms);
const byPhase = (shape: PlainShape) => strictObjectOf({ A: optional(shape), B: optional(shape), C: optional(shape) });

const transformer = strictObjectOf({
  kVA: required(within(R.transformerKVA)),
  impedancePercent: required(within(R.impedancePercent)),
  xOverR: required(within(R.xOverR)),
});
const winding = firstOf(transformer, impedance);

const conductor = strictObjectOf({
  r: optional(within(R.supplyOhms)),
  x: optional(within(R.supplyOhms)),
  lengthM: optional(within(R.lengthM)),
  lengthFt: optional(within(R.lengthFt)),
  rOhmPerKm: optional(within(R.ohmsPerKm)),
  xOhmPerKm: optional(within(R.ohmsPerKm)),
  mm2: optional(within(R.conductorMm2)),
  awg: optional(textOf(0, AWG_MAX_CHARS)),
  kcmil: optional(within(R.conductorKcmil)),
  material: optional(oneOf(CONDUCTOR_MATERIALS)),
  conduit: optional(oneOf(CONDUIT_KINDS)),
  temperatureC: optional(within(R.conductorTemperatureC)),
  parallel: optional(wholeIn(PARALLEL_CONDUCTORS.min, PARALLEL_CONDUCTORS.max)),
  ratingA: optional(within(R.ratingA)),
});

/** The schema's transform of a voltage written as notation ("400/230"). */
const voltageNotation: PlainShape = (v) => {
  if (typeof v !== 'string' || v.length > NOTATION_MAX_CHARS) return NOT_THIS_SHAPE;
  const read = readVoltageNotation(v);
  return read.ok ? { lineToLine: read.notation.lineToLineV, lineToNeutral: read.notation.lineToNeutralV, written: read.notation.text } : NOT_THIS_SHAPE;
};

export const supplyShape = strictObjectOf({
  system: required(oneOf(SYSTEMS)),
  voltage: required(
    firstOf(
      strictObjectOf({
        lineToLine: optional(within(R.voltage)),
        lineToNeutral: optional(within(R.voltage)),
        written: optional(textOf(0, NOTATION_MAX_CHARS)),
      }),
      voltageNotation,
    ),
  ),
  frequencyHz: required(oneOf(FREQUENCIES_HZ)),
  sequence: optional(oneOf(PHASE_SEQUENCES)),
  emf: optional(byPhase(strictObjectOf({ V: required(within(R.emfV)), angleDeg: required(numberIn(ANGLE_DEG.min, ANGLE_DEG.max)) }))),
  impedance: optional(firstOf(impedance, byPhase(impedance))),
  transformer: optional(transformer),
  zeroSequence: optional(impedance),
  bank: optional(byPhase(winding)),
  openDelta: optional(strictObjectOf({ 'A-B': optional(winding), 'B-C': optional(winding), 'C-A': optional(winding) })),
});

export const feederShape = strictObjectOf({
  line: optional(firstOf(conductor, byPhase(conductor))),
  neutral: optional(conductor),
  lengthM: optional(within(R.lengthM)),
  lengthFt: optional(within(R.lengthFt)),
});

const fraction = numberIn(0, 1);
/** boardSchema's readable text: 1 to `maxCharacters` characters, at least one of them visible, no controls or direction overrides. */
const readableText =
  (maxCharacters: number): PlainShape =>
  (v) => {
    const text = textOf(1, maxCharacters)(v);
    return text !== NOT_THIS_SHAPE && NAME_VISIBLE.test(text as string) && NAME_WITHOUT_CONTROLS.test(text as string) ? text : NOT_THIS_SHAPE;
  };
export const nameText = readableText(NAME_MAX_CHARACTERS);
/** boardSchema's circuit: readable text, or a whole number read as its text. */
const circuitText = firstOf(readableText(CIRCUIT_MAX_CHARACTERS), (v) => (wholeIn(CIRCUIT_NUMBER.min, CIRCUIT_NUMBER.max)(v) === NOT_THIS_SHAPE ? NOT_THIS_SHAPE : String(v)));
export const loadShape = strictObjectOf({
  name: required(nameText),
  circuit: optional(circuitText),
  breakerA: optional(within(R.ratingA)),
  poles: optional(oneOf(BREAKER_POLES)),
  continuous: optional(trueOrFalse),
  connection: required(oneOf(CONNECTIONS)),
  starPoint: optional(oneOf(STAR_POINTS)),
  kW: optional(within(R.loadKW)),
  kvar: optional(within(R.loadKvar)),
  kVA: optional(within(R.loadKVA)),
  A: optional(within(R.loadA)),
  pf: optional(within(R.pf)),
  sense: optional(oneOf(PF_SENSES)),
  ohms: optional(impedanceOf(R.loadOhms, R.loadReactanceOhms)),
  model: optional(oneOf(LOAD_MODELS)),
  zip: optional(strictObjectOf({ z: required(fraction), i: required(fraction), p: required(fraction) })),
});

const percentBand = numberIn(VOLTAGE_LIMIT_PERCENT.min, VOLTAGE_LIMIT_PERCENT.max);
export const voltageLimitsShape = firstOf(oneOf(VOLTAGE_LIMIT_PRESET_NAMES), strictObjectOf({ underPercent: required(percentBand), overPercent: required(percentBand) }));
export const conventionsShape = strictObjectOf({
  region: optional(oneOf(REGIONS)),
  phaseNames: optional(oneOf(PHASE_NAMINGS)),
  voltageLimits: optional(voltageLimitsShape),
});
/** The board file's `studies:` of the board's own (no study section). */
export const ownStudiesShape = strictObjectOf({ openNeutral: optional(trueOrFalse) });

const board = strictObjectOf({
  $schema: optional(textOf()),
  name: optional(nameText),
  note: optional(textOf()),
  supply: required(supplyShape),
  conventions: optional(conventionsShape),
  feeder: optional(feederShape),
  loads: required(listOf(loadShape, 1)),
  studies: optional(ownStudiesShape),
});

/**
 * The board as the schema would give it, when `input` (already in trivar's spelling, see
 * readTradeSpellings) is a board file of the board's own fields that the schema accepts;
 * otherwise undefined. Cross-field rules are not checked here.
 */
export function wellFormedBoardShape(input: unknown): BoardBaseSpec | undefined {
  const out = board(input);
  return out === NOT_THIS_SHAPE ? undefined : (out as BoardBaseSpec);
}

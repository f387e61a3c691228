/**
 * The words a report uses for the things regions name differently. IEC practice
 * (IEC 60364 wording): the source star point, PEN conductors and TN-C-S earthing.
 * North-American practice (NEC wording): the grounded conductor (neutral), the
 * transformer's center tap on a split-phase (120/240 V) service, the wye point of a
 * star, grounding and bonding. Every region-specific sentence of a board report is here.
 */
import type { SystemKind } from '../boardSchema.js';
import type { Board } from '../boardModel.js';
import { REGIONS, type Region } from './region.js';
import { checkWordArgument } from '../../_internal/argumentChecks.js';
import { SYSTEMS } from '../boardRanges.js';

export interface RegionWords {
  /**
   * The point the source's phase voltages are measured from: "the source star point", "the transformer center tap"
   * (a split-phase supply the file gives as a transformer), "the source center tap" (one it gives by its voltage or
   * impedance alone: the file names no winding, so neither do the words), a single-phase source's neutral terminal.
   */
  readonly sourceNeutralPoint: string;
  /** The neutral conductor, first mention: "neutral", "grounded conductor (neutral)". */
  readonly neutralConductor: string;
  /** What the phases of the board are called in a sentence: "phases", or the "legs" of a split-phase service. */
  readonly phasesWord: string;
  /** A star connection (a bank's, a load's) and its common point: "star" (IEC 60050), "wye" (NEC). Only words: file values stay `star-bank`, `ABC-star`. */
  readonly starWord: StarWord;
  /** Where a discharged capacitor's terminals are shorted to: "earth" (IEC), "ground" (NEC). */
  readonly groundWord: 'earth' | 'ground';
  /** Cautions shown with a broken-neutral study. */
  readonly openNeutralCautions: readonly string[];
  /**
   * The same cautions where the study's figures go beyond the line-to-line voltage: the first one's
   * "up to the line-to-line voltage" replaced by `reach`, what the equipment would see in words.
   */
  readonly openNeutralCautionsReaching: (reach: string) => readonly string[];
}

/** What line-to-neutral equipment can see with the neutral broken, where nothing resonates. */
const UP_TO_LINE_TO_LINE = (phases: string) => `line-to-neutral equipment on the lightly loaded ${phases} can see up to the line-to-line voltage and be destroyed`;

const iecOpenNeutralCautions = (reach: string): readonly string[] => [
  `A broken neutral is a hazardous condition: ${reach}, and in TN-C-S installations exposed metalwork can become live.`,
  'Never switch, fuse or disconnect the neutral (PEN) on its own; inspect neutral terminations and bonding regularly.',
];
const IEC_OPEN_NEUTRAL_CAUTIONS: readonly string[] = iecOpenNeutralCautions(UP_TO_LINE_TO_LINE('phases'));

const northAmericanCautions = (reach: string): readonly string[] => [
  `A lost neutral is a hazardous condition: ${reach}, and the neutral current can return through the grounding and bonding (water piping, cable sheaths, metal enclosures).`,
  'Never switch, fuse or open the grounded conductor (neutral) on its own (NEC 240.22, from memory); inspect neutral terminations at the service, the meter base and the transformer regularly.',
];

export type StarWord = 'star' | 'wye';

/** The region's word for a star connection, where nothing else of the region's wording is needed. */
export const starWordOf = (region: Region): StarWord => regionWords(region, 'three-phase-4wire').starWord;

/** What the file gives as the supply, for the words naming its neutral point: a transformer, or a source (ideal, or an impedance). */
export const SOURCE_MODELS = ['transformer', 'source'] as const;
export type SourceModel = (typeof SOURCE_MODELS)[number];

/**
 * Whether the file gives a board's supply as a transformer (supply.transformer, or single-phase units rated in kVA);
 * a sub-board is fed by its installation's supply.
 */
export function sourceModelOf(board: Pick<Board, 'transformerKVA' | 'sourceUnits' | 'installation'>): SourceModel {
  const supply = board.installation?.installation.main ?? board;
  return supply.transformerKVA !== null || (supply.sourceUnits?.length ?? 0) > 0 ? 'transformer' : 'source';
}

/**
 * @param source what the file gives as the supply (sourceModelOf); 'source' by default, the words that hold for
 *   any supply ("the source center tap")
 */
export function regionWords(region: Region, system: SystemKind, source: SourceModel = 'source'): RegionWords {
  checkWordArgument(region, 'region', REGIONS);
  checkWordArgument(system, 'system', SYSTEMS);
  checkWordArgument(source, 'source', SOURCE_MODELS);
  const split = system === 'split-phase';
  // A split-phase supply's neutral is the middle of its winding: a center tap, never a star point.
  const winding = source === 'transformer' ? 'the transformer' : 'the source';
  // A single-phase 2-wire source has one winding and no star point: its voltage is taken from its neutral end.
  const singleNeutralEnd = system === 'single-phase' ? "the source's neutral terminal" : null;
  if (region === 'north-america')
    return {
      sourceNeutralPoint: singleNeutralEnd ?? (split ? `${winding} center tap` : 'the source wye point'),
      neutralConductor: 'grounded conductor (neutral)',
      phasesWord: split ? 'leg' : 'phases',
      starWord: 'wye',
      groundWord: 'ground',
      openNeutralCautions: northAmericanCautions(UP_TO_LINE_TO_LINE(split ? 'leg' : 'phases')),
      openNeutralCautionsReaching: northAmericanCautions,
    };
  return { sourceNeutralPoint: singleNeutralEnd ?? (split ? `${winding} centre tap` : 'the source star point'), neutralConductor: 'neutral', phasesWord: 'phases', starWord: 'star', groundWord: 'earth', openNeutralCautions: IEC_OPEN_NEUTRAL_CAUTIONS, openNeutralCautionsReaching: iecOpenNeutralCautions };
}

/** InstallationBaseSpec → Installation (the solver's model). Assumes a validated spec. */
import type { Installation, SubBoard } from './boardModel.js';
import { boardModelOf } from './normaliseBoard.js';
import { assertNormalisableInstallation } from './normalisableSpec.js';
import { feederModel } from './feederModel.js';
import type { InstallationBaseSpec } from './installationSchema.js';
import { boardSpecOf } from './installationRules.js';
import type { VoltageLimits } from './conventions/voltageLimits.js';
import { conventionsOf } from './conventions/boardConventions.js';

const sameLimits = (a: VoltageLimits, b: VoltageLimits | undefined) =>
  b !== undefined && a.preset === b.preset && a.underPercent === b.underPercent && a.overPercent === b.overPercent;

/**
 * Board numbers: 0 is the main board, then the other boards in file order.
 * @returns the installation and, per board of the file, its board number.
 */
/** The description of a sub-board's feeder the file leaves out (the HTML report's words for it too). */
const NO_FEEDER_WORDS = 'none entered (zero impedance)';

export function normaliseInstallation(spec: InstallationBaseSpec): { installation: Installation; boardNumber: number[] } {
  assertNormalisableInstallation(spec);
  const mainIndex = spec.boards.findIndex((b) => b.fedFrom === undefined);
  const boardNumber: number[] = [];
  let next = 1;
  spec.boards.forEach((_, i) => boardNumber.push(i === mainIndex ? 0 : next++));
  const numberOf = new Map(spec.boards.map((b, i) => [b.name, boardNumber[i]!]));
  const main = boardModelOf(boardSpecOf(spec, mainIndex));
  // Feeder descriptions name the phases as the file does.
  const naming = conventionsOf(main).phaseNames;
  const subBoards: SubBoard[] = new Array(spec.boards.length - 1);
  // No neutral reaches a board whose feeder, or one upstream, gives line conductors only (a loop is the rules' to refuse).
  const byName = new Map(spec.boards.map((b) => [b.name, b]));
  const withoutNeutral = (b: (typeof spec.boards)[number], depth = 0): boolean =>
    main.hasNeutral &&
    b.fedFrom !== undefined &&
    depth <= spec.boards.length &&
    ((b.feeder?.line !== undefined && b.feeder.neutral === undefined) || withoutNeutral(byName.get(b.fedFrom)!, depth + 1));
  spec.boards.forEach((b, i) => {
    if (i === mainIndex) return;
    const modelled = feederModel(b.feeder, main.phases, main.frequencyHz, naming);
    // A sub-board written without a feeder is taken as on its feeding board's busbar: said, not left silent.
    const feeder = b.feeder === undefined ? { ...modelled, description: NO_FEEDER_WORDS } : modelled;
    const board = boardModelOf(boardSpecOf(spec, i));
    const limits = board.conventions?.voltageLimits;
    subBoards[boardNumber[i]! - 1] = {
      name: b.name,
      fedFrom: numberOf.get(b.fedFrom!)!,
      feeder: { ...feeder, neutralOpen: false, ...(withoutNeutral(b) ? { withoutNeutral: true as const } : {}) },
      loads: board.loads,
      // Only where they differ from the main board's, which a sub-board otherwise shares.
      ...(limits && !sameLimits(limits, main.conventions?.voltageLimits) ? { voltageLimits: limits } : {}),
    };
  });
  const serviceFeederDescription = feederModel(spec.boards[mainIndex]!.feeder, main.phases, main.frequencyHz, naming).description;
  return { installation: { name: spec.name ?? main.name, main, subBoards, serviceFeederDescription }, boardNumber };
}

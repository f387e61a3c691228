/**
 * The shortcut past the installation schema: an installation file of the installation's own fields
 * (supply, conventions, boards with their feeders and loads, the board's own studies) checked as plain
 * data, without zod, from the parts wellFormedBoard.ts checks a board file with. On an installation the
 * schema accepts it gives exactly the schema's output (same values, same key order); on anything else,
 * and on every study section or study load field, it gives undefined and the caller runs the schema,
 * which words every problem.
 *
 * Why: building every study's schema (zod) took about a third of `trivar solve` on the shipped
 * installations (maple-court-riser: 57 against 35 ms for a board file of the same size).
 * Mirrors installationSchema.ts; test/property/wellFormedInstallation.test.ts holds it to the schema.
 */
import { listOf, NOT_THIS_SHAPE, optional, required, strictObjectOf, textOf } from '../_internal/plainShape.js';
import type { InstallationBaseSpec } from './installationSchema.js';
import { conventionsShape, feederShape, loadShape, nameText, ownStudiesShape, supplyShape, voltageLimitsShape } from './wellFormedBoard.js';

const installationBoard = strictObjectOf({
  name: required(nameText),
  fedFrom: optional(nameText),
  feeder: optional(feederShape),
  voltageLimits: optional(voltageLimitsShape),
  // A board that only feeds others may have no circuits.
  loads: required(listOf(loadShape)),
});

const installation = strictObjectOf({
  $schema: optional(textOf()),
  name: optional(nameText),
  note: optional(textOf()),
  supply: required(supplyShape),
  conventions: optional(conventionsShape),
  boards: required(listOf(installationBoard, 1)),
  studies: optional(ownStudiesShape),
});

/**
 * The installation as the schema would give it, when `input` (already in trivar's spelling, see
 * readTradeSpellings) is an installation file of its own fields that the schema accepts; otherwise
 * undefined. The tree and cross-field rules are not checked here.
 */
export function wellFormedInstallationShape(input: unknown): InstallationBaseSpec | undefined {
  const out = installation(input);
  return out === NOT_THIS_SHAPE ? undefined : (out as InstallationBaseSpec);
}

/**
 * How hard the supply works: the transformer's loading against its rating, and
 * whether the solved operating point is one the supply can hold at all.
 */
import { abs, mul, sub } from '../complex.js';
import type { NetworkSolution } from '../network/solveNetwork.js';
import { lineRatingOf } from '../board/boardModel.js';
import type { IncomerReading, LineToLineReading, OperatingPoint, PhaseReading, SourceUnitReading, TransformerReading } from './boardResult.js';
import { quoteText } from '../errors.js';

export const SUPPLY_LIMITS = {
  /**
   * Board voltage (line-to-line; on a single-phase board, line-to-neutral) below which the
   * operating point is a collapse, % of nominal. Half voltage is past the nose of the P–V curve
   * of any supply feeding a resistive load (maximum power transfer sits at half the EMF).
   */
  collapsedVoltagePercent: 50,
} as const;

/**
 * Loading of the supply transformer: kVA at its terminals (Σ|V||I| over the lines, V = EMF − Z·I)
 * and the most loaded line against the rated current. Null without a transformer.
 */
export function readTransformer(solution: NetworkSolution): TransformerReading | null {
  const { board } = solution;
  if (board.transformerKVA === null) return null;
  const ratedVA = board.transformerKVA * 1000;
  // Rated line current: √3·V_LL·I three-phase; V_LL·I for a centre-tapped split-phase winding; V·I single-phase.
  const ratedCurrentA =
    board.system === 'single-phase'
      ? ratedVA / board.nominalLineToNeutralV
      : board.system === 'split-phase'
        ? ratedVA / board.nominalLineToLineV!
        : ratedVA / (Math.sqrt(3) * board.nominalLineToLineV!);
  let kVA = 0;
  let largest = 0;
  solution.lineCurrents.forEach((i, k) => {
    const terminal = sub(board.emf[k]!, mul(board.sourceImpedance, i));
    kVA += (abs(terminal) * abs(i)) / 1000;
    largest = Math.max(largest, abs(i));
  });
  return { ratedKVA: board.transformerKVA, kVA, ratedCurrentA, largestLineCurrentA: largest, loadingPercent: (100 * largest) / ratedCurrentA };
}

/**
 * Loading of each rated single-phase unit of a bank or an open delta: the line current through it
 * against its rated current (kVA over its rated voltage). Null where the supply has no such units.
 */
export function readSourceUnits(solution: NetworkSolution): SourceUnitReading[] | null {
  const { board } = solution;
  if (!board.sourceUnits?.length || board.installation?.boardIndex) return null;
  return board.sourceUnits.map((u) => {
    const currentA = abs(solution.lineCurrents[board.phases.indexOf(u.line)]!);
    const ratedCurrentA = (u.kVA * 1000) / u.ratedV;
    return { winding: u.winding, ratedKVA: u.kVA, currentA, ratedCurrentA, loadingPercent: (100 * currentA) / ratedCurrentA };
  });
}

/** A sub-board's incomer: what its feeder carries at the board, against the feeder's rating. Null on a main board. */
export function readIncomer(solution: NetworkSolution, phases: readonly PhaseReading[]): IncomerReading | null {
  const place = solution.board.installation;
  if (!place || place.boardIndex === 0) return null;
  const { installation, boardIndex } = place;
  const parent = installation.subBoards[boardIndex - 1]!.fedFrom;
  const largest = Math.max(0, ...phases.map((p) => p.current.magnitude));
  // With a rating per line, the most loaded line against its own rating speaks for the feeder.
  const ratings = phases.map((_, k) => lineRatingOf(solution.board, k));
  const worst = phases.reduce<number | null>((w, p, k) => (ratings[k] && (w === null || p.current.magnitude / ratings[k]! > phases[w]!.current.magnitude / ratings[w]!) ? k : w), null);
  const ratingA = worst === null ? null : ratings[worst]!;
  const loadingPercent = worst === null ? null : (100 * phases[worst]!.current.magnitude) / ratingA!;
  return {
    fedFrom: parent === 0 ? installation.main.name : installation.subBoards[parent - 1]!.name,
    kVA: phases.reduce((sum, p) => sum + (p.voltage.magnitude * p.current.magnitude) / 1000, 0),
    largestLineCurrentA: largest,
    ratingA,
    loadingPercent,
  };
}

/**
 * Whether the solved point is one the supply can hold. Collapsed when a board voltage (line-to-line, or
 * line-to-neutral with the neutral intact) is below
 * SUPPLY_LIMITS.collapsedVoltagePercent, or when (with the neutral intact) a constant-power or
 * constant-current load had to be taken as an impedance below the solver's low-voltage threshold:
 * the supply cannot deliver what those loads are rated to draw, and the figures are of a state no
 * real board would settle in (motors stall, electronics drop out, protection trips).
 */
export function judgeOperatingPoint(
  solution: NetworkSolution,
  phases: readonly PhaseReading[],
  lineToLine: readonly LineToLineReading[],
  belowThreshold: readonly { readonly name: string; readonly pu: number; readonly ratingV?: number }[],
): OperatingPoint {
  const { board } = solution;
  const findings: string[] = [];
  const limit = SUPPLY_LIMITS.collapsedVoltagePercent;
  // Line-to-line voltages always; line-to-neutral ones too while the neutral is intact (a broken
  // neutral moves them on purpose: that is the what-if, not the supply giving way).
  const busPercents = [
    ...lineToLine.map((l) => ({ label: `${l.pair}`, percent: l.voltagePercent })),
    ...(board.hasNeutral && !board.neutralOpen ? phases.map((p) => ({ label: `${p.phase}-N`, percent: p.voltagePercent })) : []),
  ];
  const low = busPercents.filter((b) => b.percent < limit);
  if (low.length)
    findings.push(`the board voltage has collapsed to ${low.map((b) => `${b.label} ${b.percent.toFixed(1)} %`).join(', ')} of nominal (below ${limit} %)`);
  if (!board.neutralOpen && belowThreshold.length) {
    // Each at its % of its nominal voltage, or of the voltage its rating is taken at where that is not the nominal the tables print against.
    const named = belowThreshold.slice(0, 3).map((b) => `${quoteText(b.name)} at ${(b.pu * 100).toFixed(1)} % of ${b.ratingV === undefined ? 'its nominal voltage' : `the ${b.ratingV.toFixed(1)} V its rating is taken at`}`);
    const more = belowThreshold.length > 3 ? ` and ${belowThreshold.length - 3} more` : '';
    findings.push(
      `the supply cannot deliver the rated power of ${named.join(', ')}${more}: below ${(solution.lowVoltageThreshold * 100).toFixed(0)} % a constant-power or constant-current load is taken as an impedance, so the figures describe a state the real loads would not settle in`,
    );
  }
  return { collapsed: findings.length > 0, findings };
}

/**
 * Where a correction target is measured when that is not the equipment's own
 * board (`target.measuredAt`): the origin of the installation (the supply's
 * terminals, where the service cable starts: where a tariff meter usually sits)
 * or the incomer of a board the equipment's board is fed through. Everything
 * between the equipment and that point — the feeders' reactive power, the
 * voltage they drop — is then part of every solve the study judges.
 *
 * The origin is not a node of the installation as written (the supply's
 * impedance is folded into the service cable), so it is read as a board of its
 * own: the same installation with a load-free board at the supply's terminals
 * and the written main board fed from it through the service cable — the same
 * circuit, one node more.
 */
import type { Board, Installation, SubBoard } from '../board/boardModel.js';
import type { BoardResult } from '../analysis/boardResult.js';
import { analyseSolution } from '../analysis/analyseSolution.js';
import { ZERO } from '../complex.js';
import { inputIssue, type InputIssue, quoteText } from '../errors.js';
import { boardOfInstallation, installationOf } from '../network/installationModel.js';
import { solveInstallationNetwork, type NetworkSolution, type SolveOptions } from '../network/solveNetwork.js';
import { assertBoardModel } from '../board/modelGuards.js';

/** The word for the origin of the installation in `target.measuredAt`. */
export const ORIGIN_POINT = 'origin';

/** Name of the load-free board that stands for the origin in the metering installation. */
const ORIGIN_BOARD = 'origin of the installation';

/** A target measured away from the equipment's board (internal: carries a function). */
export interface MeteringPlace {
  /** `origin`, or the name of the board at whose incomer the target is measured. */
  readonly point: string;
  /** Board number of the metering point in the installation `inFrame` places boards in. */
  readonly meterIndex: number;
  /** The equipment's board (as given, or with loads or equipment edited) in the installation the metering point is a board of. */
  inFrame(board: Board): Board;
}

/** The installation with a load-free board at the supply's terminals, feeding the written main board through the service cable. */
function withOriginBoard(installation: Installation): Installation {
  const { main } = installation;
  const { installation: _place, lineImpedances, lineRatingsA, ...supply } = main;
  const origin: Board = { ...supply, name: ORIGIN_BOARD, lineImpedance: ZERO, neutralImpedance: ZERO, neutralOpen: false, lineRatingA: null, neutralRatingA: null, loads: [] };
  const service: SubBoard = {
    name: main.name,
    fedFrom: 0,
    feeder: {
      lineImpedances: lineImpedances ?? main.phases.map(() => main.lineImpedance),
      neutralImpedance: main.neutralImpedance,
      neutralOpen: main.neutralOpen,
      lineRatingA: main.lineRatingA,
      ...(lineRatingsA ? { lineRatingsA } : {}),
      neutralRatingA: main.neutralRatingA,
      description: installation.serviceFeederDescription ?? null,
    },
    loads: main.loads,
  };
  return { ...installation, main: origin, subBoards: [service, ...installation.subBoards.map((sb) => ({ ...sb, fedFrom: sb.fedFrom + 1 }))], serviceFeederDescription: null };
}

/** Boards from `index` up to the main board (board numbers). */
function pathToSupply(installation: Installation, index: number): number[] {
  const path = [index];
  for (let b = index; b !== 0; b = installation.subBoards[b - 1]!.fedFrom) path.push(installation.subBoards[b - 1]!.fedFrom);
  return path;
}

const boardName = (installation: Installation, index: number) => (index === 0 ? installation.main.name : installation.subBoards[index - 1]!.name);

/** What `target.measuredAt` accepts for equipment on `board`: the origin, the board itself and every board it is fed through. */
export function meteringPoints(board: Board): string[] {
  assertBoardModel(board);
  const { installation, boardIndex } = installationOf(board);
  return [ORIGIN_POINT, ...pathToSupply(installation, boardIndex).map((b) => boardName(installation, b))];
}

/**
 * Checks a metering point named for equipment on `board`.
 * @param path the field or option that named it, for the issue (`target.measuredAt`, `--measured-at`)
 */
export function meteringPointIssues(board: Board, point: string | undefined, path = 'target.measuredAt'): InputIssue[] {
  assertBoardModel(board);
  if (point === undefined) return [];
  const known = installationOf(board).installation;
  const all = [known.main.name, ...known.subBoards.map((b) => b.name)];
  // "origin" is the supply's terminals; a board of that name would make the word name two places,
  // and either reading would be a silent guess: refused, naming the board to rename.
  if (point === ORIGIN_POINT && all.includes(ORIGIN_POINT))
    return [
      inputIssue(
        'ambiguous_point',
        path,
        `a metering point that names one place: "${ORIGIN_POINT}" is the word for the supply's terminals (where the service cable starts), and a board of this installation is named "${ORIGIN_POINT}" too; rename that board to measure at either`,
        point,
      ),
    ];
  const accepted = meteringPoints(board);
  if (accepted.includes(point)) return [];
  const expected = `${ORIGIN_POINT} (the supply's terminals, where the service cable starts) or a board the equipment's board ${quoteText(board.name)} is fed through: ${accepted
    .slice(1)
    .map((n) => JSON.stringify(n))
    .join(', ')}`;
  return [inputIssue(all.includes(point) ? 'not_upstream' : 'unknown_board', path, expected, point)];
}

/**
 * Where the target of a study on `board` is measured; null when that is the board itself.
 * The name must be one of `meteringPoints(board)` (checked by the study's rules).
 */
export function meteringPlace(board: Board, point: string | undefined): MeteringPlace | null {
  if (point === undefined || point === board.name) return null;
  if (point === ORIGIN_POINT) {
    return {
      point,
      meterIndex: 0,
      inFrame(b) {
        const { installation, boardIndex } = installationOf(b);
        return boardOfInstallation(withOriginBoard(installation), boardIndex + 1);
      },
    };
  }
  const { installation } = installationOf(board);
  const meterIndex = [installation.main.name, ...installation.subBoards.map((s) => s.name)].indexOf(point);
  return { point, meterIndex, inFrame: (b) => b };
}

/** Solves the whole installation with `board` as it is and reads the metering point. */
export function solveMeter(board: Board, place: MeteringPlace, options?: SolveOptions): BoardResult;
/** The same, read by `read` (e.g. only the target figures) instead of the whole analysis. */
export function solveMeter<R>(board: Board, place: MeteringPlace, options: SolveOptions, read: (solved: NetworkSolution) => R): R;
export function solveMeter(board: Board, place: MeteringPlace, options: SolveOptions = {}, read: (solved: NetworkSolution) => unknown = analyseSolution): unknown {
  const framed = place.inFrame(board);
  return read(solveInstallationNetwork(installationOf(framed).installation, options).boards[place.meterIndex]!);
}

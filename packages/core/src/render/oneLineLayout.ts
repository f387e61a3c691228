/**
 * Where the one-line drawing puts each board, each feeder run and each label.
 * Two arrangements, both built so no label can meet another label or a run:
 * - `tree`: the supply on top, each board centred over the boards it feeds;
 *   a board owns a column band as wide as its leaves, and a feeder's label sits
 *   in the fed board's band below the feeding board's bus run. It reads like a
 *   classic one-line drawing while the tree is narrow.
 * - `ladder`: one board per row, indented by its depth; runs drop from a stub
 *   under the feeding board and enter the fed board from the left, and each
 *   feeder's label sits right of its board's box. It keeps a wide tree (many
 *   boards on one level) legible on a portrait page.
 */
import type { InstallationBoardResult, InstallationResult } from '../analysis/installationResult.js';

export interface OneLineGeometry {
  readonly column: number;
  readonly boxWidth: number;
  readonly boxHeight: number;
  readonly rowPitch: number;
  readonly busDrop: number;
  readonly margin: number;
  readonly top: number;
  readonly sourceHeight: number;
  readonly minWidth: number;
  /** Ladder: indent per level, run offset from the feeding box's left edge, row pitch. */
  readonly indent: number;
  readonly stub: number;
  readonly ladderPitch: number;
  /** Above this many boards without boards of their own, the ladder is used. */
  readonly treeMaxLeaves: number;
}

export interface PlacedBoard {
  readonly board: InstallationBoardResult;
  readonly depth: number;
  /** Box top-left, px. */
  readonly x: number;
  readonly top: number;
  /** The run of the feeder into this board: from the feeding box's bottom edge (or the supply) to this box's edge. */
  readonly run: readonly (readonly [number, number])[];
  /** Baseline start of the first label line. */
  readonly label: { readonly x: number; readonly y: number; readonly width: number };
}

export interface OneLineLayout {
  readonly arrangement: 'tree' | 'ladder';
  /** In feeding order (the order of `result.boards`). */
  readonly boards: readonly PlacedBoard[];
  /** Centre of the supply symbol. */
  readonly supply: { readonly x: number; readonly y: number };
  readonly width: number;
  /** Bottom of the lowest box. */
  readonly bottom: number;
}

/** Half the supply symbol's height: runs start this far below its centre. */
export const SUPPLY_HALF_HEIGHT = 19;

/** Without repeated points (a board straight below its feeder needs no bend). */
const dedupe = (points: (readonly [number, number])[]) => points.filter((p, k) => k === 0 || p[0] !== points[k - 1]![0] || p[1] !== points[k - 1]![1]);

function childrenOf(result: InstallationResult): Map<string | null, InstallationBoardResult[]> {
  const children = new Map<string | null, InstallationBoardResult[]>();
  for (const b of result.boards) children.set(b.fedFrom, [...(children.get(b.fedFrom) ?? []), b]);
  return children;
}

const inFeedingOrder = (result: InstallationResult, placed: PlacedBoard[]): PlacedBoard[] => {
  const order = new Map(result.boards.map((b, k) => [b.name, k]));
  return placed.sort((a, b) => order.get(a.board.name)! - order.get(b.board.name)!);
};

function treeLayout(result: InstallationResult, g: OneLineGeometry, leaves: number): OneLineLayout {
  const children = childrenOf(result);
  const centres = new Map<string, { cx: number; depth: number }>();
  let nextLeaf = 0;
  const visit = (b: InstallationBoardResult, depth: number): number => {
    const kids = children.get(b.name) ?? [];
    const xs = kids.map((k) => visit(k, depth + 1));
    const cx = xs.length ? (xs[0]! + xs[xs.length - 1]!) / 2 : g.margin + (nextLeaf++ + 0.5) * g.column;
    centres.set(b.name, { cx, depth });
    return cx;
  };
  for (const root of children.get(null) ?? []) visit(root, 0);
  const topOf = (depth: number) => g.top + g.sourceHeight + depth * g.rowPitch;
  const main = result.boards.find((b) => b.fedFrom === null)!;
  const supply = { x: centres.get(main.name)!.cx, y: g.top + 16 };
  const placed = result.boards.map((board): PlacedBoard => {
    const { cx, depth } = centres.get(board.name)!;
    const top = topOf(depth);
    const parent = board.fedFrom === null ? null : centres.get(board.fedFrom)!;
    const start: [number, number] = parent ? [parent.cx, topOf(parent.depth) + g.boxHeight] : [supply.x, supply.y + SUPPLY_HALF_HEIGHT];
    const busY = parent ? start[1] + g.busDrop : start[1] + (top - start[1]) / 2;
    return {
      board,
      depth,
      x: cx - g.boxWidth / 2,
      top,
      run: dedupe([start, [start[0], busY], [cx, busY], [cx, top]]),
      // In the board's own band, right of its run and below the bus: up to the next band's run, with a gap.
      label: { x: cx + 7, y: parent ? busY + 15 : busY - 6, width: g.column - 16 },
    };
  });
  const maxDepth = Math.max(...placed.map((p) => p.depth));
  // Half a band more on the right: the last board's feeder label sits right of its run.
  return { arrangement: 'tree', boards: inFeedingOrder(result, placed), supply, width: Math.max(g.minWidth, 2 * g.margin + (leaves + 0.5) * g.column), bottom: topOf(maxDepth) + g.boxHeight };
}

function ladderLayout(result: InstallationResult, g: OneLineGeometry): OneLineLayout {
  const children = childrenOf(result);
  const rows: { board: InstallationBoardResult; depth: number }[] = [];
  const visit = (b: InstallationBoardResult, depth: number) => {
    rows.push({ board: b, depth });
    for (const k of children.get(b.name) ?? []) visit(k, depth + 1);
  };
  for (const root of children.get(null) ?? []) visit(root, 0);
  const left = g.margin + 6;
  const at = new Map(rows.map((r, k) => [r.board.name, { x: left + r.depth * g.indent, top: g.top + g.sourceHeight + k * g.ladderPitch }]));
  const supply = { x: left + g.stub, y: g.top + 16 };
  const labelX = (x: number) => x + g.boxWidth + 10;
  const labelWidth = g.column - 16;
  const placed = rows.map(({ board, depth }): PlacedBoard => {
    const { x, top } = at.get(board.name)!;
    const parent = board.fedFrom === null ? null : at.get(board.fedFrom)!;
    const mid = top + g.boxHeight / 2;
    const run: [number, number][] = parent
      ? [
          [parent.x + g.stub, parent.top + g.boxHeight],
          [parent.x + g.stub, mid],
          [x, mid],
        ]
      : [
          [supply.x, supply.y + SUPPLY_HALF_HEIGHT],
          [supply.x, top],
        ];
    return { board, depth, x, top, run, label: { x: labelX(x), y: top + 20, width: labelWidth } };
  });
  const maxDepth = Math.max(...rows.map((r) => r.depth));
  const width = Math.max(g.minWidth, labelX(left + maxDepth * g.indent) + labelWidth + g.margin);
  return { arrangement: 'ladder', boards: inFeedingOrder(result, placed), supply, width, bottom: g.top + g.sourceHeight + (rows.length - 1) * g.ladderPitch + g.boxHeight };
}

/** Lays the installation out: the tree while it is narrow, else the ladder. */
export function layOutOneLine(result: InstallationResult, g: OneLineGeometry): OneLineLayout {
  const fed = new Set(result.boards.map((b) => b.fedFrom));
  const leaves = result.boards.filter((b) => !fed.has(b.name)).length;
  return leaves <= g.treeMaxLeaves ? treeLayout(result, g, leaves) : ladderLayout(result, g);
}

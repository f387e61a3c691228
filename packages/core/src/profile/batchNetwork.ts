/**
 * A board prepared once for many intervals: its load branches grouped into
 * edges (branches between the same two terminals share one voltage, so their
 * admittances add), and per-interval "drivers" that set the loads' power.
 *
 * An interval's load powers are linear in the drivers: a driver value a_d
 * (complex: a scale factor, or a total P + jQ in VA) contributes
 * a_d · K[d, e, m] to part m (constant impedance, current, power) of the
 * complex power of edge e at its nominal voltage. The coefficients K are
 * built here from the board's ratings, so the kernels touch only numbers.
 */
import type { Board, LoadBranch, BoardLoad, Terminal } from '../board/boardModel.js';
import type { ComplexValue } from '../complex.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { quoteText } from '../errors.js';

/** How one driver reaches the board's loads: load index → complex coefficient. */
export interface DriverSpec {
  readonly name: string;
  /**
   * Each load's power at nominal voltage, VA, is Σ_d a_d · coefficient; a load's
   * power splits evenly over its branches (as normaliseBoard rates them).
   */
  readonly loads: readonly { readonly load: number; readonly coefficient: ComplexValue }[];
}

export interface BatchEdge {
  readonly from: Terminal;
  readonly to: Terminal;
  readonly vNominal: number;
}

export interface BatchNetwork {
  readonly board: Board;
  readonly edges: readonly BatchEdge[];
  readonly drivers: readonly DriverSpec[];
  /**
   * Coefficients, laid out [driver][edge][part][re, im]:
   * index ((d·E + e)·3 + m)·2. Part m: 0 impedance, 1 current, 2 power.
   */
  readonly coefficients: Float64Array;
}

const keyOf = (from: Terminal, to: Terminal, v: number) => `${from}|${to}|${v}`;

/** The edge between two terminals at a nominal voltage, or -1. */
export function edgeIndex(net: BatchNetwork, from: Terminal, to: Terminal, vNominal: number): number {
  return net.edges.findIndex((e) => e.from === from && e.to === to && e.vNominal === vNominal);
}

/** Groups the board's branches into edges and folds the drivers' coefficients onto them. */
export function compileBatchNetwork(board: Board, drivers: readonly DriverSpec[], extraEdges: readonly BatchEdge[] = []): BatchNetwork {
  assertBoardModel(board);
  const folded = foldDrivers(
    board.loads,
    (_, b) => ({ from: b.from, to: b.to, vNominal: b.vNominal }),
    (e) => keyOf(e.from, e.to, e.vNominal),
    drivers,
    extraEdges,
  );
  return { board, edges: folded.edges, drivers, coefficients: folded.coefficients };
}

/**
 * Edges of a list of loads (branches with the same key share one edge, in the order first met; extra
 * edges after them) and the drivers' coefficients folded onto them ([driver][edge][part][re, im]).
 */
export function foldDrivers<E extends BatchEdge>(
  loads: readonly BoardLoad[],
  edgeOf: (load: number, branch: LoadBranch) => E,
  keyOfEdge: (edge: E) => string,
  drivers: readonly DriverSpec[],
  extraEdges: readonly E[],
): { edges: E[]; coefficients: Float64Array } {
  const edges: E[] = [];
  const indexOf = new Map<string, number>();
  const branchEdge = loads.map((load, l) =>
    load.branches.map((b) => {
      const edge = edgeOf(l, b);
      const key = keyOfEdge(edge);
      let e = indexOf.get(key);
      if (e === undefined) {
        e = edges.push(edge) - 1;
        indexOf.set(key, e);
      }
      return e;
    }),
  );
  // Edges that equipment added later (capacitor steps) will need, even where no load sits.
  for (const x of extraEdges) {
    const key = keyOfEdge(x);
    if (!indexOf.has(key)) indexOf.set(key, edges.push(x) - 1);
  }
  const E = edges.length;
  const coefficients = new Float64Array(drivers.length * E * 6);
  drivers.forEach((driver, d) => {
    for (const { load, coefficient } of driver.loads) {
      const l = loads[load];
      if (!l) throw new RangeError(`compileBatchNetwork: driver ${quoteText(driver.name)} names load ${load}, which the board does not have`);
      const share = 1 / l.branches.length;
      l.branches.forEach((b, k) => {
        const base = (d * E + branchEdge[load]![k]!) * 6;
        const parts = [b.zip.z, b.zip.i, b.zip.p];
        for (let m = 0; m < 3; m++) {
          coefficients[base + m * 2] = coefficients[base + m * 2]! + coefficient.re * share * parts[m]!;
          coefficients[base + m * 2 + 1] = coefficients[base + m * 2 + 1]! + coefficient.im * share * parts[m]!;
        }
      });
    }
  });
  return { edges, coefficients };
}

/**
 * Per-interval driver values as columns: `re[d][i]`, `im[d][i]` for interval i.
 * A scale-factor driver has im = 0.
 */
export interface DriverColumns {
  readonly count: number;
  readonly re: readonly Float64Array[];
  readonly im: readonly Float64Array[];
}

/**
 * Fills `out` ([edge][part][re, im]) with the edge powers of interval i.
 * Written once here so both kernels read the loads the same way.
 */
export function edgePowersAt(net: Pick<BatchNetwork, 'coefficients'>, columns: DriverColumns, i: number, out: Float64Array): void {
  out.fill(0);
  const n = out.length;
  const k = net.coefficients;
  for (let d = 0; d < columns.re.length; d++) {
    const ar = columns.re[d]![i]!;
    const ai = columns.im[d]![i]!;
    if (ar === 0 && ai === 0) continue;
    const base = d * n;
    for (let j = 0; j < n; j += 2) {
      const cr = k[base + j]!;
      const ci = k[base + j + 1]!;
      out[j] = out[j]! + ar * cr - ai * ci;
      out[j + 1] = out[j + 1]! + ar * ci + ai * cr;
    }
  }
}

/**
 * The supply path's reactance as a set of shunt capacitors' own current meets it: what the resonance
 * orders and the rise estimate are worked from.
 *
 * Which conductors that current takes depends on how the capacitors are connected:
 * - single-phase 2-wire: out on the line, back on the neutral, always (the loop of shortCircuitPathImpedance);
 * - split-phase: a line-to-line (240 V) capacitor's current goes out on one line and back on the other,
 *   the neutral carries none of it; a line-to-neutral one returns on the neutral, except for the part
 *   that an equal capacitor on the other line cancels there;
 * - three-phase 4-wire: a star bank with its star point on the neutral puts only the sum of its three
 *   currents, the zero-sequence part an unequal bank has, on the neutral; a balanced bank, a delta bank
 *   and a floating star put none there.
 * S_sc,X: with the capacitors' fundamental currents I_k in each conductor (at the nominal voltages), the
 * path absorbs Q_L = Σ X_k·|I_k|² while the capacitors give Q_C, so S_sc,X = Q_C²/Q_L (n·V²/X_path for a
 * single loop or a balanced bank).
 *
 * Resonance: √(S_sc,X/Q_C) is the Rayleigh quotient of the fundamental current pattern, which is never
 * below the network's lowest resonance and, for unequal line-to-neutral capacitors, well above it (a
 * split-phase bank of 817 and 123 µF: 15.4 against 12.2). So the orders are the network's own: with the
 * source EMFs shorted, the board's terminals meet the source through the conductors' reactances X_k and
 * each other through the capacitors; at order h the nodal susceptance matrix is h·B_C − Γ/h (Γ = diag(1/X_k)
 * plus the Laplacian of any shunt reactors' susceptance, B_C the capacitors' Laplacian, both at the
 * fundamental), and it is singular where B_C·v = Γ·v/h²: h = 1/√μ for the eigenvalues μ of that small
 * (at most 4×4) symmetric pencil. A single loop gives √(X_C/(X_line + X_N)); a balanced delta or floating
 * star bank √(X_C/X_line). A star bank with its star point on the neutral also has a common mode, all
 * lines against the neutral, at √(X_C/(X_line + n·X_N)) for n equal branches: lower than the balanced
 * figure, and the scan's line-to-neutral peak sits there.
 */
import { abs, absSquared, add, mul, scale, sub, ZERO, type ComplexValue } from '../complex.js';
import type { Board, LoadBranch, Terminal } from '../board/boardModel.js';
import { neutralPathImpedance, reactanceShortCircuitVA, supplyPathImpedance } from './installationModel.js';

export interface CapacitorPathReactance {
  /** S_sc,X as the capacitors' current sees the path, Q_C²/Q_L, VA. */
  readonly shortCircuitVA: number;
  /** True where part of the capacitors' current returns on the neutral (always on a single-phase board). */
  readonly throughNeutral: boolean;
  /** The parallel resonance orders of the supply path with these capacitors (and reactors), lowest first; empty without capacitors. */
  readonly resonanceOrders: readonly number[];
  /**
   * The first-order steady rise of the worst line's voltage to the neutral bar, per unit of its nominal, with
   * the capacitors at nominal voltage: −Z_line·I_line − Z_N·I_N taken along that line's voltage (X·I alone for a
   * single loop or a balanced bank); null without capacitors.
   */
  readonly worstRise: { readonly line: Terminal; readonly perUnit: number } | null;
  /** True where a capacitor is tied to the neutral bar (its path then takes part in the resonances). */
  readonly tiedToNeutral: boolean;
  /** Q_C of these capacitors at nominal voltage, VA (what `worstRise` is worked at). */
  readonly capacitorVA: number;
  /** Q_L of the shunt reactors at nominal voltage, VA (0 without reactors): what `singleNodeOrder` adds to S_sc,X. */
  readonly reactorVA: number;
  /** The single-node figure √((S_sc,X + Q_L)/Q_C) at nominal voltage (Q_L of shunt reactors); the lowest order where the fundamental pattern is a mode of the network. Null without capacitors. */
  readonly singleNodeOrder: number | null;
}

/** The capacitive part of each branch as a susceptance at its nominal voltage, S (inductive and resistive parts left out). */
const susceptanceOf = (b: LoadBranch): number => (b.sNominal.im < 0 && b.vNominal > 0 ? -b.sNominal.im / b.vNominal ** 2 : 0);

/**
 * The path as `branches` (the capacitors switched in) see it; falls back to the board's own figure
 * (reactanceShortCircuitVA) where the branches draw no capacitive current, and null where the path has
 * no reactance.
 */
export function capacitorPathReactance(board: Board, branches: readonly LoadBranch[]): CapacitorPathReactance | null {
  const boardFigure = reactanceShortCircuitVA(board);
  if (boardFigure === null) return null;
  // A branch sized to nothing carries round-off (1e-13 of the rest): not a capacitor whose path counts.
  const largest = Math.max(0, ...branches.map((b) => -b.sNominal.im));
  const capacitive = branches.filter((b) => susceptanceOf(b) > 0 && -b.sNominal.im > 1e-9 * largest);
  const fallback = { shortCircuitVA: boardFigure, throughNeutral: board.system === 'single-phase', resonanceOrders: [], worstRise: null, capacitorVA: 0, reactorVA: 0, singleNodeOrder: null, tiedToNeutral: false };
  if (capacitive.length === 0) return fallback;

  // Nominal voltages to the source star point, each at its EMF's angle; the neutral bar at zero.
  const phaseV = new Map<Terminal, ComplexValue>(board.phases.map((p, k) => [p, scale(board.emf[k]!, board.nominalLineToNeutralV / (abs(board.emf[k]!) || 1))]));
  phaseV.set('N', ZERO);
  // A private star point floats where its branches put it (Millman).
  const stars = new Map<Terminal, { weighted: ComplexValue; total: number }>();
  for (const b of capacitive) {
    for (const [star, other] of [[b.from, b.to], [b.to, b.from]] as const) {
      if (!star.startsWith('star:') || !phaseV.has(other)) continue;
      const s = stars.get(star) ?? { weighted: ZERO, total: 0 };
      stars.set(star, { weighted: add(s.weighted, scale(phaseV.get(other)!, susceptanceOf(b))), total: s.total + susceptanceOf(b) });
    }
  }
  for (const [star, s] of stars) phaseV.set(star, s.total > 0 ? scale(s.weighted, 1 / s.total) : ZERO);

  const lineCurrent = new Map<Terminal, ComplexValue>(board.phases.map((p) => [p, ZERO]));
  let neutralCurrent = ZERO;
  let capacitorVA = 0;
  for (const b of capacitive) {
    const v = sub(phaseV.get(b.from) ?? ZERO, phaseV.get(b.to) ?? ZERO);
    const i = mul({ re: 0, im: susceptanceOf(b) }, v);
    capacitorVA += susceptanceOf(b) * absSquared(v);
    // Current leaves the source on the `from` line and comes back on the `to` one (the neutral for N).
    if (lineCurrent.has(b.from)) lineCurrent.set(b.from, add(lineCurrent.get(b.from)!, i));
    if (lineCurrent.has(b.to)) lineCurrent.set(b.to, sub(lineCurrent.get(b.to)!, i));
    if (b.to === 'N') neutralCurrent = add(neutralCurrent, i);
    if (b.from === 'N') neutralCurrent = sub(neutralCurrent, i);
  }
  // Each line at the path's mean reactance (supplyPathImpedance), the neutral at its own.
  const lineX = supplyPathImpedance(board).im;
  const neutralX = neutralPathImpedance(board)?.im ?? 0;
  const lineSquares = [...lineCurrent.values()].reduce((s, i) => s + absSquared(i), 0);
  const pathVA = lineX * lineSquares + neutralX * absSquared(neutralCurrent);
  if (!(pathVA > 0) || !(capacitorVA > 0)) return fallback;
  // A neutral share below round-off of the line currents (a balanced bank) is none.
  const throughNeutral = absSquared(neutralCurrent) > 1e-18 * lineSquares && neutralX !== 0;
  // The rise of each line's voltage to the neutral bar: its own −Z·I, and the neutral bar's shift along it. The
  // resistance drops out for a single loop or a balanced bank (each current in quadrature with its voltage) but
  // not for unequal ones (a lone A-B capacitor raises line A by 1.5·X·B + 0.87·R·B of its voltage).
  const lineZ = supplyPathImpedance(board);
  const neutralZ = neutralPathImpedance(board) ?? ZERO;
  let worstRise: CapacitorPathReactance['worstRise'] = null;
  for (const p of board.phases) {
    const v = phaseV.get(p)!;
    const drop = scale(add(mul(lineZ, lineCurrent.get(p)!), mul(neutralZ, neutralCurrent)), -1);
    const perUnit = (drop.re * v.re + drop.im * v.im) / absSquared(v);
    if (worstRise === null || perUnit > worstRise.perUnit) worstRise = { line: p, perUnit };
  }
  const inductive = branches.filter((b) => b.sNominal.im > 0 && b.vNominal > 0);
  const reactorVA = inductive.reduce((s, b) => s + (b.sNominal.im / b.vNominal ** 2) * absSquared(sub(phaseV.get(b.from) ?? ZERO, phaseV.get(b.to) ?? ZERO)), 0);
  return {
    shortCircuitVA: capacitorVA ** 2 / pathVA,
    throughNeutral,
    resonanceOrders: resonanceOrders(board.phases, lineX, neutralX, capacitive, inductive),
    worstRise,
    tiedToNeutral: capacitive.some((b) => b.from === 'N' || b.to === 'N') && neutralX > 0,
    capacitorVA,
    reactorVA,
    singleNodeOrder: Math.sqrt((capacitorVA ** 2 / pathVA + reactorVA) / capacitorVA),
  };
}

/**
 * The parallel resonance orders of the terminals (lines, and the neutral bar where its path has reactance)
 * against the shorted source: h = 1/√μ for the eigenvalues μ of B_C·v = μ·Γ·v (see the top of the file).
 * A terminal whose path has no reactance is the source itself and drops out; a private star point has no
 * path of its own and is folded into the capacitors between the terminals (Kron reduction; a reactor to such
 * a star point is left out: trivar's compensators put theirs between lines).
 */
function resonanceOrders(phases: readonly Terminal[], lineX: number, neutralX: number, capacitors: readonly LoadBranch[], reactors: readonly LoadBranch[]): number[] {
  const terminals: Terminal[] = [...(lineX > 0 ? phases : []), ...(neutralX > 0 ? ['N' as const] : [])];
  const stars = [...new Set(capacitors.flatMap((b) => [b.from, b.to]).filter((t) => t.startsWith('star:')))];
  const nodes = [...terminals, ...stars];
  const index = new Map(nodes.map((t, k) => [t, k]));
  const n = nodes.length;
  if (terminals.length === 0) return [];
  const zeros = () => Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const capacitance = zeros();
  const inverseReactance = zeros();
  // A branch between two nodes adds its susceptance to the Laplacian; a node missing is the source (voltage zero).
  const stamp = (m: number[][], b: LoadBranch, s: number) => {
    const i = index.get(b.from);
    const j = index.get(b.to);
    if (i !== undefined) m[i]![i]! += s;
    if (j !== undefined) m[j]![j]! += s;
    if (i !== undefined && j !== undefined) {
      m[i]![j]! -= s;
      m[j]![i]! -= s;
    }
  };
  for (const b of capacitors) stamp(capacitance, b, susceptanceOf(b));
  for (const b of reactors) if (!b.from.startsWith('star:') && !b.to.startsWith('star:')) stamp(inverseReactance, b, b.sNominal.im / b.vNominal ** 2);
  terminals.forEach((t, k) => (inverseReactance[k]![k]! += 1 / (t === 'N' ? neutralX : lineX)));
  // Fold the star points into the terminals: B ← B_tt − B_ts·B_ss⁻¹·B_st, one star at a time (each is its own block).
  for (let s = n - 1; s >= terminals.length; s--) {
    const pivot = capacitance[s]![s]!;
    if (!(pivot > 0)) continue;
    for (let i = 0; i < s; i++) for (let j = 0; j < s; j++) capacitance[i]![j]! -= (capacitance[i]![s]! * capacitance[s]![j]!) / pivot;
  }
  const m = terminals.length;
  const b = capacitance.slice(0, m).map((row) => row.slice(0, m));
  const g = inverseReactance.slice(0, m).map((row) => row.slice(0, m));
  // Γ = L·Lᵀ (Cholesky; Γ is positive definite: every terminal has its own path to the source), then the
  // symmetric M = L⁻¹·B_C·L⁻ᵀ has the pencil's eigenvalues.
  const l = cholesky(g);
  if (l === null) return [];
  const mu = symmetricEigenvalues(congruence(l, b));
  const largest = Math.max(0, ...mu);
  // Modes the capacitors do not reach (μ = 0, a line with none on it) have no resonance; below 1e-12 of the largest is round-off.
  return mu
    .filter((x) => x > 1e-12 * largest)
    .map((x) => 1 / Math.sqrt(x))
    .sort((x, y) => x - y);
}

/** Lower-triangular L with L·Lᵀ = a; null where a is not positive definite. */
function cholesky(a: readonly (readonly number[])[]): number[][] | null {
  const n = a.length;
  const l = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      let sum = a[i]![j]!;
      for (let k = 0; k < j; k++) sum -= l[i]![k]! * l[j]![k]!;
      if (i === j) {
        if (!(sum > 0)) return null;
        l[i]![i] = Math.sqrt(sum);
      } else l[i]![j] = sum / l[j]![j]!;
    }
  return l;
}

/** L⁻¹·b·L⁻ᵀ for lower-triangular L (forward substitution on the columns, then on the rows). */
function congruence(l: readonly (readonly number[])[], b: readonly (readonly number[])[]): number[][] {
  const n = l.length;
  const forward = (col: readonly number[]) => {
    const x = new Array<number>(n).fill(0);
    for (let i = 0; i < n; i++) {
      let sum = col[i]!;
      for (let k = 0; k < i; k++) sum -= l[i]![k]! * x[k]!;
      x[i] = sum / l[i]![i]!;
    }
    return x;
  };
  // Y = L⁻¹·b (b symmetric, so its columns are its rows), then M = L⁻¹·Yᵀ = L⁻¹·b·L⁻ᵀ.
  const y = b.map((row) => forward(row));
  const yt = y[0]!.map((_, j) => y.map((row) => row[j]!));
  const m = yt.map((row) => forward(row));
  // Symmetric up to round-off: average the halves so the rotation below sees an exactly symmetric matrix.
  return m.map((row, i) => row.map((x, j) => (x + m[j]![i]!) / 2));
}

/** Eigenvalues of a small symmetric matrix by cyclic Jacobi rotations. */
function symmetricEigenvalues(input: readonly (readonly number[])[]): number[] {
  const a = input.map((row) => [...row]);
  const n = a.length;
  for (let sweep = 0; sweep < 50; sweep++) {
    let off = 0;
    let scale = 0;
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) (i === j ? (scale += a[i]![i]! ** 2) : (off += a[i]![j]! ** 2));
    if (off <= 1e-30 * scale) break;
    for (let p = 0; p < n - 1; p++)
      for (let q = p + 1; q < n; q++) {
        const apq = a[p]![q]!;
        if (apq === 0) continue;
        // The rotation that zeroes a[p][q] (Golub and Van Loan, the symmetric Schur decomposition).
        const theta = (a[q]![q]! - a[p]![p]!) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k]![p]!;
          const akq = a[k]![q]!;
          a[k]![p] = c * akp - s * akq;
          a[k]![q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p]![k]!;
          const aqk = a[q]![k]!;
          a[p]![k] = c * apk - s * aqk;
          a[q]![k] = s * apk + c * aqk;
        }
      }
  }
  return a.map((row, i) => row[i]!);
}

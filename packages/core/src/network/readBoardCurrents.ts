/**
 * One board's line and neutral currents, read straight from a solved compiled installation:
 * what `readInstallationSolution` gives for that board, by the same operations in the same order
 * (so the same numbers, to the bit), without building every board's branch states. The
 * correction's sizing loops read these after every trial solve, and little else.
 */
import { add, mul, sub, ZERO, type ComplexValue } from '../complex.js';
import { REFERENCE } from './networkTopology.js';
import type { Installation, Terminal } from '../board/boardModel.js';
import type { InstallationCircuit } from './installationCircuit.js';

/** A solved state of a compiled installation's circuit, as the network's arrays hold it (`CompiledNetwork`), or a copy of them. */
export interface SolvedArrays {
  /** Per node, 1 when it is connected to something. */
  readonly live: ArrayLike<number>;
  readonly voltageRe: ArrayLike<number>;
  readonly voltageIm: ArrayLike<number>;
  /** Per circuit branch, the admittance it had at the solution. */
  readonly admittanceRe: ArrayLike<number>;
  readonly admittanceIm: ArrayLike<number>;
  /** Per circuit source, the current it delivers out of its plus terminal (`CompiledNetwork.sourceCurrents()`). */
  readonly sourceCurrents: readonly ComplexValue[];
}

export interface BoardCurrents {
  /** Per phase, current in the line from the source (or feeding board) to the board, A. */
  readonly lineCurrents: readonly ComplexValue[];
  /** As `NetworkSolution.neutralCurrent`: zero when the neutral is open, null on a board with no neutral. */
  readonly neutralCurrent: ComplexValue | null;
  /** The largest magnitude of a load branch current on the board, A (what the noise floor scales with). */
  readonly largestBranchCurrent: number;
}

/**
 * @param installation, layout the installation and its circuit (`CompiledInstallation`)
 * @param net the solved state
 * @param board board number (0 = main board, i + 1 = `subBoards[i]`)
 */
export function readBoardCurrents(installation: Installation, layout: InstallationCircuit, net: SolvedArrays, board: number): BoardCurrents {
  const live = (node: number) => node === REFERENCE || net.live[node] === 1;
  const re = (node: number) => (node === REFERENCE || !net.live[node] ? 0 : net.voltageRe[node]!);
  const im = (node: number) => (node === REFERENCE || !net.live[node] ? 0 : net.voltageIm[node]!);
  const loadsOf = (b: number) => (b === 0 ? installation.main.loads : installation.subBoards[b - 1]!.loads);
  // A load branch's current Y·(V_from − V_to), component by component as `mul` and `sub` form it (no object per branch).
  let branchRe = 0;
  let branchIm = 0;
  const branchCurrent = (k: number): void => {
    const cb = layout.circuit.branches[k]!;
    if (!live(cb.from) || !live(cb.to)) {
      branchRe = 0;
      branchIm = 0;
      return;
    }
    const vr = re(cb.from) - re(cb.to);
    const vi = im(cb.from) - im(cb.to);
    const yr = net.admittanceRe[k]!;
    const yi = net.admittanceIm[k]!;
    branchRe = yr * vr - yi * vi;
    branchIm = yr * vi + yi * vr;
  };
  const elementCurrent = (e: number) => {
    const el = layout.circuit.elements[e]!;
    return mul(el.admittance, { re: re(el.from) - re(el.to), im: im(el.from) - im(el.to) });
  };
  // Net current a board's own loads draw from a terminal (in load and branch order, as read there).
  const own = (b: number, terminal: Terminal): ComplexValue => {
    let totalRe = 0;
    let totalIm = 0;
    let k = layout.branchOffset[b]!;
    for (const l of loadsOf(b))
      for (const br of l.branches) {
        if (br.from === terminal || br.to === terminal) {
          branchCurrent(k);
          if (br.from === terminal) {
            totalRe = totalRe + branchRe;
            totalIm = totalIm + branchIm;
          }
          if (br.to === terminal) {
            totalRe = totalRe - branchRe;
            totalIm = totalIm - branchIm;
          }
        }
        k++;
      }
    return { re: totalRe, im: totalIm };
  };
  const phases = installation.main.phases;
  const line = (b: number, k: number): ComplexValue => {
    if (b === 0) return net.sourceCurrents[layout.mainSources[k]!]!;
    const e = layout.feederElements[b]!.lines[k];
    return e !== null && e !== undefined ? elementCurrent(e) : add(own(b, phases[k]!), layout.children[b]!.reduce((t, c) => add(t, line(c, k)), ZERO));
  };
  const neutral = (b: number): ComplexValue => {
    const open = b === 0 ? installation.main.neutralOpen : installation.subBoards[b - 1]!.feeder.neutralOpen;
    const topo = layout.topologies[b]!;
    const feeder = layout.feederElements[b];
    if (open) return ZERO;
    if (b === 0 && topo.neutralAdmittance) {
      const n = topo.neutralNode!;
      return mul(topo.neutralAdmittance, { re: re(n), im: im(n) });
    }
    if (b > 0 && feeder!.neutral !== null) return elementCurrent(feeder!.neutral);
    return sub(
      layout.children[b]!.reduce((t, c) => add(t, neutral(c)), ZERO),
      own(b, 'N'),
    );
  };
  let largest = 0;
  const first = layout.branchOffset[board]!;
  let count = 0;
  for (const l of loadsOf(board)) count += l.branches.length;
  for (let k = first; k < first + count; k++) {
    branchCurrent(k);
    largest = Math.max(largest, Math.hypot(branchRe, branchIm));
  }
  return {
    lineCurrents: phases.map((_, k) => line(board, k)),
    neutralCurrent: installation.main.hasNeutral ? neutral(board) : null,
    largestBranchCurrent: largest,
  };
}

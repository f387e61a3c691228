/**
 * An independent check of the network solver: the same circuit written as a
 * SPICE netlist and solved by ngspice's AC analysis at the board frequency.
 *
 * The netlist is built from the board's circuit elements, never from core's
 * node equations: per phase an EMF from the star point (node 0), the source
 * impedance and the feeder line as separate series R and L (or C), then a 0 V
 * source as ammeter into the phase bus; the neutral bar joined to node 0
 * through the neutral conductor and an ammeter (or left floating when the
 * neutral is open); every load branch an ammeter in series with its element,
 * written either as series R + jX or as parallel G ‖ jB, so both circuit forms
 * get exercised. Floating star points are ordinary nodes of their own.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Board, ComplexValue, NetworkSolution } from '@trivar/core';
import { c, cAbs, cInv } from './complexMath.js';

/** The ngspice on PATH, e.g. `ngspice-39`, or null when there is none. */
export function probeNgspice(): string | null {
  const run = spawnSync('ngspice', ['--version'], { encoding: 'utf8', timeout: 10_000 });
  if (run.error || run.status !== 0) return null;
  return /ngspice-\d+/.exec(run.stdout)?.[0] ?? 'ngspice (unknown version)';
}

/** One quantity core computed and ngspice must reproduce. */
export interface Probe {
  /** ngspice vector, e.g. `v(bus_a)` or `i(vib_0_1)`. */
  readonly vector: string;
  /** What it is, in words, for failure messages. */
  readonly label: string;
  readonly kind: 'voltage' | 'current';
  readonly core: ComplexValue;
}

/** How one load branch is written into the netlist. */
export interface BranchElement {
  /** `series`: R + jX from the impedance; `parallel`: G ‖ jB from the admittance. */
  readonly form: 'series' | 'parallel';
  /** The branch's impedance, ohm; when omitted, the inverse of the admittance core used. */
  readonly impedance?: ComplexValue;
}

const PHASE_NODE = { A: 'a', B: 'b', C: 'c' } as const;

/** Full double precision, in a form SPICE reads without scale suffixes. */
const num = (x: number) => x.toExponential(16);

/** Lines for R + jX between two nodes; an element smaller than 1e-13 of |Z| is left out (an exact short of it). */
export function seriesElements(name: string, from: string, to: string, z: ComplexValue, omega: number): string[] {
  const size = cAbs(z);
  const parts: [string, string][] = [];
  if (Math.abs(z.re) > 1e-13 * size) parts.push(['R', num(z.re)]);
  if (z.im > 1e-13 * size) parts.push(['L', num(z.im / omega)]);
  if (z.im < -1e-13 * size) parts.push(['C', num(-1 / (omega * z.im))]);
  if (parts.length === 0) return [`V${name}_short ${from} ${to} DC 0`];
  return parts.map(([kind, value], k) => {
    const a = k === 0 ? from : `${to}_${name}_${k}`.toLowerCase();
    const b = k === parts.length - 1 ? to : `${to}_${name}_${k + 1}`.toLowerCase();
    return `${kind}${name} ${a} ${b} ${value}`;
  });
}

/** Lines for G ‖ jB between two nodes. */
export function parallelElements(name: string, from: string, to: string, y: ComplexValue, omega: number): string[] {
  const size = cAbs(y);
  const lines: string[] = [];
  if (Math.abs(y.re) > 1e-13 * size) lines.push(`R${name} ${from} ${to} ${num(1 / y.re)}`);
  // Susceptance B < 0 is inductive (Y = 1/(jωL) = −j/(ωL)), B > 0 capacitive (jωC).
  if (y.im < -1e-13 * size) lines.push(`L${name} ${from} ${to} ${num(-1 / (omega * y.im))}`);
  if (y.im > 1e-13 * size) lines.push(`C${name} ${from} ${to} ${num(y.im / omega)}`);
  return lines;
}

const isZero = (z: ComplexValue) => z.re === 0 && z.im === 0;

/**
 * One phase's supply path: the EMF at node s_<p>, the source and feeder impedances in series (the
 * phase's own where they differ per phase), and an ammeter VI_<p> into bus_<p> (i(VI) flows from
 * the source side into the board).
 */
export function supplyPath(board: Board, p: string, emf: ComplexValue, omega: number): string[] {
  const k = board.phases.findIndex((phase) => phase.toLowerCase() === p);
  const source = board.sourceImpedances?.[k] ?? board.sourceImpedance;
  const line = board.lineImpedances?.[k] ?? board.lineImpedance;
  const lines = [`VE_${p} s_${p} 0 DC 0 AC ${num(cAbs(emf))} ${num((Math.atan2(emf.im, emf.re) * 180) / Math.PI)}`];
  let at = `s_${p}`;
  if (!isZero(source)) {
    lines.push(...seriesElements(`S_${p}`, at, `t_${p}`, source, omega));
    at = `t_${p}`;
  }
  if (!isZero(line)) {
    lines.push(...seriesElements(`F_${p}`, at, `f_${p}`, line, omega));
    at = `f_${p}`;
  }
  lines.push(`VI_${p} ${at} bus_${p} DC 0`);
  return lines;
}

/**
 * The netlist of a solved board and the probes to compare. `element(l, b)`
 * says how to write branch b of load l.
 */
export function buildNetlist(
  board: Board,
  solution: NetworkSolution,
  element: (load: number, branch: number) => BranchElement,
): { netlist: string; probes: Probe[] } {
  const omega = 2 * Math.PI * board.frequencyHz;
  const lines = [`* ${board.name}: ${board.system}, ${board.frequencyHz} Hz`];
  const probes: Probe[] = [];
  const nodeOf = (t: string): string => (t === 'N' ? 'nbar' : t.startsWith('star:') ? `star_${t.slice(5)}` : `bus_${PHASE_NODE[t as 'A']}`);
  board.phases.forEach((phase, k) => {
    const p = PHASE_NODE[phase];
    const e = board.emf[k]!;
    lines.push(...supplyPath(board, p, e, omega));
    probes.push({ vector: `i(vi_${p})`, label: `line ${phase} current`, kind: 'current', core: solution.lineCurrents[k]! });
    probes.push({ vector: `v(bus_${p})`, label: `phase ${phase} bus voltage`, kind: 'voltage', core: voltageAt(solution, phase) });
    const sourceNode = solution.topology.sourceNode[k]!;
    if (sourceNode !== solution.topology.busNode[k])
      probes.push({ vector: `v(s_${p})`, label: `phase ${phase} source terminal voltage`, kind: 'voltage', core: solution.nodeVoltages[sourceNode]! });
  });
  if (board.hasNeutral) {
    const bar = solution.topology.neutralNode;
    const live = bar === undefined || bar < 0 || solution.nodeVoltages[bar] !== null;
    if (!board.neutralOpen) {
      let at = 'nbar';
      if (!isZero(board.neutralImpedance)) {
        lines.push(...seriesElements('N', at, 'nret', board.neutralImpedance, omega));
        at = 'nret';
      }
      lines.push(`VI_N ${at} 0 DC 0`);
      probes.push({ vector: 'i(vi_n)', label: 'neutral current', kind: 'current', core: solution.neutralCurrent! });
    }
    if (live) probes.push({ vector: 'v(nbar)', label: 'neutral bar voltage', kind: 'voltage', core: voltageAt(solution, 'N') });
  }
  const stars = new Set<string>();
  board.loads.forEach((load, li) =>
    load.branches.forEach((b, bi) => {
      const state = solution.branches[li]![bi]!;
      if (!state.energised) return;
      const name = `B_${li}_${bi}`;
      const from = nodeOf(b.from);
      const to = nodeOf(b.to);
      const mid = `m_${li}_${bi}`;
      lines.push(`VI${name} ${from} ${mid} DC 0`);
      const el = element(li, bi);
      const z = el.impedance ?? cInv(state.admittance);
      lines.push(...(el.form === 'series' ? seriesElements(name, mid, to, z, omega) : parallelElements(name, mid, to, cInv(z), omega)));
      probes.push({ vector: `i(vi${name.toLowerCase()})`, label: `load ${load.name} branch ${b.from}→${b.to} current`, kind: 'current', core: state.current });
      for (const t of [b.from, b.to]) if (t.startsWith('star:')) stars.add(t);
    }),
  );
  for (const t of stars) probes.push({ vector: `v(${nodeOf(t)})`, label: `star point of load ${t.slice(5)}`, kind: 'voltage', core: voltageAt(solution, t) });
  return { netlist: lines.join('\n'), probes };
}

function voltageAt(solution: NetworkSolution, terminal: string): ComplexValue {
  const node = solution.topology.terminalNode.get(terminal as never);
  if (node === undefined) throw new Error(`no node for ${terminal}`);
  if (node < 0) return c(0);
  const v = solution.nodeVoltages[node];
  if (!v) throw new Error(`${terminal} has no voltage`);
  return v;
}

/** Vectors per `wrdata` line, to keep every control line short. */
const VECTORS_PER_FILE = 16;

/**
 * Runs `ngspice -b` on the netlist with one AC point at `frequencyHz` and
 * returns each requested vector as a complex value.
 */
export function runAc(netlist: string, frequencyHz: number, vectors: readonly string[], dir: string, tag: string): Map<string, ComplexValue> {
  const chunks: string[][] = [];
  for (let k = 0; k < vectors.length; k += VECTORS_PER_FILE) chunks.push(vectors.slice(k, k + VECTORS_PER_FILE));
  const files = chunks.map((_, k) => join(dir, `${tag}-${k}.txt`));
  const deck = [
    netlist,
    // No DC operating point: the circuit is linear, and a node reached only
    // through capacitors has no DC path, which an operating point would reject.
    '.option noopac',
    `.ac lin 1 ${num(frequencyHz)} ${num(frequencyHz)}`,
    '.control',
    'set numdgt=17',
    'set wr_vecnames',
    'set wr_singlescale',
    'run',
    ...chunks.map((chunk, k) => `wrdata ${files[k]} ${chunk.join(' ')}`),
    // Without an explicit quit, batch mode exits 1 for a deck with no .print lines.
    'quit 0',
    '.endc',
    '.end',
    '',
  ].join('\n');
  const deckFile = join(dir, `${tag}.cir`);
  writeFileSync(deckFile, deck);
  const run = spawnSync('ngspice', ['-b', deckFile], { cwd: dir, encoding: 'utf8', timeout: 20_000 });
  const log = () => `${run.stdout ?? ''}\n${run.stderr ?? ''}`.slice(-2000);
  if (run.error || run.status !== 0) throw new Error(`ngspice failed on ${deckFile} (status ${run.status}): ${run.error?.message ?? log()}`);
  // Problems inside the control block (a singular matrix, a bad element) still end in `quit 0`.
  const complaint = /^.*\b(error|singular|warning)\b.*$/im.exec(`${run.stdout}\n${run.stderr}`);
  if (complaint) throw new Error(`ngspice complained about ${deckFile}: ${complaint[0]}`);
  const values = new Map<string, ComplexValue>();
  chunks.forEach((chunk, k) => {
    let text: string;
    try {
      text = readFileSync(files[k]!, 'utf8');
    } catch {
      throw new Error(`ngspice wrote no ${files[k]}: ${log()}`);
    }
    // Header line, then one data row: frequency, then re im for each vector in order.
    const row = text.trim().split('\n')[1]?.trim().split(/\s+/).map(Number) ?? [];
    if (row.length !== 1 + 2 * chunk.length || row.some((x) => !Number.isFinite(x)))
      throw new Error(`unexpected ngspice output in ${files[k]}: ${text.slice(0, 500)}`);
    if (Math.abs(row[0]! - frequencyHz) > 1e-9 * frequencyHz) throw new Error(`ngspice solved at ${row[0]} Hz, not ${frequencyHz} Hz`);
    chunk.forEach((vector, j) => values.set(vector, c(row[1 + 2 * j]!, row[2 + 2 * j]!)));
  });
  return values;
}

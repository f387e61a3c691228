/**
 * SPICE netlists for the harmonic study, built from the circuit elements — not
 * from core's per-order admittances — so ngspice scales every reactance with
 * frequency itself:
 * - source, feeder and neutral conductors as series R and L (C) at the board frequency;
 * - each linear load branch from its solved fundamental admittance as physical
 *   R, L, C in the form the study uses (series R + jX or parallel R ‖ jX);
 * - a detuned capacitor branch as its series L and C (L = p·X_C/ω);
 * - non-linear load branches as AC current sources of order h (or left out:
 *   an ideal current source is an open circuit to the scan);
 * - EMFs as AC sources (the background of order h, or 0 for the scan).
 */
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Board, ComplexValue, HarmonicModel, NetworkSolution } from '@trivar/core';
import { c, cAbs, cInv } from './complexMath.js';
import { parallelElements, seriesElements, supplyPath } from './ngspice.js';

const num = (x: number) => x.toExponential(16);
const PHASE_NODE = { A: 'a', B: 'b', C: 'c' } as const;
export const nodeOf = (t: string): string => (t === 'N' ? 'nbar' : t.startsWith('star:') ? `star_${t.slice(5)}` : `bus_${PHASE_NODE[t as 'A']}`);
const isZero = (z: ComplexValue) => z.re === 0 && z.im === 0;
const deg = (z: ComplexValue) => (Math.atan2(z.im, z.re) * 180) / Math.PI;

export interface HarmonicNetlistOptions {
  /** Per phase EMF (AC magnitude/phase); zeros short the sources. */
  readonly emf: readonly ComplexValue[];
  /** Per load, per branch: current source of this order (from → to), or null. */
  readonly sources?: readonly (readonly (ComplexValue | null)[])[];
  /** A 1 A AC drive into node `p`, drawn from node `q`. */
  readonly drive?: readonly [string, string];
  /** Loads left out (bank steps that are off). */
  readonly omitLoads?: ReadonlySet<number>;
}

export function harmonicNetlist(fundamental: NetworkSolution, model: HarmonicModel, options: HarmonicNetlistOptions): string {
  const board: Board = fundamental.board;
  const omega = 2 * Math.PI * board.frequencyHz;
  const lines = [`* ${board.name} at order h (elements at ${board.frequencyHz} Hz)`];
  board.phases.forEach((phase, k) => {
    const p = PHASE_NODE[phase];
    const e = options.emf[k]!;
    lines.push(...supplyPath(board, p, e, omega));
  });
  if (board.hasNeutral && !board.neutralOpen) {
    let at = 'nbar';
    if (!isZero(board.neutralImpedance)) {
      lines.push(...seriesElements('N', at, 'nret', board.neutralImpedance, omega));
      at = 'nret';
    }
    lines.push(`VI_N ${at} 0 DC 0`);
  }
  board.loads.forEach((load, l) => {
    if (options.omitLoads?.has(l)) return;
    const behaviour = model.loads[l]!;
    load.branches.forEach((b, k) => {
      const state = fundamental.branches[l]![k]!;
      if (!state.energised) return;
      const name = `B_${l}_${k}`;
      const from = nodeOf(b.from);
      const to = nodeOf(b.to);
      if (behaviour.kind === 'non-linear') {
        const j = options.sources?.[l]?.[k];
        if (j) lines.push(`I${name} ${from} ${to} AC ${num(cAbs(j))} ${num(deg(j))}`);
        return;
      }
      const y = state.admittance;
      if (cAbs(y) === 0) return;
      if (behaviour.kind === 'detuned') {
        const bC = y.im * (1 - behaviour.p);
        lines.push(`L${name} ${from} mid_${name} ${num(behaviour.p / (bC * omega))}`, `C${name} mid_${name} ${to} ${num(bC / omega)}`);
        return;
      }
      lines.push(...(behaviour.form === 'series' ? seriesElements(name, from, to, cInv(y), omega) : parallelElements(name, from, to, y, omega)));
    });
  });
  if (options.drive) lines.push(`IDRIVE ${options.drive[1]} ${options.drive[0]} AC 1 0`);
  return lines.join('\n');
}

/**
 * Runs an AC sweep of `points` frequencies, linear from `startHz` to `stopHz`,
 * and returns each vector at each frequency, with the frequencies ngspice used.
 */
export function runAcSweep(
  netlist: string,
  sweep: { readonly startHz: number; readonly stopHz: number; readonly points: number },
  vectors: readonly string[],
  dir: string,
  tag: string,
): { frequencies: number[]; values: Map<string, ComplexValue[]> } {
  const file = join(dir, `${tag}.txt`);
  const deck = [
    netlist,
    '.option noopac',
    `.ac lin ${sweep.points} ${num(sweep.startHz)} ${num(sweep.stopHz)}`,
    '.control',
    'set numdgt=17',
    'set wr_vecnames',
    'set wr_singlescale',
    'run',
    `wrdata ${file} ${vectors.join(' ')}`,
    'quit 0',
    '.endc',
    '.end',
    '',
  ].join('\n');
  const deckFile = join(dir, `${tag}.cir`);
  writeFileSync(deckFile, deck);
  const run = spawnSync('ngspice', ['-b', deckFile], { cwd: dir, encoding: 'utf8', timeout: 60_000 });
  if (run.error || run.status !== 0) throw new Error(`ngspice failed on ${deckFile}: ${run.error?.message ?? run.stderr}`);
  const complaint = /^.*\b(error|singular|warning)\b.*$/im.exec(`${run.stdout}\n${run.stderr}`);
  if (complaint) throw new Error(`ngspice complained about ${deckFile}: ${complaint[0]}`);
  const rows = readFileSync(file, 'utf8').trim().split('\n').slice(1).map((r) => r.trim().split(/\s+/).map(Number));
  const values = new Map<string, ComplexValue[]>(vectors.map((v) => [v, []]));
  const frequencies: number[] = [];
  for (const row of rows) {
    if (row.length !== 1 + 2 * vectors.length || row.some((x) => !Number.isFinite(x))) throw new Error(`unexpected ngspice row in ${file}: ${row.join(' ')}`);
    frequencies.push(row[0]!);
    vectors.forEach((v, j) => values.get(v)!.push(c(row[1 + 2 * j]!, row[2 + 2 * j]!)));
  }
  return { frequencies, values };
}

/**
 * An installation written as a SPICE netlist from its physical parts, never from
 * core's node equations: per phase an EMF (from the source star point, or for an
 * open delta from the earthed corner), the source winding and the service feeder
 * as separate series elements; a zero-sequence impedance as the star point's
 * return to the earthed neutral terminal (node 0); every sub-board feeder
 * conductor, phase by phase and the neutral, as its own series element and
 * ammeter — a conductor of zero impedance is an ammeter alone, so boards core
 * merges into one node stay separate nodes here; every load branch an ammeter and
 * its element (alternately series R + jX and parallel G ‖ jB).
 *
 * At a harmonic order (`harmonic`), the same parts at the supply frequency, so ngspice scales
 * every reactance itself when run at h·f: the EMFs of order h; each linear load branch from its
 * solved fundamental admittance in the form the study uses (series or parallel R, L, C); a
 * detuned step as its series L and C; a non-linear load branch as an AC current source of
 * |I1|·(percent/100) at h·∠I1 + the spectrum angle, worked out here from the fundamental.
 */
import type { ComplexValue, HarmonicModel, Installation, InstallationSolution } from '@trivar/core';
import { cAbs, cInv, cSub } from './complexMath.js';
import { seriesElements, parallelElements, type Probe } from './ngspice.js';

const num = (x: number) => x.toExponential(16);
const isZero = (z: ComplexValue) => z.re === 0 && z.im === 0;
const lower = (p: string) => p.toLowerCase();

/** What a netlist at harmonic order h needs besides the installation: the order, its EMFs, the fundamental and the models. */
export interface HarmonicOrderParts {
  readonly order: number;
  /** Per phase, the supply EMF of order h (the background distortion, or zero). */
  readonly emf: readonly ComplexValue[];
  readonly fundamental: InstallationSolution;
  readonly models: readonly HarmonicModel[];
}

const polar = (m: number, a: number): ComplexValue => ({ re: m * Math.cos(a), im: m * Math.sin(a) });

/**
 * @param solution the solution whose figures the probes carry (at order h when `harmonic` is given)
 */
export function buildInstallationNetlist(installation: Installation, solution: InstallationSolution, harmonic?: HarmonicOrderParts): { netlist: string; probes: Probe[] } {
  const main = installation.main;
  const omega = 2 * Math.PI * main.frequencyHz;
  const lines = [`* ${installation.name}: ${installation.subBoards.length + 1} boards`];
  const probes: Probe[] = [];
  const bus = (b: number, p: string) => `b${b}_${lower(p)}`;
  const bar = (b: number) => `b${b}_n`;
  const series = (name: string, from: string, to: string, z: ComplexValue) => (isZero(z) ? [`V${name} ${from} ${to} DC 0`] : seriesElements(name, from, to, z, omega));
  const voltage = (b: number, node: number | undefined): ComplexValue => {
    if (node === undefined || node < 0) return { re: 0, im: 0 };
    return solution.boards[b]!.nodeVoltages[node]!;
  };
  // Source and service feeder.
  const corner = main.openDeltaCorner ? main.phases.indexOf(main.openDeltaCorner) : -1;
  let star = '0';
  if (main.sourceStarImpedance && !isZero(main.sourceStarImpedance) && corner < 0) {
    star = 'sp';
    lines.push(...seriesElements('ZSTAR', star, '0', main.sourceStarImpedance, omega));
  }
  main.phases.forEach((phase, k) => {
    const p = lower(phase);
    let at: string;
    if (k === corner) at = '0';
    else {
      const emf = harmonic?.emf ?? main.emf;
      const e = corner >= 0 ? cSub(emf[k]!, emf[corner]!) : emf[k]!;
      lines.push(`VE_${p} s_${p} ${star} DC 0 AC ${num(cAbs(e))} ${num((Math.atan2(e.im, e.re) * 180) / Math.PI)}`);
      const winding = main.sourceImpedances?.[k] ?? main.sourceImpedance;
      lines.push(...series(`W_${p}`, `s_${p}`, `t_${p}`, winding));
      at = `t_${p}`;
    }
    lines.push(...series(`F0_${p}`, at, `f0_${p}`, main.lineImpedances?.[k] ?? main.lineImpedance));
    lines.push(`VI0_${p} f0_${p} ${bus(0, phase)} DC 0`);
    probes.push({ vector: `i(vi0_${p})`, label: `service line ${phase} current`, kind: 'current', core: solution.boards[0]!.lineCurrents[k]! });
  });
  if (main.hasNeutral && !main.neutralOpen) {
    lines.push(`VI0_N ${bar(0)} r0_n DC 0`, ...series('F0_N', 'r0_n', '0', main.neutralImpedance));
    probes.push({ vector: 'i(vi0_n)', label: 'service neutral current', kind: 'current', core: solution.boards[0]!.neutralCurrent! });
  }
  // Sub-board feeders, conductor by conductor.
  installation.subBoards.forEach((sb, i) => {
    const b = i + 1;
    const s = solution.boards[b]!;
    main.phases.forEach((phase, k) => {
      const p = lower(phase);
      lines.push(...series(`F${b}_${p}`, bus(sb.fedFrom, phase), `e${b}_${p}`, sb.feeder.lineImpedances[k]!));
      lines.push(`VI${b}_${p} e${b}_${p} ${bus(b, phase)} DC 0`);
      probes.push({ vector: `i(vi${b}_${p})`, label: `${sb.name} feeder line ${phase} current`, kind: 'current', core: s.lineCurrents[k]! });
    });
    if (main.hasNeutral && !sb.feeder.neutralOpen) {
      lines.push(`VI${b}_N ${bar(b)} r${b}_n DC 0`, ...series(`F${b}_N`, `r${b}_n`, bar(sb.fedFrom), sb.feeder.neutralImpedance));
      probes.push({ vector: `i(vi${b}_n)`, label: `${sb.name} feeder neutral current`, kind: 'current', core: s.neutralCurrent! });
    }
  });
  // Loads.
  const stars = new Set<string>();
  solution.boards.forEach((s, b) => {
    const topo = s.topology;
    s.board.phases.forEach((phase) => probes.push({ vector: `v(${bus(b, phase)})`, label: `${s.board.name} phase ${phase} voltage`, kind: 'voltage', core: voltage(b, topo.terminalNode.get(phase)) }));
    const nodeOf = (t: string) => (t === 'N' ? bar(b) : t.startsWith('star:') ? `b${b}_s${t.slice(5)}` : bus(b, t));
    let barUsed = false;
    s.board.loads.forEach((load, li) =>
      load.branches.forEach((br, bi) => {
        const state = s.branches[li]![bi]!;
        if (!state.energised) return;
        const name = `L${b}_${li}_${bi}`;
        const mid = `m${b}_${li}_${bi}`;
        lines.push(`VI${name} ${nodeOf(br.from)} ${mid} DC 0`);
        probes.push({ vector: `i(vi${name.toLowerCase()})`, label: `${s.board.name} load ${load.name} ${br.from}→${br.to} current`, kind: 'current', core: state.current });
        for (const t of [br.from, br.to]) {
          if (t.startsWith('star:') && !stars.has(`${b}:${t}`)) {
            stars.add(`${b}:${t}`);
            probes.push({ vector: `v(${nodeOf(t)})`, label: `${s.board.name} star point ${t}`, kind: 'voltage', core: voltage(b, topo.terminalNode.get(t as never)) });
          }
          if (t === 'N') barUsed = true;
        }
        if (harmonic) {
          lines.push(...harmonicBranch(harmonic, b, li, bi, name, mid, nodeOf(br.to), omega));
          return;
        }
        // A branch of zero admittance (an empty branch of a compensator) is an open circuit: a resistor far
        // above any impedance in the netlist keeps its ammeter's node from floating (current ~1e-16 A).
        const open = state.admittance.re === 0 && state.admittance.im === 0;
        const z = cInv(state.admittance);
        if (open) lines.push(`R${name} ${mid} ${nodeOf(br.to)} 1e18`);
        else lines.push(...((li + bi) % 2 === 0 ? seriesElements(name, mid, nodeOf(br.to), z, omega) : parallelElements(name, mid, nodeOf(br.to), state.admittance, omega)));
      }),
    );
    const feedsNeutral = main.hasNeutral && (b === 0 ? !main.neutralOpen : !installation.subBoards[b - 1]!.feeder.neutralOpen);
    if (main.hasNeutral && (barUsed || feedsNeutral)) probes.push({ vector: `v(${bar(b)})`, label: `${s.board.name} neutral bar voltage`, kind: 'voltage', core: voltage(b, topo.neutralNode) });
  });
  return { netlist: lines.join('\n'), probes };
}

/** One load branch at order h from its fundamental state: a current source, a detuned L–C, or linear R, L, C in the study's form. */
function harmonicBranch(parts: HarmonicOrderParts, b: number, l: number, k: number, name: string, from: string, to: string, omega: number): string[] {
  const state = parts.fundamental.boards[b]!.branches[l]![k]!;
  const behaviour = parts.models[b]!.loads[l]!;
  const y = state.admittance;
  if (behaviour.kind === 'non-linear') {
    const content = behaviour.spectrum.find((o) => o.order === parts.order);
    if (!content) return [`R${name} ${from} ${to} 1e18`];
    const i1 = state.current;
    const j = polar(cAbs(i1) * content.fraction, parts.order * Math.atan2(i1.im, i1.re) + content.angleRad);
    // A resistor far above any impedance here keeps the ammeter's node from floating.
    return [`I${name} ${from} ${to} AC ${num(cAbs(j))} ${num((Math.atan2(j.im, j.re) * 180) / Math.PI)}`, `R${name} ${from} ${to} 1e18`];
  }
  if (y.re === 0 && y.im === 0) return [`R${name} ${from} ${to} 1e18`];
  if (behaviour.kind === 'detuned') {
    const bC = y.im * (1 - behaviour.p);
    return [`LD${name} ${from} d${name} ${num(behaviour.p / (bC * omega))}`, `CD${name} d${name} ${to} ${num(bC / omega)}`];
  }
  return behaviour.form === 'series' ? seriesElements(name, from, to, cInv(y), omega) : parallelElements(name, from, to, y, omega);
}

/** Installations with their loads scaled and capacitors added, as the general solver's input in profile tests. */
import type { BoardLoad, Installation } from '@trivar/core';

/** Every load's rating scaled by `scaleOf(k)`, k counting loads board by board (main first), as the profile's plan flattens them. */
export function scaleLoads(installation: Installation, scaleOf: (k: number) => number): Installation {
  let k = 0;
  const scaled = (loads: readonly BoardLoad[]) =>
    loads.map((load) => {
      const x = scaleOf(k++);
      return { ...load, branches: load.branches.map((b) => ({ ...b, sNominal: { re: b.sNominal.re * x, im: b.sNominal.im * x } })) };
    });
  return { ...installation, main: { ...installation.main, loads: scaled(installation.main.loads) }, subBoards: installation.subBoards.map((sb) => ({ ...sb, loads: scaled(sb.loads) })) };
}

/** `kvar` of capacitors at nominal voltage, star to the neutral, constant impedance: a simulated bank's three-phase step. */
export function starBank(installation: Installation, kvar: number): BoardLoad {
  const v = installation.main.nominalLineToNeutralV;
  return {
    name: 'bank',
    connection: 'ABC-star',
    model: 'constant-impedance',
    origin: 'added',
    branches: installation.main.phases.map((p) => ({ from: p, to: 'N' as const, sNominal: { re: 0, im: (-kvar * 1000) / 3 }, vNominal: v, zip: { z: 1, i: 0, p: 0 } })),
  };
}

/** The installation with `load` added to board `board` (0 = main, i + 1 = subBoards[i]). */
export function withLoadOn(installation: Installation, board: number, load: BoardLoad): Installation {
  if (board === 0) return { ...installation, main: { ...installation.main, loads: [...installation.main.loads, load] } };
  return { ...installation, subBoards: installation.subBoards.map((sb, j) => (j + 1 === board ? { ...sb, loads: [...sb.loads, load] } : sb)) };
}

/**
 * A generated installation for the solver benchmark: a radial tree of boards (each fed from a
 * random earlier board), cable feeders from the library, and loads of every connection and
 * model, floating stars included. Deterministic for a seed (mulberry32), so every run and
 * every machine times the same network. Invented data, no real site.
 */
import type { InstallationSpec } from '../packages/core/src/index.js';
// The same mulberry32 generator the rebalance search uses, so there is one copy of it.
import { seededRandom as random } from '../packages/core/src/rebalance/seededRandom.js';


export function generatedInstallation(seed: number, boards: number, loads: number): InstallationSpec {
  const r = random(seed);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(r() * xs.length)]!;
  const round = (x: number, step: number) => Math.round(x / step) * step;
  const singles = ['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A'] as const;
  const models = ['constant-power', 'constant-power', 'constant-impedance', 'constant-current'] as const;
  const perBoard = Math.floor(loads / boards);
  return {
    name: `generated installation ${seed}`,
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 1000, impedancePercent: 5, xOverR: 5 } },
    boards: Array.from({ length: boards }, (_, b) => ({
      name: `board ${b}`,
      ...(b === 0 ? {} : { fedFrom: `board ${Math.floor(r() * b)}` }),
      feeder:
        b === 0
          ? { lengthM: 20, line: { mm2: 300 }, neutral: { mm2: 300 } }
          : { lengthM: round(5 + r() * 55, 0.5), line: { mm2: pick([70, 95, 120, 150] as const) }, neutral: { mm2: pick([35, 50, 70, 95] as const) } },
      loads: Array.from({ length: b === boards - 1 ? loads - perBoard * (boards - 1) : perBoard }, (_, k) => {
        const name = `b${b} circuit ${k}`;
        const kind = r();
        if (kind < 0.05) return { name, connection: 'ABC-star' as const, starPoint: 'floating' as const, ohms: { r: round(300 + r() * 500, 1), x: round(50 + r() * 150, 1) } };
        if (kind < 0.15) return { name, connection: 'ABC-delta' as const, kW: round(0.4 + r() * 2, 0.1), pf: round(0.78 + r() * 0.12, 0.01), model: pick(models) };
        return { name, connection: pick(singles), kW: round(0.04 + r() * 0.3, 0.01), pf: round(0.85 + r() * 0.15, 0.01), model: pick(models) };
      }),
    })),
  };
}

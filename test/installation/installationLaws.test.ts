/**
 * Laws on random installations (trees of 2–20 boards, unequal conductors and
 * sources; see arbitraries/installationSpec.ts):
 * - KCL at every board: each feeder conductor carries the board's own load
 *   currents plus what its feeder conductors pass on; ΣI_line = I_N per board.
 * - Power balance at every board: what its feeder takes = its loads + its
 *   feeder's losses + what the boards it feeds take; for the installation,
 *   source = all loads + all losses.
 * - Collapse: with zero-impedance feeders, the tree is one board — the same
 *   currents as the single board holding every load.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  normaliseInstallation,
  parseInstallation,
  solveBoard,
  solveInstallation,
  solveInstallationNetwork,
  type ComplexValue,
  type InstallationSpec,
  type LoadSpec,
} from '@trivar/core';
import { installationSpecArb } from '../property/arbitraries/installationSpec.js';
import { C0, c, cAbs, cAdd, cSub } from '../support/complexMath.js';
import { expectComplexClose } from '../support/tolerance.js';

const REL = 1e-9;
const strip = ({ shape: _s, ...file }: InstallationSpec & { shape: string }): InstallationSpec => file;
const kilo = (kW: number, kvar: number) => c(kW * 1000, kvar * 1000);

describe('installation laws', () => {
  it('KCL at every board, conductor by conductor', () => {
    fc.assert(
      fc.property(installationSpecArb(), (spec) => {
        const { installation } = normaliseInstallation(parseInstallation(strip(spec)));
        const solution = solveInstallationNetwork(installation);
        const scale = Math.max(1, ...solution.boards.flatMap((s) => s.lineCurrents.map(cAbs)));
        const tol = { rel: REL, abs: REL * scale };
        solution.boards.forEach((s, b) => {
          const children = installation.subBoards.flatMap((sb, i) => (sb.fedFrom === b ? [i + 1] : []));
          const out = (t: string) =>
            s.board.loads.reduce(
              (sum, l, li) => l.branches.reduce((acc, br, bi) => (br.from === t ? cAdd(acc, s.branches[li]![bi]!.current) : br.to === t ? cSub(acc, s.branches[li]![bi]!.current) : acc), sum),
              C0 as ComplexValue,
            );
          s.board.phases.forEach((p, k) => {
            const passed = children.reduce((sum, ch) => cAdd(sum, solution.boards[ch]!.lineCurrents[k]!), C0 as ComplexValue);
            expectComplexClose(s.lineCurrents[k]!, cAdd(out(p), passed), tol, `${s.board.name} line ${p}`);
          });
          const lineSum = s.lineCurrents.reduce(cAdd, C0);
          if (s.neutralCurrent) {
            const passed = children.reduce((sum, ch) => cAdd(sum, solution.boards[ch]!.neutralCurrent!), C0 as ComplexValue);
            expectComplexClose(s.neutralCurrent, cSub(passed, out('N')), tol, `${s.board.name} neutral`);
            expectComplexClose(lineSum, s.neutralCurrent, tol, `${s.board.name} ΣI_line = I_N`);
          } else expectComplexClose(lineSum, C0, tol, `${s.board.name} ΣI_line = 0`);
        });
      }),
      { numRuns: 40 },
    );
  });

  it('power balance at every board and for the installation', () => {
    fc.assert(
      fc.property(installationSpecArb(), (spec) => {
        const result = solveInstallation(strip(spec));
        const scale = 1000 * Math.max(1, result.totals.loadKW, Math.abs(result.totals.loadKvar));
        const tol = { rel: REL, abs: REL * scale };
        for (const board of result.boards) {
          const r = board.result;
          const passedOn = result.boards.filter((b) => b.fedFrom === board.name).reduce((t, b) => cAdd(t, kilo(b.result.source.kW, b.result.source.kvar)), C0 as ComplexValue);
          const expected = cAdd(cAdd(kilo(r.totals.kW, r.totals.kvar), kilo(r.losses.totalKW, r.losses.totalKvar)), passedOn);
          expectComplexClose(kilo(r.source.kW, r.source.kvar), expected, tol, `${board.name}: supplied = loads + losses + passed on`);
        }
        const t = result.totals;
        expect(Math.abs(t.sourceKW - t.loadKW - t.lossesKW) * 1000).toBeLessThanOrEqual(REL * scale);
        // Feeder losses are the boards' own loss figures.
        result.feeders.forEach((f, k) => expect(f.lossesKW).toBe(result.boards[k]!.result.losses.totalKW));
      }),
      { numRuns: 40 },
    );
  });

  it('a tree whose feeders have no impedance is the single board that holds every load', () => {
    fc.assert(
      fc.property(installationSpecArb({ maxBoards: 8 }), (spec) => {
        const file = strip(spec);
        const merged: InstallationSpec = {
          ...file,
          boards: file.boards.map((b, i) => (i === 0 ? b : { name: b.name, ...(b.fedFrom ? { fedFrom: b.fedFrom } : {}), loads: b.loads })),
        };
        const loads: LoadSpec[] = merged.boards.flatMap((b) => b.loads);
        if (loads.length === 0) return;
        const tree = solveInstallation(merged);
        const single = solveBoard({ supply: file.supply, ...(file.boards[0]!.feeder ? { feeder: file.boards[0]!.feeder } : {}), loads });
        const main = tree.boards[0]!.result;
        const scale = Math.max(1, ...single.phases.map((p) => p.current.magnitude));
        const tol = { rel: 1e-9, abs: 1e-9 * scale };
        single.phases.forEach((p, k) => expectComplexClose(main.phases[k]!.current, p.current, tol, `line ${p.phase}`));
        if (single.neutral) expectComplexClose(main.neutral!.current, single.neutral.current, tol, 'neutral');
        const treeLoads = tree.boards.flatMap((b) => b.result.loads);
        for (const l of single.loads) {
          const same = treeLoads.find((t) => t.name === l.name)!;
          l.branches.forEach((br, k) => expectComplexClose(same.branches[k]!.current, br.current, tol, `${l.name} branch ${k}`));
        }
        expect(cAbs(cSub(kilo(tree.totals.sourceKW, tree.totals.sourceKvar), kilo(single.source.kW, single.source.kvar)))).toBeLessThanOrEqual(1e-9 * 1000 * Math.max(1, single.totals.kVA));
      }),
      { numRuns: 30 },
    );
  });
});

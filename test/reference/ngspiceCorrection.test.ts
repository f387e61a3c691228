/**
 * Corrected boards against an independent solver: the board with the
 * recommended bank or compensator in place (CorrectionReport.verification.board)
 * written as a SPICE netlist and solved by ngspice's AC analysis. trivar's
 * reported corrected line and neutral currents must match to 1e-6 relative.
 * Skipped without ngspice unless CI=true (then a missing ngspice fails).
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoardText, solveNetwork, type Board } from '@trivar/core';
import { c, cAbs, cSub } from '../support/complexMath.js';
import { FigureLog } from '../support/figureLog.js';
import { buildNetlist, probeNgspice, runAc } from '../support/ngspice.js';

const REL = 1e-6;
const ngspice = probeNgspice();
const mustRun = process.env.CI === 'true';
const figures = new FigureLog(new URL('./.ngspice-correction-agreement.json', import.meta.url));

const boardOf = (file: string): Board => normaliseBoard(parseBoardText(readFileSync(new URL(`../../examples/${file}`, import.meta.url), 'utf8')));

const CASES: readonly { file: string; study: Record<string, unknown> }[] = [
  { file: 'riverside-cold-store.yaml', study: { arrangement: 'delta-bank', target: { pf: 0.95 } } },
  { file: 'riverside-cold-store.yaml', study: { arrangement: 'star-bank', target: { pf: 0.97 } } },
  { file: 'riverside-cold-store.yaml', study: { arrangement: 'star-bank', starPoint: 'floating', target: { pf: 0.95 } } },
  { file: 'riverside-cold-store.yaml', study: { arrangement: 'balancing-compensator', target: { pf: 0.95 } } },
  { file: 'hillside-workshop.yaml', study: { arrangement: 'delta-bank', target: { pf: 0.9, definition: 'effective' } } },
  { file: 'corner-bakery.yaml', study: { arrangement: 'balancing-compensator' } },
  // Reactors re-sized beside the capacitors as built (see refitReactors.ts).
  { file: 'hillside-workshop.yaml', study: { arrangement: 'balancing-compensator' } },
];

describe.skipIf(!ngspice && !mustRun)(`corrected boards agree with ngspice (${ngspice ?? 'not installed: skipped'})`, () => {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-spice-corr-'));
  afterAll(() => {
    rmSync(dir, { recursive: true, force: true });
    figures.describe('reference', `${ngspice ?? 'none'}, AC analysis of the corrected board`);
    if (ngspice) figures.write();
  });

  it('ngspice is installed (required on CI)', () => expect(ngspice).not.toBeNull());

  CASES.forEach(({ file, study }, k) => {
    it.skipIf(!ngspice)(`${file}: ${String(study.arrangement)} ${JSON.stringify(study.target ?? {})}`, () => {
      const report = correctBoard(boardOf(file), study);
      const corrected = report.verification.board;
      expect(corrected.loads.some((l) => l.origin === 'added') || report.status === 'already-meets-target').toBe(true);
      const solution = solveNetwork(corrected);
      // Alternate the two circuit forms; a branch with zero admittance can only be written as an open (parallel) one.
      const zero = (l: number, b: number) => cAbs(solution.branches[l]![b]!.admittance) === 0;
      const { netlist, probes } = buildNetlist(corrected, solution, (l, b) => ({ form: (l + b) % 2 || zero(l, b) ? 'parallel' : 'series' }));
      const spice = runAc(netlist, corrected.frequencyHz, probes.map((p) => p.vector), dir, `corr${k}`);
      const after = report.verification.after;
      const scale = Math.max(...after.phases.map((p) => p.current.magnitude));
      // The reported corrected line currents and neutral current against ngspice's.
      const reported = [
        ...after.phases.map((p) => ({ label: `line ${p.phase}`, value: c(p.current.re, p.current.im) })),
        ...(after.neutral ? [{ label: 'neutral', value: c(after.neutral.current.re, after.neutral.current.im) }] : []),
      ];
      for (const { label, value } of reported) {
        const probe = probes.find((p) => p.label.startsWith(label === 'neutral' ? 'neutral' : `line ${label.slice(5)}`) && p.kind === 'current');
        expect(probe, `no ngspice probe for ${label}`).toBeDefined();
        const ref = spice.get(probe!.vector)!;
        const error = cAbs(cSub(value, ref));
        figures.note('reported corrected current, relative', error / Math.max(cAbs(ref), 1e-3 * scale), `${file} ${String(study.arrangement)}: ${label}`);
        expect(error).toBeLessThanOrEqual(REL * cAbs(ref) + 1e-9 * scale);
      }
      // And every other voltage and current of the corrected network.
      for (const probe of probes) {
        const ref = spice.get(probe.vector)!;
        const floor = 1e-9 * (probe.kind === 'voltage' ? corrected.nominalLineToNeutralV : scale);
        expect(cAbs(cSub(probe.core, ref)), probe.label).toBeLessThanOrEqual(REL * cAbs(ref) + floor);
      }
    });
  });
});

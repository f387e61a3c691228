/**
 * A bank on a sub-board against an independent circuit solver: the installation
 * with the verified equipment in place (CorrectionReport.verification.board,
 * back in its installation) written as a SPICE netlist from its physical parts
 * (test/support/ngspiceInstallation.ts) and solved by ngspice's AC analysis.
 * Every bus, bar and star-point voltage and every feeder, neutral and load-branch
 * current — the bank's own branches included — must agree to 1e-6 relative.
 * Skipped without ngspice unless CI=true.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { correctInstallation, installationOf, normaliseInstallation, parseInstallation, readBoardText, solveInstallationNetwork } from '@trivar/core';
import { cAbs, cSub } from '../support/complexMath.js';
import { FigureLog } from '../support/figureLog.js';
import { complexRelativeError } from '../support/tolerance.js';
import { probeNgspice, runAc } from '../support/ngspice.js';
import { buildInstallationNetlist } from '../support/ngspiceInstallation.js';

const REL = 1e-6;
const FLOOR = 1e-9;
const ngspice = probeNgspice();
const mustRun = process.env.CI === 'true';
const figures = new FigureLog(new URL('./.ngspice-installation-correction-agreement.json', import.meta.url));

const installationIn = (file: string) => normaliseInstallation(parseInstallation(readBoardText(readFileSync(new URL(`../../examples/${file}`, import.meta.url), 'utf8')))).installation;

const CASES = [
  { file: 'tannery-lane-works.yaml', board: 'Press shop', study: { arrangement: 'star-bank' } },
  { file: 'tannery-lane-works.yaml', board: 'Press shop', study: { arrangement: 'delta-bank', target: { pf: 0.98 } } },
  { file: 'maple-court-riser.yaml', board: 'Floor 2', study: { arrangement: 'star-bank', target: { pf: 0.99 } } },
  { file: 'maple-court-riser.yaml', board: 'Plant room', study: { arrangement: 'balancing-compensator' } },
] as const;

describe.skipIf(!ngspice && !mustRun)(`a bank on a sub-board agrees with ngspice (${ngspice ?? 'missing'})`, () => {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-spice-instcorr-'));
  afterAll(() => {
    rmSync(dir, { recursive: true, force: true });
    figures.describe('reference', `${ngspice ?? 'none'}, AC analysis of the corrected installation`);
    figures.describe('tolerance', { rel: REL, floor: `${FLOOR} × the voltage or current scale` });
    if (ngspice) figures.write();
  });
  it('ngspice is installed (required on CI)', () => expect(ngspice).not.toBeNull());

  CASES.forEach(({ file, board, study }, k) => {
    it(`${file}, ${study.arrangement} on ${board}`, () => {
      const corrected = correctInstallation(installationIn(file), study, { board });
      const equipment = corrected.report.verification.equipment;
      expect(equipment.length).toBeGreaterThan(0);
      const { installation } = installationOf(corrected.report.verification.board);
      const solution = solveInstallationNetwork(installation);
      const { netlist, probes } = buildInstallationNetlist(installation, solution);
      const spice = runAc(netlist, installation.main.frequencyHz, probes.map((p) => p.vector), dir, `instcorr${k}`);
      const currentScale = Math.max(1, ...probes.filter((p) => p.kind === 'current').map((p) => cAbs(p.core)));
      const scale = { voltage: installation.main.nominalLineToNeutralV, current: currentScale };
      const failures: string[] = [];
      for (const probe of probes) {
        const ref = spice.get(probe.vector)!;
        if (!(cAbs(cSub(probe.core, ref)) <= REL * cAbs(ref) + FLOOR * scale[probe.kind])) failures.push(`${probe.label}: core ${JSON.stringify(probe.core)}, ngspice ${JSON.stringify(ref)}`);
        figures.note(`relative (${probe.kind})`, complexRelativeError(probe.core, ref, 1e-3 * scale[probe.kind]), `${file} ${board}: ${probe.label}`);
      }
      expect(failures).toEqual([]);
      // The bank's branches are among the compared currents, and the effect's "after" is this solve.
      const bankBoard = corrected.boardIndex;
      const bankBranches = solution.boards[bankBoard]!.branches.slice(-equipment.length).flat().filter((b) => b.energised).length;
      expect(bankBranches).toBeGreaterThan(0);
      const after = corrected.effect.after.boards.find((b) => b.name === board)!.result;
      after.phases.forEach((p, i) => expect(Math.abs(p.current.magnitude - cAbs(solution.boards[bankBoard]!.lineCurrents[i]!))).toBeLessThanOrEqual(1e-9 * p.current.magnitude + 1e-12));
    });
  });
});

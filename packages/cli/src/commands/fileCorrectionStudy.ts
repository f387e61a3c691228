/**
 * The correction a file's `correction:` section gives, as `trivar correct` gives it, for the commands
 * that use it beside their own work (`diagram --with-correction` / `--view triangles`,
 * `profile --correction-bank`): the arrangement the section names, or — none named — the one
 * `trivar correct` recommends (as `trivar report` does, render/report/correctionComparisonBlocks.ts).
 * And the one refusal all of them share: no arrangement could be studied at all.
 */
import {
  arrangementNames,
  boardHasHarmonicData,
  compareWithHarmonics,
  correctWithHarmonics,
  type BoardSpec,
  compareCorrections,
  compareInstallationCorrections,
  conventionsOf,
  correctBoard,
  correctInstallation,
  labellerOf,
  switchingFromBank,
  type Board,
  type CorrectionComparison,
  type CorrectionReport,
  type Installation,
  type Region,
  type InstallationEffect,
  type SwitchingFromBank,
} from '@trivar/core';
import { UsageError } from '../exitCodes.js';

export interface FileCorrection {
  readonly report: CorrectionReport;
  /** The arrangement in the board's words when trivar correct recommended it (the file names none); null when the file names it. */
  readonly recommended: string | null;
}

export interface InstallationFileCorrection extends FileCorrection {
  /** The board the equipment is on. */
  readonly board: string;
  readonly effect: InstallationEffect;
  readonly measuredAt: string | undefined;
}

/** Every arrangement was "not applicable": say why, and what the section may name instead. */
function noneStudied(option: string, c: CorrectionComparison, system: string, region: Region): UsageError {
  const names = arrangementNames(system, region);
  const why = c.outcomes.map((o) => `${names[o.arrangement]}: ${o.notApplicable ?? 'not studied'}`).join('; ');
  return new UsageError(
    `${option}: the file's correction section names no arrangement, and trivar correct could study none with its settings (${why}); name one that fits with correction.arrangement (${c.outcomes.map((o) => o.arrangement).join(', ')})`,
  );
}

/** The board file's correction study: the arrangement it names, or the one trivar correct recommends. */
export function boardCorrection(board: Board, section: Record<string, unknown>, option: string, spec?: BoardSpec): FileCorrection {
  // A board with harmonic data gets the bank its harmonic check chooses (plain or detuned), as trivar correct and report give it.
  const harmonic = spec !== undefined && boardHasHarmonicData(spec);
  if (section.arrangement !== undefined) return { report: harmonic ? correctWithHarmonics(spec, board, section) : correctBoard(board, section), recommended: null };
  const c = harmonic ? compareWithHarmonics(spec, board, section) : compareCorrections(board, section);
  const chosen = c.outcomes.find((o) => o.arrangement === c.recommended)?.report;
  const region = conventionsOf(board).region;
  if (!chosen) throw noneStudied(option, c, board.system, region);
  return { report: chosen, recommended: arrangementNames(board.system, region)[chosen.arrangement] };
}

/** The same on an installation, on the board the study places the equipment on. */
export function installationCorrection(installation: Installation, study: Record<string, unknown>, board: string | undefined, option: string): InstallationFileCorrection {
  const placement = board === undefined ? {} : { board };
  if (study.arrangement !== undefined) {
    const c = correctInstallation(installation, study, placement);
    return { report: c.report, recommended: null, board: c.board, effect: c.effect, measuredAt: c.measuredAt };
  }
  const c = compareInstallationCorrections(installation, study, placement);
  const chosen = c.comparison.outcomes.find((o) => o.arrangement === c.comparison.recommended)?.report;
  const before = (c.comparison.outcomes.find((o) => o.report)?.report ?? chosen)?.verification.before;
  const system = before?.board.system ?? installation.main.system;
  const region = before?.conventions.region ?? conventionsOf(installation.main).region;
  if (!chosen || !c.effect) throw noneStudied(option, c.comparison, system, region);
  return { report: chosen, recommended: arrangementNames(system, region)[chosen.arrangement], board: c.board, effect: c.effect, measuredAt: c.measuredAt };
}

/** "the delta bank" / "the recommended delta bank" (the file names none), for messages. */
const what = (c: FileCorrection) => `the ${c.recommended ? `recommended ${c.recommended} (the file's correction section names no arrangement)` : arrangementNames(c.report.verification.before.board.system, c.report.verification.before.conventions.region)[c.report.arrangement]}`;

/**
 * The bank a correction study builds, as simulator steps — or a usage error saying why it cannot be
 * simulated and what can: the simulator switches capacitor steps, three-phase or from a line to the
 * neutral, with the study's controller. Never a partial bank passed off as the study's.
 */
export function switchedBankOf(c: FileCorrection, option: string, fromDefaults = false): SwitchingFromBank {
  const r = c.report;
  const label = labellerOf(r.verification.before.conventions.phaseNames);
  const system = r.verification.before.board.system;
  const threePhase = system === 'three-phase-4wire' || system === 'three-phase-3wire';
  const accepted = `the simulator switches capacitor steps that are three-phase, from a line to the neutral, or across two lines (correction.arrangement: star-bank${threePhase ? ', or delta-bank' : ''}); or use --bank for a bank sized from the profile`;
  const selection = r.selection;
  if (r.status === 'already-meets-target') throw new UsageError(`${option}: the board already meets the correction target, so ${what(c)} adds nothing to simulate`);
  if (r.status === 'nothing-to-build') throw new UsageError(`${option}: the correction study has nothing to build for this board (${r.nothingToBuild?.why ?? r.summary}), so there is no bank to simulate; ${accepted}`);
  if (r.status === 'no-suitable-units' || selection?.unbuildable)
    throw new UsageError(`${option}: no unit of the catalogue suits ${what(c)}${selection?.unbuildable ? ` (${selection.unbuildable.message})` : ''}, so there is no bank as built to simulate (trivar correct shows the sizing); ${accepted}`);
  const reactors = r.verification.branches.filter((b) => b.element === 'reactor');
  if (reactors.length)
    throw new UsageError(
      `${option}: ${what(c)} needs reactors (${reactors.map((b) => `${Math.abs(b.kvarAtNominalV).toFixed(2)} kvar on ${label(b.branch)}`).join(', ')}) beside its capacitors; the simulated controller switches capacitor steps only, and its capacitors without the reactors are not that equipment; ${accepted}`,
    );
  if (!selection?.steps.length || !selection.controller) throw new UsageError(`${option}: the correction study builds no switched bank for this board (run trivar correct to see why); ${accepted}`);
  const bank = switchingFromBank(selection.steps, selection.controller);
  if (!bank.steps.length && !bank.fixed.length) {
    const across = [...new Set(selection.steps.flatMap((s) => s.branches))].map(label).join(', ');
    throw new UsageError(
      `${option}: no step of ${what(c)} is one the simulator can switch (its steps are on ${across}, several branches to a step that is not three-phase), so none of it can be simulated; ${accepted}`,
    );
  }
  const design = { arrangement: r.arrangement, words: arrangementNames(system, r.verification.before.conventions.region)[r.arrangement], recommended: c.recommended !== null };
  return { ...bank, design: fromDefaults ? { ...design, defaultsWords: studyDefaultsWords(r) } : design };
}

/**
 * The correction study's defaults in words, read off the study that ran with them (its resolved target), for a
 * file with no correction section: `trivar correct` runs on such a file with these, and so does
 * `profile --correction-bank`, so the two agree and the reader is told what stood in for the section.
 */
function studyDefaultsWords(r: CorrectionReport): string {
  const t = r.verification.target;
  const where = t.definition === 'per-line' ? ' on every line' : '';
  const leading = t.leading === 'never' ? ', never leading' : '';
  return `target PF ${t.pf.toFixed(2)}${where}${leading}, every arrangement compared`;
}

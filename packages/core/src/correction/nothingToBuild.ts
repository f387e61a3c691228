/**
 * When the correction study offers no build: a build from units that makes things worse is withheld
 * (withheldBuildOf), and a study that ends with nothing to build says why in figures — each line's
 * need, Q = P·(tan φ1 − tan φ2), against the smallest step and the smallest unit that suits its
 * branch — and what to do instead (nothingToBuildOf).
 */
import type { PhaseId } from '../board/boardModel.js';
import type { BoardResult, LoadReading } from '../analysis/boardResult.js';
import type { TargetDefinition } from './correctionSpec.js';
import type { CatalogueUnit } from './unitCatalogues.js';
import type { BankSelection, CorrectionVerification, LineComparison, LineNeed, NothingToBuild, PowerFactorsBeforeAfter, SizedEquipment, SmallestUnitOnBranch, WithheldBuild, WithheldBuildReason } from './correctionResult.js';
import { nothingToBuildWords } from './correctionWording.js';
import type { PhaseLabeller } from '../board/conventions/phaseNames.js';

/** A PF change smaller than this does not show at three decimals: no lowering to speak of. */
const PF_PRINT_STEP = 5e-4;

/**
 * The kvar each line loaded before needs to reach the target's lower bound on its own (lagging lines
 * only: a unity or leading line needs none), from the solved readings before correction.
 */
export function lineNeeds(before: Pick<BoardResult, 'phases'>, pfTargetOf: (phase: PhaseId) => number): LineNeed[] {
  return before.phases.map((p) => {
    const pfTarget = pfTargetOf(p.phase);
    const tanTarget = Math.tan(Math.acos(pfTarget));
    // The target is a band on Q/|P| (correctionTarget.ts): a line that exports active power is judged on its size too.
    const needed = p.pf === null || p.kvar <= 0 ? 0 : Math.max(0, p.kvar - Math.abs(p.kW) * tanTarget);
    return { phase: p.phase, kW: p.kW, kvar: p.kvar, pfBefore: p.pf, pfTarget, neededKvar: needed };
  });
}

/** The PF the target is defined on, before and after (per-line: the lowest line loaded before). */
export function targetPfBeforeAfter(lines: readonly LineComparison[], pf: PowerFactorsBeforeAfter, definition: TargetDefinition): { before: number | null; after: number | null } {
  if (definition === 'per-line') {
    const loaded = lines.filter((l) => l.pf.before !== null);
    if (!loaded.length) return { before: null, after: null };
    const afters = loaded.flatMap((l) => (l.pf.after === null ? [] : [l.pf.after]));
    return { before: Math.min(...loaded.map((l) => l.pf.before!)), after: afters.length ? Math.min(...afters) : null };
  }
  const pair = definition === 'effective' ? pf.effective : definition === 'vector' ? pf.vector : definition === 'arithmetic' ? pf.arithmetic : pf.positiveSequence;
  return pair ? { before: pair.before, after: pair.after } : { before: null, after: null };
}

/**
 * Why a verified build is not offered, or null where it may be. A compensator's reactors without its
 * capacitors are never offered (they balance what the capacitors correct; alone they only add lagging
 * current). A build that misses the target is withheld where the PF the target is defined on falls with
 * it, or where a line that carried nothing carries current with it. A build that meets the target may load
 * an idle line: that is how a balancing compensator spreads a single-phase load.
 */
export function withheldBuildOf(
  v: CorrectionVerification,
  definition: TargetDefinition,
  build: { readonly missesTarget: boolean; readonly reactorsAlone: boolean; readonly capacitorKvar: number; readonly reactorKvar: number },
): WithheldBuild | null {
  const lines = v.metering?.lines ?? v.lines;
  const pf = targetPfBeforeAfter(lines, v.metering?.powerFactor ?? v.powerFactor, definition);
  const idle = lines.filter((l) => l.pf.before === null && l.pf.after !== null).map((l) => ({ phase: l.phase, currentA: l.currentA.after }));
  const reasons: WithheldBuildReason[] = [];
  if (build.reactorsAlone) reasons.push('reactors-alone');
  if (build.missesTarget && pf.before !== null && pf.after !== null && pf.after < pf.before - PF_PRINT_STEP) reasons.push('lowers-target-pf');
  if (build.missesTarget && idle.length) reasons.push('loads-idle-line');
  if (!reasons.length) return null;
  return { reasons, capacitorKvar: build.capacitorKvar, reactorKvar: build.reactorKvar, targetPfBefore: pf.before, targetPfWithBuild: pf.after, idleLinesLoaded: build.missesTarget || build.reactorsAlone ? idle : [] };
}

/**
 * The smallest single-phase unit of the catalogue that suits each line-to-neutral capacitor branch of a
 * lagging line, by the unit choice's own rules (rating at least the branch's required rating, output at
 * the floor voltage at least the delivery floor), with that branch's capacitance window.
 */
export function smallestUnitsOn(selection: BankSelection, sized: SizedEquipment, units: readonly CatalogueUnit[], needs: readonly LineNeed[]): SmallestUnitOnBranch[] {
  const hz = selection.frequencyHz;
  const omega = 2 * Math.PI * hz;
  const floor = selection.deliveryFloorPercent / 100;
  return needs.flatMap((need) => {
    if (need.neededKvar <= 0) return [];
    const branch = `${need.phase}-N`;
    const s = selection.selections.find((x) => x.branch === branch);
    const b = sized.branches.find((x) => x.branch === branch);
    // Only where the sizing put a capacitor: a reactor's or an empty branch's window holds no unit at all.
    if (!s || !b || b.element !== 'capacitor') return [];
    const suits = units.filter((u) => u.kind === 'single-phase' && u.ratedV >= s.requiredRatedV * (1 - 1e-12) && (s.nominalV / u.ratedV) ** 2 * (hz / u.ratedHz) >= floor - 1e-12);
    if (!suits.length) return [];
    const farad = (u: CatalogueUnit) => (u.ratedKvar * 1000) / (2 * Math.PI * u.ratedHz * u.ratedV ** 2);
    const least = suits.reduce((a, u) => (farad(u) < farad(a) ? u : a));
    const f = farad(least);
    return [
      {
        branch,
        phase: need.phase,
        unitName: least.name,
        ratedKvar: least.ratedKvar,
        ratedV: least.ratedV,
        capacitanceUF: f * 1e6,
        kvarAtAppliedV: (f * omega * b.appliedV ** 2) / 1000,
        minimumUF: s.minimumCapacitanceUF,
        maximumUF: s.maximumCapacitanceUF,
      },
    ];
  });
}

/** The loads drawing the most lagging kvar on a line (a load on that line's phase, its own or shared), largest first. */
function laggingLoadsOn(loads: readonly LoadReading[], phase: PhaseId): LoadReading[] {
  return loads.filter((l) => l.kvar > 0 && l.energised && l.connection.includes(phase)).sort((a, b) => b.kvar - a.kvar);
}

/** Everything a report of `nothing-to-build` needs: the figures and the words. */
export function nothingToBuildOf(args: {
  readonly before: BoardResult;
  readonly pfTargetOf: (phase: PhaseId) => number;
  readonly definitionWords: string;
  readonly minStepKvar: number;
  readonly selection: BankSelection | null;
  readonly sized: SizedEquipment;
  readonly units: readonly CatalogueUnit[];
  readonly withheld: WithheldBuild | null;
  readonly label: PhaseLabeller;
}): NothingToBuild {
  const needs = lineNeeds(args.before, args.pfTargetOf);
  const smallestUnits = args.selection ? smallestUnitsOn(args.selection, args.sized, args.units, needs) : [];
  const tolerance = args.selection?.capacitanceTolerance ?? null;
  const needing = needs.filter((n) => n.neededKvar > 0);
  const withheld = args.withheld && { ...args.withheld, idleLinesLoaded: args.withheld.idleLinesLoaded.map((l) => ({ line: args.label(l.phase), currentA: l.currentA })) };
  const why = nothingToBuildWords.why({
    needs: needing.map((n) => ({ ...n, line: args.label(n.phase) })),
    minStepKvar: args.minStepKvar,
    smallestUnits: smallestUnits.map((u) => ({ ...u, branchLabel: args.label(u.branch), line: args.label(u.phase) })),
    tolerance,
    withheld,
    definitionWords: args.definitionWords,
  });
  const atEquipment = needing.map((n) => ({ line: args.label(n.phase), loads: laggingLoadsOn(args.before.loads, n.phase).slice(0, 2).map((l) => ({ name: l.name, kvar: l.kvar })) }));
  const advice = nothingToBuildWords.advice(atEquipment, args.before.totals.kvar, args.before.totals.pf);
  const withheldWords = withheld ? nothingToBuildWords.withheld(withheld, args.definitionWords) : null;
  return { needs, minStepKvar: args.minStepKvar, smallestUnits, withheld: args.withheld, withheldWords, why, advice };
}

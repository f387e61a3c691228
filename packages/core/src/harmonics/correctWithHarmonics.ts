/**
 * Harmonics inside the correction study: the plain bank `correctBoard` chose is
 * checked on the board's harmonics (resonance scan of every step combination,
 * capacitor duty in every state); beside it, detuned variants (p = 5.67, 7,
 * 14 %) are sized and checked the same way, and one is chosen.
 *
 * A detuned variant re-runs the whole correction study (sizing, units, every
 * verification) with each catalogue unit replaced by its fundamental
 * equivalent: a unit of Q_r at U_r behind a reactor of p behaves at the
 * fundamental as a plain capacitor of susceptance B_r/(1 − p), and its
 * capacitor sees U/(1 − p). That is exactly a plain unit rated
 * (Q_r·(1 − p), U_r·(1 − p)): same susceptance B_r/(1 − p), and the study's
 * voltage rule "U_r·(1 − p) ≥ U·(1 + margin)" is the rating the detuned
 * capacitor needs, U_r ≥ U·(1 + margin)/(1 − p) [METHODS §5]. The chosen build
 * is then written back in real units (rating, nameplate, capacitance) with
 * its detuning factor, and its harmonics are solved with the series L–C steps.
 */
import type { Board, BoardLoad, Terminal } from '../board/boardModel.js';
import { correctBoard, correctBoardBuilt } from '../correction/correctBoard.js';
import { compareCorrections, figuresOf, recommendArrangement, specFor, type CorrectionComparison } from '../correction/compareCorrections.js';
import type { Arrangement } from '../correction/correctionSpec.js';
import { parseCorrectionSpec } from '../correction/validateCorrectionSpec.js';
import { defaultPractice } from '../correction/selectBankUnits.js';
import { TYPICAL_CATALOGUES, catalogueUnitOf } from '../correction/unitCatalogues.js';
import type { BankStep, CorrectionReport, CorrectionWarning } from '../correction/correctionResult.js';
import { arrangementNames, CORRECTION_CAUTIONS, reportSummary, resonanceSummaryClause, selectionWording, warningText } from '../correction/correctionWording.js';
import { resonanceNearOrders } from '../correction/stepStateResonance.js';
import { CORRECTION_DEFAULTS } from '../correction/correctionDefaults.js';
import type { CapacitorUnitSpec } from '../correction/correctionSpec.js';
import { resolveHarmonicModel, type BankModel, type HarmonicModel } from './harmonicModel.js';
import type { HarmonicsBoardSpec } from './harmonicsSpec.js';
import { analyseHarmonics } from './studyHarmonics.js';
import { DETUNING_FACTORS_PERCENT, capacitorVoltage, tuningOrder } from './detuning.js';
import { dutyRatio } from './capacitorDuty.js';
import type { CapacitorDuty, HarmonicsReport } from './harmonicsResult.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { riseFlagRider } from '../correction/voltageRiseFlag.js';

const capitalised = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

export interface CorrectionVariant {
  /** `plain`, or `detuned 7 %`… */
  readonly name: string;
  /** Detuning factor p, % (0 for plain). */
  readonly detuningPercent: number;
  /** 1/√p; null for plain. */
  readonly tuningOrder: number | null;
  /** Fundamental voltage across the capacitors at nominal network voltage, V. */
  readonly capacitorVoltageV: number;
  /**
   * Reactor per branch of each distinct step size, mH (X_L = p·X_C of the step's
   * capacitance per branch at the board frequency); empty for plain.
   */
  readonly reactorsMilliHenry: readonly { readonly capacitancePerBranchUF: number; readonly inductanceMH: number }[];
  /** Rated voltage of the units chosen, V; null when nothing was built. */
  readonly unitRatedV: number | null;
  readonly nameplateKvar: number;
  readonly deliveredKvar: number;
  readonly correctionStatus: CorrectionReport['status'];
  /** Lowest resonance peak over every step combination; null when none. */
  readonly lowestResonanceOrder: number | null;
  /** Orders present on the board that some step combination resonates within ±10 % of. */
  readonly resonantOrders: readonly number[];
  /**
   * On an installation with other banks: orders some step combination resonates within ±10 % of only
   * with the other banks switched (absent on a board file).
   */
  readonly resonantOrdersOtherBanksSwitched?: readonly number[];
  /** Worst capacitor duty over every state, as a fraction of its limit (≤ 1 is within). */
  readonly worstDutyRatio: number | null;
  /** Within the duty limits in every state, and below the voltage the units stand continuously (IEC 60831-1: 1.00 U_N). */
  readonly dutyOk: boolean;
  /** Meets the target, no resonance near an order present, duty within limits. */
  readonly passes: boolean;
  /** Why it does not pass, in words. */
  readonly reasons: readonly string[];
}

/** A variant with the reports it came from (kept out of the result: the chosen one is the result). */
interface VariantRun<Check> {
  readonly summary: CorrectionVariant;
  readonly report: CorrectionReport;
  readonly harmonics: Check | null;
  /** Largest 3rd-harmonic current of a line at the bank's board, % of its fundamental. */
  readonly thirdPercent: number;
}

/** What the harmonic check of one bank found, whatever the network it was checked on. */
export interface BankCheck<Check> {
  /** The study of the bank (kept for the chosen variant); null when nothing is built. */
  readonly check: Check | null;
  /** Resonance peaks (orders) of the step combinations judged (on an installation, those with some of the bank in service). */
  readonly peakOrders: readonly number[];
  /** Orders present that such a combination resonates within ±10 % of. */
  readonly resonantOrders: readonly number[];
  /** The same only with other banks switched (an installation's other banks); absent without them. */
  readonly resonantOrdersOtherBanksSwitched?: readonly { readonly order: number; readonly words: string }[];
  readonly duty: CapacitorDuty | null;
  /** Largest 3rd-harmonic current of a line at the bank's board, % of its fundamental. */
  readonly thirdPercent: number;
  /** The resonant orders in words with their figures (`7 (steps 1+2: h 7.04)`), where the check words them so. */
  readonly resonanceWords?: string;
  /** The worst duty in words with its figures, where the check words it so. */
  readonly dutyWords?: string;
}

/** Checks the bank of a correction report (its steps with their detuning factor) on the harmonics. */
export type BankChecker<Check> = (report: CorrectionReport) => BankCheck<Check>;

export interface CorrectionHarmonics<Check = HarmonicsReport> {
  /** The choice in words. */
  readonly summary: string;
  /** Name of the chosen variant; null when none passes; `plain` where nothing is added (then `variants` is empty). */
  readonly chosen: string | null;
  /** Every variant sized and checked; empty where the study adds nothing. */
  readonly variants: readonly CorrectionVariant[];
  /** The harmonic study of the bank in the report (scan curves included, for plotting); null when nothing is built. */
  readonly check: Check | null;
  readonly basis: string;
}

/** A correction report with the harmonic comparison of plain and detuned variants. */
export type HarmonicCorrectionReport<Check = HarmonicsReport> = CorrectionReport & { readonly harmonics: CorrectionHarmonics<Check> };

/** The catalogue a study uses, as plain unit specs (user's, or the practice's typical one at the board frequency). */
function catalogueOf(board: Board, study: ReturnType<typeof parseCorrectionSpec>): CapacitorUnitSpec[] {
  if (study.catalogue) return study.catalogue.map((u, i) => ({ ...catalogueUnitOf(u, i) }));
  const practice = study.practice ?? defaultPractice(board.frequencyHz);
  return TYPICAL_CATALOGUES[practice].units.map((u) => ({ name: u.name, kind: u.kind, ratedKvar: u.ratedKvar, ratedV: u.ratedV, ratedHz: u.ratedHz }));
}

/** Each unit as its fundamental equivalent behind a reactor of p (see the module comment). */
const equivalentUnit = (u: CapacitorUnitSpec, p: number): CapacitorUnitSpec => ({
  ...u,
  name: `${u.name ?? 'unit'} behind a ${(100 * p).toFixed(2).replace(/\.?0+$/, '')} % reactor`,
  ratedKvar: u.ratedKvar * (1 - p),
  ratedV: u.ratedV * (1 - p),
});

/** The caution a correction report gives when it has not looked at harmonics; replaced once it has. */
const HARMONICS_NOT_CHECKED = CORRECTION_CAUTIONS.find((c) => c.includes('does not check harmonics'));
const harmonicsChecked = (file: string) =>
  `Adding capacitance moves the supply resonance down in frequency. The harmonic check of this correction covers the spectra entered in the ${file}; measure the real spectrum (true-rms, per order) before installing.`;

/**
 * Writes a variant's steps back in real units: rating, nameplate and
 * capacitance of the capacitors behind the reactors, the catalogue they came
 * from, the summary; the √(S_sc/Q_c) estimate does not apply to a detuned bank
 * (its resonances are in the harmonic check), so it and its warning go.
 */
function asDetuned(report: CorrectionReport, p: number, percent: number, plainSelection: CorrectionReport['selection']): CorrectionReport {
  const selection = report.selection;
  if (!selection) return report;
  const typical = plainSelection ? plainSelection.catalogue === 'typical' : selection.catalogue === 'typical';
  const realUnit = <T extends { ratedKvar: number; ratedV: number; elementCapacitanceUF: number; source: string; catalogueIndex: number | null }>(u: T): T => ({
    ...u,
    source: typical ? 'typical' : 'catalogue',
    catalogueIndex: typical ? null : u.catalogueIndex,
    ratedKvar: u.ratedKvar / (1 - p),
    ratedV: u.ratedV / (1 - p),
    elementCapacitanceUF: u.elementCapacitanceUF * (1 - p),
  });
  const real = (uf: number) => uf * (1 - p);
  const steps = selection.steps.map((s): BankStep => ({
    ...s,
    unit: realUnit(s.unit),
    nameplateKvar: s.nameplateKvar / (1 - p),
    capacitancePerBranchUF: s.capacitancePerBranchUF * (1 - p),
    detuningFactor: p,
  }));
  const nameplate = selection.nameplateKvar / (1 - p);
  // Units were chosen as fundamental equivalents (kvar × (1 − p)), so their cost counted the equivalent's
  // kvar; the bank bought has the real nameplate and a reactor of p × that behind each step (Q_L = p·Q_C).
  const unitCostKvar = selection.cost.unitCostKvar;
  const cost = {
    statement: selectionWording.detunedCostStatement(unitCostKvar, percent, CORRECTION_DEFAULTS.reactorCostFactor),
    unitCostKvar,
    value: nameplate + unitCostKvar * selection.units + CORRECTION_DEFAULTS.reactorCostFactor * p * nameplate,
  };
  const what = `${arrangementNames(report.verification.before.board.system, report.verification.before.conventions.region)[report.arrangement]} with ${percent} % detuning reactors`;
  const summary =
    report.status === 'already-meets-target' || report.status === 'no-suitable-units' || report.status === 'nothing-to-build'
      ? reportSummary[report.status](what)
      : reportSummary[report.status](what, selection.deliveredKvar, nameplate);
  // The rise above its flag level stays beside the verdict, as correctBoard's summary has it.
  const summaryWithFlag = summary + riseFlagRider(report.verification.voltageRise, 'see the warnings');
  const withoutEstimate = (ws: readonly CorrectionWarning[]) => ws.filter((w) => w.code !== 'resonance' && w.code !== 'resonance-step-state');
  return {
    ...report,
    summary: summaryWithFlag,
    warnings: withoutEstimate(report.warnings),
    verification: {
      ...report.verification,
      resonanceOrder: null,
      resonanceOrders: [],
      resonanceNearOrders: [],
      resonanceStepStates: null,
      resonanceHeadlineOrders: [],
      resonanceNearHarmonic: false,
      warnings: withoutEstimate(report.verification.warnings),
    },
    selection: {
      ...selection,
      ...(plainSelection ? { catalogue: plainSelection.catalogue, catalogueTitle: plainSelection.catalogueTitle, catalogueNote: plainSelection.catalogueNote } : {}),
      steps,
      nameplateKvar: nameplate,
      cost,
      selections: selection.selections.map((b) => ({
        ...b,
        nameplateKvar: b.nameplateKvar / (1 - p),
        requiredRatedV: b.requiredRatedV / (1 - p),
        requiredCapacitanceUF: real(b.requiredCapacitanceUF),
        minimumCapacitanceUF: real(b.minimumCapacitanceUF),
        maximumCapacitanceUF: b.maximumCapacitanceUF === null ? null : real(b.maximumCapacitanceUF),
        fixedCapacitanceUF: real(b.fixedCapacitanceUF),
        designCapacitanceUF: real(b.designCapacitanceUF),
      })),
    },
  };
}

/**
 * The bank of a correction report as switchable parts on the plain board: the
 * fixed part and one load per controller output, each branch at its effective
 * fundamental susceptance. Star branches of a floating bank share one star point.
 */
export function bankOfReport(board: Board, report: CorrectionReport): { board: Board; model: BankModel } | null {
  assertBoardModel(board);
  const steps = report.selection?.steps ?? [];
  if (steps.length === 0) return null;
  const omega = 2 * Math.PI * board.frequencyHz;
  const p = steps[0]!.detuningFactor;
  const star: Terminal = `star:${board.loads.length}`;
  const outputs = [...new Set(steps.map((s) => s.output))];
  const loads: BoardLoad[] = outputs.map((output) => {
    const parts = steps.filter((s) => s.output === output);
    const branches = parts.flatMap((s) =>
      s.branches.map((name) => {
        const [from, to] = name.split('-') as [Terminal, string];
        const vNominal = to === 'N' || to === 'star' ? board.nominalLineToNeutralV : (board.nominalLineToLineV ?? board.nominalLineToNeutralV);
        const bEffective = (omega * s.capacitancePerBranchUF * 1e-6) / (1 - p);
        return { from, to: (to === 'star' ? star : to) as Terminal, sNominal: { re: 0, im: -bEffective * vNominal * vNominal }, vNominal, zip: { z: 1, i: 0, p: 0 } };
      }),
    );
    return { name: output === null ? 'bank fixed part' : `bank output ${output}`, connection: 'ABC-delta', model: 'constant-impedance', origin: 'added', branches };
  });
  const first = board.loads.length;
  const fixedIndex = outputs.indexOf(null);
  const elementV = (s: BankStep) => (s.unit.kind === 'three-phase' && s.branches.some((b) => b.endsWith('-N') || b.endsWith('-star')) ? s.unit.ratedV / Math.sqrt(3) : s.unit.ratedV);
  const starBranches = steps.some((s) => s.branches.some((b) => b.endsWith('-N') || b.endsWith('-star')));
  const kvarOf = (output: number | null) => steps.filter((s) => s.output === output).reduce((t, s) => t + s.kvarAtNominalV, 0);
  return {
    board: { ...board, loads: [...board.loads, ...loads] },
    model: {
      ratedV: Math.min(...steps.map(elementV)),
      elementNominalV: starBranches ? board.nominalLineToNeutralV : (board.nominalLineToLineV ?? board.nominalLineToNeutralV),
      stepsKvar: outputs.filter((o) => o !== null).map(kvarOf),
      fixedKvar: fixedIndex >= 0 ? kvarOf(null) : 0,
      detuning: p,
      fixedLoad: fixedIndex >= 0 ? first + fixedIndex : null,
      stepLoads: outputs.flatMap((o, k) => (o === null ? [] : [first + k])),
    },
  };
}

/**
 * The bank checked is the one the correction study chose, so its duty is judged at the ends of the
 * capacitance tolerance that study chose the units with (the `harmonics.bank` tolerance is the installed bank's).
 */
export function withStudyTolerance(model: HarmonicModel, report: CorrectionReport): HarmonicModel {
  const tolerance = report.selection?.capacitanceTolerance;
  return tolerance ? { ...model, capacitanceTolerance: { minusPercent: tolerance.minusPercent, plusPercent: tolerance.plusPercent } } : model;
}

/** The harmonic check of a bank on a board file: the board with the bank, every step combination scanned, duty in every state. */
export function boardBankChecker(spec: HarmonicsBoardSpec, board: Board): BankChecker<HarmonicsReport> {
  return (report) => {
    const bank = bankOfReport(board, report);
    const harmonics = bank ? analyseHarmonics(bank.board, withStudyTolerance(resolveHarmonicModel(spec, bank.board, bank.model), report)) : null;
    const duty = harmonics?.capacitorDuty ?? null;
    return {
      check: harmonics,
      peakOrders: harmonics?.scan.combinations.flatMap((c) => c.peaks.map((pk) => pk.order)) ?? [],
      resonantOrders: [...new Set(harmonics?.scan.combinations.flatMap((c) => c.nearOrders) ?? [])].sort((a, b) => a - b),
      duty,
      thirdPercent: Math.max(0, ...(harmonics?.lines.map((l) => l.current.orders.find((o) => o.order === 3)?.percentOfFundamental ?? 0) ?? [])),
    };
  };
}

/** Why a variant's correction study does not count as meeting the target, in words. */
const UNMET_REASON: Partial<Record<CorrectionReport['status'], string>> = {
  'no-suitable-units': 'no unit of the catalogue suits its capacitor voltage',
  infeasible: 'it cannot reach the target in this arrangement',
  'misses-target-with-available-units': 'the units available miss the target',
  'nothing-to-build': 'no build of the available units brings the board nearer the target',
};

function variantOf<Check>(checkBank: BankChecker<Check>, board: Board, report: CorrectionReport, name: string, percent: number): VariantRun<Check> {
  const p = percent / 100;
  const checked = checkBank(report);
  const { peakOrders: peaks, resonantOrders, duty } = checked;
  const switched = checked.resonantOrdersOtherBanksSwitched;
  const worstDutyRatio = duty ? dutyRatio(duty.worst.figures, duty.limits) : null;
  const met = report.status === 'meets-target' || report.status === 'meets-target-at-nominal-capacitance' || report.status === 'already-meets-target';
  const reasons = [
    ...(met ? [] : [report.status === 'no-suitable-units' && (report.selection?.units ?? 0) > 0 ? 'no unit of the catalogue suits some of its branches (the rest is built)' : (UNMET_REASON[report.status] ?? 'the correction study does not meet the target')]),
    ...(resonantOrders.length ? [`a step combination resonates with the supply within ±10 % of order ${checked.resonanceWords ?? resonantOrders.join(', ')}`] : []),
    ...(switched?.length ? [`with the other banks switched a step combination resonates within ±10 % of order ${switched.map((s) => `${s.order} (${s.words})`).join(', ')}`] : []),
    ...(duty && !duty.ok ? [`the capacitors exceed their duty limits in some state${checked.dutyWords ? ` (${checked.dutyWords})` : ''}`] : []),
    // Within the 8-hour allowance is not within limits: a unit at its rated voltage continuously is rated too low.
    ...(duty?.ok && duty.continuousVoltage?.reached
      ? [`the capacitors run at or above the ${duty.continuousVoltage.limitPu.toFixed(2)} × rated voltage they stand continuously (IEC 60831-1; ${Math.max(duty.continuousVoltage.highestPu, duty.continuousVoltage.anyStatePu, duty.continuousVoltage.fundamentalPu).toFixed(3)} × at worst)`]
      : []),
  ];
  // The capacitors' own nominal voltage: the highest over the branches built (a compensator has line-to-line
  // and line-to-neutral ones); where nothing is built, the arrangement's (star: line-to-neutral).
  const built = report.verification.equipment.flatMap((g) => g.branches).filter((b) => b.susceptanceS > 0);
  const lineToLine = board.nominalLineToLineV ?? board.nominalLineToNeutralV;
  const elementV = built.length ? Math.max(...built.map((b) => b.vNominal)) : report.sizing.arrangement === 'star-bank' ? board.nominalLineToNeutralV : lineToLine;
  const summary: CorrectionVariant = {
    name,
    detuningPercent: percent,
    tuningOrder: p > 0 ? tuningOrder(p) : null,
    capacitorVoltageV: capacitorVoltage(elementV, p),
    reactorsMilliHenry: p > 0 ? reactorsOf(report, board.frequencyHz, p) : [],
    unitRatedV: report.selection?.steps[0]?.unit.ratedV ?? null,
    nameplateKvar: report.selection?.nameplateKvar ?? 0,
    deliveredKvar: report.selection?.deliveredKvar ?? 0,
    correctionStatus: report.status,
    lowestResonanceOrder: peaks.length ? Math.min(...peaks) : null,
    resonantOrders,
    ...(switched ? { resonantOrdersOtherBanksSwitched: [...new Set(switched.map((s) => s.order))].sort((a, b) => a - b) } : {}),
    worstDutyRatio,
    dutyOk: (duty?.ok ?? true) && !duty?.continuousVoltage?.reached,
    passes: reasons.length === 0,
    reasons,
  };
  return { summary, report, harmonics: checked.check, thirdPercent: checked.thirdPercent };
}

function reactorsOf(report: CorrectionReport, frequencyHz: number, p: number): CorrectionVariant['reactorsMilliHenry'] {
  const omega = 2 * Math.PI * frequencyHz;
  const sizes = [...new Set((report.selection?.steps ?? []).map((s) => s.capacitancePerBranchUF))].sort((a, b) => a - b);
  // X_C = 1/(ωC), X_L = p·X_C, L = X_L/ω.
  return sizes.map((uf) => ({ capacitancePerBranchUF: uf, inductanceMH: (1e3 * p) / (omega * omega * uf * 1e-6) }));
}

/** The harmonic check's summary where the study adds nothing. */
export const NOTHING_TO_CHECK = 'no capacitors are added, so there is no bank to check against the harmonics';

/** A third harmonic worth a 14 % reactor: above this share of the fundamental on some line (common practice, no source). */
const SIGNIFICANT_THIRD = 0.1;

/** How the check is worded for the kind of file it was made on. */
export interface HarmonicCheckWording {
  /** `board file`, `installation file`: where the spectra were entered. */
  readonly file: string;
  /** What the check adds to the basis (the network it was made on). */
  readonly basis?: string;
}

/**
 * Runs the correction study with its harmonic check: the plain bank, and
 * detuned variants at 5.67, 7 and 14 % (or the one `harmonics.detuning`
 * names), each sized for the target with its effective fundamental output and
 * checked again; the chosen variant's report is returned with the comparison.
 * @param spec the validated board file (spectra, background, harmonics section)
 * @param board `normaliseBoard(spec)`
 * @param study the correction study (as for `correctBoard`)
 * @param studied `correctBoard(board, study)` where the caller has it (a comparison made it), not made again
 */
export function correctWithHarmonics(spec: HarmonicsBoardSpec, board: Board, study: unknown, studied?: CorrectionReport): HarmonicCorrectionReport {
  assertBoardModel(board);
  const checked = correctWithBankCheck(board, study, spec.harmonics?.detuning, boardBankChecker(spec, board), { file: 'board file' }, studied);
  const fileBank = spec.harmonics?.bank;
  if (!fileBank || !checked.selection?.units) return checked;
  // The file's bank is not on the board the study sizes for (normaliseBoard leaves it out): the bank sized here takes its place.
  const total = (fileBank.fixedKvar ?? 0) + fileBank.stepsKvar.reduce((s, q) => s + q, 0);
  const note = {
    code: 'file-bank-replaced',
    message: `the bank of the board file's harmonics section (${total} kvar at ${fileBank.ratedV} V, ${fileBank.connection}) is not on the board in this study: the bank sized here is meant to take its place, and the harmonic check has it instead; both together on the board is not what this study checked`,
    path: 'harmonics.bank',
    value: total,
    threshold: null,
  };
  return { ...checked, warnings: [...checked.warnings, note] };
}

/**
 * The correction study with the harmonic check of its bank by `checkBank` (a board's, or the bank on a
 * board of an installation): plain and detuned variants, one chosen.
 * @param board the board the equipment is on (with its place in an installation where it has one)
 * @param detuning the file's `harmonics.detuning`
 * @param studied `correctBoard(board, study)` where the caller has it (a comparison made it), not made again
 */
export function correctWithBankCheck<Check>(
  board: Board,
  study: unknown,
  detuning: number | 'auto' | 'none' | undefined,
  checkBank: BankChecker<Check>,
  wording: HarmonicCheckWording,
  studied?: CorrectionReport,
): HarmonicCorrectionReport<Check> {
  const plain = variantOf(checkBank, board, studied ?? correctBoard(board, study), 'plain', 0);
  // No capacitors built (nothing to add, a board already leading, reactors only): no bank to scan or
  // detune, so no variant is sized or checked (a table of zero-kvar banks that "pass" would read as a
  // check that was made).
  if (plain.report.status === 'already-meets-target' || !plain.report.selection?.steps.length)
    return {
      ...plain.report,
      harmonics: {
        summary: NOTHING_TO_CHECK,
        chosen: plain.summary.passes ? 'plain' : null,
        variants: [],
        check: null,
        basis: `no capacitors are added, so none are scanned or sized with detuning reactors${wording.basis ? `; ${wording.basis}` : ''}`,
      },
    };
  const parsed = parseCorrectionSpec(study, board);
  const setting = detuning ?? 'auto';
  const factors: number[] = setting === 'none' ? [] : setting === 'auto' ? [...DETUNING_FACTORS_PERCENT] : [setting];
  const catalogue = catalogueOf(board, parsed);
  const detuned = factors.map((percent) => {
    const p = percent / 100;
    const variantStudy = { ...(study as Record<string, unknown>), catalogue: catalogue.map((u) => equivalentUnit(u, p)) };
    return variantOf(checkBank, board, asDetuned(correctBoardBuilt(board, variantStudy, { detunedSteps: true }), p, percent, plain.report.selection), `detuned ${percent} %`, percent);
  });
  const runs = [plain, ...detuned];
  const third = plain.thirdPercent > 100 * SIGNIFICANT_THIRD;
  // The order of trial is only said where it was chosen here: a file that fixes the detuning tried one factor.
  // Practice: 14 % where the 3rd matters, else 7 % (then 5.67 %), common practice [METHODS §5].
  const order = third ? [...detuned].sort((a, b) => b.summary.detuningPercent - a.summary.detuningPercent) : [...detuned].sort((a, b) => Math.abs(a.summary.detuningPercent - 7) - Math.abs(b.summary.detuningPercent - 7));
  const chosen = plain.summary.passes ? plain : (order.find((v) => v.summary.passes) ?? null);
  const shown = chosen ?? plain;
  const why = (v: VariantRun<Check>) => v.summary.reasons.join('; ');
  const summary = chosen
    ? chosen === plain
      ? 'the plain bank passes the harmonic check: no detuning needed'
      : `the plain bank fails the harmonic check (${why(plain)}); chosen: ${chosen.summary.name} (tuned to h = ${chosen.summary.tuningOrder!.toFixed(2)}, ${chosen.summary.unitRatedV?.toFixed(0)} V capacitors)${third && setting === 'auto' ? '; 14 % is tried first because the third harmonic is significant' : ''}`
    : `no variant passes the harmonic check (${runs.map((v) => `${v.summary.name}: ${why(v)}`).join(' | ')}): a tuned filter or a specialist harmonic study is needed; the plain bank is shown`;
  // A bank that meets the target but fails the harmonic check in every variant is not one to install:
  // the verdict's summary and the warnings say so beside the figures (the check itself is below them).
  const failsCheck = chosen === null && shown.report.selection !== null && (shown.report.selection.units ?? 0) > 0;
  const failure = `no variant passes the harmonic check (${runs.map((v) => `${v.summary.name}: ${why(v)}`).join(' | ')})`;
  const warnings = shown === plain ? deferredToScan(plain) : shown.report.warnings;
  // The scan of every step combination decides where the plain bank is shown: the estimate's "but" gives way to it.
  const scannedSummary = shown === plain ? shown.report.summary.replace(resonanceSummaryClause(shown.report.verification, shown.report.verification.overloadsCaused.length ? 'and' : 'but'), '') : shown.report.summary;
  return {
    ...shown.report,
    summary: failsCheck ? `${scannedSummary}; but it fails the harmonic check: ${failure}` : scannedSummary,
    warnings: failsCheck
      ? [...warnings, { code: 'harmonic-check-failed', message: `${failure}: do not install it as built; a tuned filter or a specialist harmonic study is needed`, path: null, value: null, threshold: null }]
      : warnings,
    verification: shown === plain ? { ...shown.report.verification, resonanceNearHarmonic: false, warnings: deferredToScan(plain, shown.report.verification.warnings) } : shown.report.verification,
    cautions: shown.report.cautions.map((c) => (c === HARMONICS_NOT_CHECKED ? harmonicsChecked(wording.file) : c)),
    harmonics: {
      summary,
      chosen: chosen?.summary.name ?? null,
      variants: runs.map((v) => v.summary),
      check: shown.harmonics,
      basis: `each variant is sized for the same target with its effective fundamental output Q_r(U/U_r)²/(1 − p) and units rated for U/(1 − p) with the study’s voltage margin; every correction check is re-run, then the resonance scan and the capacitor duty of every step combination${wording.basis ? `; ${wording.basis}` : ''}`,
    },
  };
}

/**
 * The plain bank's resonance warning where the harmonic check scanned that bank in the same study: the estimate
 * from the supply path names an order, the scan says whether a present order lies near a peak. Without this the
 * answer read "needs a harmonic study and probably a detuned bank" beside a check that passed the plain bank.
 */
function deferredToScan<Check>(plain: VariantRun<Check>, warnings: readonly CorrectionWarning[] = plain.report.warnings): CorrectionWarning[] {
  const v = plain.report.verification;
  const near = v.resonanceOrders.filter((h) => resonanceNearOrders(h).length > 0);
  const states = v.resonanceStepStates;
  const nearPartial = states?.states.slice(1).filter((st) => st.nearOrders.length > 0) ?? [];
  return warnings.map((w) =>
    w.code === 'resonance' && near.length
      ? { ...w, message: warningText.lowResonanceScanned(near, v.resonanceNearOrders, plain.summary.lowestResonanceOrder, plain.summary.passes) }
      : w.code === 'resonance-step-state' && states && nearPartial.length
        ? { ...w, message: warningText.stepStateResonance(nearPartial, states.fixedPart, near.length > 0, { passes: plain.summary.passes }, v.resonanceCapacitance.onBoardKvar > 0) }
        : w,
  );
}

export interface ArrangementHarmonics {
  readonly arrangement: Arrangement;
  /** The variant chosen for this arrangement; null when none passes (or nothing was studied). */
  readonly chosen: string | null;
  readonly summary: string;
  readonly variants: readonly CorrectionVariant[];
}

/** The arrangement comparison with every arrangement's plain and detuned variants checked on the harmonics. */
export type HarmonicComparison = CorrectionComparison & {
  readonly harmonics: {
    readonly arrangements: readonly ArrangementHarmonics[];
    /** What the comparison recommended before the harmonic check. */
    readonly recommendedBeforeCheck: Arrangement | null;
    readonly rule: string;
  };
};

/**
 * `compareCorrections` on a board with harmonic data: each arrangement's bank
 * is checked with its detuned variants (`correctWithHarmonics`); the outcome
 * of each arrangement becomes its chosen variant, and the comparison's rule
 * (verdict, then least cost, then losses) picks among the arrangements whose
 * chosen variant passes, on the figures of those variants as shown.
 */
export function compareWithHarmonics(spec: HarmonicsBoardSpec, board: Board, study: unknown): HarmonicComparison {
  assertBoardModel(board);
  return compareWithBankCheck(board, study, (arrangementStudy, studied) => correctWithHarmonics(spec, board, arrangementStudy, studied));
}

/**
 * The arrangement comparison with each arrangement's study run by `correctChecked` (the correction
 * study with the harmonic check of its bank, `correctWithBankCheck`), given the comparison's own
 * report of that study, which it need not make again.
 */
export function compareWithBankCheck<Check>(
  board: Board,
  study: unknown,
  correctChecked: (arrangementStudy: unknown, studied: CorrectionReport) => HarmonicCorrectionReport<Check>,
): HarmonicComparison {
  const comparison = compareCorrections(board, study);
  const parsed = parseCorrectionSpec(study, board);
  const checked = comparison.outcomes.map((o) => {
    if (!o.report) return { outcome: o, harmonics: null };
    const report = correctChecked(specFor(parsed, o.arrangement), o.report);
    const { harmonics, ...plainReport } = report;
    return { outcome: { ...o, report: plainReport, figures: figuresOf(plainReport) }, harmonics };
  });
  const outcomes = checked.map((c) => c.outcome);
  // The rule applied to the variants as shown, among the arrangements with a variant that passes
  // (it meets the target by definition): the reason then reads the figures shown beside it.
  const passing = checked.filter((c) => c.harmonics?.chosen);
  const choice = recommendArrangement(outcomes, passing.map((c) => c.outcome.arrangement));
  const pick = passing.find((c) => c.outcome.arrangement === choice.recommended) ?? null;
  const before = comparison.recommended;
  const names = arrangementNames(board.system, conventionsOf(board).region);
  const name = (a: Arrangement) => names[a];
  // An arrangement that meets the target as plain yet fails the harmonic check in every variant is said so.
  const failing = checked.filter((c) => c.harmonics && !c.harmonics.chosen && ['meets-target', 'meets-target-at-nominal-capacitance'].includes(c.outcome.report!.status)).map((c) => name(c.outcome.arrangement));
  const failingWords = failing.length ? ` ${capitalised(failing.join(' and '))} ${failing.length > 1 ? 'fail' : 'fails'} the harmonic check in every variant.` : '';
  const checkWords = pick && pick.harmonics!.variants.length > 0 ? ` Harmonic check of the ${name(pick.outcome.arrangement)}: ${pick.harmonics!.summary}.` : '';
  const why = pick
    ? failingWords || checkWords
      ? `${choice.why.replace(/\.?$/, '.')}${failingWords}${checkWords}`
      : choice.why
    : checked.every((c) => !c.harmonics || c.harmonics.variants.length === 0)
      ? comparison.why
      : `${comparison.why.replace(/\.?$/, '.')} But no arrangement passes the harmonic check in any variant: a tuned filter or a specialist harmonic study is needed.`;
  return {
    ...comparison,
    outcomes,
    recommended: pick?.outcome.arrangement ?? before,
    meetsTarget: pick !== null && choice.meetsTarget,
    why,
    harmonics: {
      arrangements: checked.flatMap((c) => (c.harmonics ? [{ arrangement: c.outcome.arrangement, chosen: c.harmonics.chosen, summary: c.harmonics.summary, variants: c.harmonics.variants }] : [])),
      recommendedBeforeCheck: before,
      rule: 'an arrangement counts only with a variant (plain, or detuned at 5.67/7/14 %) that meets the target, resonates near no order present and keeps the capacitor duty within limits; each arrangement is shown as that variant',
    },
  };
}

/**
 * `trivar correct` on an installation file with harmonic data: the bank the
 * correction study builds on its board is checked against the installation's
 * harmonic model — every step combination scanned from its board with the
 * supply and every feeder on the way, the other banks of `harmonics.banks` in
 * place (all on, and switched in the joint scan), its units' duty with the
 * whole installation re-solved per state — and detuned variants are sized and
 * checked beside it, one chosen, exactly as on a board file
 * (correctWithHarmonics.ts). The file's bank on the equipment's board, if
 * any, is the one the study designs: the designed bank takes its place.
 *
 * A resonance near an order that the installation has with none of the new
 * bank in service (every step off, no fixed part) — with the other banks all
 * on, or in some state of theirs — is not the new bank's doing: it is
 * reported beside the check, not counted against it. A resonance the new bank
 * brings near an order (its own, or one of the other banks' moved by it) is.
 */
import type { Installation } from '../board/boardModel.js';
import { placeCorrection, measuredAt, leadingWithBanks, type CorrectInstallationOptions, type InstallationCorrection, type InstallationComparison } from '../correction/correctInstallation.js';
import { installationEffect } from '../correction/installationEffect.js';
import { bankOfReport, compareWithBankCheck, correctWithBankCheck, withStudyTolerance, type BankCheck, type BankChecker, type HarmonicComparison, type HarmonicCorrectionReport } from './correctWithHarmonics.js';
import { analyseInstallationHarmonics, resolveInstallationHarmonics, type HarmonicsInstallationSpec } from './studyInstallationHarmonics.js';
import { withBanksInService } from './banksInService.js';
import type { BoardScan, InstallationHarmonicsReport } from './harmonicsResult.js';
import { dutyRatio } from './capacitorDuty.js';
import { conditionWords } from './dutyConditions.js';
import { assertInstallationModel } from '../board/modelGuards.js';

/** What the check on an installation adds to the basis. */
const WORDING = {
  file: 'installation file',
  basis:
    'on the installation: the scan from the bank’s board with the supply and every feeder in the path and the other banks of harmonics.banks in place (all on, and switched), the duty with the whole installation re-solved in every state; the bank designed here takes the place of a harmonics.banks entry on its board',
} as const;

/** Checked orders the installation resonates near, seen from the equipment's board, with none of the new bank in service. */
export interface ResonanceWithoutBank {
  /** Orders within ±10 % of a peak with every other bank fully on. */
  readonly withOtherBanksOn: readonly number[];
  /** Orders within ±10 % of a peak only in some other state of the other banks, each with that state in words. */
  readonly withOtherBanksSwitched: readonly { readonly order: number; readonly peakOrder: number; readonly otherBanks: string }[];
}

interface HarmonicPlacement {
  /** Null when the new bank always has something in service (a fixed part) or nothing was checked. */
  readonly resonanceWithoutBank: ResonanceWithoutBank | null;
}

export type InstallationHarmonicCorrection = Omit<InstallationCorrection, 'report'> & HarmonicPlacement & { readonly report: HarmonicCorrectionReport<InstallationHarmonicsReport> };
export type InstallationHarmonicComparison = Omit<InstallationComparison, 'comparison'> & HarmonicPlacement & { readonly comparison: HarmonicComparison };

const NOTHING_BUILT: BankCheck<InstallationHarmonicsReport> = { check: null, peakOrders: [], resonantOrders: [], duty: null, thirdPercent: 0 };

/** What the scan found with none of the new bank in service; null when every state has some of it on. */
function resonanceWithoutBank({ scan, jointScan }: BoardScan): ResonanceWithoutBank | null {
  const k = scan.combinations.findIndex((c) => c.capacitorKvar === 0);
  if (k < 0) return null;
  const on = scan.combinations[k]!.nearOrders;
  const switched = (jointScan?.combinations[k]?.nearOrders ?? []).filter((n) => !on.includes(n.order));
  return { withOtherBanksOn: on, withOtherBanksSwitched: switched.map((n) => ({ order: n.order, peakOrder: n.peak.order, otherBanks: n.peak.otherBanks })) };
}

/**
 * The harmonic check of a bank on board `boardIndex` of an installation file: the installation's harmonic
 * model with the bank in place of the file's bank there, scanned and checked for duty from that board.
 * @param seen called with what the scan found with none of the bank in service
 */
export function installationBankChecker(spec: HarmonicsInstallationSpec, boardIndex: number, seen?: (without: ResonanceWithoutBank | null) => void): BankChecker<InstallationHarmonicsReport> {
  return (report) => {
    const resolved = resolveInstallationHarmonics(spec, { board: boardIndex, add: (board) => bankOfReport(board, report) });
    if (!resolved.models[boardIndex]!.bank) return NOTHING_BUILT;
    const models = resolved.models.map((m, b) => (b === boardIndex ? withStudyTolerance(m, report) : m));
    const check = analyseInstallationHarmonics({ ...resolved, models }, { scanBoards: [boardIndex] });
    const { scan, jointScan, capacitorDuty } = check.scans[0]!;
    const without = resonanceWithoutBank(check.scans[0]!);
    seen?.(without);
    // Only the states that put some of the new bank in service are its own, and only the orders it
    // brings a resonance near: one the installation resonates near without it (with the other banks
    // in the same setting: all on; in any state) is there whether or not it is installed.
    const alreadyOn = new Set(without?.withOtherBanksOn ?? []);
    const alreadySwitched = new Set([...alreadyOn, ...(without?.withOtherBanksSwitched.map((w) => w.order) ?? [])]);
    const inService = scan.combinations.flatMap((c, k) => (c.capacitorKvar > 0 ? [k] : []));
    const resonantOrders = [...new Set(inService.flatMap((k) => scan.combinations[k]!.nearOrders))].filter((o) => !alreadyOn.has(o)).sort((a, b) => a - b);
    const switched = jointScan
      ? inService.flatMap((k) =>
          jointScan.combinations[k]!.nearOrders
            .filter((n) => !resonantOrders.includes(n.order) && !alreadySwitched.has(n.order))
            .map((n) => ({ order: n.order, peak: n.peak.order, words: `${scan.combinations[k]!.label}: h ${n.peak.order.toFixed(2)} with ${n.peak.otherBanks}` })),
        )
      : undefined;
    // One reason per order: the state whose peak is nearest it.
    const nearest = switched && [...new Set(switched.map((s) => s.order))].sort((a, b) => a - b).map((order) => {
      const best = switched.filter((s) => s.order === order).reduce((b, s) => (Math.abs(s.peak - order) < Math.abs(b.peak - order) ? s : b));
      return { order, words: best.words };
    });
    // Each resonant order with the state whose peak is nearest it; the worst duty with its state and condition.
    const resonanceWords = resonantOrders
      .map((order) => {
        const hits = inService.flatMap((k) => (scan.combinations[k]!.nearOrders.includes(order) ? scan.combinations[k]!.peaks.map((p) => ({ label: scan.combinations[k]!.label, peak: p.order })) : []));
        const best = hits.reduce((b, x) => (Math.abs(x.peak - order) < Math.abs(b.peak - order) ? x : b));
        return `${order} (${best.label}: h ${best.peak.toFixed(2)})`;
      })
      .join(', ');
    const worst = capacitorDuty?.worst;
    const dutyWords = worst && capacitorDuty ? `worst ${dutyRatio(worst.figures, capacitorDuty.limits).toFixed(2)} × the limit: ${worst.label}, ${conditionWords(worst.condition)}` : undefined;
    return {
      check,
      ...(resonanceWords ? { resonanceWords } : {}),
      ...(dutyWords ? { dutyWords } : {}),
      peakOrders: inService.flatMap((k) => scan.combinations[k]!.peaks.map((p) => p.order)),
      resonantOrders,
      ...(nearest ? { resonantOrdersOtherBanksSwitched: nearest } : {}),
      duty: capacitorDuty,
      thirdPercent: Math.max(0, ...check.boards[boardIndex]!.lines.map((l) => l.current.orders.find((o) => o.order === 3)?.percentOfFundamental ?? 0)),
    };
  };
}

/**
 * `correctInstallation` on an installation file with harmonic data: the bank on its board checked
 * against the installation's harmonics, with detuned variants, one chosen (as `correctWithHarmonics`).
 * @param spec the validated installation file (loads' spectra, the `harmonics:` section)
 * @param installation `normaliseInstallation(spec).installation`; the file's banks on other boards are
 *   taken in service at the fundamental (`withBanksInService`), the one on the equipment's board replaced
 * @throws {InputError} for an unknown board, a study that does not fit the board, or a `harmonics.banks` entry that does not fit
 */
export function correctInstallationWithHarmonics(spec: HarmonicsInstallationSpec, installation: Installation, study: unknown, options?: CorrectInstallationOptions): InstallationHarmonicCorrection {
  assertInstallationModel(installation);
  // The harmonics section is checked before the study runs (its banks' boards, one per board).
  resolveInstallationHarmonics(spec);
  // The fundamental study sees what the harmonic check sees: the other boards' banks in service.
  const { board, placed } = placeCorrection(withBanksInService(installation, spec.harmonics?.banks), options);
  let without: ResonanceWithoutBank | null = null;
  const report = correctWithBankCheck(board, study, spec.harmonics?.detuning, installationBankChecker(spec, placed.boardIndex, (w) => (without ??= w)), WORDING);
  return { ...placed, ...measuredAt(report), report, leadingWithBanks: leadingWithBanks(placed, report), resonanceWithoutBank: without, effect: installationEffect(board, report.verification.equipment) };
}

/**
 * `compareInstallationCorrections` on an installation file with harmonic data: every arrangement's
 * bank checked with its detuned variants (as `compareWithHarmonics`), the recommended one's effect on every board.
 */
export function compareInstallationWithHarmonics(spec: HarmonicsInstallationSpec, installation: Installation, study: unknown, options?: CorrectInstallationOptions): InstallationHarmonicComparison {
  assertInstallationModel(installation);
  resolveInstallationHarmonics(spec);
  const { board, placed } = placeCorrection(withBanksInService(installation, spec.harmonics?.banks), options);
  let without: ResonanceWithoutBank | null = null;
  const checker = installationBankChecker(spec, placed.boardIndex, (w) => (without ??= w));
  const comparison = compareWithBankCheck(board, study, (arrangementStudy, studied) => correctWithBankCheck(board, arrangementStudy, spec.harmonics?.detuning, checker, WORDING, studied));
  const chosen = comparison.outcomes.find((o) => o.arrangement === comparison.recommended)?.report;
  const studied = comparison.outcomes.find((o) => o.report !== null)?.report;
  return {
    ...placed,
    ...(studied ? measuredAt(studied) : {}),
    comparison,
    leadingWithBanks: leadingWithBanks(placed, studied),
    resonanceWithoutBank: without,
    effect: chosen ? installationEffect(board, chosen.verification.equipment) : null,
  };
}

/**
 * How each load of a normalised board behaves at harmonic orders, resolved
 * from the board file: a current source with a spectrum (non-linear), a linear
 * impedance in series or parallel form, or a detuned capacitor step. Also the
 * supply's background distortion and the study's settings, with defaults
 * filled in (harmonicsDefaults.ts).
 */
import type { Board, BoardLoad, Terminal } from '../board/boardModel.js';
import { degToRad } from '../complex.js';
import { InputError, inputIssue } from '../errors.js';
import { HARMONICS_DEFAULTS } from './harmonicsDefaults.js';
import { CORRECTION_DEFAULTS } from '../correction/correctionDefaults.js';
import type { CapacitanceTolerance } from './harmonicsResult.js';
import type { HarmonicLoadSpec, HarmonicsBoardSpec, HarmonicsSectionSpec, InstalledBankSpec, LinearForm, SpectrumSpec } from './harmonicsSpec.js';
import { TYPICAL_SPECTRA } from './typicalSpectra.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { regionVoltageDistortionBasis, type VoltageDistortionBasis } from './voltageDistortionLimits.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';

/** One order of a spectrum: magnitude as a fraction of the fundamental, angle relative to h × the fundamental angle. */
export interface OrderContent {
  readonly order: number;
  readonly fraction: number;
  readonly angleRad: number;
}

export type LoadBehaviour =
  | { readonly kind: 'linear'; readonly form: LinearForm }
  | {
      readonly kind: 'non-linear';
      readonly spectrum: readonly OrderContent[];
      /** The built-in kind, or 'board file' for a spectrum written out. */
      readonly spectrumName: string;
      /** Where the figures come from. */
      readonly source: string;
    }
  /** A capacitor step behind a detuning reactor with p = X_L/X_C. */
  | { readonly kind: 'detuned'; readonly p: number };

/** A capacitor bank on the board: which added loads are its fixed part and its steps. */
export interface BankModel {
  /** Rated voltage of the capacitor elements, V (the lowest, when parts differ). */
  readonly ratedV: number;
  /** Nominal network voltage across one element, V (line-to-line for delta, line-to-neutral for star). */
  readonly elementNominalV: number;
  /** Per step, three-phase rated output, kvar (at rated voltage). */
  readonly stepsKvar: readonly number[];
  readonly fixedKvar: number;
  /** p as a fraction; 0 for a plain bank. */
  readonly detuning: number;
  /** Index in `board.loads` of the fixed part (null when there is none) and of each step. */
  readonly fixedLoad: number | null;
  readonly stepLoads: readonly number[];
}

export interface HarmonicModel {
  /** Per load of the board (with the bank, if any), in the board's order. */
  readonly loads: readonly LoadBehaviour[];
  /** Background supply voltage distortion, fraction of the nominal voltage per order. */
  readonly background: readonly OrderContent[];
  readonly resistance: 'constant' | 'skin-effect';
  readonly bank: BankModel | null;
  readonly pcc: { readonly shortCircuitRatio: number | null; readonly demandCurrentA: number | null } | null;
  readonly scan: { readonly maxOrder: number; readonly step: number };
  readonly capacitorStandard: 'ieee-18' | 'iec-60831-1';
  /** What the board voltages are judged against: named in the file, or the board's region's document. */
  readonly voltageDistortionLimits: { readonly basis: VoltageDistortionBasis; readonly from: 'board file' | 'region' };
  /** Capacitance tolerance of the bank's units, % (the duty is checked at each end). */
  readonly capacitanceTolerance: CapacitanceTolerance;
}

function spectrumContent(spec: Exclude<SpectrumSpec, string>): OrderContent[] {
  return spec.map((e) => ({ order: e.order, fraction: e.percent / 100, angleRad: degToRad(e.angleDeg ?? 0) })).sort((a, b) => a.order - b.order);
}

function behaviourOf(spec: HarmonicLoadSpec | undefined, load: BoardLoad, defaultForm: LinearForm): LoadBehaviour {
  const spectrum = spec?.spectrum;
  if (spectrum !== undefined && spectrum !== 'linear') {
    if (typeof spectrum === 'string') {
      const typical = TYPICAL_SPECTRA[spectrum];
      return {
        kind: 'non-linear',
        spectrum: typical.orders.map(([order, percent]) => ({ order, fraction: percent / 100, angleRad: 0 })),
        spectrumName: spectrum,
        source: `typical: ${typical.source}`,
      };
    }
    return { kind: 'non-linear', spectrum: spectrumContent(spectrum), spectrumName: 'board file', source: 'given in the board file' };
  }
  // Loads written in ohms (and equipment added by a study) keep their series R + jX.
  const form = spec?.linearForm ?? (spec?.ohms || load.origin === 'added' ? 'series' : defaultForm);
  return { kind: 'linear', form };
}

/**
 * Where an installed bank's capacitors of one part sit on a board of this system, with the connection its
 * parts are reported under; or, where the bank cannot be built on it, what the file should give instead.
 * Three-phase: three elements, line to line (delta) or to the neutral bar (star; on a three-wire supply a
 * floating star point). Split-phase: the one line-to-line capacitor (delta); a bank from each line to the
 * neutral would be two single-phase capacitors switched together, which no connection of a load names,
 * so it is refused with its line-to-line form. Single-phase: one capacitor from the line to the neutral (star).
 */
export function installedBankLayout(board: Pick<Board, 'system' | 'phases' | 'hasNeutral'>, connection: InstalledBankSpec['connection']):
  | { readonly ok: true; readonly pairs: (floatingStar: string) => [Terminal, Terminal][]; readonly connection: BoardLoad['connection'] }
  | { readonly ok: false; readonly expected: string } {
  const star = connection === 'star';
  if (board.phases.length === 3)
    return star
      ? { ok: true, connection: 'ABC-star', pairs: (floating) => (['A', 'B', 'C'] as const).map((ph): [Terminal, Terminal] => [ph, board.hasNeutral ? 'N' : (floating as Terminal)]) }
      : { ok: true, connection: 'ABC-delta', pairs: () => [['A', 'B'], ['B', 'C'], ['C', 'A']] };
  if (board.system === 'split-phase')
    return star
      ? { ok: false, expected: 'connection: delta on a split-phase board (capacitors across the two lines; line-to-neutral capacitors switched together are not modelled: give them as loads in ohms)' }
      : { ok: true, connection: 'A-B', pairs: () => [['A', 'B']] };
  return star ? { ok: true, connection: 'A-N', pairs: () => [['A', 'N']] } : { ok: false, expected: 'connection: star on a single-phase board (one capacitor from the line to the neutral; there is no second line for a delta)' };
}

/**
 * Adds an installed bank to a board as one constant-impedance load per part
 * (fixed part, then each step), all steps on, its capacitors placed as
 * `installedBankLayout` says (a part's kvar shared equally by its elements). A
 * detuned step is entered at its effective fundamental susceptance B_C/(1 − p).
 * @throws {InputError} at `bank.connection` for a bank the board's system cannot take (the studies check the file's field first)
 */
export function addInstalledBank(board: Board, bank: InstalledBankSpec): { board: Board; model: BankModel } {
  assertBoardModel(board);
  const layout = installedBankLayout(board, bank.connection);
  if (!layout.ok) throw new InputError([inputIssue('not_applicable', 'bank.connection', layout.expected, bank.connection)], `addInstalledBank: the bank does not fit a ${board.system} board`);
  const p = (bank.detuningPercent ?? 0) / 100;
  const star = bank.connection === 'star';
  const vNominal = star ? board.nominalLineToNeutralV : (board.nominalLineToLineV ?? board.nominalLineToNeutralV);
  const loads: BoardLoad[] = [];
  const part = (name: string, kvar: number): number => {
    const index = board.loads.length + loads.length;
    const pairs = layout.pairs(`star:${index}`);
    const bCapacitor = (kvar * 1000) / pairs.length / bank.ratedV ** 2;
    const bEffective = bCapacitor / (1 - p);
    loads.push({
      name,
      connection: layout.connection,
      model: 'constant-impedance',
      origin: 'added',
      branches: pairs.map(([from, t]) => ({ from, to: t, sNominal: { re: 0, im: -bEffective * vNominal * vNominal }, vNominal, zip: { z: 1, i: 0, p: 0 } })),
    });
    return index;
  };
  const fixedKvar = bank.fixedKvar ?? 0;
  const fixedLoad = fixedKvar > 0 ? part('bank fixed part', fixedKvar) : null;
  const stepLoads = bank.stepsKvar.map((kvar, k) => part(`bank step ${k + 1}`, kvar));
  return {
    board: { ...board, loads: [...board.loads, ...loads] },
    model: { ratedV: bank.ratedV, elementNominalV: vNominal, stepsKvar: bank.stepsKvar, fixedKvar, detuning: p, fixedLoad, stepLoads },
  };
}

/**
 * Resolves the harmonic behaviour of every load of `board` (normalised from
 * `spec`, the bank already added when there is one) and the study settings.
 */
export function resolveHarmonicModel(spec: Pick<HarmonicsBoardSpec, 'loads' | 'harmonics'>, board: Board, bank: BankModel | null): HarmonicModel {
  assertBoardModel(board);
  const section: HarmonicsSectionSpec = spec.harmonics ?? {};
  const defaultForm = section.linearForm ?? HARMONICS_DEFAULTS.linearForm;
  const bankLoads = new Set(bank ? [...(bank.fixedLoad === null ? [] : [bank.fixedLoad]), ...bank.stepLoads] : []);
  const loads = board.loads.map((load, i): LoadBehaviour => {
    if (bankLoads.has(i) && bank && bank.detuning > 0) return { kind: 'detuned', p: bank.detuning };
    return behaviourOf(load.origin === 'board' ? spec.loads[i] : undefined, load, defaultForm);
  });
  return {
    loads,
    background: section.background ? spectrumContent(section.background) : [],
    resistance: section.resistance ?? HARMONICS_DEFAULTS.resistance,
    bank,
    pcc: section.pcc ? { shortCircuitRatio: section.pcc.shortCircuitRatio ?? null, demandCurrentA: section.pcc.demandCurrentA ?? null } : null,
    scan: { maxOrder: section.scan?.maxOrder ?? HARMONICS_DEFAULTS.scanMaxOrder, step: section.scan?.step ?? HARMONICS_DEFAULTS.scanStep },
    capacitorStandard: section.capacitorStandard ?? (board.frequencyHz === 60 ? 'ieee-18' : 'iec-60831-1'),
    voltageDistortionLimits: section.voltageDistortionLimits
      ? { basis: section.voltageDistortionLimits, from: 'board file' }
      : { basis: regionVoltageDistortionBasis(conventionsOf(board).region), from: 'region' },
    capacitanceTolerance: {
      minusPercent: section.bank?.capacitanceTolerance?.minusPercent ?? CORRECTION_DEFAULTS.capacitanceTolerance.minusPercent,
      plusPercent: section.bank?.capacitanceTolerance?.plusPercent ?? CORRECTION_DEFAULTS.capacitanceTolerance.plusPercent,
    },
  };
}

/** Every order something injects or the supply carries, ascending. */
export function ordersPresent(model: HarmonicModel): number[] {
  checkObjectArgument(model, 'model', "a board's harmonic model from resolveHarmonicModel(...)", ['background', 'loads']);
  const orders = new Set<number>(model.background.map((b) => b.order));
  for (const load of model.loads) if (load.kind === 'non-linear') for (const o of load.spectrum) orders.add(o.order);
  return [...orders].sort((a, b) => a - b);
}

/**
 * What a bank state connects, as text: per branch (from-to), the summed
 * susceptance of the parts that are on, to 12 digits. Equal keys are the same network.
 * The branches in code-unit order: any fixed order makes equal states equal keys, and
 * localeCompare (a collator per call) cost a correction with harmonic data some 60 ms.
 */
export function stateKey(board: Board, bank: BankModel, steps: readonly boolean[]): string {
  assertBoardModel(board);
  const on = new Map<string, number>();
  const parts = [...(bank.fixedLoad === null ? [] : [bank.fixedLoad]), ...bank.stepLoads.filter((_, k) => steps[k])];
  for (const l of parts)
    for (const b of board.loads[l]!.branches) {
      const where = `${b.from}>${b.to.startsWith('star:') ? 'star' : b.to}`;
      on.set(where, (on.get(where) ?? 0) - b.sNominal.im / (b.vNominal * b.vNominal));
    }
  return [...on].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)).map(([k, v]) => `${k}:${v.toPrecision(12)}`).join(' ');
}


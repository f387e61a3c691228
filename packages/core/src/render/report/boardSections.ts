/** Report sections about the board itself: description, panel schedule, solved results, lost neutral. */
import type { BoardBaseSpec, ImpedanceSpec, SystemKind, WindingSpec } from '../../board/boardSchema.js';
import { regionWords } from '../../board/conventions/regionWords.js';
import { describeConductor, isPerPhaseLine } from '../../board/feederModel.js';

/** A source impedance as entered: one for all phases, or one per phase. */
function impedanceWords(z: NonNullable<BoardBaseSpec['supply']['impedance']>, naming: PhaseNaming): string {
  if ('r' in z) return `${z.r} + j${z.x} Ω`;
  return (['A', 'B', 'C'] as const)
    .filter((p) => z[p])
    .map((p) => `${labelIn(naming, p)} ${(z[p] as ImpedanceSpec).r} + j${(z[p] as ImpedanceSpec).x} Ω`)
    .join(', ');
}
import type { BoardResult, LoadReading, PowerReading } from '../../analysis/boardResult.js';
import { fixed } from '../svgText.js';
import { assumedPfNote, isExportKW, powerFactorText, signedPfText } from '../powerFactorText.js';
import { OPEN_NEUTRAL_BAND, WARNING_THRESHOLDS } from '../../analysis/boardWarnings.js';
import { OPEN_NEUTRAL_COLUMN_KEY, OPEN_NEUTRAL_METHOD } from '../../analysis/openNeutralWording.js';
import { labelIn, type PhaseNaming } from '../../board/conventions/phaseNames.js';
import { bandVolts, bandVoltsWords, bandWords, customLimits } from '../../board/conventions/voltageLimits.js';
import { percentBesideBand, voltageBesideBand } from '../../board/conventions/voltageBesideBand.js';
import { bandDecimalsOf, judgedNominals } from '../../analysis/voltageCheck.js';
import { worstBranch } from '../../analysis/readLoads.js';
import { renderPhasorDiagram } from '../renderPhasorDiagram.js';
import { renderSequenceDiagram } from '../renderSequenceDiagram.js';
import type { ReportBlock, ReportSection } from './reportDocument.js';
import { nominalVoltageWords, nonStandardNominalNote, sourceVoltageWords } from '../nominalVoltageWords.js';

const SYSTEM_WORDS: Readonly<Record<string, string>> = {
  'three-phase-4wire': 'three-phase 4-wire (lines and neutral)',
  'three-phase-3wire': 'three-phase 3-wire (no neutral)',
  'split-phase': 'split-phase (two lines and neutral)',
  'single-phase': 'single-phase 2-wire',
};

/** "Phase" on a three-phase board; on a split-phase or single-phase board, whose lines are not phases of a three-phase system, `other`. */
const phaseWord = (system: string, other: string, phase = 'Phase'): string => (system.startsWith('three-phase') ? phase : other);

/** A reading's PF as the text tables print it (export, no tag at 1.000 with 0.00 kvar); — for none. */
const pfWords = (r: Pick<PowerReading, 'pf' | 'sense' | 'kVA' | 'kW' | 'kvar'>): string => powerFactorText(r, '—');
/** Where the board's phase voltages are measured from, as the region and the file's supply name it (the transformer's center tap, or the source's). */
const sourcePointWords = (result: BoardResult): string =>
  regionWords(result.conventions.region, result.board.system as SystemKind, result.board.suppliedByTransformer ? 'transformer' : 'source').sourceNeutralPoint;
/** A current's angle, where the current prints as more than 0.0 A (a round-off current's angle is noise), as `trivar solve` leaves it. */
const currentAngle = (i: { magnitude: number; angleDeg: number }): string => (fixed(i.magnitude, 1) === '0.0' ? '' : fixed(i.angleDeg, 1));
const orDash = (x: number | null | undefined, digits: number): string => (x === null || x === undefined ? '—' : fixed(x, digits));

/** A conductor's rating as the file gives it, and its parallel set's where there is one: `, rated 60 A each, 120 A the set of 2`. */
const ratingWords = (c: { readonly ratingA?: number | undefined; readonly parallel?: number | undefined }): string =>
  c.ratingA === undefined ? '' : (c.parallel ?? 1) > 1 ? `, rated ${c.ratingA} A each, ${c.ratingA * c.parallel!} A the set of ${c.parallel}` : `, rated ${c.ratingA} A`;

export function conductorWords(line: NonNullable<BoardBaseSpec['feeder']>['line'], feeder?: BoardBaseSpec['feeder'], naming: PhaseNaming = 'A/B/C'): string {
  if (!line) return 'none entered (zero impedance)';
  if (isPerPhaseLine(line)) return (['A', 'B', 'C'] as const).filter((p) => line[p]).map((p) => `${labelIn(naming, p)}: ${conductorWords(line[p], feeder)}`).join('; ');
  const c = line;
  const library = describeConductor(c, feeder);
  if (library) return `${library}${ratingWords(c)}`;
  const parts: string[] = [];
  if (c.lengthM !== undefined) parts.push(`${c.lengthM} m at ${c.rOhmPerKm ?? 0} + j${c.xOhmPerKm ?? 0} Ω/km`);
  if (c.r !== undefined || c.x !== undefined) parts.push(`${c.r ?? 0} + j${c.x ?? 0} Ω`);
  if (c.ratingA !== undefined) parts.push(ratingWords(c).slice(2));
  return parts.join(', ') || 'zero impedance';
}

/** Each unit of a bank or an open delta with its rating: `L1-L2 10 kVA, 3 %` (or its impedance where given in ohms). */
function unitList(units: Partial<Record<string, WindingSpec>>, name: (key: string) => string): string {
  return Object.entries(units)
    .flatMap(([key, w]) => (w ? [`${name(key)} ${'kVA' in w ? `${w.kVA} kVA, ${w.impedancePercent} %` : `${w.r} + j${w.x} Ω`}`] : []))
    .join('; ');
}

/** The supply in words: transformer, source impedance, bank or ideal; zero-sequence data when entered. */
export function sourceWords(s: BoardBaseSpec['supply'], naming: PhaseNaming = 'A/B/C'): string {
  const base = s.transformer
    ? `transformer ${s.transformer.kVA} kVA, impedance ${s.transformer.impedancePercent} %, X/R ${s.transformer.xOverR}${s.impedance ? `, plus ${impedanceWords(s.impedance, naming)}` : ''}`
    : s.impedance
      ? `${impedanceWords(s.impedance, naming)}${'r' in s.impedance ? ' per phase' : ''}`
      : s.bank
        ? `a bank of single-phase units, one per phase (${unitList(s.bank, (p) => `${labelIn(naming, p)}-N`)})`
        : s.openDelta
          ? `an open delta of two single-phase units (${unitList(s.openDelta, (pair) => labelIn(naming, pair))})`
          : 'ideal (zero source impedance)';
  return s.zeroSequence ? `${base}; zero-sequence ${s.zeroSequence.r} + j${s.zeroSequence.x} Ω` : base;
}

/** System, nominal voltage and frequency of a board, as facts. */
export function systemFacts(result: BoardResult): [string, string][] {
  const b = result.board;
  return [
    ['System', b.withoutNeutral ? `${b.system === 'split-phase' ? 'split-phase, two lines' : 'three-phase 3-wire'}: no neutral at this board (its feeder, or one upstream, has line conductors only)` : (SYSTEM_WORDS[b.system] ?? b.system)],
    ['Nominal voltage', nominalVoltageWords(b)],
    result.sequences ? ['Frequency and phase sequence', `${b.frequencyHz} Hz, ${labelIn(result.conventions.phaseNames, b.sequence)}`] : ['Frequency', `${b.frequencyHz} Hz`],
  ];
}

export function installationSection(spec: BoardBaseSpec, result: BoardResult): ReportSection {
  const b = result.board;
  const s = spec.supply;
  const items: [string, string][] = [
    ['Board', b.name],
    ...systemFacts(result),
    ['Source', sourceWords(s, result.conventions.phaseNames)],
    ['Source voltages', sourceVoltageWords(b, s.emf !== undefined, (p) => labelIn(result.conventions.phaseNames, p))],
    [b.system === 'single-phase' ? 'Feeder, line' : 'Feeder, each line', conductorWords(spec.feeder?.line, spec.feeder, result.conventions.phaseNames)],
  ];
  if (result.neutral !== null) items.push(['Feeder, neutral', conductorWords(spec.feeder?.neutral, spec.feeder, result.conventions.phaseNames)]);
  if (b.neutralOpen) items.push(['Neutral', 'entered as broken (what-if)']);
  items.push(['Circuits', `${spec.loads.length}`]);
  const blocks: ReportBlock[] = [{ kind: 'facts', items }];
  if (spec.note) blocks.push({ kind: 'paragraph', text: spec.note });
  return { id: 'installation', title: 'Board and supply', blocks };
}

/** The circuit's voltage as `trivar solve` quotes it (worstBranch); none for a circuit without branches. */
const circuitVoltage = (l: LoadReading) => (l.branches.length ? worstBranch(l) : undefined);

/** The panel schedule of a board: the circuits of the file (numbers, breakers) with their solved figures. */
export function scheduleTable(loads: BoardBaseSpec['loads'], result: BoardResult): ReportBlock {
  const boardLoads = result.loads.filter((l) => l.origin === 'board');
  const rows = boardLoads.map((l, k) => {
    const entered = loads[k];
    const worst = circuitVoltage(l);
    // Circuit numbers and breakers only as the file gives them: a schedule never numbers circuits itself.
    return [
      entered?.circuit ?? '—',
      l.name,
      labelIn(result.conventions.phaseNames, l.connection),
      entered?.breakerA !== undefined ? `${fixed(entered.breakerA, 0)}${entered.poles !== undefined ? ` ${entered.poles}P` : ''}` : '—',
      l.model,
      fixed(l.kW, 2),
      fixed(l.kvar, 2),
      fixed(l.currentA, 1),
      `${pfWords(l)}${l.pfAssumed ? ' *' : ''}`,
      worst ? percentBesideBand(result.voltageCheck.limits, worst.voltagePercent) : '—',
    ];
  });
  return {
    kind: 'table',
    caption: 'Circuits as solved (kW, kvar and current at the voltage each circuit really gets)',
    columns: [
      { label: 'No.' },
      { label: 'Circuit' },
      { label: phaseWord(result.board.system, 'Connection') },
      { label: 'Breaker A, poles', align: 'right' },
      { label: 'Model' },
      { label: 'kW', align: 'right' },
      { label: 'kvar', align: 'right' },
      { label: 'A', align: 'right' },
      { label: 'PF', align: 'right' },
      { label: 'V %nom', align: 'right' },
    ],
    rows,
    note: `A: largest current the circuit draws from one line. V %nom: the voltage across the part of the circuit furthest from its nominal, above or below, % of that nominal (as trivar solve quotes it).${
      loads.some((l) => l.breakerA !== undefined || l.circuit !== undefined) ? '' : ' No. and breaker: from the circuit, breakerA and poles fields of each load in the board file (none given here).'
    }${boardLoads.some((l) => l.pfAssumed) ? ` ${assumedPfNote(boardLoads.filter((l) => l.pfAssumed).map((l) => l.kW))}` : ''}`,
  };
}

export function scheduleSection(spec: BoardBaseSpec, result: BoardResult): ReportSection {
  return { id: 'schedule', title: 'Panel schedule', blocks: [scheduleTable(spec.loads, result)] };
}

/** The voltage band the report judges against, % of nominal either side. */
export interface VoltageBand {
  readonly lowPercent: number;
  readonly highPercent: number;
  /** Where the band comes from, for the table's note. */
  readonly source: string;
}

/** The band of the board's own voltage limits (`conventions.voltageLimits`), which its warnings and verdict use. */
export function bandOf(result: BoardResult): VoltageBand {
  const l = result.voltageCheck.limits;
  const nonStandard = nonStandardNominalNote(result.board);
  return {
    lowPercent: -l.underPercent,
    highPercent: l.overPercent,
    source: `${bandWords(l)} of nominal (${l.preset}), on this board ${bandVoltsWords(l, judgedNominals(result), bandDecimalsOf(result))}: ${l.source}${nonStandard ? `. ${nonStandard}` : ''}`,
  };
}

/** The EN 50160 low-voltage supply band (±10 %), the IEC default. */
export const DEFAULT_VOLTAGE_BAND: VoltageBand = {
  lowPercent: -WARNING_THRESHOLDS.voltageBandPercent,
  highPercent: WARNING_THRESHOLDS.voltageBandPercent,
  source: `±${WARNING_THRESHOLDS.voltageBandPercent} % of nominal, the EN 50160 low-voltage supply band trivar's warnings use`,
};

/** A report band as the limits judgeVoltage and voltageBesideBand take. */
const bandLimits = (band: VoltageBand) => customLimits(-band.lowPercent, band.highPercent);

/** Every phase and line-to-line voltage of the board against the band: its limits in volts, the margin and a verdict. */
export function voltageLimitsTable(result: BoardResult, band: VoltageBand = bandOf(result)): ReportBlock {
  const b = result.board;
  const label = (t: string) => labelIn(result.conventions.phaseNames, t);
  const limits = bandLimits(band);
  const row = (name: string, v: number, percent: number, nominal: number): string[] => {
    // Judged as the warnings and the verdict are (judgeVoltage); a figure near an edge, its allowed volts
    // and its margin printed with the decimals that show its side.
    const shown = voltageBesideBand(limits, { volts: v, percent });
    const margin = Math.min(percent - (100 + band.lowPercent), 100 + band.highPercent - percent);
    return [
      name,
      shown.volts,
      shown.percent,
      ((volts) => `${volts.low} – ${volts.high}`)(bandVolts(limits, nominal, Math.max(1, shown.voltsDecimals))),
      fixed(shown.side === 'within' ? Math.max(0, margin) : margin, shown.percentDecimals),
      shown.side === 'under' ? 'below the band' : shown.side === 'over' ? 'above the band' : 'within',
    ];
  };
  // The voltages the board's verdict judges (voltageCheck.ts): phase voltages only where a neutral gives them meaning.
  const judged = result.neutral !== null || result.lineToLine.length === 0 ? result.phases : [];
  const rows = judged.map((p) => row(label(`${p.phase}-N`), p.voltage.magnitude, p.voltagePercent, b.nominalLineToNeutralV));
  if (b.nominalLineToLineV !== null && result.phases.length > 1)
    for (const l of result.lineToLine) rows.push(row(label(l.pair), l.voltage.magnitude, l.voltagePercent, b.nominalLineToLineV));
  return {
    kind: 'table',
    caption: 'Voltages against the limits',
    columns: [{ label: 'Voltage' }, { label: 'V', align: 'right' }, { label: '%nom', align: 'right' }, { label: 'Allowed V', align: 'right' }, { label: 'Margin %', align: 'right' }, { label: 'Verdict' }],
    rows,
    note: `Band: ${band.source}. Margin: distance to the nearer limit, % of nominal (negative outside the band).${result.neutral ? '' : ' Phase voltages to the centroid of the line voltages (no neutral).'}`,
  };
}

export interface ResultBlockOptions {
  /** Start of every figure name, so figures of several boards stay apart. @defaultValue '' */
  readonly figurePrefix?: string;
  /** Draw the symmetrical components too (three-phase boards). @defaultValue true */
  readonly sequenceFigure?: boolean;
  /** The band voltages are judged against. @defaultValue `DEFAULT_VOLTAGE_BAND` */
  readonly band?: VoltageBand;
}

/**
 * What the board draws and where it goes, in the words of `trivar solve`'s power balance, so the figures add up:
 * loads + losses + boards beyond = what comes in. A sub-board's losses are its own feeder's and what comes in is
 * what enters that feeder at the board feeding it; the main board's come from the source, its windings included.
 */
function powerBalanceFacts(result: BoardResult): [string, string][] {
  const l = result.losses;
  const feeding = result.incomer?.fedFrom ?? null;
  // What the board passes on to the boards it feeds (their loads and feeders), as solve's balance works it out.
  const beyondKW = result.source.kW - result.totals.kW - l.totalKW;
  const beyondKvar = result.source.kvar - result.totals.kvar - l.totalKvar;
  const feedsOthers = Math.abs(beyondKW) + Math.abs(beyondKvar) > 1e-6 * Math.max(1, Math.abs(result.source.kW) + Math.abs(result.source.kvar));
  // The parts as solve lists them; no neutral part on a board without one.
  const parts = `line conductors ${fixed(l.lineFeederKW, 3)}${result.neutral ? `, neutral ${fixed(l.neutralKW, 3)}` : ''}`;
  const losses: [string, string] = feeding
    ? [`Losses in its feeder (from ${feeding})`, `${fixed(l.totalKW, 3)} kW (${parts})`]
    : result.board.idealSource
      ? ['Losses in the feeder (the source is ideal)', `${fixed(l.totalKW, 3)} kW (${parts})`]
      : ['Losses in source and feeder', `${fixed(l.totalKW, 3)} kW (source ${fixed(l.sourceKW, 3)}, ${parts})`];
  // A board with a generating circuit: its loads are net of it, as solve labels them.
  const net = result.loads.some((load) => isExportKW(load.kW)) ? ' (net: consumption minus generation)' : '';
  // Power flowing back is said as solve says it: to the board feeding it (or the supply), exported.
  const inflow: [string, string] = fixed(result.source.kW, 3).startsWith('-')
    ? [feeding ? `To ${feeding}` : 'To the source', `${fixed(-result.source.kW, 3)} kW exported${varsWords(result.source.kvar)}`]
    : [feeding ? `From ${feeding}` : 'From the source', `${fixed(result.source.kW, 3)} kW, ${fixed(result.source.kvar, 3)} kvar`];
  return [
    [`${feedsOthers || feeding ? 'Loads on this board' : 'Loads'}${net}`, `${fixed(result.totals.kW, 3)} kW, ${fixed(result.totals.kvar, 3)} kvar`],
    losses,
    ...(feedsOthers ? [['Boards beyond (the boards it feeds, with their feeders)', `${fixed(beyondKW, 3)} kW, ${fixed(beyondKvar, 3)} kvar`] as [string, string]] : []),
    inflow,
  ];
}

/** The vars of an exporting board in words, load convention (+kvar absorbed), as solve's balance words them. */
function varsWords(kvar: number): string {
  const shown = fixed(Math.abs(kvar), 3);
  if (Number(shown) === 0) return ', with no reactive power';
  return `; the board ${kvar > 0 ? 'absorbs' : 'supplies'} ${shown} kvar`;
}

/** The solved figures of a board as report blocks: the V/I table, the limits, the phasors, power factors and unbalance, warnings. */
export function resultBlocks(result: BoardResult, options: ResultBlockOptions = {}): ReportBlock[] {
  const prefix = options.figurePrefix ?? '';
  const blocks: ReportBlock[] = [];
  // As the text report does: a collapse is said before any figure, so none is read as a working board.
  if (result.operatingPoint.collapsed)
    blocks.push({ kind: 'list', tone: 'warning', items: ['Supply collapse: the supply cannot carry these loads; the figures below are not a working board.', ...result.operatingPoint.findings] });
  const label = (t: string) => labelIn(result.conventions.phaseNames, t);
  const band = options.band ?? bandOf(result);
  // Phase voltages are judged where a neutral gives them meaning (voltageCheck.ts): those beside the band read its way.
  const judgedPhases = result.neutral !== null || result.lineToLine.length === 0;
  const shownAgainstBand = (volts: number, percent: number) =>
    judgedPhases ? voltageBesideBand(bandLimits(band), { volts, percent }) : { volts: fixed(volts, 1), percent: fixed(percent, 1) };
  const rows = result.phases.map((p) => [
    label(p.phase),
    shownAgainstBand(p.voltage.magnitude, p.voltagePercent).volts,
    fixed(p.voltage.angleDeg, 1),
    shownAgainstBand(p.voltage.magnitude, p.voltagePercent).percent,
    fixed(p.current.magnitude, 1),
    currentAngle(p.current),
    fixed(p.kW, 2),
    fixed(p.kvar, 2),
    pfWords(p),
    orDash(p.loadingPercent, 0),
  ]);
  if (result.neutral) {
    const n = result.neutral;
    rows.push(['N', n.barVoltage ? fixed(n.barVoltage.magnitude, 1) : '—', n.barVoltage ? fixed(n.barVoltage.angleDeg, 1) : '—', '', fixed(n.current.magnitude, 1), currentAngle(n.current), '', '', '', orDash(n.loadingPercent, 0)]);
  }
  blocks.push({
    kind: 'table',
    caption: 'Voltages and currents at the board',
    columns: [
      { label: 'Line' },
      { label: 'V', align: 'right' },
      { label: '∠V °', align: 'right' },
      { label: '%nom', align: 'right' },
      { label: 'A', align: 'right' },
      { label: '∠I °', align: 'right' },
      { label: 'kW', align: 'right' },
      { label: 'kvar', align: 'right' },
      { label: 'PF', align: 'right' },
      { label: '% rating', align: 'right' },
    ],
    rows,
    // A single-phase 2-wire board has no line pair: no line-to-line sentence, as solve prints none.
    note: [
      result.neutral
        ? `${phaseWord(result.board.system, result.phases.length > 1 ? "Each line's voltage" : 'Voltage of the line', 'Phase voltages')} to the neutral bar; the N row gives the neutral bar voltage to ${sourcePointWords(result)} and the neutral current.`
        : 'Phase voltages to the centroid of the line voltages (no neutral).',
      ...(result.lineToLine.length
        ? [`Line-to-line: ${result.lineToLine.map((l) => `${label(l.pair)} ${voltageBesideBand(bandLimits(band), { volts: l.voltage.magnitude, percent: l.voltagePercent }).volts} V`).join(', ')}.`]
        : []),
    ].join(' '),
  });
  blocks.push(voltageLimitsTable(result, band));
  blocks.push({ kind: 'figure', name: `${prefix}phasors`, caption: `Phasor diagram of ${result.board.name} as solved`, svg: renderPhasorDiagram(result) });
  const pf = result.powerFactor;
  const facts: [string, string][] = [
    ...powerBalanceFacts(result),
    // A PF of nothing (no power flows) is "—"; an exporting board's reads "1.000 export", as in trivar solve.
    ['Power factor, vector |ΣS|', `${signedPfText(pf.vector.pf, '—')} (${fixed(pf.vector.kVA, 2)} kVA)`],
    ['Power factor, arithmetic Σ|V||I|', `${signedPfText(pf.arithmetic.pf, '—')} (${fixed(pf.arithmetic.kVA, 2)} kVA)`],
  ];
  if (pf.effective) facts.push(['Power factor, effective (IEEE 1459)', `${signedPfText(pf.effective.pf, '—')} (${fixed(pf.effective.kVA, 2)} kVA)`]);
  if (pf.positiveSequence) facts.push(['Power factor, positive sequence', signedPfText(pf.positiveSequence.pf, '—')]);
  const u = result.unbalance;
  if (u) {
    facts.push(['Voltage unbalance factor |V2|/|V1| (IEC)', `${fixed(u.voltageFactorPercent, 2)} %`]);
    facts.push(['Line-voltage unbalance rate (NEMA MG 1)', `${fixed(u.lineVoltageRatePercent, 2)} %`]);
    facts.push(['Current |I2|/|I1|, |I0|/|I1|', `${fixed(u.currentNegativePercent, 1)} %, ${fixed(u.currentZeroPercent, 1)} %`]);
    facts.push(['Three-phase motor derating (NEMA MG 1)', u.motorDeratingFactor === null ? 'operation not recommended (above 5 %)' : `× ${fixed(u.motorDeratingFactor, 2)}`]);
  }
  blocks.push({ kind: 'facts', items: facts });
  if (result.sequences && options.sequenceFigure !== false) blocks.push({ kind: 'figure', name: `${prefix}sequences`, caption: 'Symmetrical components of the voltages and line currents', svg: renderSequenceDiagram(result) });
  blocks.push(
    result.warnings.length
      ? { kind: 'list', tone: 'warning', items: result.warnings.map((w) => w.message) }
      : { kind: 'paragraph', text: 'No warnings: every figure is within the thresholds trivar checks.' },
  );
  return blocks;
}

/**
 * @param fileBank the bank of the file's harmonics section, where it has one: these results are the board
 *   without it (the harmonic study switches it in), which the section says first
 */
export function resultsSection(result: BoardResult, fileBank?: { readonly stepsKvar: readonly number[]; readonly fixedKvar?: number; readonly ratedV: number; readonly connection: string }): ReportSection {
  const note: ReportBlock[] = fileBank
    ? [
        {
          kind: 'paragraph',
          text: `The board as its loads are: the capacitor bank of the file's harmonics section (${[...(fileBank.fixedKvar ? [`${fileBank.fixedKvar} kvar fixed`] : []), `steps ${fileBank.stepsKvar.join(' + ')} kvar`].join(', ')}, ${fileBank.ratedV} V units, ${fileBank.connection}) is not in these figures; the harmonic study has it in, every step on.`,
        },
      ]
    : [];
  return { id: 'results', title: 'Results', blocks: [...note, ...resultBlocks(result)] };
}

/**
 * The broken-neutral study with every finding `trivar solve` gives on it: the state reached, the same board
 * with every load as a constant impedance, another solution of the same equations, the loads below the
 * low-voltage rule, and the findings that say how far those voltages can be trusted, then the cautions.
 */
export function openNeutralSection(result: BoardResult): ReportSection | null {
  const on = result.openNeutral;
  if (!on || !on.applicable) return null;
  const impedance = on.impedanceModel;
  const other = on.otherStates[0];
  const label = (p: string) => labelIn(result.conventions.phaseNames, p);
  const point = sourcePointWords(result);
  const bar = on.barVoltage
    ? `${on.reachedFromIntact ? 'The neutral bar would float to' : 'In the worst state found, the neutral bar floats to'} ${fixed(on.barVoltage.magnitude, 1)} V from ${point}.`
    : null;
  const key = [
    on.reachedFromIntact ? OPEN_NEUTRAL_COLUMN_KEY.reached : OPEN_NEUTRAL_COLUMN_KEY.worstFound,
    ...(impedance ? [OPEN_NEUTRAL_COLUMN_KEY.impedanceModel] : []),
    ...(other ? [OPEN_NEUTRAL_COLUMN_KEY.otherState] : []),
    ...(on.loads.some((l) => l.belowLowVoltageRule) ? [OPEN_NEUTRAL_COLUMN_KEY.belowLowVoltageRule] : []),
  ];
  return {
    id: 'open-neutral',
    title: 'If the neutral conductor broke',
    blocks: [
      { kind: 'paragraph', text: OPEN_NEUTRAL_METHOD },
      ...(bar ? [{ kind: 'paragraph' as const, text: bar }] : []),
      {
        kind: 'table',
        caption: 'Voltage each line-to-neutral circuit would see',
        columns: [
          { label: 'Circuit' },
          { label: phaseWord(result.board.system, 'Line') },
          { label: 'V', align: 'right' },
          { label: '%nom', align: 'right' },
          { label: 'Verdict' },
          ...(impedance ? [{ label: 'V if Z', align: 'right' as const }, { label: '%nom if Z', align: 'right' as const }] : []),
          ...(other ? [{ label: 'V alt', align: 'right' as const }, { label: '%nom alt', align: 'right' as const }] : []),
        ],
        rows: on.loads.map((l, k) => {
          // The flagged figures printed with the decimals that show their side of the band, as solve prints them.
          const shown = voltageBesideBand(OPEN_NEUTRAL_BAND, { volts: l.voltage, percent: l.voltagePercent });
          return [
            l.name,
            label(l.phase),
            `${shown.volts}${l.belowLowVoltageRule ? '*' : ''}`,
            shown.percent,
            l.flag === 'over' ? 'overvoltage' : l.flag === 'under' ? 'undervoltage' : 'within limits',
            ...(impedance ? [fixed(impedance.loads[k]!.voltage, 1), fixed(impedance.loads[k]!.voltagePercent, 1)] : []),
            ...(other ? [fixed(other.loads[k]!.voltage, 1), fixed(other.loads[k]!.voltagePercent, 1)] : []),
          ];
        }),
        note: `${key.join('. ')}.`,
      },
      ...(on.findings.length ? [{ kind: 'list' as const, tone: 'warning' as const, items: on.findings }] : []),
      { kind: 'list', tone: 'caution', items: on.cautions },
    ],
  };
}

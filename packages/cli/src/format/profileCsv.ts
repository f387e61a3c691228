/** CSV files of `trivar profile`: the summary (one figure a row) and the per-interval results. */
import { labellerOf, type BankStepRun, type InstallationProfileResult, type InstallationProfileStudy, type IntervalFigures, type PhaseLabeller, type ProfileResult, type ProfileStudy, type ProfileSummary } from '@trivar/core';
import { fixed } from './textTable.js';

const cell = (x: string | number | null) => {
  if (x === null) return '';
  if (typeof x === 'number') return Number.isInteger(x) ? String(x) : x.toPrecision(8).replace(/\.?0+$/, '');
  return /[",\n]/.test(x) ? `"${x.replace(/"/g, '""')}"` : x;
};

/**
 * Rows: figure, where, before, after (empty without a bank), unit.
 * @param label the board file's phase labels: the `where` column names lines and phases that way
 * @param currency the tariff's currency (profile.tariff.currency, "units" where it sets none): the charges' unit
 */
export function summaryCsv(r: ProfileResult, label: PhaseLabeller = labellerOf(r.phaseNames), currency = 'units'): string {
  const rows: (string | number | null)[][] = [['figure', 'where', 'before', 'after', 'unit'], ...summaryRows(r.before, r.bank?.after ?? null, r.bank?.steps ?? [], label, currency, r.timeZone)];
  return rows.map((row) => row.map(cell).join(',')).join('\n') + '\n';
}

/** The summary of an installation: the rows of summaryCsv for every board, each after the board's name. */
export function installationSummaryCsv(r: InstallationProfileResult, label: PhaseLabeller = labellerOf(r.phaseNames), currency = 'units'): string {
  const rows: (string | number | null)[][] = [['board', 'figure', 'where', 'before', 'after', 'unit']];
  for (const b of r.boards) for (const row of summaryRows(b.before, b.after, r.bank?.board === b.board ? r.bank.steps : [], label, currency, r.timeZone)) rows.push([b.board, ...row]);
  // The origin is no board of the file: its rows only when the bank's controller measured there.
  const meter = r.bank?.meter;
  if (meter?.point === 'origin') for (const row of summaryRows(meter.before, meter.after, [], label, currency, r.timeZone)) rows.push(['origin', ...row]);
  return rows.map((row) => row.map(cell).join(',')).join('\n') + '\n';
}

function summaryRows(before: ProfileSummary, a: ProfileSummary | null, steps: readonly BankStepRun[], label: PhaseLabeller, currency: string, zone: string): (string | number | null)[][] {
  const rows: (string | number | null)[][] = [];
  // The times' unit names their zone; outside UTC each carries its offset too (profileClock).
  const timeUnit = zone === 'UTC' ? 'UTC' : `local time in ${zone}`;
  const add = (figure: string, where: string, pick: (s: ProfileSummary) => string | number | null, unit: string) =>
    rows.push([figure, where, pick(before), a ? pick(a) : null, unit]);
  before.conductors.forEach((c, k) => {
    const where = c.conductor === 'N' ? 'neutral' : `line ${label(c.conductor)}`;
    add('peak current', where, (s) => s.conductors[k]!.maxA, 'A');
    add('peak current at', where, (s) => s.conductors[k]!.maxAt, timeUnit);
    add('P99 current', where, (s) => s.conductors[k]!.p99A, 'A');
    add('P95 current', where, (s) => s.conductors[k]!.p95A, 'A');
    add('hours over limit', where, (s) => s.conductors[k]!.hoursAboveLimit, 'h');
  });
  before.voltages.forEach((v, k) => {
    const where = v.phase.includes('-') ? `line-to-line ${label(v.phase)}` : `phase ${label(v.phase)}`;
    add('lowest voltage', where, (s) => s.voltages[k]!.minPercent, '% of nominal');
    add('highest voltage', where, (s) => s.voltages[k]!.maxPercent, '% of nominal');
  });
  add('hours below voltage limit', 'board', (s) => s.hoursVoltageLow, 'h');
  add('hours above voltage limit', 'board', (s) => s.hoursVoltageHigh, 'h');
  if (before.unbalance) add('hours above unbalance limit', 'board', (s) => s.unbalance?.hoursAbove ?? null, 'h');
  add('leading import', 'board', (s) => s.leadingHours, 'h');
  before.energy.phases.forEach((p, k) => {
    add('energy', `line ${label(p.phase)}`, (s) => s.energy.phases[k]!.kWh, 'kWh');
    add('reactive energy', `line ${label(p.phase)}`, (s) => s.energy.phases[k]!.kvarh, 'kvarh');
  });
  add('billing power factor', 'period', (s) => s.energy.billingPf, '');
  before.months.forEach((m, k) => {
    add('imported energy', m.month, (s) => s.months[k]!.kWhImport, 'kWh');
    add('lagging reactive energy', m.month, (s) => s.months[k]!.kvarhLagging, 'kvarh');
    add('billing power factor', m.month, (s) => s.months[k]!.billingPf, '');
    add('peak demand', m.month, (s) => s.months[k]!.peakKVA, 'kVA');
    add('reactive charge', m.month, (s) => s.months[k]!.reactiveCharge, currency);
    add('demand charge', m.month, (s) => s.months[k]!.demandCharge, currency);
  });
  steps.forEach((s) => rows.push([`bank step ${s.step} closings per year`, label(s.channel), null, s.closingsPerYear, 'operations']));
  return rows;
}

/** One row per interval: local time, currents, phase voltages, board P, Q, PF (and the same with the bank). */
/** @param label the board file's phase labels: the column headers name lines and phases that way */
export function intervalCsv(study: ProfileStudy, label: PhaseLabeller = labellerOf(study.result.phaseNames)): string {
  const f = study.before;
  const names = phaseNamesOf(f, label);
  const head = ['time', ...columnSet(names, '', ''), ...(study.after ? ['bank kvar', ...columnSet(names, '', ' with bank')] : [])];
  const out: string[] = [head.join(',')];
  const vBase = study.nominalLineToNeutralV;
  for (let i = 0; i < f.count; i++) {
    let line = `${study.label(i)},${figuresRow(f, i, vBase)}`;
    if (study.after) line += `,${fixed(study.connectedKvar![i]!, 1)},${figuresRow(study.after, i, vBase)}`;
    out.push(line);
  }
  return out.join('\n') + '\n';
}

/** intervalCsv for an installation: the same columns for every board, each headed "<board>: ". */
export function installationIntervalCsv(study: InstallationProfileStudy, nominalLineToNeutralV: number, label: PhaseLabeller = labellerOf(study.result.phaseNames)): string {
  // The origin (where a bank's controller may measure) goes first, as it comes before the main board.
  const origin = study.meter?.point === 'origin' ? study.meter : null;
  const boards = [...(origin ? ['origin'] : []), ...study.result.boards.map((b) => b.board)];
  const before = [...(origin ? [origin.before] : []), ...study.before];
  const after = study.after ? [...(origin ? [origin.after] : []), ...study.after] : null;
  const names = phaseNamesOf(study.before[0]!, label);
  const head = ['time', ...boards.flatMap((b) => columnSet(names, `${b}: `, '')), ...(after ? ['bank kvar', ...boards.flatMap((b) => columnSet(names, `${b}: `, ' with bank'))] : [])];
  const out: string[] = [head.map(cell).join(',')];
  for (let i = 0; i < study.before[0]!.count; i++) {
    let line = [study.label(i), ...before.map((f) => figuresRow(f, i, nominalLineToNeutralV))].join(',');
    if (after) line += `,${fixed(study.connectedKvar![i]!, 1)},${after.map((f) => figuresRow(f, i, nominalLineToNeutralV)).join(',')}`;
    out.push(line);
  }
  return out.join('\n') + '\n';
}

const phaseNamesOf = (f: IntervalFigures, label: PhaseLabeller) => (['A', 'B', 'C'] as const).slice(0, f.lineA.length).map(label);

const columnSet = (names: readonly string[], prefix: string, tag: string) => [
  ...names.map((p) => `${prefix}line ${p}${tag} A`),
  `${prefix}neutral${tag} A`,
  ...names.map((p) => `${prefix}phase ${p}${tag} %V`),
  `${prefix}P${tag} kW`,
  `${prefix}Q${tag} kvar`,
  `${prefix}PF${tag}`,
];

function figuresRow(g: IntervalFigures, i: number, vBase: number): string {
  const phases = g.lineA.length;
  let w = 0;
  let q = 0;
  for (let k = 0; k < phases; k++) {
    w += g.phaseW[k]![i]!;
    q += g.phaseVar[k]![i]!;
  }
  const s = Math.hypot(w, q);
  // A figure that rounds to zero prints as 0, never −0; an interval with no power has no power factor.
  return [
    ...g.lineA.map((c) => fixed(c[i]!, 2)),
    fixed(g.neutralA[i]!, 2),
    ...g.phaseV.map((c) => fixed((100 * c[i]!) / vBase, 2)),
    fixed(w / 1000, 3),
    fixed(q / 1000, 3),
    s === 0 ? '' : fixed(Math.abs(w) / s, 4),
  ].join(',');
}

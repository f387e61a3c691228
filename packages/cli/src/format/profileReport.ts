/** ProfileResult → the text report of `trivar profile`. */
import { belowTargetWords, billingPowerFactorText, contactorLifeWords, intervalSequenceWords, labellerOf, percentBesideEdges, type PhaseLabeller, type ProfileBankResonance, type ProfileBankResult, type ProfileResult, type ProfileSummary, type ScenarioResult, type ScenarioTariff, type BoardScenarios, type VoltageUnbalanceLimit } from '@trivar/core';
import { fixed, renderTable, section, thousands } from './textTable.js';
import { wrapText } from './wrapText.js';

const hours = (h: number) => (h === 0 ? '0' : h < 10 ? fixed(h, 2) : fixed(h, 1));
const money = (x: number | null) => (x === null ? '-' : fixed(x, 2));
/** Labels of a board file named A/B/C: what a caller without the board's naming gets. */
const LETTERED = labellerOf('A/B/C');

/** Data lines longer than this wrap. */
const LONG_LINE = 120;

export function dataLines(r: Pick<ProfileResult, 'sequence' | 'intervals' | 'timeZone' | 'undriven' | 'path'> & { readonly columnNotes?: readonly string[] }): string[] {
  const s = r.sequence;
  const lines = [`${thousands(r.intervals.count)} intervals of ${r.intervals.intervalSeconds} s, ${r.intervals.first} to ${r.intervals.last} (${r.timeZone})`];
  if (s) lines.push(...intervalSequenceWords(s));
  if (r.undriven && r.undriven.loads.length)
    lines.push(`${r.undriven.loads.length} board load${r.undriven.loads.length === 1 ? '' : 's'} with no column (${r.undriven.loads.slice(0, 4).join(', ')}${r.undriven.loads.length > 4 ? ', ...' : ''}): ${r.undriven.atRating ? 'held at rating' : 'taken as off (--unlisted-at-rating keeps them on)'}`);
  lines.push(...(r.columnNotes ?? []));
  lines.push(`solved on the ${r.path === 'closed-form' ? 'closed-form (Millman) path: phase-to-neutral loads and a neutral conductor' : 'nodal path'}`);
  // A sentence (an irregular step, a column's reading) wraps with a hanging indent; a fact a little past the width stays whole.
  return lines.map((l) => (l.length > LONG_LINE ? wrapText(l, '  ', '    ') : `  ${l}`));
}

export function currentTable(s: ProfileSummary, label: PhaseLabeller): string {
  return renderTable(
    [{ header: 'conductor', align: 'left' }, { header: 'peak A' }, { header: 'at', align: 'left' }, { header: 'P99 A' }, { header: 'P95 A' }, { header: 'limit A' }, { header: 'hours over' }],
    s.conductors.map((c) => [
      c.conductor === 'N' ? 'neutral' : `line ${label(c.conductor)}`,
      fixed(c.maxA, 1),
      c.maxAt ?? '-',
      fixed(c.p99A, 1),
      fixed(c.p95A, 1),
      c.ratingA === null ? '-' : fixed(c.ratingA, 0),
      c.hoursAboveLimit === null ? '-' : hours(c.hoursAboveLimit),
    ]),
  );
}

/** The band the hours below and above are counted against, % of nominal. */
export type VoltageEdges = Pick<ProfileResult['limits'], 'voltageLowPercent' | 'voltageHighPercent'>;

/** A % of nominal beside the hours outside `edges`, with the decimals that show its side of them (percentBesideEdges). */
export const percentBeside = (percent: number, edges: VoltageEdges) => percentBesideEdges(percent, edges.voltageLowPercent, edges.voltageHighPercent);

export function voltageTable(s: ProfileSummary, label: PhaseLabeller, edges: VoltageEdges): string {
  return renderTable(
    [{ header: 'voltage', align: 'left' }, { header: 'lowest %' }, { header: 'at', align: 'left' }, { header: 'highest %' }, { header: 'at', align: 'left' }],
    s.voltages.map((v) => [label(v.phase), percentBeside(v.minPercent, edges), v.minAt, percentBeside(v.maxPercent, edges), v.maxAt]),
  );
}

/** A voltage threshold as given: 90, 91.7 (c84-service-b), 94.25. */
const limitPercent = (x: number) => String(Math.round(x * 100) / 100);

export function thresholdLines(s: ProfileSummary, r: Pick<ProfileResult, 'limits'>): string[] {
  const l = r.limits;
  const from = l.voltageLimitsFrom === 'profile.limits' ? 'profile.limits' : `the board's limits, ${l.voltageLimitsFrom}`;
  const out = [`below ${limitPercent(l.voltageLowPercent)} % voltage: ${hours(s.hoursVoltageLow)} h · above ${limitPercent(l.voltageHighPercent)} %: ${hours(s.hoursVoltageHigh)} h (${from})`];
  if (s.unbalance) {
    // The board region's index and limit (|V2|/|V1| and 2 % IEC, the line-to-line deviation and 3 % ANSI C84.1).
    const u = l.unbalance;
    const threshold = l.unbalanceFrom === 'profile.limits' ? 'profile.limits' : u.source;
    out.push(`${u.name}: peak ${fixed(s.unbalance.maxPercent, 2)} % at ${s.unbalance.maxAt}, P95 ${fixed(s.unbalance.p95Percent, 2)} %, above ${fixed(l.unbalancePercent, 1)} % (${threshold}): ${hours(s.unbalance.hoursAbove)} h`);
    if (u.definition) out.push(`  (${u.name}: ${u.definition})`);
  }
  out.push(`import at a leading power factor: ${hours(s.leadingHours)} h`);
  const lines = out.map((x) => `  ${x}`);
  if (s.hoursCollapsed > 0)
    lines.push(
      wrapText(
        `! a phase voltage below 50 % of nominal for ${hours(s.hoursCollapsed)} h: there the supply cannot carry the load (trivar solve calls that state a collapse), and the figures of those intervals describe a state the real loads would not settle in`,
        '  ',
        '    ',
      ),
    );
  return lines;
}

/** Below this, a table's energies take one decimal: whole units would round a visible share of each line away (common practice, no source). */
const WHOLE_ENERGY_FROM = 100;

export function energyTable(s: ProfileSummary, label: PhaseLabeller): string {
  const e = s.energy;
  const largest = Math.max(...e.phases.flatMap((p) => [Math.abs(p.kWh), Math.abs(p.kvarh)]), e.kWhImport, e.kvarhLagging, e.kWhExport, e.kvarhLeading);
  // Round-off cleared as thousands() does, so 7.499999999999998 reads 7.5 and the lines add up to the board as printed.
  const figure = largest < WHOLE_ENERGY_FROM ? (x: number) => fixed(Number.isFinite(x) && x !== 0 ? Number(x.toPrecision(12)) : x, 1) : thousands;
  const rows = e.phases.map((p) => [`line ${label(p.phase)}`, figure(p.kWh), figure(p.kvarh)]);
  rows.push(['board, imported', figure(e.kWhImport), figure(e.kvarhLagging) + ' lag']);
  if (e.kWhExport > 0 || e.kvarhLeading > 0) rows.push(['board, exported / leading', figure(e.kWhExport), figure(e.kvarhLeading) + ' lead']);
  return `${renderTable([{ header: '', align: 'left' }, { header: 'kWh' }, { header: 'kvarh' }], rows)}\n  billing power factor over the period: ${billingPowerFactorText(e.billingPf)}`;
}

export function monthTable(s: ProfileSummary, after: ProfileSummary | null, currency: string): string {
  const head = [
    { header: 'month', align: 'left' as const },
    { header: 'kWh' },
    { header: 'kvarh lag' },
    { header: 'billing PF' },
    ...(after ? [{ header: 'with bank' }] : []),
    { header: 'peak kVA' },
    { header: `reactive ${currency}` },
    ...(after ? [{ header: 'with bank' }] : []),
    { header: `demand ${currency}` },
  ];
  const rows = s.months.map((m, k) => {
    const a = after?.months[k];
    return [
      m.month,
      thousands(m.kWhImport),
      thousands(m.kvarhLagging),
      billingPowerFactorText(m.billingPf, true),
      ...(a ? [billingPowerFactorText(a.billingPf, true)] : []),
      fixed(m.peakKVA, 1),
      money(m.reactiveCharge),
      ...(a ? [money(a.reactiveCharge)] : []),
      money(m.demandCharge),
    ];
  });
  return renderTable(head, rows);
}

export function bankLines(r: { readonly bank: ProfileResult['bank']; readonly before: ProfileSummary; readonly limits: VoltageEdges }): string {
  const b = r.bank!;
  const set = b.settings;
  const sizing =
    b.source === 'profile'
      ? // The cover share is of the kvar need (its percentile), not of the intervals that end at the target: steps
        // too large to close at a small need leave those short (the hours below the target are given further on).
        `sized from the profile to cover the kvar the target needs in ${fixed((set.coverShare ?? 0) * 100, 0)} % of intervals: ${Object.entries(b.needKvar ?? {})
          .map(([c, v]) => `${fixed(v, 1)} kvar ${b.placeWords[c] ?? c}`)
          .join(', ')} at that percentile (a step closes only where the need left exceeds its threshold, so the hours below the target can be more)`
      : b.source === 'correction-study'
        ? b.design?.defaultsWords
          ? `the ${b.design.words} trivar correct designs and recommends for this board with the correction study's defaults (the file has no correction section): ${b.design.defaultsWords}`
          : b.design?.recommended
          ? `the ${b.design.words} trivar correct recommends for this board (the board file's correction section names no arrangement), as it designs it`
          : `the ${b.design?.words ?? 'bank'} of the board file's correction section, as trivar correct designs it`
        : 'steps as given in profile.bank.steps';
  // Three decimals where a band edge needs them (0.995 must not read as 0.99).
  const pf = (x: number) => fixed(x, Math.round(x * 100) === x * 100 ? 2 : 3);
  const band =
    set.upperPf === null ? `target PF ${pf(set.targetPf)}` : set.upperPf >= 1 ? `target PF ${pf(set.targetPf)} up to unity, never leading` : `PF band ${pf(set.targetPf)} to ${pf(set.upperPf)} lagging`;
  const lines = [
    wrapText(sizing, '  ', '    '),
    `  ${b.steps.length} switched step${b.steps.length === 1 ? '' : 's'}, ${fixed(b.totalKvar, 1)} kvar in all at nominal voltage${b.fixedKvar > 0 ? `; fixed part ${fixed(b.fixedKvar, 1)} kvar, always connected` : ''}`,
    ...(b.sizingNotes ?? []).map((w) => wrapText(w, '  ', '    ')),
    ...(b.notSimulated
      ? [
          `  not simulated (no single-phase channel for a line-to-line step here): ${[
            ...(b.notSimulated.outputs.length ? [`output${b.notSimulated.outputs.length > 1 ? 's' : ''} ${b.notSimulated.outputs.join(', ')}`] : []),
            ...(b.notSimulated.fixedKvar > 0 ? [`${fixed(b.notSimulated.fixedKvar, 1)} kvar of the fixed part`] : []),
          ].join('; ')}`,
        ]
      : []),
    wrapText(`controller: ${band}, switching threshold ${fixed(set.responseShare, 2)} × smallest step, delay ${set.delaySeconds} s, reconnect after ${set.reconnectSeconds} s${reconnectBasis(set)}`, '  ', '    '),
    wrapText(b.withinInterval.words, '  ', '    '),
    ...b.warnings.map((w) => wrapText(`! warning: ${w}`, '  ', '    ')),
    ...(b.targetOutOfReach ? [wrapText(`warning: ${b.targetOutOfReach.words}`, '  ', '    ')] : []),
    '',
    renderTable(
      [{ header: 'step' }, { header: 'where', align: 'left' }, { header: 'kvar' }, { header: 'closings' }, { header: 'per year' }],
      b.steps.map((s) => [String(s.step), b.placeWords[s.channel] ?? s.channel, fixed(s.kvar, 1), thousands(s.closings), thousands(s.closingsPerYear)]),
    ),
    wrapText(b.closingsBasis.words, '  ', '    '),
    ...(b.neverClosed ?? []).map((n) => wrapText(`! ${n.words}`, '  ', '    ')),
    `  typical limit ${thousands(b.operationsPerYearLimit)} operations a year per step (IEC 60831-1 practice); a capacitor contactor lasts about ${thousands(b.contactorLifeOperations)} operations${
      b.yearsToContactorLife === null ? '' : ` — the busiest step ${contactorLifeWords(b.yearsToContactorLife)}`
    }`,
    `  billing power factor ${billingPowerFactorText(r.before.energy.billingPf)} → ${billingPowerFactorText(b.after.energy.billingPf)}; leading import ${hours(r.before.leadingHours)} h → ${hours(b.after.leadingHours)} h`,
    ...belowTargetLines(b),
    `  ${b.voltageRiseAt === null ? (b.voltageRiseWords ?? 'no voltage rise from the bank') : `largest voltage rise from the bank ${fixed(b.voltageRisePercent, 2)} % of nominal (${b.voltageRiseAt})`}; highest voltage with it ${percentBeside(Math.max(...b.after.voltages.map((v) => v.maxPercent)), r.limits)} %`,
    ...resonanceLines(b.resonance ?? null),
  ];
  return lines.join('\n');
}

/** The hours the board stays below the target with the bank, and why, where there are any. */
function belowTargetLines(b: ProfileBankResult): string[] {
  const words = belowTargetWords(b);
  return words ? [wrapText(words, '  ', '    ')] : [];
}

/**
 * The bank's supply resonance in every step state: the headline, the warnings, then the states as a table where
 * any lies near a watched order, else one line; nothing where there is no estimate (an ideal source).
 */
function resonanceLines(res: ProfileBankResonance | null): string[] {
  if (!res) return [];
  const table = res.table
    ? [
        renderTable(
          res.table.header.map((header, k) => ({ header, align: k === 0 || k === 3 ? ('left' as const) : ('right' as const) })),
          res.table.rows,
          '    ',
        ),
        wrapText(res.table.note, '    ', '      '),
      ]
    : [wrapText(`the bank's supply resonance in ${res.clear!}`, '  ', '    ')];
  return ['', ...(res.headline ? [wrapText(res.headline, '  ', '    ')] : []), ...res.warnings.map((w) => wrapText(`! warning: ${w}`, '  ', '    ')), ...table];
}

/** Why `--bank` gave no bank, under the heading the bank would have had. */
export function noBankLines(words: string): string {
  return wrapText(words, '  ', '    ');
}

/** Why the step waits that long: the practice's discharge time, or the file's setting beside it. */
function reconnectBasis(set: ProfileBankResult['settings']): string {
  if (set.reconnectFrom === 'practice') return ` (the discharge time, ${set.dischargeRule})`;
  if (set.reconnectFrom === 'file') return ` (profile.bank.reconnectSeconds; discharge time ${set.dischargeSeconds} s, ${set.dischargeRule})`;
  return ` (discharge time ${set.dischargeSeconds} s, ${set.dischargeRule})`;
}

/** @param unbalance the index the board's limits judge (ResolvedLimits.unbalance), named under the table */
export function worstTable(s: ProfileSummary, unbalance: VoltageUnbalanceLimit): string {
  const worst = s.worstByNeutral.length ? s.worstByNeutral : s.worstByLine;
  const rows = worst.map((w) => [w.at, fixed(w.maxLineA, 1), fixed(w.neutralA, 1), w.unbalancePercent === null ? '-' : fixed(w.unbalancePercent, 2)]);
  const table = renderTable([{ header: 'interval', align: 'left' }, { header: 'highest line A' }, { header: 'neutral A' }, { header: 'unbalance %' }], rows);
  // Both indices need three phases: on a split-phase or single-phase board there is none (solve leaves it blank too).
  return worst.some((w) => w.unbalancePercent === null) ? `${table}\n  (unbalance %: defined for three phases only; - on this board)` : `${table}\n${unbalanceIndexNote(unbalance)}`;
}

/** Which voltage unbalance figure an "unbalance %" column holds: the board region's (unbalanceLimits.ts). */
const unbalanceIndexNote = (u: VoltageUnbalanceLimit): string => `  (unbalance %: ${u.definition ?? u.name})`;

/** @param label the board file's phase labels (`labellerOf(conventionsOf(board).phaseNames)`) */
export function renderProfileReport(r: ProfileResult, currency: string, label: PhaseLabeller = labellerOf(r.phaseNames)): string {
  const s = r.before;
  const parts = [
    `${r.board} — load over time`,
    ...dataLines(r),
    section('Currents'),
    currentTable(s, label),
    section('Phase voltage at the board (% of nominal)'),
    voltageTable(s, label, r.limits),
    ...thresholdLines(s, r),
    section('Energy'),
    energyTable(s, label),
    section('Calendar months'),
    monthTable(s, r.bank?.after ?? null, currency),
    section(s.worstByNeutral.length ? 'Intervals with the highest neutral current' : 'Intervals with the highest line current'),
    worstTable(s, r.limits.unbalance),
  ];
  if (r.bank) parts.push(section('Automatic bank over the profile'), bankLines(r));
  else if (r.bankNotSized) parts.push(section('Automatic bank over the profile'), noBankLines(r.bankNotSized.words));
  const cautions = r.bank?.resonance ? [...r.cautions, r.bank.resonance.caution] : r.cautions;
  parts.push(...warningLines(r.warnings), section('Cautions'), ...cautions.map((c) => `  - ${c}`));
  return `${parts.join('\n')}\n`;
}

/** The study's warnings under their heading, each marked; nothing when there are none. */
export function warningLines(warnings: readonly string[]): string[] {
  return warnings.length ? [section('Warnings'), ...warnings.map((w) => wrapText(`! ${w}`, '  ', '    '))] : [];
}

/**
 * A board's scenarios as a table, a row per scenario.
 * @param edges the band scenarios are said to be outside of, where the report says so (installations)
 */
export function scenarioTable(r: BoardScenarios, label: PhaseLabeller = LETTERED, edges?: VoltageEdges): string {
  const percent = (x: number) => (edges ? percentBeside(x, edges) : fixed(x, 1));
  const phases = r.scenarios[0]?.lineA.length ?? 0;
  const names = (['A', 'B', 'C'] as const).slice(0, phases).map(label);
  const hasNeutral = r.scenarios.some((s) => s.neutralA !== null);
  return renderTable(
    [
      { header: 'scenario', align: 'left' },
      { header: 'h/yr' },
      ...names.map((p) => ({ header: `line ${p}, A` })),
      ...(hasNeutral ? [{ header: 'neutral A' }] : []),
      { header: 'lowest V %' },
      { header: 'highest V %' },
      { header: 'unbalance %' },
      { header: 'kW' },
      { header: 'kvar' },
      { header: 'PF' },
    ],
    r.scenarios.map((s) => [
      s.name,
      fixed(s.hours, 0),
      ...s.lineA.map((a) => fixed(a, 1)),
      ...(hasNeutral ? [s.neutralA === null ? '-' : fixed(s.neutralA, 1)] : []),
      percent(s.lowestVoltagePercent),
      percent(s.highestVoltagePercent),
      s.unbalancePercent === null ? '-' : fixed(s.unbalancePercent, 2),
      fixed(s.kW, 1),
      fixed(s.kvar, 1),
      s.pf === null ? '-' : fixed(s.pf, 3),
    ]),
  ) + (r.scenarios.some((s) => s.unbalancePercent !== null) ? `\n${unbalanceIndexNote(r.unbalance)}` : '');
}

/** The year weighed by the scenarios' hours, in one line. */
export const scenarioYearLine = (r: BoardScenarios): string =>
  `  over the year: ${thousands(r.kWhImport)} kWh imported, ${thousands(r.kvarhLagging)} kvarh lagging, billing power factor ${billingPowerFactorText(r.billingPf)}`;

/** A line per scenario and conductor above its rating; `where` goes before each (a board's name and a colon, or ''). */
export function scenarioOverRating(r: BoardScenarios, label: PhaseLabeller = LETTERED, where = ''): string[] {
  const names = (['A', 'B', 'C'] as const).slice(0, r.scenarios[0]?.lineA.length ?? 0).map(label);
  return r.scenarios.flatMap((s) => [
    ...s.lineA.flatMap((a, k) => {
      const rating = r.lineRatingsA[k] ?? null;
      return rating !== null && a > rating ? [`  ${where}${s.name}: line ${names[k]} carries ${fixed(a, 1)} A, above its ${fixed(rating, 0)} A rating`] : [];
    }),
    ...(s.neutralA !== null && r.neutralRatingA !== null && s.neutralA > r.neutralRatingA ? [`  ${where}${s.name}: the neutral carries ${fixed(s.neutralA, 1)} A, above its ${fixed(r.neutralRatingA, 0)} A rating`] : []),
  ]);
}

/**
 * profile.tariff on scenarios: each charge the one way the scenarios' hours allow, and what that leaves
 * out; nothing where the file prices nothing.
 * @param heading the lines that head it, in the report's style
 */
export function scenarioTariffLines(t: ScenarioTariff | null, year: Pick<BoardScenarios, 'kWhImport' | 'kvarhLagging'>, heading: readonly string[]): string[] {
  if (!t) return [];
  const lines = [...heading];
  if (t.reactive)
    lines.push(
      wrapText(
        `${
          t.reactive.chargeableKvarh > 0
            ? `reactive charge ${fixed(t.reactive.charge, 2)} ${t.currency} a year: ${thousands(t.reactive.chargeableKvarh)} kvarh lagging above the allowance (${thousands(year.kvarhLagging)} kvarh − ${t.reactive.tanPhiAllowance} × ${thousands(year.kWhImport)} kWh)`
            : `no reactive charge: ${thousands(year.kvarhLagging)} kvarh lagging is within the allowance (${t.reactive.tanPhiAllowance} × ${thousands(year.kWhImport)} kWh = ${thousands(t.reactive.tanPhiAllowance * year.kWhImport)} kvarh)`
        }, on the year's totals; the tariff judges each calendar month on its own, so a month with more kvarh per kWh than the year's can be charged more`,
        '  ',
        '    ',
      ),
    );
  if (t.demand)
    lines.push(
      wrapText(
        `demand charge ${fixed(t.demand.chargePerMonth, 2)} ${t.currency} in each month in which "${t.demand.scenario}" (${fixed(t.demand.peakKVA, 1)} kVA, the largest scenario) lasts a whole ${t.demand.windowMinutes}-min window; scenarios do not say in which months a state falls, so no year's total`,
        '  ',
        '    ',
      ),
    );
  return lines;
}

export const OVER_RATING_CAUTION = '  Conductors above their rating overheat in service: check sizing against local wiring rules.';

/** The report of a board file's scenarios (no interval data). */
/** @param label the board file's phase labels (`labellerOf(conventionsOf(board).phaseNames)`) */
export function renderScenarioReport(r: ScenarioResult, label: PhaseLabeller = labellerOf(r.phaseNames)): string {
  const over = scenarioOverRating(r, label);
  return `${[
    `${r.board} — scenarios (${fixed(r.hours, 0)} h)`,
    `  solved on the ${r.path === 'closed-form' ? 'closed-form (Millman) path' : 'nodal path'}`,
    '',
    scenarioTable(r, label),
    '',
    scenarioYearLine(r),
    ...scenarioTariffLines(r.tariff, r, ['', 'Tariff']),
    ...(over.length ? ['', 'Over a rating', ...over, OVER_RATING_CAUTION] : []),
  ].join('\n')}\n`;
}

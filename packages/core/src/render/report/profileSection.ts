/**
 * The report section of a load-profile study: what the interval data showed, with its charts. On an
 * installation: an overview (a row per board, the feeder loading, the bank) and a section per board
 * with the same blocks a board's study has, its currents being its incomer's.
 */
import type { VoltageUnbalanceLimit } from '../../board/conventions/unbalanceLimits.js';
import { bankInServiceWords, BANKS_IN_SERVICE_BASIS } from '../../analysis/banksInServiceWords.js';
import type { ProfileBankResult, ProfileResult } from '../../profile/studyProfile.js';
import type { InstallationProfileResult } from '../../profile/studyInstallationProfile.js';
import type { ProfileSummary, ResolvedLimits } from '../../profile/summariseFigures.js';
import { fixed } from '../svgText.js';
import { groupDigits } from '../../_internal/groupDigits.js';
import { percentBesideEdges } from '../../board/conventions/voltageBesideBand.js';

/** A % of nominal beside the hours outside the band, with the decimals that show its side of it. */
const percentBeside = (percent: number, limits: Pick<ResolvedLimits, 'voltageLowPercent' | 'voltageHighPercent'>) =>
  percentBesideEdges(percent, limits.voltageLowPercent, limits.voltageHighPercent);
import { billingPowerFactorText } from '../../profile/billingPowerFactor.js';
import { belowTargetWords, contactorLifeWords, intervalSequenceWords } from '../../profile/profileWording.js';
import type { ReportBlock, ReportSection } from './reportDocument.js';
import { labellerOf, type PhaseNaming } from '../../board/conventions/phaseNames.js';
import { argumentIssueError, checkListArgument, checkObjectArgument } from '../../_internal/argumentChecks.js';

export interface ProfileChart {
  /** File-safe short name. */
  readonly name: string;
  readonly caption: string;
  readonly svg: string;
}

const orDash = (x: number | null, d: number): string => (x === null ? '—' : fixed(x, d));
/** A voltage threshold as given: 90, 91.7 (c84-service-b), 94.25. */
const limitPercent = (x: number) => String(Math.round(x * 100) / 100);
const bandWords = (limits: ResolvedLimits) => (limits.voltageLimitsFrom === 'profile.limits' ? 'profile.limits' : `the board's voltage limits, ${limits.voltageLimitsFrom}`);
/** A whole number with its thousands grouped, as `trivar profile` prints counts and energies: 210,100. */
const grouped = (x: number) => groupDigits(Math.round(x) || 0);
const intervalWords = (p: Pick<ProfileResult, 'intervals' | 'timeZone'>) =>
  `${grouped(p.intervals.count)} of ${fixed(p.intervals.intervalSeconds / 60, 0)} min, ${p.intervals.first} to ${p.intervals.last} (${p.timeZone})`;

/** What one board's blocks are read from: a board's study, or one board of an installation's. */
interface BoardProfileView {
  readonly intervals: ProfileResult['intervals'];
  readonly timeZone: string;
  /** What the data's sequence showed (gaps, repeated times), where this board's blocks state it; null: stated elsewhere. */
  readonly sequence: ProfileResult['sequence'];
  /** How columns were read where the file leaves it to the model; absent: stated elsewhere. */
  readonly columnNotes?: readonly string[];
  readonly limits: ResolvedLimits;
  readonly before: ProfileSummary;
  /** The conductors' caption: where the currents are measured. */
  readonly currentsCaption: string;
}

/** The facts, the currents and the voltages of one board, then its charts. */
/**
 * The board region's unbalance index, capitalised, with its definition where its name does not say it, and
 * where its limit comes from: the file's profile.limits where it sets one (as `trivar profile` says), else the
 * standard the region's level is from.
 */
const unbalanceWords = (u: VoltageUnbalanceLimit, limits: Pick<ResolvedLimits, 'unbalanceFrom'>) => {
  const source = limits.unbalanceFrom === 'profile.limits' ? 'profile.limits' : u.source;
  return `${u.name[0]!.toUpperCase()}${u.name.slice(1)}${u.definition ? ` (${u.definition}; ${source})` : ` (${source})`}`;
};

/** The data's gaps and repeated times, as `trivar profile` words them. */
const sequenceFacts = (s: ProfileResult['sequence']): [string, string][] => (s ? [['Interval data', intervalSequenceWords(s, false).join('; ')]] : []);

/** How columns were read where the file leaves it to the model (a phase in kW alone, a group's shares). */
const columnFacts = (notes: readonly string[] | undefined): [string, string][] => (notes?.length ? [['Columns read', notes.join('; ')]] : []);

function boardBlocks(p: BoardProfileView, charts: readonly ProfileChart[], naming: PhaseNaming, figurePrefix: string): ReportBlock[] {
  const s = p.before;
  const label = labellerOf(naming);
  return [
    {
      kind: 'facts',
      items: [
        ['Intervals', intervalWords(p)],
        ...sequenceFacts(p.sequence),
        ...columnFacts(p.columnNotes),
        ['Energy imported / exported', `${grouped(s.energy.kWhImport)} kWh / ${grouped(s.energy.kWhExport)} kWh`],
        ['Reactive energy lagging / leading', `${grouped(s.energy.kvarhLagging)} kvarh / ${grouped(s.energy.kvarhLeading)} kvarh`],
        ['Billing power factor', billingPowerFactorText(s.energy.billingPf)],
        ['Hours importing at a leading PF', fixed(s.leadingHours, 1)],
        ...((s.unbalance
          ? [
              [
                `${unbalanceWords(p.limits.unbalance, p.limits)}, highest / 95th percentile / hours above ${limitPercent(p.limits.unbalancePercent)} %`,
                `${fixed(s.unbalance.maxPercent, 2)} % (${s.unbalance.maxAt}) / ${fixed(s.unbalance.p95Percent, 2)} % / ${fixed(s.unbalance.hoursAbove, 1)}`,
              ],
            ]
          : []) as [string, string][]),
        [`Hours below ${limitPercent(p.limits.voltageLowPercent)} % / above ${limitPercent(p.limits.voltageHighPercent)} % (${bandWords(p.limits)})`, `${fixed(s.hoursVoltageLow, 1)} / ${fixed(s.hoursVoltageHigh, 1)}`],
        ...(s.hoursCollapsed > 0 ? ([['Hours with a phase below 50 % of nominal (the supply cannot carry the load: a collapse)', fixed(s.hoursCollapsed, 2)]] as [string, string][]) : []),
      ],
    },
    {
      kind: 'table',
      caption: p.currentsCaption,
      columns: [{ label: 'Conductor' }, { label: 'Highest A', align: 'right' }, { label: 'When' }, { label: '99th % A', align: 'right' }, { label: '95th % A', align: 'right' }, { label: 'Rating A', align: 'right' }, { label: 'Hours over', align: 'right' }],
      rows: s.conductors.map((c) => [label(c.conductor), fixed(c.maxA, 1), c.maxAt ?? '—', fixed(c.p99A, 1), fixed(c.p95A, 1), orDash(c.ratingA, 0), orDash(c.hoursAboveLimit, 1)]),
      note: 'Hours over: above the conductor rating; for the neutral, above the neutral limit of the study.',
    },
    {
      kind: 'table',
      caption: 'Voltages over the period, % of nominal (line-to-neutral where there is a neutral, and line-to-line)',
      columns: [{ label: 'Voltage' }, { label: 'Lowest %', align: 'right' }, { label: 'When' }, { label: 'Highest %', align: 'right' }, { label: 'When' }],
      rows: s.voltages.map((v) => [label(v.phase), percentBeside(v.minPercent, p.limits), v.minAt, percentBeside(v.maxPercent, p.limits), v.maxAt]),
    },
    ...charts.map((c): ReportBlock => ({ kind: 'figure', name: `${figurePrefix}${c.name}`, caption: c.caption, svg: c.svg })),
  ];
}

/** The simulated bank in facts. */
function bankBlock(b: ProfileBankResult, where = ''): ReportBlock {
  return {
    kind: 'facts',
    items: [
      ['Automatic bank simulated', `${fixed(b.totalKvar, 1)} kvar in ${b.steps.length} steps${where}${b.sizedFromProfile ? ' (sized from the profile)' : ''}`],
      ...(b.sizingNotes ?? []).map((w): [string, string] => ['Steps', w]),
      ['Billing power factor with the bank', billingPowerFactorText(b.after.energy.billingPf)],
      ['Hours leading with the bank', fixed(b.after.leadingHours, 1)],
      ['Largest voltage rise from the bank', b.voltageRiseAt === null ? (b.voltageRiseWords ?? 'none') : `${fixed(b.voltageRisePercent, 2)} % (${b.voltageRiseAt})`],
      ['Busiest step’s contactor and its typical life', contactorLifeWords(b.yearsToContactorLife, 'it') ?? '—'],
      ['Closings per year at the busiest step', `${groupDigits(Math.round(Math.max(0, ...b.steps.map((x) => x.closingsPerYear))))}: ${b.closingsBasis.words}`],
      ['Reconnection after a step goes off', `${b.settings.reconnectSeconds} s (discharge time ${b.settings.dischargeSeconds} s, ${b.settings.dischargeRule})`],
      ['Switching within an interval', b.withinInterval.words],
      ...(belowTargetWords(b) ? ([['Hours below the target with the bank', belowTargetWords(b)!]] as [string, string][]) : []),
      ...(b.neverClosed ?? []).map((n): [string, string] => ['Step never closed', n.words]),
      ...(b.targetOutOfReach ? ([['Target out of reach of the sized steps', b.targetOutOfReach.words]] as [string, string][]) : []),
    ],
  };
}

/**
 * @param namingGiven the phase naming conductors and phases are labelled with @defaultValue the board's (`p.phaseNames`)
 */
export function profileSection(p: ProfileResult, charts: readonly ProfileChart[], namingGiven?: PhaseNaming): ReportSection {
  checkObjectArgument(p, 'p', 'a profile result from profileBoard(...)', ['phaseNames']);
  checkListArgument(charts, 'charts', 'a list of profile charts (empty for none)');
  const naming = namingGiven ?? p.phaseNames;
  const blocks = boardBlocks({ ...p, currentsCaption: 'Conductor currents over the period' }, charts, naming, 'profile-');
  if (p.bank) blocks.push(bankBlock(p.bank));
  if (p.warnings.length) blocks.push({ kind: 'list', tone: 'warning', items: p.warnings });
  if (p.bank?.warnings.length) blocks.push({ kind: 'list', tone: 'warning', items: p.bank.warnings });
  if (p.cautions.length) blocks.push({ kind: 'list', tone: 'caution', items: p.cautions });
  return { id: 'profile', title: 'Load over time', blocks };
}

/**
 * The installation's profile: an overview section (`profile`: a row per board, the feeder loading chart, the
 * bank and what it does at the supply, the cautions), then one per board (`profile-<board section id>`).
 * @param charts each board's charts, by board name; `overview` the installation-wide ones
 * @param ids each board's report section id (`boardSectionIds`), so a board's profile sits beside its section's anchor
 */
export function installationProfileSections(
  r: InstallationProfileResult,
  charts: { readonly boards: ReadonlyMap<string, readonly ProfileChart[]>; readonly overview: readonly ProfileChart[] },
  ids: ReadonlyMap<string, string>,
  namingGiven?: PhaseNaming,
): ReportSection[] {
  checkObjectArgument(r, 'r', 'an installation profile result from profileInstallation(...)', ['phaseNames', 'boards']);
  checkObjectArgument(charts, 'charts', 'the charts { boards, overview }', ['boards', 'overview']);
  if (!(ids instanceof Map)) throw argumentIssueError('ids', 'a Map of board name to section id (boardSectionIds(...))', ids);
  const naming = namingGiven ?? r.phaseNames;
  const peakLine = (s: ProfileSummary) => Math.max(...s.conductors.filter((c) => c.conductor !== 'N').map((c) => c.maxA));
  const main = r.boards[0]!;
  const overview: ReportBlock[] = [
    {
      kind: 'facts',
      items: [
        ['Intervals', intervalWords(r)],
        ...sequenceFacts(r.sequence),
        ...columnFacts(r.columnNotes),
        ['Boards', `${r.boards.length}, every board and feeder solved at once in each interval`],
        ...(r.banksInService.length ? [['Capacitor banks in service', `in every interval, ${BANKS_IN_SERVICE_BASIS}: ${r.banksInService.map((b) => bankInServiceWords(b)).join('; ')}`] as [string, string]] : []),
      ],
    },
    {
      kind: 'table',
      caption: "Boards over the period: the supply at the main board, each sub-board's incoming feeder",
      columns: [
        { label: 'Board' },
        { label: 'Fed from' },
        { label: 'Highest line A', align: 'right' },
        { label: 'Rating A', align: 'right' },
        { label: 'Highest neutral A', align: 'right' },
        { label: 'Lowest %', align: 'right' },
        { label: 'Highest %', align: 'right' },
        { label: 'Band %' },
        { label: 'Hours low / high', align: 'right' },
      ],
      rows: r.boards.map((b) => {
        const rating = b.before.conductors.find((c) => c.conductor !== 'N')?.ratingA ?? null;
        const neutral = b.before.conductors.find((c) => c.conductor === 'N');
        return [
          b.board,
          b.fedFrom ?? 'supply',
          fixed(peakLine(b.before), 1),
          orDash(rating, 0),
          neutral ? fixed(neutral.maxA, 1) : '—',
          percentBeside(Math.min(...b.before.voltages.map((v) => v.minPercent)), b.limits),
          percentBeside(Math.max(...b.before.voltages.map((v) => v.maxPercent)), b.limits),
          `${limitPercent(b.limits.voltageLowPercent)}–${limitPercent(b.limits.voltageHighPercent)}`,
          `${fixed(b.before.hoursVoltageLow, 1)} / ${fixed(b.before.hoursVoltageHigh, 1)}`,
        ];
      }),
    },
    ...charts.overview.map((c): ReportBlock => ({ kind: 'figure', name: `profile-${c.name}`, caption: c.caption, svg: c.svg })),
    ...(r.warnings.length ? [{ kind: 'list', tone: 'warning', items: r.warnings } as ReportBlock] : []),
  ];
  if (r.bank) {
    overview.push(bankBlock(r.bank, ` on ${r.bank.board}`));
    if (r.bank.warnings.length) overview.push({ kind: 'list', tone: 'warning', items: r.bank.warnings });
    if (r.bank.board !== main.board && main.after)
      overview.push({
        kind: 'facts',
        items: [
          [`At the supply (${main.board}): billing power factor`, `${billingPowerFactorText(main.before.energy.billingPf)} → ${billingPowerFactorText(main.after.energy.billingPf)}`],
          [`At the supply (${main.board}): highest line current`, `${fixed(peakLine(main.before), 1)} A → ${fixed(peakLine(main.after), 1)} A`],
        ],
      });
  }
  if (r.warnings.length) overview.push({ kind: 'list', tone: 'warning', items: r.warnings });
  if (r.cautions.length) overview.push({ kind: 'list', tone: 'caution', items: r.cautions });
  const boards = r.boards.map((b): ReportSection => {
    const id = `profile-${ids.get(b.board)!}`;
    const where = b.fedFrom === null ? 'the supply to the main board' : `the feeder from ${b.fedFrom}`;
    const blocks = boardBlocks({ ...r, sequence: null, limits: b.limits, before: b.before, currentsCaption: `Currents in ${where} over the period` }, charts.boards.get(b.board) ?? [], naming, `${id}-`);
    if (b.after && r.bank) blocks.push({ kind: 'facts', items: [[`Billing power factor with the bank on ${r.bank.board}`, billingPowerFactorText(b.after.energy.billingPf)]] });
    return { id, title: `Load over time — ${b.board}`, blocks };
  });
  return [{ id: 'profile', title: 'Load over time', blocks: overview }, ...boards];
}

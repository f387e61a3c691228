/** The report section of a load-profile study: what the interval data showed, with its charts. */
import type { ProfileResult } from '../../profile/studyProfile.js';
import { fixed } from '../svgText.js';
import type { ReportBlock, ReportSection } from './reportDocument.js';
import { labellerOf, type PhaseNaming } from '../../board/conventions/phaseNames.js';

export interface ProfileChart {
  /** File-safe short name. */
  readonly name: string;
  readonly caption: string;
  readonly svg: string;
}

const orDash = (x: number | null, d: number): string => (x === null ? '—' : fixed(x, d));
/** A voltage threshold as given: 90, 91.7 (c84-service-b), 94.25. */
const limitPercent = (x: number) => String(Math.round(x * 100) / 100);

/**
 * @param naming the phase naming conductors and phases are labelled with @defaultValue the board's (`p.phaseNames`)
 */
export function profileSection(p: ProfileResult, charts: readonly ProfileChart[], naming: PhaseNaming = p.phaseNames): ReportSection {
  const s = p.before;
  const label = labellerOf(naming);
  const blocks: ReportBlock[] = [
    {
      kind: 'facts',
      items: [
        ['Intervals', `${p.intervals.count} of ${fixed(p.intervals.intervalSeconds / 60, 0)} min, ${p.intervals.first} to ${p.intervals.last} (${p.timeZone})`],
        ['Energy imported / exported', `${fixed(s.energy.kWhImport, 0)} kWh / ${fixed(s.energy.kWhExport, 0)} kWh`],
        ['Reactive energy lagging / leading', `${fixed(s.energy.kvarhLagging, 0)} kvarh / ${fixed(s.energy.kvarhLeading, 0)} kvarh`],
        ['Billing power factor', fixed(s.energy.billingPf, 3)],
        ['Hours importing at a leading PF', fixed(s.leadingHours, 1)],
        ...((s.unbalance ? [['Voltage unbalance, highest / 95th percentile', `${fixed(s.unbalance.maxPercent, 2)} % (${s.unbalance.maxAt}) / ${fixed(s.unbalance.p95Percent, 2)} %`]] : []) as [string, string][]),
        [
          `Hours below ${limitPercent(p.limits.voltageLowPercent)} % / above ${limitPercent(p.limits.voltageHighPercent)} % (${p.limits.voltageLimitsFrom === 'profile.limits' ? 'profile.limits' : `the board's voltage limits, ${p.limits.voltageLimitsFrom}`})`,
          `${fixed(s.hoursVoltageLow, 1)} / ${fixed(s.hoursVoltageHigh, 1)}`,
        ],
      ],
    },
    {
      kind: 'table',
      caption: 'Conductor currents over the period',
      columns: [{ label: 'Conductor' }, { label: 'Highest A', align: 'right' }, { label: 'When' }, { label: '99th % A', align: 'right' }, { label: '95th % A', align: 'right' }, { label: 'Rating A', align: 'right' }, { label: 'Hours over', align: 'right' }],
      rows: s.conductors.map((c) => [label(c.conductor), fixed(c.maxA, 1), c.maxAt, fixed(c.p99A, 1), fixed(c.p95A, 1), orDash(c.ratingA, 0), orDash(c.hoursAboveLimit, 1)]),
      note: 'Hours over: above the conductor rating; for the neutral, above the neutral limit of the study.',
    },
    {
      kind: 'table',
      caption: 'Phase voltages over the period, % of nominal',
      columns: [{ label: 'Phase' }, { label: 'Lowest %', align: 'right' }, { label: 'When' }, { label: 'Highest %', align: 'right' }, { label: 'When' }],
      rows: s.voltages.map((v) => [label(v.phase), fixed(v.minPercent, 1), v.minAt, fixed(v.maxPercent, 1), v.maxAt]),
    },
    ...charts.map((c): ReportBlock => ({ kind: 'figure', name: `profile-${c.name}`, caption: c.caption, svg: c.svg })),
  ];
  if (p.bank) {
    const b = p.bank;
    blocks.push({
      kind: 'facts',
      items: [
        ['Automatic bank simulated', `${fixed(b.totalKvar, 1)} kvar in ${b.steps.length} steps${b.sizedFromProfile ? ' (sized from the profile)' : ''}`],
        ['Billing power factor with the bank', fixed(b.after.energy.billingPf, 3)],
        ['Hours leading with the bank', fixed(b.after.leadingHours, 1)],
        ['Largest voltage rise from the bank', `${fixed(b.voltageRisePercent, 2)} % (${b.voltageRiseAt})`],
        ['Busiest contactor reaches its typical life in', b.yearsToContactorLife === null ? '—' : `${fixed(b.yearsToContactorLife, 1)} years`],
      ],
    });
  }
  if (p.cautions.length) blocks.push({ kind: 'list', tone: 'caution', items: p.cautions });
  return { id: 'profile', title: 'Load over time', blocks };
}

/**
 * How interval data is read where the file leaves something to the model, against figures worked by hand
 * (boards and data invented here): a metered phase in kW alone, a group's kW, rows closer together than one
 * interval, a record mostly made up by the gap fill, bank settings that need a neutral, a file that is not
 * separated by commas. The supply is ideal at 400 V line to line, so a phase is at 400/√3 = 230.94 V.
 */
import { describe, expect, it } from 'vitest';
import {
  checkIntervalSequence,
  createRowReader,
  driverColumns,
  InputError,
  normaliseBoard,
  parseBoard,
  planColumns,
  planDrivers,
  planInstallationColumns,
  profileSection,
  studyProfile,
  type GapFill,
  type InputIssue,
} from '@trivar/core';
import { ferrybankInService } from '../support/ferrybankInService.js';

const SUPPLY = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;
const V_PHASE = 400 / Math.sqrt(3);
const tanOf = (pf: number) => Math.tan(Math.acos(pf));

function issuesOf(run: () => unknown): readonly InputIssue[] {
  try {
    run();
  } catch (e) {
    if (e instanceof InputError) return e.issues;
    throw e;
  }
  throw new Error('expected an InputError');
}

/** A board file's spec through a profile of the given rows, as `trivar profile` runs it. */
function profileOf(spec: Record<string, unknown>, header: string[], rows: string[][], options: { fill?: GapFill; bank?: boolean } = {}) {
  const parsed = parseBoard(spec);
  const board = normaliseBoard(parsed);
  const plan = planColumns(board, header, parsed.profile?.groups ? { groups: parsed.profile.groups } : {});
  const reader = createRowReader(plan);
  rows.forEach((r, k) => reader.push(r, k + 2));
  const table = checkIntervalSequence(reader.finish(), options.fill ?? 'none');
  const study = studyProfile(
    {
      board: plan.board,
      drivers: planDrivers(plan),
      columns: driverColumns(plan, table.values, table.count),
      utcMs: table.utcMs,
      intervalMs: table.intervalMs,
      rowHours: table.rowHours,
      sequence: table.report,
      undriven: { loads: plan.undriven, atRating: false },
      columnNotes: plan.notes ?? [],
      ...(parsed.profile ? { profile: parsed.profile } : {}),
    },
    { bank: options.bank ?? false },
  );
  return { plan, table, study, result: study.result };
}

const peakOf = (result: { before: { conductors: readonly { conductor: string; maxA: number }[] } }, conductor: string) => result.before.conductors.find((c) => c.conductor === conductor)!.maxA;

describe('a metered phase given in kW alone', () => {
  // Bakery back room: a dough mixer 3 kW at PF 0.70 and a proofer fan 2 kW at PF 0.72 on A; the shop lights on B.
  const bakery = {
    name: 'Bakery back room',
    supply: SUPPLY,
    loads: [
      { name: 'Dough mixer', connection: 'A-N', kW: 3, pf: 0.7 },
      { name: 'Proofer fan', connection: 'A-N', kW: 2, pf: 0.72 },
      { name: 'Shop lights', connection: 'B-N', kW: 2, pf: 0.95 },
    ],
  };

  it('is taken at the rated power factor of the loads on that phase, not at PF 1, and says so', () => {
    const { result, plan } = profileOf(bakery, ['time', 'phase A [kW]', 'Shop lights [x]'], [['2025-02-03T05:00Z', '5', '1']]);
    // By hand: Q = 3·tan(acos 0.70) + 2·tan(acos 0.72) = 3.061 + 1.928 = 4.988 kvar; S = √(5² + 4.988²) = 7.063 kVA.
    const q = 3 * tanOf(0.7) + 2 * tanOf(0.72);
    expect(q).toBeCloseTo(4.988, 3);
    const sA = Math.hypot(5, q);
    // I_A = 7063 / 230.94 = 30.6 A (at PF 1 it would read 5000 / 230.94 = 21.65 A).
    expect(peakOf(result, 'A')).toBeCloseTo((sA * 1000) / V_PHASE, 2);
    expect(peakOf(result, 'A')).toBeCloseTo(30.58, 2);
    // The board: P = 7 kW, Q = 4.988 + 2·tan(acos 0.95) = 5.646 kvar, PF 7 / √(7² + 5.646²) = 0.778.
    expect(result.before.energy.billingPf).toBeCloseTo(0.7784, 4);
    const pfA = 5 / sA;
    expect(plan.targets[0]!.phaseRating!.pf).toBeCloseTo(pfA, 12);
    expect(result.columnNotes).toEqual([
      `"phase A [kW]" has no kvar or pf column: taken at PF ${pfA.toFixed(3)} lagging, the rated power factor of the board file's loads on that phase (Dough mixer, Proofer fan); give "phase A [kvar]" or "phase A [pf]" where the meter records it`,
    ]);
    // The mixer and the fan are inside the phase total, not "off".
    expect(result.undriven!.loads).toEqual([]);
    // The report states it among the facts of the data.
    const facts = profileSection(result, []).blocks.flatMap((b) => (b.kind === 'facts' ? b.items : []));
    expect(facts).toContainEqual(['Columns read', result.columnNotes[0]]);
  });

  it('on a sub-board: from the loads there, each line-to-line branch as the line carries it, the bank in service aside', () => {
    // The shipped joinery's finishing shop: spray booth fans 11 kW at 0.8 and drying heaters 12 kW at PF 1, both
    // delta; line A carries its share of the A-B and C-A branches of each (the ∓30° turns cancel in a balanced
    // delta), so P = (11 + 12)/3 kW, Q = 11/3 × 0.75 kvar.
    // Its bank (25 + 25 kvar, in service in the file) is solved at its rating beside the total, so it is not counted.
    const plan = planInstallationColumns(ferrybankInService, ['time', 'Finishing shop/phase A [kW]']);
    const rating = plan.targets[0]!.phaseRating!;
    expect(rating.pf).toBeCloseTo(23 / Math.hypot(23, 11 * 0.75), 12);
    expect(rating.loads).toEqual(['part of Finishing shop/Spray booth fans', 'part of Finishing shop/Drying room heaters']);
  });

  it("takes a line-to-line load's share as the line carries it (S/√3 turned by ∓30°), so the neutral is the line-to-neutral loads' alone", () => {
    // Bakehouse: an oven pair of 20 kW at PF 1 on A-B and a 10 kW prover at PF 1 on C-N, each phase metered in kW.
    const bakehouse = {
      name: 'Bakehouse lane',
      supply: SUPPLY,
      loads: [
        { name: 'Oven pair', connection: 'A-B', kW: 20, pf: 1 },
        { name: 'Prover', connection: 'C-N', kW: 10, pf: 1 },
      ],
    };
    const { result, plan } = profileOf(bakehouse, ['time', 'phase A [kW]', 'phase B [kW]', 'phase C [kW]'], [['2026-02-02T08:00Z', '10', '10', '10']]);
    // By hand: line A carries S_AB/(√3∠30°) = 10 − j5.77 kVA (PF 0.866 leading), line B 10 + j5.77 (0.866 lagging), line C 10 kVA.
    expect(plan.targets[0]!.phaseRating!.tanPhi).toBeCloseTo(-Math.tan(Math.PI / 6), 12);
    expect(plan.targets[1]!.phaseRating!.tanPhi).toBeCloseTo(Math.tan(Math.PI / 6), 12);
    expect(plan.targets[2]!.phaseRating!.tanPhi).toBeCloseTo(0, 12);
    // Lines 20000/400 = 50 A on A and B, 10000/230.94 = 43.30 A on C; the neutral carries the prover alone, 43.30 A
    // (half of each oven on each line at PF 1 gave three equal 43.3 A lines and 0 A in the neutral).
    expect(peakOf(result, 'A')).toBeCloseTo(50, 2);
    expect(peakOf(result, 'B')).toBeCloseTo(50, 2);
    expect(peakOf(result, 'C')).toBeCloseTo(10_000 / V_PHASE, 2);
    expect(peakOf(result, 'N')).toBeCloseTo(10_000 / V_PHASE, 2);
  });

  it('is taken at PF 1 where the file has no load drawing power on that phase, and says that too', () => {
    const { result } = profileOf(bakery, ['time', 'phase C [kW]', 'Shop lights [x]'], [['2025-02-03T05:00Z', '4', '1']]);
    expect(peakOf(result, 'C')).toBeCloseTo(4000 / V_PHASE, 2);
    expect(result.columnNotes[0]).toMatch(/^"phase C \[kW\]" has no kvar or pf column and the board file has no load drawing power on that phase: taken at PF 1;/);
  });

  it('a pf column beside it still wins', () => {
    const { result } = profileOf(bakery, ['time', 'phase A [kW]', 'phase A [pf]', 'Shop lights [x]'], [['2025-02-03T05:00Z', '5', '1', '1']]);
    expect(peakOf(result, 'A')).toBeCloseTo(5000 / V_PHASE, 2);
    expect(result.columnNotes).toEqual([]);
  });
});

describe("a group's kW column", () => {
  // A dye works' rinse line: a water heater on A at PF 1 and a pump motor on B at PF 0.6, 6 kW each.
  const dyeWorks = {
    name: 'Dye works rinse line',
    supply: SUPPLY,
    loads: [
      { name: 'Water heater', connection: 'A-N', kW: 6, pf: 1 },
      { name: 'Rinse pump', connection: 'B-N', kW: 6, pf: 0.6 },
    ],
    profile: { groups: { rinse: ['Water heater', 'Rinse pump'] } },
  };

  it('is shared by rated kW, each load at its own power factor: at the rated total it equals the board at rating', () => {
    const { result, plan } = profileOf(dyeWorks, ['time', 'rinse [kW]'], [
      ['2025-02-03T05:00Z', '12'],
      ['2025-02-03T05:15Z', '6'],
    ]);
    // By hand: A = 6000 / 230.94 = 25.98 A; B = (6 / 0.6) kVA / 230.94 = 43.30 A at 53.13° lagging;
    // N = |25.98∠0° + 43.30∠(−120° − 53.13°)| = 17.78 A.
    const iA = 6000 / V_PHASE;
    const iB = 10_000 / V_PHASE;
    const angleB = (-120 - (Math.acos(0.6) * 180) / Math.PI) * (Math.PI / 180);
    const iN = Math.hypot(iA + iB * Math.cos(angleB), iB * Math.sin(angleB));
    expect(peakOf(result, 'A')).toBeCloseTo(iA, 2);
    expect(peakOf(result, 'B')).toBeCloseTo(iB, 2);
    expect(peakOf(result, 'N')).toBeCloseTo(iN, 2);
    expect(iN).toBeCloseTo(17.78, 2);
    // The heater draws no kvar: all 8 kvar of the first interval and 4 of the second are the pump's, on B.
    expect(result.before.energy.phases.find((p) => p.phase === 'A')!.kvarh).toBeCloseTo(0, 9);
    expect(result.before.energy.phases.find((p) => p.phase === 'B')!.kvarh).toBeCloseTo((8 + 4) * 0.25, 9);
    expect(planDrivers(plan)[0]!.loads.map((l) => [l.coefficient.re, l.coefficient.im])).toEqual([
      [0.5, 0],
      [0.5, expect.closeTo(0.5 * (4 / 3), 12)],
    ]);
    expect(result.columnNotes).toEqual(['"rinse" [kW] is shared among its 2 loads in proportion to their rated kW, each at its own rated power factor']);
  });

  it('with kvar beside it the total is as given, shared by rated kW', () => {
    const { result } = profileOf(dyeWorks, ['time', 'rinse [kW]', 'rinse [kvar]'], [['2025-02-03T05:00Z', '12', '0']]);
    expect(peakOf(result, 'A')).toBeCloseTo(6000 / V_PHASE, 2);
    expect(peakOf(result, 'B')).toBeCloseTo(6000 / V_PHASE, 2);
  });
});

describe('rows closer together than one interval', () => {
  // A joinery shop: a spindle moulder 7.5 kW at PF 0.8 (three-phase) all hour, a glue pot 2 kW at PF 1 on C.
  const joinery = {
    name: 'Joinery shop',
    supply: SUPPLY,
    loads: [
      { name: 'Spindle moulder', connection: 'ABC-star', kW: 7.5, pf: 0.8 },
      { name: 'Glue pot', connection: 'C-N', kW: 2, pf: 1 },
    ],
    profile: { tariff: { demand: { windowMinutes: 15, pricePerKVA: 1 } } },
  };
  const rows = [
    ['2025-02-03T07:00Z', '1', '0'],
    ['2025-02-03T07:15Z', '1', '0'],
    ['2025-02-03T07:22Z', '1', '1'],
    ['2025-02-03T07:30Z', '1', '0'],
    ['2025-02-03T07:45Z', '1', '0'],
  ];

  it('count for the time up to the next row: the hour is an hour and its energy the clock’s', () => {
    const { result, table } = profileOf(joinery, ['time', 'Spindle moulder [x]', 'Glue pot [x]'], rows);
    // Rows cover 15, 7, 8, 15 and 15 min (the last one interval).
    expect(Array.from(table.rowHours!, (h) => Math.round(h * 60))).toEqual([15, 7, 8, 15, 15]);
    expect(result.before.hours).toBeCloseTo(1, 12);
    // By hand: 7.5 kW × 1 h + 2 kW × 8 min = 7.5 + 0.267 = 7.767 kWh (counting rows as whole intervals gave 9.875).
    expect(result.before.energy.kWhImport).toBeCloseTo(7.5 + (2 * 8) / 60, 9);
    expect(result.before.energy.kvarhLagging).toBeCloseTo(7.5 * 0.75, 9);
    // The 07:15 window: P = (7.5 × 7 + 9.5 × 8) / 15 = 8.567 kW, Q = 5.625 kvar → 10.248 kVA.
    expect(result.before.months[0]!.peakKVA).toBeCloseTo(Math.hypot((7.5 * 7 + 9.5 * 8) / 15, 5.625), 9);
    expect(result.before.months[0]!.hours).toBeCloseTo(1, 12);
    expect(result.sequence!.irregularSteps).toBe(2);
  });

  it("the bank's yearly rate is taken over the hour the rows cover, not 5 × 15 min", () => {
    const { result } = profileOf(joinery, ['time', 'Spindle moulder [x]', 'Glue pot [x]'], rows, { bank: true });
    const step = result.bank!.steps[0]!;
    // A year is 365.25 × 24 = 8,766 h: one closing in 1 h is 8,766 a year (7,013 over 1.25 h).
    expect(step.closingsPerYear).toBeCloseTo(step.closings * 8766, 6);
  });

  it('regular rows stand for one interval each: no weights', () => {
    const { table, result } = profileOf(joinery, ['time', 'Spindle moulder [x]', 'Glue pot [x]'], [rows[0]!, rows[1]!, rows[3]!]);
    expect(table.rowHours).toBeNull();
    expect(result.before.energy.kWhImport).toBeCloseTo(7.5 * 0.75, 9);
  });

  it('a step holding missing intervals leaves them a gap, and the row covers the rest', () => {
    // 07:00, then 07:40: two intervals missing (round(40/15) − 1), the 07:00 row stands for 40 − 30 = 10 min.
    const { table } = profileOf(joinery, ['time', 'Spindle moulder [x]', 'Glue pot [x]'], [rows[0]!, ['2025-02-03T07:40Z', '1', '0'], ['2025-02-03T07:55Z', '1', '0'], ['2025-02-03T08:10Z', '1', '0']]);
    expect(table.report.gaps.missingIntervals).toBe(2);
    expect(Array.from(table.rowHours!, (h) => Math.round(h * 60))).toEqual([10, 15, 15, 15]);
  });
});

describe('a record mostly made up by the gap fill', () => {
  const shed = { name: 'Potting shed', supply: SUPPLY, loads: [{ name: 'Heater', connection: 'A-N', kW: 2, pf: 1 }] };
  const hourly = (hours: number[]) => hours.map((h) => [new Date(Date.UTC(2025, 1, 3) + h * 3_600_000).toISOString(), '1']);

  it('warns with the counts made up and read above 10 %', () => {
    // Read at 00:00, 01:00 and 22:00: 20 intervals missing, 20 of 23 made up (87.0 %).
    const { result } = profileOf(shed, ['time', 'Heater [x]'], hourly([0, 1, 22]), { fill: 'hold' });
    expect(result.warnings).toEqual([
      '20 of the 23 intervals (87.0 %) are made up by the gap fill (the last reading held) and 3 were read; the longest gap is 20.0 h: above 10 % made up, every energy, hour, demand and bank figure leans on invented readings; fill only short gaps, or study the stretches that were read',
    ]);
  });

  it("the report's load-over-time section lists it with the warnings", () => {
    const { result } = profileOf(shed, ['time', 'Heater [x]'], hourly([0, 1, 22]), { fill: 'hold' });
    const warnings = profileSection(result, []).blocks.filter((b) => b.kind === 'list' && b.tone === 'warning');
    expect(warnings.flatMap((b) => (b.kind === 'list' ? b.items : []))).toEqual(result.warnings);
  });

  it('says nothing at or below 10 %, or where gaps are left out', () => {
    // 20 read, 2 made up: 2 of 22 = 9.1 %.
    const read = [...Array.from({ length: 10 }, (_, h) => h), ...Array.from({ length: 10 }, (_, h) => h + 12)];
    expect(profileOf(shed, ['time', 'Heater [x]'], hourly(read), { fill: 'linear' }).result.warnings).toEqual([]);
    expect(profileOf(shed, ['time', 'Heater [x]'], hourly([0, 1, 22])).result.warnings).toEqual([]);
  });
});

describe('bank settings that need a neutral, on a board without one', () => {
  const crusher = (bank: Record<string, unknown>) => ({
    name: 'Gravel screen house',
    supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
    loads: [{ name: 'Screen drive', connection: 'ABC-delta', kW: 22, pf: 0.8 }],
    profile: { bank },
  });
  const rows = [
    ['2025-02-03T07:00Z', '1'],
    ['2025-02-03T07:15Z', '0.5'],
  ];

  it('perPhase: true is refused by its field, not dropped for three-phase steps', () => {
    const issues = issuesOf(() => profileOf(crusher({ perPhase: true }), ['time', 'Screen drive [x]'], rows, { bank: true }));
    expect(issues).toEqual([expect.objectContaining({ code: 'not_applicable', path: 'profile.bank.perPhase' })]);
    expect(issues[0]!.message).toMatch(/false or left out on a board without a neutral \(Gravel screen house\): single-phase steps connect line to neutral/);
  });

  it('a step on one phase is refused by its field, not left to the solver', () => {
    const issues = issuesOf(() => profileOf(crusher({ steps: [{ kvar: 5 }, { kvar: 5, phase: 'B' }] }), ['time', 'Screen drive [x]'], rows, { bank: true }));
    expect(issues.map((i) => [i.code, i.path])).toEqual([['not_applicable', 'profile.bank.steps.1.phase']]);
  });

  it('three-phase steps run as before, and without --bank the section is not read', () => {
    const { result } = profileOf(crusher({ steps: [{ kvar: 5 }, { kvar: 5 }] }), ['time', 'Screen drive [x]'], rows, { bank: true });
    expect(result.bank!.steps.map((s) => s.channel)).toEqual(['ABC', 'ABC']);
    expect(profileOf(crusher({ perPhase: true }), ['time', 'Screen drive [x]'], rows).result.bank).toBeNull();
  });
});

describe('a file not separated by commas', () => {
  const board = normaliseBoard(parseBoard({ supply: SUPPLY, loads: [{ name: 'Kettle', connection: 'A-N', kW: 2, pf: 1 }] }));
  it.each([
    ['time;Kettle [x]', 'semicolons'],
    ['time\tKettle [x]', 'tabs'],
  ])('%j: the header says the separator must be a comma', (cell, found) => {
    const issues = issuesOf(() => planColumns(board, [cell]));
    expect(issues).toEqual([expect.objectContaining({ code: 'bad_separator', path: 'header', received: JSON.stringify(cell) })]);
    expect(issues[0]!.message).toContain(`columns separated by commas, with a point for decimals (1.25): the header's columns are separated by ${found}`);
  });

  it('a header of one column without either is still a missing data column', () => {
    expect(issuesOf(() => planColumns(board, ['time'])).map((i) => i.code)).toEqual(['missing']);
  });
});
